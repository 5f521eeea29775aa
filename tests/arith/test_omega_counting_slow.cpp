// SPDX-License-Identifier: MIT
// The large arguments of count_by_omega: random x <= 10^8 against the segmented sieve, windows at
// 2^32, 2^40, squares of primes near 2^16 and 10^5, a prime past 10^10 and 10^13, published
// pi(10^k) and Q(10^k) for k = 10..14 (10^14 is the top of the verified range).
#include "sqfc/arith/omega_counting.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <vector>

#include "arith/omega_counting_test_support.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::count_by_omega;
using sqfc::testing::OmegaHistogram;
using sqfc::testing::same_counts;

TEST(OmegaCountingSlow, RandomXUpTo10To8AgainstTheSieve) {
  // One sieve pass over [1, 10^8] collects the histogram at 60 random x (plus 10^8 itself).
  constexpr Natural top = 100'000'000;
  auto rng = sqfc::testing::test_rng(3002);
  std::uniform_int_distribution<Natural> pick(1, top);
  std::vector<Natural> xs;
  for (std::uint64_t i = 0; i < 60 * sqfc::testing::test_multiplier(); ++i) xs.push_back(pick(rng));
  xs.push_back(top);
  std::sort(xs.begin(), xs.end());
  xs.erase(std::unique(xs.begin(), xs.end()), xs.end());
  std::vector<OmegaHistogram> expected;
  OmegaHistogram running;
  std::size_t next = 0;
  sqfc::arith::sieve_range(1, top + 1, [&](const sqfc::arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i) {
      const Natural n = b.lo() + i;
      if (b.is_squarefree(i)) running.add(n, b.omega(i));
      while (next < xs.size() && xs[next] == n) expected.push_back(running), ++next;
    }
  });
  ASSERT_EQ(expected.size(), xs.size());
  for (std::size_t i = 0; i < xs.size(); ++i)
    EXPECT_TRUE(same_counts(count_by_omega(xs[i], 1 + static_cast<unsigned>(i % 2)), expected[i]))
        << "x = " << xs[i] << " " << sqfc::testing::seed_note();
  EXPECT_GE(xs.size(), 55U);
}

TEST(OmegaCountingSlow, LargeWindowsAgainstTheSieve) {
  // count_by_omega(b) = count_by_omega(a) + the sieve's histogram of (a, b].
  int checked = 0;
  for (const int k : {32, 40}) {
    const Natural t = Natural{1} << k;
    checked += sqfc::testing::check_window(t - 1000, {t - 1, t, t + 1}, 2);
  }
  // 65521^2 and 99991^2: squares of the largest primes below 2^16 and 10^5 (from memory).
  for (const Natural q : {Natural{65521}, Natural{99991}})
    checked += sqfc::testing::check_window(q * q - 300, {q * q - 1, q * q, q * q + 1}, 2);
  // 4294967291, the largest prime below 2^32, and 10^10 + 19, the first prime past 10^10 (both
  // from memory; the window sieve confirms omega = 1).
  checked += sqfc::testing::check_window(4294967291ULL - 1, {4294967291ULL, 4294967292ULL}, 2);
  checked += sqfc::testing::check_window(10'000'000'018ULL, {10'000'000'019ULL, 10'000'000'020ULL}, 2);
  EXPECT_EQ(sqfc::testing::sieved_histogram(4294967291ULL, 4294967292ULL).all[1], 1U);
  EXPECT_EQ(sqfc::testing::sieved_histogram(10'000'000'019ULL, 10'000'000'020ULL).all[1], 1U);
  // Up to 10^13.
  checked += sqfc::testing::check_window(10'000'000'000'000ULL - 200, {10'000'000'000'000ULL}, 2);
  EXPECT_EQ(checked, 6 + 6 + 2 + 2 + 1);
}

TEST(OmegaCountingSlow, PrimorialOf31AndThreadCounts) {
  // 2*3*5*...*29*31 = 200560490130 (OEIS A002110, from memory): the first x with omega 11.
  const auto below = count_by_omega(200560490129ULL, 2);
  const auto at = count_by_omega(200560490130ULL, 2);
  EXPECT_EQ(below.squarefree_by_omega.size(), 11U);
  EXPECT_EQ(at.squarefree_by_omega.size(), 12U);
  EXPECT_EQ(at.squarefree_by_omega.back(), 1U);
  const auto one = count_by_omega(200560490130ULL, 1);
  const auto three = count_by_omega(200560490130ULL, 3);
  EXPECT_EQ(one.squarefree_by_omega, at.squarefree_by_omega);
  EXPECT_EQ(one.odd_squarefree_by_omega, at.odd_squarefree_by_omega);
  EXPECT_EQ(three.squarefree_by_omega, at.squarefree_by_omega);
  EXPECT_EQ(three.odd_squarefree_by_omega, at.odd_squarefree_by_omega);
}

TEST(OmegaCountingSlow, PublishedValuesUpToTheTopOfTheRange) {
  // sum over m = Q(10^k) (OEIS A071172, from memory) and entry m = 1 = pi(10^k)
  // (tests/data/prime_counts_powers_of_ten.csv: OEIS A006880) for k = 10..14; 10^14 is
  // max_omega_counting_x, the top of the verified range.
  const std::vector<Natural> q = {6'079'270'942ULL, 60'792'710'280ULL, 607'927'102'274ULL, 6'079'271'018'294ULL,
                                  60'792'710'185'947ULL};
  const auto pi = sqfc::oracles::read_published_csv(sqfc::testing::omega_data_path("prime_counts_powers_of_ten.csv"));
  ASSERT_EQ(sqfc::arith::max_omega_counting_x, 100'000'000'000'000ULL);
  int checked = 0;
  Natural x = 10'000'000'000ULL;
  for (std::size_t k = 10; k <= 14; ++k, x *= 10) {
    const auto c = count_by_omega(x, 2);
    EXPECT_EQ(sqfc::testing::total_squarefree(c), q[k - 10]) << "10^" << k;
    ASSERT_EQ(pi.integer(k, "k"), static_cast<std::int64_t>(k));
    EXPECT_EQ(c.squarefree_by_omega[1], static_cast<Natural>(pi.integer(k, "value"))) << "10^" << k;
    ++checked;
  }
  EXPECT_EQ(checked, 5);
  EXPECT_THROW(count_by_omega(sqfc::arith::max_omega_counting_x + 1, 2), sqfc::InvalidArgument);
}

}  // namespace
