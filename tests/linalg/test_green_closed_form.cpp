// SPDX-License-Identifier: MIT
// Tests of linalg/green_closed_form: the closed form g_n(x, y) = -mu(x) mu(y) mu(l) M_l(n / l)
// (design.md identity 6, from the published Green star formula) against the bordered inverse
// entry by entry for every n <= 600 (every n <= 2000 in test_green_closed_form_slow.cpp), its
// statistics against the bordered statistics, energy = 1 - M(n) (energy theorem, published
// 2017/2019) up to n = 10^6, and M_l(y) against a direct sum.
#include "sqfc/linalg/green_closed_form.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <numeric>
#include <random>
#include <string>
#include <vector>

#include "linalg/closed_form_comparison.hpp"
#include "linalg/linalg_test_support.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/squarefree_enumeration.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/linalg/bordered_green.hpp"

namespace {

using sqfc::Natural;
using sqfc::linalg::BorderedGreen;
using sqfc::linalg::GreenClosedForm;
namespace testing_support = sqfc::testing;

TEST(GreenClosedForm, EqualsTheBorderedInverseEntryByEntryForEveryNUpTo600) {
  const auto result = testing_support::compare_closed_form_with_bordered(600);
  EXPECT_FALSE(result.first_mismatch.has_value()) << *result.first_mismatch;
  // Q(600) = 366 squarefree k <= 600 (PARI/GP 2.15), so 365 graphs; entries = sum of V^2 for V = 1..365.
  EXPECT_EQ(result.graphs, 365U);
  EXPECT_EQ(result.entries, 365ULL * 366 * 731 / 6);
}

TEST(GreenClosedForm, StatisticsMatchTheBorderedStatisticsAtSamplePoints) {
  const Natural limit = 600;
  const auto vertices = sqfc::complex::squarefree_vertices(limit);
  const GreenClosedForm closed(limit);
  BorderedGreen g(vertices.size(), 1 << 24);
  std::size_t next = 0, checked = 0;
  for (const Natural n : {1, 2, 3, 6, 10, 30, 100, 105, 210, 330, 599, 600}) {
    while (next < vertices.size() && vertices[next] <= n) {
      g.add_vertex(sqfc::complex::shared_factor_neighbours_below(vertices, next));
      ++next;
    }
    const auto formula = closed.statistics_at(n);
    EXPECT_EQ(formula, g.statistics(n)) << "n = " << n;
    EXPECT_EQ(formula.vertices, g.size()) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, 12U);
}

TEST(GreenClosedForm, EnergyIsOneMinusMertensUpTo10To6) {
  const Natural limit = 1'000'000;
  const GreenClosedForm closed(limit);
  std::uint64_t checked = 0;
  // Published values: M(10^k), OEIS A084237, from tests/data/mertens_powers_of_ten.csv.
  const auto table = sqfc::oracles::read_published_csv(std::string(SQFC_TEST_DATA_DIR) + "/mertens_powers_of_ten.csv");
  for (std::size_t row = 0; row < table.rows.size(); ++row) {
    const auto k = table.integer(row, "k");
    if (k > 6) continue;
    Natural n = 1;
    for (std::int64_t i = 0; i < k; ++i) n *= 10;
    EXPECT_EQ(closed.statistics_at(n).energy, 1 - table.integer(row, "value")) << "n = " << n << " ("
                                                                               << table.text(row, "source") << ")";
    ++checked;
  }
  EXPECT_EQ(checked, 7U);
  // Random n up to 10^6 against M(n) from the oracle's depth-first Moebius table.
  const auto mu = sqfc::oracles::mobius_table_dfs(limit);
  std::vector<std::int64_t> mertens(limit + 1, 0);
  for (Natural k = 1; k <= limit; ++k) mertens[k] = mertens[k - 1] + mu[k];
  auto rng = testing_support::test_rng(6);
  std::uniform_int_distribution<Natural> pick(1, limit);
  const std::uint64_t samples = 12 * testing_support::test_multiplier();
  for (std::uint64_t i = 0; i < samples; ++i) {
    const Natural n = pick(rng);
    EXPECT_EQ(closed.statistics_at(n).energy, 1 - mertens[n]) << "n = " << n << ", " << testing_support::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, 7U + samples);
}

TEST(GreenClosedForm, CoprimeMertensMatchesADirectSum) {
  // M_l(y) = sum of mu(t) over t <= y with gcd(t, l) = 1, summed directly for every squarefree
  // l <= 400 (l = 1 included: M_1 = M) and every y <= 400; plus the recursion of design.md
  // identity 6, M_{p l'}(y) = M_{l'}(y) + M_{p l'}(floor(y / p)), with p the largest prime of l.
  const Natural limit = 400;
  const GreenClosedForm closed(limit);
  const auto mu = sqfc::oracles::mobius_table_dfs(limit);
  std::uint64_t checked = 0, recursions = 0;
  for (Natural l = 1; l <= limit; ++l) {
    if (mu[l] == 0) continue;
    std::int64_t direct = 0;
    const auto primes = closed.prime_factors(l);
    for (Natural y = 0; y <= limit; ++y) {
      if (y >= 1 && std::gcd(y, l) == 1) direct += mu[y];
      ASSERT_EQ(closed.mertens_coprime(l, y), direct) << "l = " << l << ", y = " << y;
      ++checked;
      if (l > 1) {
        const Natural p = primes.back(), rest = l / p;
        ASSERT_EQ(closed.mertens_coprime(l, y), closed.mertens_coprime(rest, y) + closed.mertens_coprime(l, y / p))
            << "l = " << l << ", y = " << y;
        ++recursions;
      }
    }
  }
  // The 243 squarefree l in [1, 400] (Q(400) = 243, PARI/GP 2.15), 401 values of y each.
  EXPECT_EQ(checked, 243U * 401U);
  EXPECT_EQ(recursions, 242U * 401U);
}

TEST(GreenClosedForm, PrimeFactorsAndMobiusFromTheTables) {
  const GreenClosedForm closed(1000);
  const auto mu = sqfc::oracles::mobius_table_dfs(1000);
  std::uint64_t checked = 0;
  for (Natural k = 1; k <= 1000; ++k) {
    ASSERT_EQ(closed.mu(k), mu[k]) << k;
    Natural product = 1, rest = k;
    for (const auto p : closed.prime_factors(k)) {
      ASSERT_EQ(rest % p, 0U) << k;
      while (rest % p == 0) rest /= p;
      product *= p;
    }
    ASSERT_EQ(rest, 1U) << k;  // every prime factor found
    if (mu[k] != 0) {
      ASSERT_EQ(product, k) << k;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 1000U);
  EXPECT_EQ(closed.prime_factors(210), (std::vector<std::uint32_t>{2, 3, 5, 7}));
  EXPECT_EQ(closed.mertens(1000), 2);  // OEIS A084237: M(10^3) = 2
}

TEST(GreenClosedForm, Preconditions) {
  EXPECT_THROW(GreenClosedForm(0), sqfc::InvalidArgument);
  EXPECT_THROW(GreenClosedForm(200'000'001), sqfc::InvalidArgument);
  const GreenClosedForm closed(30);
  EXPECT_EQ(closed.n(), 30U);
  EXPECT_THROW(static_cast<void>(closed.entry_at(31, 2, 3)), sqfc::InvalidArgument);  // beyond the tables
  EXPECT_THROW(static_cast<void>(closed.entry_at(30, 4, 3)), sqfc::InvalidArgument);  // 4 is not squarefree
  EXPECT_THROW(static_cast<void>(closed.entry_at(30, 1, 3)), sqfc::InvalidArgument);  // 1 is not a vertex
  EXPECT_THROW(static_cast<void>(closed.entry_at(10, 11, 3)), sqfc::InvalidArgument); // 11 > m
  EXPECT_THROW(static_cast<void>(closed.statistics_at(0)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(closed.statistics_at(31)), sqfc::InvalidArgument);
  // lcm beyond n gives 0; the hand-computed inverse of H_30 (test_bordered_green.cpp) has
  // g(2,2) = -3 and g(30,30) = 1.
  EXPECT_EQ(closed.entry(3, 11), 0);
  EXPECT_EQ(closed.entry(2, 2), -3);
  EXPECT_EQ(closed.entry(30, 30), 1);
  const auto empty = closed.statistics_at(1);
  EXPECT_EQ(empty.vertices, 0U);
  EXPECT_TRUE(empty.histogram.empty());
  EXPECT_EQ(empty.energy, 0);
}

}  // namespace
