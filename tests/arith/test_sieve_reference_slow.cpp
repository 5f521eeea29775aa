// SPDX-License-Identifier: MIT
// The sieve at the configured maximum config::max_sieve_n = 10^16, against PARI (reference
// library) and FLINT: tables for 10^16 (base primes to 10^8), the top of the range, random
// ranges in [10^15, 10^16], and the powers of two 2^41 .. 2^53.
#include <gtest/gtest.h>

#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include "arith/sieve_test_support.hpp"
#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/factor.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/config.hpp"

namespace {

using sqfc::Natural;

auto pari = [](Natural n) { return sqfc::oracles::pari_arithmetic(n); };
auto flint = [](Natural n) { return sqfc::arith::arithmetic_values(n); };

const sqfc::arith::SieveTables& max_tables() {
  static const sqfc::arith::SieveTables tables(sqfc::config::max_sieve_n);
  return tables;
}

TEST(SieveReferenceSlow, TablesForTheMaximum) {
  const auto& tables = max_tables();
  EXPECT_EQ(tables.max_n(), 10'000'000'000'000'000ULL);
  EXPECT_EQ(tables.prime_count(), 5761455U);  // pi(10^8): OEIS A006880
}

TEST(SieveReferenceSlow, TopOfTheRangeAgainstPari) {
  constexpr Natural top = sqfc::config::max_sieve_n;
  constexpr Natural length = 3000;
  const auto values = sqfc::testing::sieve_values(max_tables(), top - length + 1, top + 1, 1U << 17);
  ASSERT_EQ(values.size(), length);
  std::string report;
  EXPECT_EQ(sqfc::testing::count_mismatches(values, top - length + 1, pari, &report), 0U) << report;
  // n = 10^16 = 2^16 5^16 is the last value the sieve accepts.
  EXPECT_EQ(values.back().omega, 2);
  EXPECT_EQ(values.back().big_omega, 32);
  EXPECT_EQ(values.back().mu, 0);
}

TEST(SieveReferenceSlow, RandomRangesNearTenToThe16AgainstPari) {
  constexpr Natural length = 2000;
  auto rng = sqfc::testing::test_rng(502);
  std::uniform_int_distribution<Natural> starts(1'000'000'000'000'000ULL, sqfc::config::max_sieve_n - length);
  std::uniform_int_distribution<std::size_t> block_sizes(1U << 10, 1U << 11);
  const int ranges = static_cast<int>(6 * sqfc::testing::test_multiplier());
  std::uint64_t checked = 0;
  for (int r = 0; r < ranges; ++r) {
    const Natural lo = starts(rng);
    // A small block size makes each range several blocks: carried offsets are exercised.
    const std::size_t block_size = block_sizes(rng);
    const auto values = sqfc::testing::sieve_values(max_tables(), lo, lo + length, block_size);
    ASSERT_EQ(values.size(), length);
    std::string report;
    EXPECT_EQ(sqfc::testing::count_mismatches(values, lo, pari, &report), 0U)
        << "[" << lo << ", " << lo + length << ") block size " << block_size << report << " "
        << sqfc::testing::seed_note();
    checked += values.size();
  }
  EXPECT_EQ(checked, static_cast<std::uint64_t>(ranges) * length);
}

TEST(SieveReferenceSlow, RangesAroundLargePowersOfTwo) {
  // [2^k - 300, 2^k + 300) for k = 41 .. 53 (2^53 < 10^16 < 2^54) with the 10^16 tables,
  // against FLINT; for k <= 47 and k = 50, 53 also with tables sized to the range (building
  // those for every k would take about 7 s).
  std::uint64_t checked = 0;
  int tight_checked = 0;
  for (int k = 41; k <= 53; ++k) {
    const Natural p = Natural{1} << k;
    const auto values = sqfc::testing::sieve_values(max_tables(), p - 300, p + 300, 1U << 10);
    ASSERT_EQ(values.size(), 600U);
    std::string report;
    EXPECT_EQ(sqfc::testing::count_mismatches(values, p - 300, flint, &report), 0U) << "around 2^" << k << report;
    if (k <= 47 || k == 50 || k == 53) {
      const sqfc::arith::SieveTables tight(p + 299);
      EXPECT_TRUE(sqfc::testing::same_values(sqfc::testing::sieve_values(tight, p - 300, p + 300, 1U << 10), values)) << k;
      ++tight_checked;
    }
    EXPECT_EQ(values[300].big_omega, k);
    checked += values.size();
  }
  EXPECT_EQ(checked, 13U * 600);
  EXPECT_EQ(tight_checked, 9);
}

}  // namespace
