// SPDX-License-Identifier: MIT
// `sqfc face K [--n N] [--format text|json]` run as a program (issue 7, item 1): its text and
// JSON outputs for small, large and non-squarefree K, the --n counts against direct counting,
// and its input errors (one line on stderr, exit 2).
#include <gtest/gtest.h>

#include <cstdint>
#include <nlohmann/json.hpp>
#include <numeric>
#include <regex>

#include "cli_runner.hpp"
#include "oracles/pari_oracle.hpp"

namespace sqfc::cli_test {
namespace {

RunResult face(const std::vector<std::string>& args) {
  ScratchDir dir;
  std::vector<std::string> all = {"face"};
  all.insert(all.end(), args.begin(), args.end());
  auto r = run_sqfc(dir, all);
  EXPECT_TRUE(list_dir(dir.work()).empty()) << "sqfc face wrote files";
  return r;
}

// The "key: value" line of the text output, or "" when there is none.
std::string field(const std::string& out, const std::string& key) {
  for (const auto& line : split_lines(out))
    if (line.rfind(key + ": ", 0) == 0) return line.substr(key.size() + 2);
  return "";
}

TEST(FaceCommand, EmptyFaceVertexAndNonSquarefree) {
  // Hand-computed: 1 is the empty face; 2 a vertex with the empty face as boundary; 12 = 2^2 * 3.
  const auto one = face({"1"});
  ASSERT_EQ(one.exit_code, 0) << describe(one);
  EXPECT_EQ(one.out,
            "K: 1\nfactorisation: 1 (no prime factors)\nsquarefree: yes\nmu: 1\nomega: 0\nOmega: 0\n"
            "face: the empty face {}, dimension -1 (a face of no K_n: their faces start at 2)\n");
  EXPECT_TRUE(one.err.empty());
  const auto two = face({"2"});
  ASSERT_EQ(two.exit_code, 0) << describe(two);
  EXPECT_EQ(two.out,
            "K: 2\nfactorisation: 2\nsquarefree: yes\nmu: -1\nomega: 1\nOmega: 1\nface: {2}, dimension 0 (a vertex)\n"
            "boundary: 1 face of dimension -1\n  1 = {} (without 2), the empty face\n");
  const auto twelve = face({"12"});
  ASSERT_EQ(twelve.exit_code, 0) << describe(twelve);
  EXPECT_EQ(twelve.out,
            "K: 12\nfactorisation: 2^2 * 3\nsquarefree: no (2^2 divides K)\nmu: 0\nomega: 2\nOmega: 3\n"
            "face: none (K is not squarefree, so it is no face of any K_n)\n");
}

TEST(FaceCommand, TwoDimensionalFaces) {
  // Hand-computed: 30 = 2*3*5 and 105 = 3*5*7 (the first 2-sphere of K_n, design.md landmarks).
  const auto thirty = face({"30"});
  ASSERT_EQ(thirty.exit_code, 0) << describe(thirty);
  EXPECT_EQ(thirty.out,
            "K: 30\nfactorisation: 2 * 3 * 5\nsquarefree: yes\nmu: -1\nomega: 3\nOmega: 3\nface: {2, 3, 5}, dimension 2\n"
            "boundary: 3 faces of dimension 1\n  15 = {3, 5} (without 2)\n  10 = {2, 5} (without 3)\n"
            "  6 = {2, 3} (without 5)\n");
  const auto r = face({"105"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(field(r.out, "factorisation"), "3 * 5 * 7");
  EXPECT_EQ(field(r.out, "mu"), "-1");
  EXPECT_EQ(field(r.out, "face"), "{3, 5, 7}, dimension 2");
  EXPECT_NE(r.out.find("\n  35 = {5, 7} (without 3)\n  21 = {3, 7} (without 5)\n  15 = {3, 5} (without 7)\n"), std::string::npos)
      << r.out;
}

TEST(FaceCommand, LargeIntegersMatchPari) {
  // A 30-digit squarefree product 101 * 998244353 * 1000000007 * 1000000009 (primes from
  // memory), 2^64 + 1 = 274177 * 67280421310721 (from memory), and the syntax 2^200, 1e30;
  // every factorisation is compared with PARI's factor.
  struct Case {
    std::string argument, decimal, face;
  };
  const std::vector<Case> cases = {
      {"100822681266162880799828818139", "100822681266162880799828818139", "{101, 998244353, 1000000007, 1000000009}, dimension 3"},
      {"18446744073709551617", "18446744073709551617", "{274177, 67280421310721}, dimension 1"},
      {"2^200", "1606938044258990275541962092341162602522202993782792835301376", ""},  // 2^200, from memory
      {"1e30", "1000000000000000000000000000000", ""},
  };
  std::size_t checked = 0;
  for (const auto& c : cases) {
    const auto r = face({c.argument, "--format", "json"});
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j.at("k").get<std::string>(), c.decimal);
    std::vector<std::pair<std::string, int>> got;
    for (const auto& f : j.at("factorisation")) got.emplace_back(f.at("prime").get<std::string>(), f.at("exponent").get<int>());
    EXPECT_EQ(got, sqfc::oracles::pari_factor_decimal(c.decimal)) << c.argument;
    int big_omega = 0;
    for (const auto& [p, e] : got) big_omega += e;
    EXPECT_EQ(j.at("big_omega").get<int>(), big_omega);
    EXPECT_EQ(j.at("omega").get<int>(), static_cast<int>(got.size()));
    const auto text = face({c.argument});
    ASSERT_EQ(text.exit_code, 0) << describe(text);
    EXPECT_EQ(field(text.out, "K"), c.decimal);
    if (!c.face.empty()) {
      EXPECT_EQ(j.at("face").get<std::string>(), "face");
      EXPECT_EQ(field(text.out, "face"), c.face);
      EXPECT_EQ(j.at("boundary").size(), got.size());
    } else {
      EXPECT_EQ(j.at("face").get<std::string>(), "none");
      EXPECT_EQ(j.at("mu").get<int>(), 0);
    }
    ++checked;
  }
  EXPECT_EQ(checked, 4U);
}

// Direct counts of the neighbourhood of k in K_n (n small): every j in [2, n] is looked at.
struct Direct {
  std::uint64_t faces = 0, cofaces = 0, g = 0, h = 0;
};
Direct count_directly(std::uint64_t k, std::uint64_t n) {
  auto squarefree = [](std::uint64_t m) {
    for (std::uint64_t d = 2; d * d <= m; ++d)
      if (m % (d * d) == 0) return false;
    return true;
  };
  Direct r;
  for (std::uint64_t d = 2; d < k; ++d) r.g += (k % d == 0 && squarefree(d)) ? 1 : 0;
  for (std::uint64_t j = 2; j <= n; ++j) {
    if (!squarefree(j)) continue;
    ++r.faces;
    if (j == k) continue;
    if (j % k == 0) ++r.cofaces, ++r.g;
    if (std::gcd(j, k) > 1) ++r.h;
  }
  return r;
}

TEST(FaceCommand, CountsInKnMatchDirectCounting) {
  // 30 in K_100: faces 60, no coface, G-degree 6, H-degree 35 (hand-computed by direct count).
  const auto r = face({"30", "--n", "100"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_NE(r.out.find("N: 100\nfaces of K_N: 60\nin K_N: yes\ncofaces in K_N: 0\ndegree in G_N: 6\ndegree in H_N: 35\n"),
            std::string::npos)
      << r.out;
  const std::vector<std::pair<std::uint64_t, std::uint64_t>> cases = {{2, 1000}, {6, 100}, {105, 1000}, {97, 3000}, {2310, 3000}, {3000, 3000}};
  std::size_t checked = 0;
  for (const auto& [k, n] : cases) {
    const auto j = face({std::to_string(k), "--n", std::to_string(n), "--format", "json"});
    ASSERT_EQ(j.exit_code, 0) << describe(j);
    const auto c = nlohmann::json::parse(j.out).at("complex");
    const auto want = count_directly(k, n);
    EXPECT_EQ(c.at("faces").get<std::uint64_t>(), want.faces) << k;
    ASSERT_EQ(c.at("in_complex").get<bool>(), k != 3000) << k;  // 3000 = 2^3 * 3 * 5^3 is no face
    if (k == 3000) {
      EXPECT_EQ(c.at("reason").get<std::string>(), "K is not squarefree");
    } else {
      EXPECT_EQ(c.at("cofaces").get<std::uint64_t>(), want.cofaces) << k;
      EXPECT_EQ(c.at("divisibility_degree").get<std::uint64_t>(), want.g) << k;
      EXPECT_EQ(c.at("shared_factor_degree").get<std::uint64_t>(), want.h) << k;
    }
    ++checked;
  }
  EXPECT_EQ(checked, cases.size());
  // K > N, K = 1 and a big K: "no" with the reason; and N = 10^10 (the limit) is accepted.
  EXPECT_EQ(field(face({"31", "--n", "30"}).out, "in K_N"), "no (K > N)");
  EXPECT_EQ(field(face({"1", "--n", "30"}).out, "in K_N"), "no (the empty face is not a face of K_N)");
  EXPECT_EQ(field(face({"2^100", "--n", "30"}).out, "in K_N"), "no (K is not squarefree)");
  EXPECT_EQ(field(face({"18446744073709551617", "--n", "30"}).out, "in K_N"), "no (K > N)");
  const auto big = face({"2", "--n", "1e10"});
  ASSERT_EQ(big.exit_code, 0) << describe(big);
  // For a vertex p, the faces sharing a prime with p are exactly its cofaces.
  EXPECT_EQ(field(big.out, "cofaces in K_N"), field(big.out, "degree in H_N"));
  EXPECT_EQ(field(big.out, "cofaces in K_N"), field(big.out, "degree in G_N"));
  EXPECT_FALSE(field(big.out, "cofaces in K_N").empty());
}

TEST(FaceCommand, BadInputIsOneLineAndExitTwo) {
  struct Case {
    std::vector<std::string> args;
    std::string must_mention;
  };
  const std::vector<Case> cases = {
      {{"0"}, "K"},
      {{"abc"}, "abc"},
      {{"12x"}, "12x"},
      {{"-5"}, ""},
      {{"2^5000"}, "2^5000"},
      {{"30", "--n", "0"}, "--n"},
      {{"30", "--n", "10000000001"}, "--n"},
      {{"30", "--n", "1e11"}, "--n"},
      {{"30", "--n", "junk"}, "junk"},
      {{"30", "--format", "xml"}, "xml"},
      {{}, ""},
  };
  std::size_t checked = 0;
  for (const auto& c : cases) {
    const auto r = face(c.args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_TRUE(r.out.empty()) << describe(r);
    const auto lines = split_lines(r.err);
    EXPECT_EQ(lines.size(), 1U) << describe(r);
    EXPECT_NE(r.err.find(c.must_mention), std::string::npos) << describe(r);
    ++checked;
  }
  EXPECT_EQ(checked, 11U);
}

}  // namespace
}  // namespace sqfc::cli_test
