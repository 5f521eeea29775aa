// SPDX-License-Identifier: MIT
// `sqfc fredholm` at the sizes of issue 4 (label slow, about 70 s on 2 cores): every n <= 2000
// with the entry-by-entry cross-check, and samples up to 10^4 by both methods, each value
// checked against trial division, gcd over pairs and direct sums computed here.
#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <map>
#include <nlohmann/json.hpp>
#include <numeric>

#include "cli_runner.hpp"
#include "oracles/brute_force.hpp"

namespace sqfc::cli_test {
namespace {

/// A CSV file of plain fields with columns found by name.
struct Csv {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  [[nodiscard]] const std::string& at(std::size_t row, const std::string& name) const {
    const auto it = std::find(header.begin(), header.end(), name);
    if (it == header.end()) throw std::runtime_error("no column " + name);
    return rows.at(row).at(static_cast<std::size_t>(it - header.begin()));
  }
  [[nodiscard]] std::int64_t number(std::size_t row, const std::string& name) const { return std::stoll(at(row, name)); }
};

Csv parse_csv(const std::string& text) {
  Csv csv;
  const auto lines = split_lines(text);
  if (lines.empty()) return csv;
  csv.header = split_fields(lines[0]);
  for (std::size_t i = 1; i < lines.size(); ++i) csv.rows.push_back(split_fields(lines[i]));
  return csv;
}

/// Trial-division facts about H_n for every n <= n_max.
struct Facts {
  explicit Facts(std::uint64_t n_max) : prefix(oracles::prefix_naive(n_max)) {
    std::vector<std::uint64_t> vertices;
    edges.assign(n_max + 1, 0);
    even.assign(n_max + 1, 0);
    odd.assign(n_max + 1, 0);
    fredholm.assign(n_max + 1, 1);
    for (std::uint64_t n = 2; n <= n_max; ++n) {
      edges[n] = edges[n - 1];
      even[n] = even[n - 1];
      odd[n] = odd[n - 1];
      fredholm[n] = fredholm[n - 1];
      if (prefix.mu[n] == 0) continue;
      // Adding vertex n: one edge to each earlier vertex sharing a prime (gcd > 1).
      for (const auto a : vertices) edges[n] += std::gcd(a, n) > 1;
      vertices.push_back(n);
      // omega odd <=> mu = -1 <=> even dimension; the determinant picks up -mu(n)
      // (unimodularity of connection graphs, published 2016).
      (prefix.mu[n] == -1 ? even : odd)[n] += 1;
      fredholm[n] *= -prefix.mu[n];
    }
  }
  oracles::NaivePrefix prefix;
  std::vector<std::int64_t> edges, even, odd;
  std::vector<int> fredholm;
};

// Checks the row against the facts; returns the number of values compared.
int check_row(const Csv& csv, std::size_t r, const Facts& f, bool bordered) {
  const auto n = static_cast<std::size_t>(csv.number(r, "n"));
  int checked = 0;
  auto expect = [&](const std::string& column, std::int64_t value) {
    EXPECT_EQ(csv.number(r, column), value) << "n = " << n << ", " << column;
    ++checked;
  };
  expect("vertices", f.prefix.squarefree[n] - 1);      // Q(n) - 1, trial division
  expect("edges", f.edges[n]);                          // gcd over pairs
  expect("fredholm", f.fredholm[n]);                    // prod -mu(k), published 2016
  expect("energy", 1 - f.prefix.mertens[n]);            // energy theorem, published 2017/2019
  expect("even_faces", f.even[n]);
  expect("odd_faces", f.odd[n]);
  if (bordered) {
    expect("positive_eigenvalues", f.even[n]);  // sign counts = face parities, published 2017
    expect("negative_eigenvalues", f.odd[n]);
  }
  return checked;
}

std::map<std::int64_t, std::int64_t> formula_histogram(std::uint64_t n, const Facts& f) {
  // Closed form of design.md identity 6 by direct sums: M_l(n/l) summed term by term.
  std::vector<std::uint64_t> v;
  for (std::uint64_t k = 2; k <= n; ++k)
    if (f.prefix.mu[k] != 0) v.push_back(k);
  std::map<std::uint64_t, std::int64_t> memo;
  std::map<std::int64_t, std::int64_t> h;
  for (const auto x : v)
    for (const auto y : v) {
      const auto l = x / std::gcd(x, y) * y;
      if (l > n) {
        ++h[0];
        continue;
      }
      auto it = memo.find(l);
      if (it == memo.end()) {
        std::int64_t s = 0;
        for (std::uint64_t t = 1; t <= n / l; ++t)
          if (std::gcd(t, l) == 1) s += f.prefix.mu[t];
        it = memo.emplace(l, s).first;
      }
      ++h[-f.prefix.mu[x] * f.prefix.mu[y] * f.prefix.mu[l] * it->second];
    }
  return h;
}

std::map<std::int64_t, std::int64_t> histogram_at(const std::string& text, std::int64_t n) {
  const auto csv = parse_csv(text);
  std::map<std::int64_t, std::int64_t> h;
  for (std::size_t r = 0; r < csv.rows.size(); ++r)
    if (csv.number(r, "n") == n) h[csv.number(r, "value")] = csv.number(r, "count");
  return h;
}

const std::vector<std::string> shared_columns = {"n",         "vertices",       "edges",      "fredholm", "energy",
                                                 "green_min", "green_max",      "green_distinct", "even_faces",
                                                 "odd_faces"};

TEST(FredholmSlow, EveryNUpTo2000WithCrossCheck) {
  // Issue 4: the bordered inverse equals the closed form entry by entry for every n <= 2000, and
  // det(1 + A) = prod -mu(k) at every one of them.
  const Facts f(2000);
  ScratchDir dir;
  RunOptions options;
  options.timeout = std::chrono::seconds(600);
  const std::vector<std::string> base = {"fredholm", "--to", "2000", "--every", "1", "--green-stats", "--quiet"};
  auto args = base;
  args.insert(args.end(), {"--method", "bordered", "--cross-check", "--histogram", "hb.csv", "--out", "b.csv"});
  const auto b = run_sqfc(dir, args, options);
  args = base;
  args.insert(args.end(), {"--method", "closed", "--histogram", "hc.csv", "--out", "c.csv"});
  const auto c = run_sqfc(dir, args, options);
  ASSERT_EQ(b.exit_code, 0) << describe(b);
  ASSERT_EQ(c.exit_code, 0) << describe(c);
  const auto bt = parse_csv(read_file(dir.path("b.csv")));
  const auto ct = parse_csv(read_file(dir.path("c.csv")));
  ASSERT_EQ(bt.rows.size(), 2000u);
  ASSERT_EQ(ct.rows.size(), 2000u);
  int values = 0, cross_checked = 0;
  for (std::size_t i = 0; i < bt.rows.size(); ++i) {
    EXPECT_EQ(bt.number(i, "n"), static_cast<std::int64_t>(i + 1));
    values += check_row(bt, i, f, true);
    values += check_row(ct, i, f, false);
    for (const auto& column : shared_columns) EXPECT_EQ(bt.at(i, column), ct.at(i, column)) << "n = " << i + 1;
    const auto& checks = bt.at(i, "checks");
    EXPECT_EQ(checks.find("FAIL"), std::string::npos) << "n = " << i + 1 << ": " << checks;
    cross_checked += checks.find("closed_form") != std::string::npos;
  }
  EXPECT_EQ(values, 2000 * (8 + 6));
  EXPECT_EQ(cross_checked, 2000);
  EXPECT_EQ(read_file(dir.path("hb.csv")), read_file(dir.path("hc.csv")));
  const auto m = nlohmann::json::parse(read_file(dir.path("b.csv.manifest.json")));
  EXPECT_EQ(m.at("checks_passed"), true);
  std::map<std::string, std::int64_t> passes;
  for (const auto& check : m.at("checks")) {
    EXPECT_EQ(check.at("failed"), 0) << check.dump();
    passes[check.at("name").get<std::string>()] = check.at("passed").get<std::int64_t>();
  }
  // s = -mu(k) once per vertex, V = Q(2000) - 1 by trial division; the rest once per n.
  EXPECT_EQ(passes, (std::map<std::string, std::int64_t>{{"schur_sign", f.prefix.squarefree[2000] - 1},
                                                         {"fredholm_parity", 2000},
                                                         {"energy", 2000},
                                                         {"inertia", 2000},
                                                         {"closed_form", 2000}}));
}

TEST(FredholmSlow, BothMethodsUpTo10000) {
  // Samples 2500, 5000, 7500, 10^4 by the bordered method (cross-checked) and the closed form.
  const Facts f(10'000);
  ScratchDir dir;
  RunOptions options;
  options.timeout = std::chrono::seconds(600);
  const auto b = run_sqfc(dir,
                          {"fredholm", "--to", "1e4", "--every", "2500", "--method", "bordered", "--green-stats",
                           "--cross-check", "--histogram", "hb.csv", "--quiet", "--out", "b.csv"},
                          options);
  const auto c = run_sqfc(dir,
                          {"fredholm", "--to", "1e4", "--every", "2500", "--method", "closed", "--green-stats",
                           "--histogram", "hc.csv", "--quiet", "--out", "c.csv"},
                          options);
  ASSERT_EQ(b.exit_code, 0) << describe(b);
  ASSERT_EQ(c.exit_code, 0) << describe(c);
  const auto bt = parse_csv(read_file(dir.path("b.csv")));
  const auto ct = parse_csv(read_file(dir.path("c.csv")));
  ASSERT_EQ(bt.rows.size(), 4u);
  ASSERT_EQ(ct.rows.size(), 4u);
  int values = 0;
  for (std::size_t i = 0; i < 4; ++i) {
    EXPECT_EQ(bt.number(i, "n"), static_cast<std::int64_t>(2500 * (i + 1)));
    values += check_row(bt, i, f, true);
    values += check_row(ct, i, f, false);
    for (const auto& column : shared_columns) EXPECT_EQ(bt.at(i, column), ct.at(i, column)) << "row " << i;
    EXPECT_EQ(bt.at(i, "checks").find("FAIL"), std::string::npos) << bt.at(i, "checks");
  }
  EXPECT_EQ(values, 4 * (8 + 6));
  EXPECT_EQ(read_file(dir.path("hb.csv")), read_file(dir.path("hc.csv")));
  // Published at 10^4: V = Q - 1 = 6082 (OEIS A071172), energy = 1 - M = 24 (OEIS A084237,
  // M(10^4) = -23), det = (-1)^((6083 - 23)/2 - 1) = -1.
  EXPECT_EQ(bt.number(3, "vertices"), 6082);
  EXPECT_EQ(bt.number(3, "energy"), 24);
  EXPECT_EQ(bt.number(3, "fredholm"), -1);
  // The whole distribution at 10^4 against the closed form summed directly.
  const auto expected = formula_histogram(10'000, f);
  EXPECT_EQ(histogram_at(read_file(dir.path("hb.csv")), 10'000), expected);
  std::int64_t total = 0;
  for (const auto& [value, count] : expected) total += count;
  EXPECT_EQ(total, 6082 * 6082);
  EXPECT_EQ(bt.number(3, "green_min"), expected.begin()->first);
  EXPECT_EQ(bt.number(3, "green_max"), expected.rbegin()->first);
  EXPECT_EQ(bt.number(3, "green_distinct"), static_cast<std::int64_t>(expected.size()));
}

}  // namespace
}  // namespace sqfc::cli_test
