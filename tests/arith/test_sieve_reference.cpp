// SPDX-License-Identifier: MIT
// The sieve against PARI (reference library) at large n: random short ranges in
// [10^12, 10^13] and the very top of that interval, every n compared. The ranges near the
// configured maximum 10^16 are in test_sieve_reference_slow.cpp (their tables alone take 0.5 s).
#include <gtest/gtest.h>

#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include "arith/sieve_test_support.hpp"
#include "oracles/brute_force.hpp"
#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/sieve.hpp"

namespace {

using sqfc::Natural;

auto pari = [](Natural n) { return sqfc::oracles::pari_arithmetic(n); };

TEST(SieveReference, PariOracleAgreesWithTrialDivision) {
  // The oracle itself: PARI and trial division agree at every n <= 20000 and on a few large n.
  std::uint64_t checked = 0;
  for (Natural n = 1; n <= 20000; ++n) {
    const auto p = sqfc::oracles::pari_arithmetic(n);
    const auto t = sqfc::oracles::arithmetic_naive(n);
    ASSERT_EQ(p.mu, t.mu) << n;
    ASSERT_EQ(p.omega, t.omega) << n;
    ASSERT_EQ(p.big_omega, t.big_omega) << n;
    ++checked;
  }
  for (const Natural n : {Natural{1'000'000'000'000ULL}, Natural{999'999'999'989ULL}, Natural{1'000'000'007ULL * 999'983ULL}}) {
    const auto p = sqfc::oracles::pari_arithmetic(n);
    const auto t = sqfc::oracles::arithmetic_naive(n);
    EXPECT_EQ(p.mu, t.mu) << n;
    EXPECT_EQ(p.omega, t.omega) << n;
    EXPECT_EQ(p.big_omega, t.big_omega) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 20003U);
  EXPECT_THROW(sqfc::oracles::pari_arithmetic(0), std::invalid_argument);
  const auto range = sqfc::oracles::pari_arithmetic_range(1, 31);
  ASSERT_EQ(range.size(), 30U);
  EXPECT_EQ(range[29].omega, 3);  // n = 30 = 2 * 3 * 5
  EXPECT_EQ(range[29].mu, -1);
}

TEST(SieveReference, RandomRangesUpToTenToThe13AgainstPari) {
  constexpr Natural top = 10'000'000'000'000ULL;  // 10^13
  constexpr Natural length = 2000;
  const sqfc::arith::SieveTables tables(top);
  auto rng = sqfc::testing::test_rng(501);
  std::uniform_int_distribution<Natural> starts(1'000'000'000'000ULL, top - length);
  std::uniform_int_distribution<std::size_t> block_sizes(1U << 10, 1U << 12);

  struct Range {
    Natural lo, hi;
  };
  std::vector<Range> ranges;
  const int random_ranges = static_cast<int>(20 * sqfc::testing::test_multiplier());
  for (int r = 0; r < random_ranges; ++r) {
    const Natural lo = starts(rng);
    ranges.push_back({lo, lo + length});
  }
  ranges.push_back({top - length, top});          // the very top, below 10^13
  ranges.push_back({top - length + 1, top + 1});  // ending at n = 10^13 = max_n of the tables

  std::uint64_t checked = 0;
  for (const auto& range : ranges) {
    const std::size_t block_size = block_sizes(rng);
    const auto values = sqfc::testing::sieve_values(tables, range.lo, range.hi, block_size);
    ASSERT_EQ(values.size(), range.hi - range.lo);
    std::string report;
    EXPECT_EQ(sqfc::testing::count_mismatches(values, range.lo, pari, &report), 0U)
        << "[" << range.lo << ", " << range.hi << ") block size " << block_size << report << " "
        << sqfc::testing::seed_note();
    checked += values.size();
  }
  EXPECT_EQ(checked, (static_cast<std::uint64_t>(random_ranges) + 2) * length);
  // 10^13 = 2^13 5^13: omega 2, Omega 26 (the last value of the last range).
  const auto last = sqfc::testing::sieve_values(tables, top, top + 1, 1U << 10);
  ASSERT_EQ(last.size(), 1U);
  EXPECT_EQ(last[0].omega, 2);
  EXPECT_EQ(last[0].big_omega, 26);
}

}  // namespace
