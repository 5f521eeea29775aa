// SPDX-License-Identifier: MIT
// `sqfc homology` run as a program: Betti rows against the odd-squarefree formula and the
// landmarks, the barcode file, families with the formula checks off, and input errors.
#include <gtest/gtest.h>

#include "cli_runner.hpp"
#include "oracles/brute_force.hpp"

namespace sqfc::cli_test {
namespace {

TEST(Homology, RowsAtTheLandmarksAndDirectHomology) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"homology", "--to", "300", "--at", "104,105,209,210,300", "--out", "-"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto lines = split_lines(r.out);
  ASSERT_EQ(lines.size(), 6U);
  EXPECT_EQ(lines[0], "n,b0,b1,b2,b3,checks");
  int checked = 0;
  for (std::size_t i = 1; i < lines.size(); ++i) {
    const auto fields = split_fields(lines[i]);
    ASSERT_EQ(fields.size(), 6U);
    const auto n = std::stoull(fields[0]);
    const auto naive = oracles::betti_mod2_naive(n);  // dense Z/2 homology of K_n
    for (std::size_t d = 0; d < 4; ++d) EXPECT_EQ(std::stoll(fields[1 + d]), d < naive.size() ? naive[d] : 0) << lines[i];
    EXPECT_EQ(fields[5], "betti_formula");
    ++checked;
  }
  EXPECT_EQ(checked, 5);
  // b2(104) = 0 and b2(105) = 1: the 2-sphere of 3*5*7 (common knowledge of the field).
  EXPECT_EQ(split_fields(lines[1])[3], "0");
  EXPECT_EQ(split_fields(lines[2])[3], "1");
}

TEST(Homology, BarcodeFileAndManifest) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"homology", "--to", "30", "--at", "30", "--out", "h.csv", "--barcode", "bars.csv"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto bars = split_lines(read_file(dir.work() / "bars.csv"));
  ASSERT_GE(bars.size(), 2U);
  EXPECT_EQ(bars[0], "dimension,birth,death");
  // Hand-computed for K_30: 18 faces (10 primes; the edges 6, 10, 14, 15, 21, 22, 26; the
  // triangle 30). The finite bars are [m, 2m) for the odd squarefree m <= 15; each uses two faces.
  int finite = 0, infinite = 0;
  for (std::size_t i = 1; i < bars.size(); ++i) {
    const auto f = split_fields(bars[i]);
    ASSERT_EQ(f.size(), 3U);
    if (f[2] == "inf") {
      ++infinite;
    } else {
      EXPECT_EQ(std::stoull(f[2]), 2 * std::stoull(f[1])) << bars[i];
      ++finite;
    }
  }
  EXPECT_EQ(finite, 6);    // m = 3, 5, 7, 11, 13, 15
  // 18 - 2 * 6 = 6 essential classes: b0 = 1 + #{17, 19, 23, 29} = 5 and b1 = #{21} = 1.
  EXPECT_EQ(infinite, 6);
  const auto table = split_lines(read_file(dir.work() / "h.csv"));
  ASSERT_EQ(table.size(), 2U);
  const auto row = split_fields(table[1]);
  EXPECT_EQ(std::stoi(row[1]) + std::stoi(row[2]) + std::stoi(row[3]), infinite);
  EXPECT_TRUE(std::filesystem::exists(dir.work() / "h.csv.manifest.json"));
}

TEST(Homology, FamiliesSwitchTheFormulaChecksOff) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"homology", "--to", "1000", "--at", "1000", "--smooth", "7", "--field", "3", "--out", "-"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto lines = split_lines(r.out);
  ASSERT_EQ(lines.size(), 2U);
  // 2*3*5*7 = 210 <= 1000: the 7-smooth family is the full simplex on 4 vertices (contractible).
  EXPECT_EQ(lines[1], "1000,1,0,0,0,formula_checks_off:family_is_not_K_n");
}

TEST(Homology, BadInputIsOneLineAndExitTwo) {
  const std::vector<std::vector<std::string>> cases = {
      {"homology", "--to", "0"},          {"homology", "--to", "3e8"},        {"homology", "--to", "1x"},
      {"homology", "--to", "100", "--field", "5"}, {"homology", "--to", "100", "--at", "200"},
      {"homology", "--to", "100", "--max-dim", "99"}, {"homology", "--to", "100", "--coprime-to", "0"},
      {"homology", "--to", "100", "--out", "/nonexistent/dir/h.csv"}};
  int checked = 0;
  for (const auto& args : cases) {
    ScratchDir dir;
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(split_lines(r.err).size(), 1U) << describe(r);
    EXPECT_FALSE(detail::has_partial_file(dir.work()));
    ++checked;
  }
  EXPECT_EQ(checked, 8);
}

}  // namespace
}  // namespace sqfc::cli_test
