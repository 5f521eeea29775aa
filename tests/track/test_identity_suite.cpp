// SPDX-License-Identifier: MIT
// The identity suite (design.md section 2): every check passes over a small range, covers the
// range it claims, and fails at exactly the corrupted n when one value is corrupted (mutation tests).
#include "sqfc/track/identity_suite.hpp"

#include <gtest/gtest.h>

#include <map>
#include <set>

#include "sqfc/core/error.hpp"

namespace sqfc::track {
namespace {

// Small bounds so that a whole run takes a few milliseconds; every check still visits n.
IdentitySuiteBounds small_bounds() {
  IdentitySuiteBounds b;
  b.persistence_to = 300;
  b.flint_determinant_to = 120;
  b.bordered_to = 200;
  b.green_every_n_to = 60;
  b.lapack_every_n_to = 40;
  b.lapack_last_n = 150;
  b.closed_energy_every_n_to = 100;
  b.closed_energy_samples = 10;
  b.closed_energy_to = 350;
  b.arithmetic_every_n_to = 250;
  b.arithmetic_samples = 20;
  b.divisibility_enumeration_to = 320;
  b.shared_factor_to = 180;
  return b;
}

IdentitySuiteReport run(Natural to, std::vector<int> identities = {}, std::optional<IdentityCorruption> corruption = {}) {
  IdentitySuiteOptions o;
  o.to = to;
  o.threads = 2;
  o.identities = std::move(identities);
  o.bounds = small_bounds();
  o.corruption = std::move(corruption);
  return run_identity_suite(o);
}

const IdentityCheckResult& find(const IdentitySuiteReport& r, const std::string& name) {
  for (const auto& c : r.checks)
    if (c.name == name) return c;
  throw std::runtime_error("no check " + name);
}

std::vector<std::string> all_check_names() {
  std::vector<std::string> names;
  for (int i = 1; i <= 8; ++i)
    for (auto& n : identity_check_names(i)) names.push_back(n);
  return names;
}

TEST(IdentitySuite, EveryCheckPassesAndCoversItsRange) {
  const Natural to = 400;
  const auto r = run(to);
  EXPECT_TRUE(r.passed());
  EXPECT_TRUE(r.engine_checks_failed.empty());
  ASSERT_EQ(r.checks.size(), 20u);
  for (const auto& c : r.checks) {
    EXPECT_EQ(c.failed, 0u) << c.name << ": n = " << (c.first_failure ? c.first_failure->n : 0);
    EXPECT_GT(c.compared, 0u) << c.name;
    EXPECT_FALSE(c.source.empty()) << c.name;
    EXPECT_FALSE(c.coverage.empty()) << c.name;
  }
  // The ranges each check claims, from the bounds above (cut to --to = 400).
  const std::map<std::string, std::tuple<Natural, Natural, Count>> expected = {
      {"euler_characteristic", {1, 400, 400}},  {"betti_persistence", {1, 300, 300}}, {"betti_odd_interval", {1, 400, 400}},
      {"betti0_odd_primes", {2, 400, 399}},     {"mertens_odd_interval", {1, 400, 400}}, {"fredholm_parity", {1, 400, 400}},
      {"fredholm_flint", {1, 120, 120}},        {"fredholm_bordered", {1, 200, 200}},  {"energy_bordered", {1, 200, 200}},
      {"energy_closed_form", {1, 350, 110}},    {"inertia_pivots", {1, 200, 200}},     {"inertia_lapack", {2, 150, 40}},
      {"green_closed_form", {2, 200, 60}},      {"green_inverse_certificate", {200, 200, 1}},
      {"mertens_divisor_sum", {1, 400, 270}},   {"squarefree_formula", {1, 400, 270}}, {"liouville_formula", {1, 400, 270}},
      {"liouville_half_interval", {1, 400, 400}}, {"divisibility_edges", {1, 320, 320}}, {"shared_factor_edges", {1, 180, 180}},
  };
  for (const auto& [name, range] : expected) {
    const auto& c = find(r, name);
    EXPECT_EQ(c.from, std::get<0>(range)) << name;
    EXPECT_EQ(c.to, std::get<1>(range)) << name;
    EXPECT_EQ(c.points, std::get<2>(range)) << name;
    // Sampled checks are reduced even where their last n reaches --to.
    const std::set<std::string> sampled = {"inertia_lapack", "green_closed_form", "energy_closed_form",
                                           "mertens_divisor_sum", "squarefree_formula", "liouville_formula"};
    EXPECT_EQ(c.reduced_range, std::get<1>(range) < to || sampled.count(name) == 1) << name;
  }
  EXPECT_EQ(expected.size(), 20u);
  // Betti vectors b_0..b_3 at n <= 400 (K_400 has faces of dimension 3 from 210 on).
  EXPECT_EQ(find(r, "betti_persistence").compared, 300u * 4);
  // Every entry of g_n: sum of V(n)^2 over the n visited.
  EXPECT_GT(find(r, "green_closed_form").compared, 120u * 120u);
}

TEST(IdentitySuite, OneCorruptedValueFailsExactlyItsCheckAtThatN) {
  // For each check: corrupt the first and the last n it visits, run only its identity, and
  // expect that check (alone) to fail once, first at that n.
  const Natural to = 330;
  const auto clean = run(to);
  ASSERT_TRUE(clean.passed());
  int mutations = 0;
  std::set<int> identities_hit;
  for (const auto& name : all_check_names()) {
    const auto& c = find(clean, name);
    for (const Natural n : {c.from, c.to}) {
      const auto r = run(to, {c.identity}, IdentityCorruption{name, n});
      EXPECT_FALSE(r.passed()) << name << " at " << n;
      for (const auto& other : r.checks) {
        if (other.name != name) {
          EXPECT_EQ(other.failed, 0u) << other.name << " failed with " << name << " corrupted";
          continue;
        }
        EXPECT_EQ(other.failed, 1u) << name << " at " << n;
        ASSERT_TRUE(other.first_failure.has_value()) << name;
        EXPECT_EQ(other.first_failure->n, n) << name;
        EXPECT_NE(other.first_failure->expected, other.first_failure->got) << name;
      }
      ++mutations;
      identities_hit.insert(c.identity);
    }
  }
  EXPECT_EQ(mutations, 40);
  EXPECT_EQ(identities_hit.size(), 8u);
}

TEST(IdentitySuite, FirstFailureShowsBothValues) {
  // euler_characteristic at n = 37: 1 - M(37) = 3 (M(37) = -2, OEIS A002321), corrupted to 4.
  const auto euler = run(100, {1}, IdentityCorruption{"euler_characteristic", 37});
  const auto& e = find(euler, "euler_characteristic");
  ASSERT_TRUE(e.first_failure);
  EXPECT_EQ(e.first_failure->expected, "3");
  EXPECT_EQ(e.first_failure->got, "4");
  // A sign is negated: D(6) = prod -mu(k), k = 2, 3, 5, 6: (1)(1)(1)(-1) = -1 (design.md identity 3).
  const auto det = run(100, {3}, IdentityCorruption{"fredholm_flint", 6});
  const auto& d = find(det, "fredholm_flint");
  ASSERT_TRUE(d.first_failure);
  EXPECT_EQ(d.first_failure->expected, "-1");
  EXPECT_EQ(d.first_failure->got, "1");
  // A vector gets its first component raised: b(105) = [b0, b1, b2] with b2 = 1 at 105 (design.md landmark).
  const auto betti = run(120, {2}, IdentityCorruption{"betti_persistence", 105});
  const auto& b = find(betti, "betti_persistence");
  ASSERT_TRUE(b.first_failure);
  EXPECT_EQ(b.first_failure->expected.back(), ']');
  EXPECT_NE(b.first_failure->expected.find(", 1]"), std::string::npos) << b.first_failure->expected;
  // A matrix entry names its position.
  const auto green = run(100, {6}, IdentityCorruption{"green_closed_form", 10});
  const auto& g = find(green, "green_closed_form");
  ASSERT_TRUE(g.first_failure);
  EXPECT_EQ(g.first_failure->expected.rfind("g(2, 2) = ", 0), 0u) << g.first_failure->expected;
}

TEST(IdentitySuite, CorruptionOutsideTheRangeChangesNothing) {
  const auto r = run(200, {7}, IdentityCorruption{"mertens_divisor_sum", 5000});
  EXPECT_TRUE(r.passed());
}

TEST(IdentitySuite, SelectionAndEdges) {
  const auto r = run(50, {8, 2});
  EXPECT_EQ(r.identities, (std::vector<int>{2, 8}));
  for (const auto& c : r.checks) EXPECT_TRUE(c.identity == 2 || c.identity == 8) << c.name;
  EXPECT_EQ(r.checks.size(), 6u);
  // n = 1: the empty complex; checks that start at 2 visit nothing and are not failures.
  const auto one = run(1);
  EXPECT_TRUE(one.passed());
  EXPECT_EQ(find(one, "betti0_odd_primes").points, 0u);
  EXPECT_EQ(find(one, "euler_characteristic").points, 1u);
  EXPECT_EQ(find(one, "green_closed_form").points, 0u);
}

TEST(IdentitySuite, BadOptionsAreRefused) {
  IdentitySuiteOptions o;
  o.bounds = small_bounds();
  o.to = 0;
  EXPECT_THROW(run_identity_suite(o), InvalidArgument);
  o.to = max_identity_suite_n + 1;
  EXPECT_THROW(run_identity_suite(o), InvalidArgument);
  o.to = 10;
  o.threads = 0;
  EXPECT_THROW(run_identity_suite(o), InvalidArgument);
  o.threads = 1;
  o.identities = {9};
  EXPECT_THROW(run_identity_suite(o), InvalidArgument);
  o.identities = {};
  o.corruption = IdentityCorruption{"no_such_check", 3};
  EXPECT_THROW(run_identity_suite(o), InvalidArgument);
  o.identities = {1};
  o.corruption = IdentityCorruption{"green_closed_form", 3};  // identity 6, not selected
  EXPECT_THROW(run_identity_suite(o), InvalidArgument);
}

TEST(IdentitySuite, IdentityListParsing) {
  EXPECT_EQ(parse_identity_list("1"), (std::vector<int>{1}));
  EXPECT_EQ(parse_identity_list("energy,3,3,euler"), (std::vector<int>{1, 3, 4}));
  EXPECT_EQ(parse_identity_list("counts,arithmetic,green,spectrum,unimodularity,betti"), (std::vector<int>{2, 3, 5, 6, 7, 8}));
  for (const char* bad : {"", "0", "9", "1,", ",1", "Euler", "1 ,2", "euler;2"})
    EXPECT_THROW(parse_identity_list(bad), InvalidArgument) << bad;
  EXPECT_THROW(identity_short_name(0), InvalidArgument);
  EXPECT_EQ(identity_title(7), "Arithmetic");
  EXPECT_EQ(all_check_names().size(), 20u);
}

TEST(IdentitySuite, LargerRangeReportsSampledArithmetic) {
  // Above arithmetic_every_n_to the literal formulas run on an evenly spaced sample ending at --to.
  const auto r = run(5000, {7});
  ASSERT_TRUE(r.passed());
  const auto& c = find(r, "squarefree_formula");
  EXPECT_EQ(c.points, 250u + 20u);
  EXPECT_EQ(c.to, 5000u);
  EXPECT_TRUE(c.reduced_range);
  EXPECT_NE(c.coverage.find("20 evenly spaced n in (250, 5000]"), std::string::npos) << c.coverage;
  EXPECT_EQ(find(r, "liouville_half_interval").points, 5000u);
}

}  // namespace
}  // namespace sqfc::track
