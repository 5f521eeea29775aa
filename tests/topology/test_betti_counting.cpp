// SPDX-License-Identifier: MIT
// Tests of topology/betti_counting: the incremental interval counts give the Betti numbers of
// K_n. The oracle is the direct Z/2 homology of K_n (tests/oracles/brute_force.hpp), an
// independent computation from the boundary matrices.
#include "sqfc/topology/betti_counting.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <vector>

#include "oracles/brute_force.hpp"
#include "topology/betti_test_support.hpp"

namespace {

using sqfc::topology::OddIntervalCounts;
using sqfc::topology::advance_interval_counts;
using sqfc::topology::betti_from_interval_counts;
namespace oracles = sqfc::oracles;

// Interval counts at n by trial division, advanced from n = 1.
OddIntervalCounts counts_at(std::uint64_t n) {
  OddIntervalCounts counts{};
  for (std::uint64_t k = 1; k <= n; ++k) {
    const auto a = oracles::arithmetic_naive(k);
    advance_interval_counts(counts, k, a.omega, a.mu != 0);
  }
  return counts;
}

TEST(BettiCounting, MatchesDirectHomologyForEveryNUpTo1000) {
  // Wider range (to 3000) in test_betti_counting_slow.cpp.
  EXPECT_EQ(sqfc::testing::compare_counting_with_homology(1000), 1000U);
}

TEST(BettiCounting, IntervalCountsMatchTheirDefinitionForEveryN) {
  // counts[w] = #{odd squarefree m in (n/2, n] with omega(m) = w} (design.md identity 2),
  // counted directly for every n <= 3000.
  const std::uint64_t limit = 3000;
  const auto prefix = oracles::prefix_naive(limit);
  OddIntervalCounts counts{};
  std::uint64_t checked = 0;
  for (std::uint64_t n = 1; n <= limit; ++n) {
    advance_interval_counts(counts, n, prefix.omega[n], prefix.mu[n] != 0);
    OddIntervalCounts direct{};
    for (std::uint64_t m = n / 2 + 1; m <= n; ++m)
      if ((m & 1) && prefix.mu[m] != 0) ++direct[static_cast<std::size_t>(prefix.omega[m])];
    ASSERT_EQ(counts, direct) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

TEST(BettiCounting, EmptyComplexAndFirstVertices) {
  // K_1 is empty: no homology at all. K_2 is a point, K_3 two points, K_6 the edge 2-3 plus
  // the point 5 (direct homology confirms each).
  int checked = 0;
  for (const std::uint64_t n : {1, 2, 3, 5, 6}) {
    const auto counts = counts_at(n);
    EXPECT_EQ(sqfc::testing::betti_from_counts(counts), sqfc::testing::betti_direct(n)) << n;
    ++checked;
  }
  EXPECT_EQ(betti_from_interval_counts(counts_at(1), 0), 0);
  EXPECT_EQ(betti_from_interval_counts(counts_at(2), 0), 1);
  EXPECT_EQ(betti_from_interval_counts(counts_at(3), 0), 2);
  EXPECT_EQ(betti_from_interval_counts(counts_at(6), 0), 2);
  EXPECT_EQ(betti_from_interval_counts(counts_at(6), 1), 0);
  EXPECT_EQ(checked, 5);
}

TEST(BettiCounting, TwoSphereAppearsAt105AndIsFilledAt210) {
  // Common knowledge of the field: b_2 first becomes nonzero at n = 105 = 3*5*7 (a 2-sphere),
  // and that class dies at 210 = 2*105.
  int checked = 0;
  for (std::uint64_t n = 1; n < 105; ++n) {
    ASSERT_EQ(betti_from_interval_counts(counts_at(n), 2), 0) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, 104);
  EXPECT_EQ(betti_from_interval_counts(counts_at(104), 2), 0);
  EXPECT_EQ(betti_from_interval_counts(counts_at(105), 2), 1);
  EXPECT_EQ(sqfc::testing::betti_direct(104)[2], 0);
  EXPECT_EQ(sqfc::testing::betti_direct(105)[2], 1);
  // The sphere born at 105 dies at 210: b_2 drops by exactly one, by counting and by direct
  // homology. In between, 165 = 3*5*11 and 195 = 3*5*13 are born (odd, omega 3), so b_2(209) = 3.
  const auto counted_209 = betti_from_interval_counts(counts_at(209), 2);
  const auto counted_210 = betti_from_interval_counts(counts_at(210), 2);
  const auto direct_209 = sqfc::testing::betti_direct(209)[2];
  const auto direct_210 = sqfc::testing::betti_direct(210)[2];
  EXPECT_EQ(counted_209, direct_209);
  EXPECT_EQ(counted_210, direct_210);
  EXPECT_EQ(direct_209 - direct_210, 1);
  EXPECT_EQ(direct_209, 3);
}

TEST(BettiCounting, EachHomologyDimensionFirstAppearsAtAnOddPrimorial) {
  // b_d (d >= 1) first becomes nonzero at the product of the first d + 1 odd primes
  // (design.md identity 2 with OEIS A070826): 15 for b_1, 105 for b_2, 1155 for b_3.
  const std::uint64_t limit = 1155;
  const auto prefix = oracles::prefix_naive(limit);
  OddIntervalCounts counts{};
  std::vector<std::uint64_t> first(4, 0);
  std::uint64_t scanned = 0;
  for (std::uint64_t n = 1; n <= limit; ++n, ++scanned) {
    advance_interval_counts(counts, n, prefix.omega[n], prefix.mu[n] != 0);
    for (int d = 1; d <= 3; ++d)
      if (first[static_cast<std::size_t>(d)] == 0 && betti_from_interval_counts(counts, d) > 0)
        first[static_cast<std::size_t>(d)] = n;
  }
  EXPECT_EQ(first[1], 15U);    // OEIS A070826: 3*5
  EXPECT_EQ(first[2], 105U);   // OEIS A070826: 3*5*7
  EXPECT_EQ(first[3], 1155U);  // OEIS A070826: 3*5*7*11
  // Direct homology agrees on either side of the first two.
  EXPECT_EQ(sqfc::testing::betti_direct(14)[1], 0);
  EXPECT_EQ(sqfc::testing::betti_direct(15)[1], 1);
  EXPECT_EQ(scanned, limit);
}

TEST(BettiCounting, IncrementalStepChangesOneCount) {
  // One squarefree n moves exactly one count by one; a non-squarefree n changes nothing.
  const std::uint64_t limit = 5000;
  const auto prefix = oracles::prefix_naive(limit);
  OddIntervalCounts counts{};
  std::uint64_t checked = 0;
  for (std::uint64_t n = 1; n <= limit; ++n) {
    const auto before = counts;
    advance_interval_counts(counts, n, prefix.omega[n], prefix.mu[n] != 0);
    std::int64_t moved = 0;
    for (std::size_t w = 0; w < counts.size(); ++w) moved += counts[w] > before[w] ? counts[w] - before[w] : before[w] - counts[w];
    ASSERT_EQ(moved, prefix.mu[n] != 0 ? 1 : 0) << "n = " << n;
    for (const auto c : counts) ASSERT_GE(c, 0) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

}  // namespace
