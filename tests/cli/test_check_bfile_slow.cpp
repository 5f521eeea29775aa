// SPDX-License-Identifier: MIT
// `sqfc check --bfile` on the whole published power tables (sieving to 2^30 and 10^9, a few seconds).
#include <gtest/gtest.h>

#include "cli_runner.hpp"

namespace sqfc::cli_test {
namespace {

TEST(CheckBfileSlow, WholePowerTablesCompareEqual) {
  ScratchDir dir;
  // OEIS A084237 M(10^k), k <= 9 and OEIS A084236 M(2^k), k <= 30 (from memory; small k re-checked
  // against trial division in test_check_bfile.cpp, the rest by this comparison with the engine).
  const std::vector<std::pair<std::string, std::string>> cases = {
      {"a084237_mertens_pow10.txt", "mertens_pow10"}, {"a084236_mertens_pow2.txt", "mertens_pow2"}};
  const std::vector<std::string> compared = {"10", "31"};
  int runs = 0;
  for (std::size_t i = 0; i < cases.size(); ++i) {
    const auto path = (std::filesystem::path(SQFC_TEST_DATA_DIR) / "bfile" / cases[i].first).string();
    const auto r = run_sqfc(dir, {"check", "--bfile", path, "--sequence", cases[i].second, "--threads", "2"});
    EXPECT_EQ(r.exit_code, 0) << describe(r) << r.out;
    EXPECT_NE(r.out.find("terms compared: " + compared[i] + "\n"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("terms skipped: 0 "), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("values: all equal\n"), std::string::npos) << r.out;
    ++runs;
  }
  EXPECT_EQ(runs, 2);
}

}  // namespace
}  // namespace sqfc::cli_test
