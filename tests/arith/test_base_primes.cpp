// SPDX-License-Identifier: MIT
// Tests of primes_up_to: published prime counts, exhaustive small limits, PARI windows and
// the 2^32 guard.
#include "sqfc/arith/base_primes.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <vector>

#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::arith::primes_up_to;

bool is_prime_by_trial_division(std::uint64_t n) {
  if (n < 2) return false;
  for (std::uint64_t d = 2; d * d <= n; ++d)
    if (n % d == 0) return false;
  return true;
}

TEST(BasePrimes, PrimeCountsAtPowersOfTen) {
  // pi(10^k) for k = 0..8: OEIS A006880.
  const std::vector<std::size_t> pi_of_ten_to = {0, 4, 25, 168, 1229, 9592, 78498, 664579, 5761455};
  std::uint64_t limit = 1;
  int checked = 0;
  for (std::size_t k = 0; k < pi_of_ten_to.size(); ++k, limit *= 10) {
    const auto primes = primes_up_to(limit);
    ASSERT_EQ(primes.size(), pi_of_ten_to[k]) << "10^" << k;
    if (k == 8) {
      // The list is strictly increasing and ends at the largest prime below 10^8,
      // 99999989 (from memory; PARI confirms it is prime and that nothing between is).
      EXPECT_EQ(std::adjacent_find(primes.begin(), primes.end(), [](auto a, auto b) { return a >= b; }), primes.end());
      EXPECT_EQ(primes.front(), 2U);
      EXPECT_EQ(primes.back(), 99999989U);
      EXPECT_TRUE(sqfc::oracles::pari_is_prime(99999989));
      for (std::uint64_t n = 99999990; n <= 100000000; ++n) EXPECT_FALSE(sqfc::oracles::pari_is_prime(n)) << n;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 9);
}

TEST(BasePrimes, EdgesOfTheDomain) {
  EXPECT_TRUE(primes_up_to(0).empty());
  EXPECT_TRUE(primes_up_to(1).empty());
  EXPECT_EQ(primes_up_to(2), (std::vector<std::uint32_t>{2}));
  EXPECT_EQ(primes_up_to(3), (std::vector<std::uint32_t>{2, 3}));
  EXPECT_EQ(primes_up_to(4), (std::vector<std::uint32_t>{2, 3}));
  EXPECT_EQ(primes_up_to(5), (std::vector<std::uint32_t>{2, 3, 5}));
  EXPECT_EQ(primes_up_to(9), (std::vector<std::uint32_t>{2, 3, 5, 7}));
  // The primes below 100 (from memory).
  const std::vector<std::uint32_t> below_100 = {2,  3,  5,  7,  11, 13, 17, 19, 23, 29, 31, 37, 41,
                                                43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97};
  EXPECT_EQ(primes_up_to(100), below_100);
  EXPECT_EQ(primes_up_to(97), below_100);
  EXPECT_EQ(below_100.size(), 25U);
}

TEST(BasePrimes, EveryLimitUpTo3000AgainstTrialDivision) {
  std::vector<std::uint32_t> expected;
  std::uint64_t checked = 0;
  for (std::uint64_t limit = 0; limit <= 3000; ++limit) {
    if (is_prime_by_trial_division(limit)) expected.push_back(static_cast<std::uint32_t>(limit));
    ASSERT_EQ(primes_up_to(limit), expected) << "limit " << limit;
    ++checked;
  }
  EXPECT_EQ(checked, 3001U);
  EXPECT_EQ(expected.size(), 430U);  // pi(3000) = 430 (OEIS A000720)
}

TEST(BasePrimes, RandomLimitsAgainstPari) {
  // For random limits up to 10^7: the count equals PARI's primepi, and in a window of 1000
  // numbers below the limit, membership equals PARI's isprime for every number.
  auto rng = sqfc::testing::test_rng(301);
  std::uniform_int_distribution<std::uint64_t> limits(2, 10'000'000);
  const int rounds = static_cast<int>(6 * sqfc::testing::test_multiplier());
  std::uint64_t numbers_checked = 0;
  std::uint64_t window_total = 0;
  for (int r = 0; r < rounds; ++r) {
    const std::uint64_t limit = limits(rng);
    window_total += std::min<std::uint64_t>(limit + 1, 1000);
    const auto primes = primes_up_to(limit);
    ASSERT_EQ(primes.size(), sqfc::oracles::pari_prime_count(limit)) << limit << " " << sqfc::testing::seed_note();
    const std::uint64_t window_lo = limit > 1000 ? limit - 999 : 0;
    for (std::uint64_t n = window_lo; n <= limit; ++n) {
      const bool listed = std::binary_search(primes.begin(), primes.end(), static_cast<std::uint32_t>(n));
      ASSERT_EQ(listed, sqfc::oracles::pari_is_prime(n)) << n << " (limit " << limit << ") " << sqfc::testing::seed_note();
      ++numbers_checked;
    }
  }
  EXPECT_EQ(numbers_checked, window_total);
  EXPECT_GE(numbers_checked, static_cast<std::uint64_t>(rounds) * 3);
}

TEST(BasePrimes, GuardAtTwoToThe32) {
  EXPECT_THROW(primes_up_to(std::uint64_t{1} << 32), sqfc::InvalidArgument);
  EXPECT_THROW(primes_up_to((std::uint64_t{1} << 32) + 1), sqfc::InvalidArgument);
  EXPECT_THROW(primes_up_to(~std::uint64_t{0}), sqfc::InvalidArgument);
  // The accepted side, 2^32 - 1, takes about 30 s and 1.3 GB: test_base_primes_slow.cpp.
}

}  // namespace
