// SPDX-License-Identifier: MIT
// Tests of factor_u64 and arithmetic_values (FLINT) against trial division and PARI, from
// n = 1 to the largest 64-bit primes and semiprimes.
#include "sqfc/arith/factor.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <random>
#include <utility>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/types.hpp"

namespace {

using Factorisation = std::vector<std::pair<std::uint64_t, int>>;
using sqfc::arith::arithmetic_values;
using sqfc::arith::factor_u64;

// Trial-division factorisation, increasing primes.
Factorisation factor_by_trial_division(std::uint64_t n) {
  Factorisation f;
  for (std::uint64_t p = 2; p * p <= n; ++p) {
    int e = 0;
    while (n % p == 0) n /= p, ++e;
    if (e > 0) f.emplace_back(p, e);
  }
  if (n > 1) f.emplace_back(n, 1);
  return f;
}

// Checks a factorisation of n from first principles: increasing primes (PARI's proven
// isprime), positive exponents, and the product is n (in 128 bits).
::testing::AssertionResult is_factorisation_of(const Factorisation& f, std::uint64_t n) {
  sqfc::WideUnsigned product = 1;
  std::uint64_t previous = 1;
  for (const auto& [p, e] : f) {
    if (p <= previous) return ::testing::AssertionFailure() << "primes not increasing at " << p;
    if (e < 1) return ::testing::AssertionFailure() << "exponent " << e << " of " << p;
    if (!sqfc::oracles::pari_is_prime(p)) return ::testing::AssertionFailure() << p << " is not prime";
    for (int i = 0; i < e; ++i) product *= p;
    if (product > n) return ::testing::AssertionFailure() << "product passes " << n;
    previous = p;
  }
  if (product != n) return ::testing::AssertionFailure() << "product differs from " << n;
  return ::testing::AssertionSuccess();
}

TEST(Factor, EveryNUpTo30000AgainstTrialDivision) {
  std::uint64_t checked = 0;
  for (std::uint64_t n = 1; n <= 30000; ++n) {
    ASSERT_EQ(factor_u64(n), factor_by_trial_division(n)) << n;
    const auto v = arithmetic_values(n);
    const auto t = sqfc::oracles::arithmetic_naive(n);
    ASSERT_EQ(v.mu, t.mu) << n;
    ASSERT_EQ(v.omega, t.omega) << n;
    ASSERT_EQ(v.big_omega, t.big_omega) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 30000U);
}

TEST(Factor, OneAndZero) {
  EXPECT_TRUE(factor_u64(1).empty());
  const auto one = arithmetic_values(1);
  EXPECT_EQ(one.mu, 1);
  EXPECT_EQ(one.omega, 0);
  EXPECT_EQ(one.big_omega, 0);
  EXPECT_THROW(factor_u64(0), sqfc::InvalidArgument);
  EXPECT_THROW(arithmetic_values(0), sqfc::InvalidArgument);
}

TEST(Factor, LargestSixtyFourBitPrimesAndSpecialValues) {
  const std::uint64_t u64_max = ~std::uint64_t{0};
  // 2^64 - 59 is the largest 64-bit prime (from memory); PARI proves it prime and the 58
  // numbers above it composite.
  const std::uint64_t largest_prime = u64_max - 58;
  ASSERT_TRUE(sqfc::oracles::pari_is_prime(largest_prime));
  int composites = 0;
  for (std::uint64_t n = largest_prime + 1; n != 0; ++n, ++composites) ASSERT_FALSE(sqfc::oracles::pari_is_prime(n)) << n;
  EXPECT_EQ(composites, 58);
  EXPECT_EQ(factor_u64(largest_prime), (Factorisation{{largest_prime, 1}}));
  EXPECT_EQ(arithmetic_values(largest_prime).mu, -1);

  // 2^64 - 1 = 3 * 5 * 17 * 257 * 641 * 65537 * 6700417 (from memory; checked with PARI).
  const Factorisation fermat = {{3, 1}, {5, 1}, {17, 1}, {257, 1}, {641, 1}, {65537, 1}, {6700417, 1}};
  EXPECT_EQ(sqfc::oracles::pari_factor(u64_max), fermat);
  EXPECT_EQ(factor_u64(u64_max), fermat);
  EXPECT_EQ(arithmetic_values(u64_max).mu, -1);
  EXPECT_EQ(arithmetic_values(u64_max).omega, 7);

  // Prime powers at the top of the range.
  EXPECT_EQ(factor_u64(std::uint64_t{1} << 63), (Factorisation{{2, 63}}));
  EXPECT_EQ(arithmetic_values(std::uint64_t{1} << 63).big_omega, 63);
  std::uint64_t three_40 = 1;
  for (int i = 0; i < 40; ++i) three_40 *= 3;  // 3^40 < 2^64
  EXPECT_EQ(factor_u64(three_40), (Factorisation{{3, 40}}));
  // The square of the largest prime below 2^32 (4294967291, from memory; checked with PARI).
  const std::uint64_t p32 = 4294967291ULL;
  ASSERT_TRUE(sqfc::oracles::pari_is_prime(p32));
  EXPECT_EQ(factor_u64(p32 * p32), (Factorisation{{p32, 2}}));
  const auto square = arithmetic_values(p32 * p32);
  EXPECT_EQ(square.mu, 0);
  EXPECT_EQ(square.omega, 1);
  EXPECT_EQ(square.big_omega, 2);

  // The product of the first 15 primes (2 .. 47) is the largest primorial below 2^64.
  Factorisation primorial_factors;
  std::uint64_t primorial = 1;
  for (std::uint64_t p : {2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47}) {
    primorial *= p;
    primorial_factors.emplace_back(p, 1);
  }
  EXPECT_EQ(primorial, 614889782588491410ULL);  // 47# (OEIS A002110)
  EXPECT_EQ(factor_u64(primorial), primorial_factors);
  const auto pv = arithmetic_values(primorial);
  EXPECT_EQ(pv.mu, -1);
  EXPECT_EQ(pv.omega, 15);
  EXPECT_EQ(pv.big_omega, 15);
}

TEST(Factor, RandomBalancedSemiprimesAgainstPari) {
  // p * q with p, q random primes of 31-32 bits (found with PARI's isprime): the hardest
  // inputs for a 64-bit factoriser. Also unbalanced p q and p^2 q with p < 2^20.
  auto rng = sqfc::testing::test_rng(601);
  auto random_prime = [&](std::uint64_t lo, std::uint64_t hi) {
    std::uniform_int_distribution<std::uint64_t> pick(lo, hi);
    for (int attempt = 0; attempt < 100000; ++attempt) {
      const std::uint64_t c = pick(rng) | 1;
      if (c <= hi && sqfc::oracles::pari_is_prime(c)) return c;
    }
    ADD_FAILURE() << "no prime found in [" << lo << ", " << hi << "]";
    return std::uint64_t{2};
  };
  const int count = static_cast<int>(40 * sqfc::testing::test_multiplier());
  int checked = 0;
  for (int i = 0; i < count; ++i) {
    const std::uint64_t p = random_prime(std::uint64_t{1} << 31, (std::uint64_t{1} << 32) - 1);
    const std::uint64_t q = random_prime(std::uint64_t{1} << 31, (std::uint64_t{1} << 32) - 1);
    const std::uint64_t n = p * q;  // < 2^64
    const auto f = factor_u64(n);
    ASSERT_EQ(f, sqfc::oracles::pari_factor(n)) << n << " " << sqfc::testing::seed_note();
    ASSERT_TRUE(is_factorisation_of(f, n)) << sqfc::testing::seed_note();
    const auto v = arithmetic_values(n);
    const auto pv = sqfc::oracles::pari_arithmetic(n);
    ASSERT_EQ(v.mu, p == q ? 0 : 1) << n;
    ASSERT_EQ(v.mu, pv.mu) << n;
    ASSERT_EQ(v.omega, pv.omega) << n;
    ASSERT_EQ(v.big_omega, 2) << n;

    // Unbalanced: small * big (< 2^63) and small^2 * big2 (< 2^63, not squarefree).
    const std::uint64_t small = random_prime(3, std::uint64_t{1} << 20);
    const std::uint64_t big = random_prime(std::uint64_t{1} << 40, std::uint64_t{1} << 43);
    const std::uint64_t big2 = random_prime(std::uint64_t{1} << 21, std::uint64_t{1} << 23);
    const std::uint64_t k = small * big;
    ASSERT_EQ(factor_u64(k), (Factorisation{{small, 1}, {big, 1}})) << k << " " << sqfc::testing::seed_note();
    ASSERT_EQ(factor_u64(k), sqfc::oracles::pari_factor(k)) << k << " " << sqfc::testing::seed_note();
    const std::uint64_t m = small * small * big2;
    ASSERT_EQ(factor_u64(m), (Factorisation{{small, 2}, {big2, 1}})) << m << " " << sqfc::testing::seed_note();
    const auto mv = arithmetic_values(m);
    ASSERT_EQ(mv.mu, 0) << m;
    ASSERT_EQ(mv.omega, 2) << m;
    ASSERT_EQ(mv.big_omega, 3) << m;
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

TEST(Factor, RandomSixtyFourBitValuesAgainstPari) {
  auto rng = sqfc::testing::test_rng(602);
  std::uniform_int_distribution<std::uint64_t> any(1, ~std::uint64_t{0});
  std::uniform_int_distribution<int> shift(0, 40);
  const int count = static_cast<int>(300 * sqfc::testing::test_multiplier());
  int checked = 0;
  for (int i = 0; i < count; ++i) {
    std::uint64_t n = any(rng) >> shift(rng);
    if (n == 0) n = 1;
    const auto f = factor_u64(n);
    ASSERT_EQ(f, sqfc::oracles::pari_factor(n)) << n << " " << sqfc::testing::seed_note();
    const auto v = arithmetic_values(n);
    const auto pv = sqfc::oracles::pari_arithmetic(n);
    ASSERT_EQ(v.mu, pv.mu) << n << " " << sqfc::testing::seed_note();
    ASSERT_EQ(v.omega, pv.omega) << n << " " << sqfc::testing::seed_note();
    ASSERT_EQ(v.big_omega, pv.big_omega) << n << " " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

TEST(Factor, RandomValuesBelowTenToThe12AgainstTrialDivision) {
  auto rng = sqfc::testing::test_rng(603);
  std::uniform_int_distribution<std::uint64_t> any(1, 1'000'000'000'000ULL);
  const int count = static_cast<int>(200 * sqfc::testing::test_multiplier());
  int checked = 0;
  for (int i = 0; i < count; ++i) {
    const std::uint64_t n = any(rng);
    ASSERT_EQ(factor_u64(n), factor_by_trial_division(n)) << n << " " << sqfc::testing::seed_note();
    const auto v = arithmetic_values(n);
    const auto t = sqfc::oracles::arithmetic_naive(n);
    ASSERT_EQ(v.mu, t.mu) << n;
    ASSERT_EQ(v.omega, t.omega) << n;
    ASSERT_EQ(v.big_omega, t.big_omega) << n;
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

}  // namespace
