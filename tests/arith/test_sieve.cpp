// SPDX-License-Identifier: MIT
// Tests of the segmented sieve: every n <= 2*10^5 against trial division and FLINT, block
// sizes and splits, block edges, ranges at 1, 2, 3, at powers of two and next to 2^32, the
// table structure and the preconditions. The exhaustive 10^6 comparison is in
// test_sieve_exhaustive_slow.cpp, the comparison with PARI up to 10^16 in
// test_sieve_reference*.cpp.
#include "sqfc/arith/sieve.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include "arith/sieve_test_support.hpp"
#include "oracles/brute_force.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/factor.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::SegmentedSieve;
using sqfc::arith::SieveTables;
using sqfc::testing::count_mismatches;
using sqfc::testing::sieve_values;

auto naive = [](Natural n) { return sqfc::oracles::arithmetic_naive(n); };
auto flint = [](Natural n) { return sqfc::arith::arithmetic_values(n); };

TEST(Sieve, EveryNUpTo200000AgainstTrialDivisionAndFlint) {
  const Natural hi = 200001;
  const SieveTables tables(hi - 1);
  std::uint64_t blocks = 0;
  const auto values = sieve_values(tables, 1, hi, sqfc::config::default_block_size, &blocks);
  ASSERT_EQ(values.size(), 200000U);
  EXPECT_EQ(blocks, 2U);  // 200000 values in blocks of 2^17
  std::string report;
  EXPECT_EQ(count_mismatches(values, 1, naive, &report), 0U) << report;
  EXPECT_EQ(count_mismatches(values, 1, flint, &report), 0U) << report;
  // A few values stated outright (from memory): mu(1) = 1, 2*3*5*7*11*13 = 30030 has six
  // prime factors, 2^17 = 131072 has Omega = 17, 199999 is prime.
  EXPECT_EQ(values[0].mu, 1);
  EXPECT_EQ(values[0].omega, 0);
  EXPECT_EQ(values[30030 - 1].omega, 6);
  EXPECT_EQ(values[30030 - 1].mu, 1);
  EXPECT_EQ(values[131072 - 1].big_omega, 17);
  EXPECT_EQ(values[131072 - 1].mu, 0);
  EXPECT_EQ(values[199999 - 1].mu, -1);
  EXPECT_EQ(sqfc::oracles::arithmetic_naive(199999).omega, 1);
}

TEST(Sieve, BlockSizesAgree) {
  // One reference run per region; every block size and both kinds of tables (sized to the
  // range, and sized far beyond it) must give identical values, and the reference must match
  // FLINT at every n of the small region and at the two ends of the large one.
  auto rng = sqfc::testing::test_rng(401);
  std::uniform_int_distribution<std::size_t> extra(0, (1U << 11) - 1);
  const std::size_t random_size = (1U << 11) + extra(rng);
  const std::vector<std::size_t> sizes = {1U << 10, (1U << 10) + 1, random_size, 3000, 1U << 17};
  struct Region {
    Natural lo, hi;
  };
  const std::vector<Region> regions = {{1, 100001}, {1'000'000'000'000ULL, 1'000'000'000'000ULL + 100000}};
  const SieveTables wide(Natural{1} << 40);
  int runs = 0;
  for (const auto& region : regions) {
    const SieveTables tight(region.hi - 1);
    const auto reference = sieve_values(tight, region.lo, region.hi, 1U << 17);
    ASSERT_EQ(reference.size(), region.hi - region.lo);
    std::string report;
    if (region.lo == 1) {
      EXPECT_EQ(count_mismatches(reference, region.lo, flint, &report), 0U) << report;
    } else {
      const std::vector<sqfc::testing::SievedValue> head(reference.begin(), reference.begin() + 2000);
      const std::vector<sqfc::testing::SievedValue> tail(reference.end() - 2000, reference.end());
      EXPECT_EQ(count_mismatches(head, region.lo, flint, &report), 0U) << report;
      EXPECT_EQ(count_mismatches(tail, region.hi - 2000, flint, &report), 0U) << report;
    }
    for (const auto size : sizes) {
      EXPECT_TRUE(sqfc::testing::same_values(sieve_values(tight, region.lo, region.hi, size), reference))
          << "block size " << size << " at " << region.lo << " " << sqfc::testing::seed_note();
      EXPECT_TRUE(sqfc::testing::same_values(sieve_values(wide, region.lo, region.hi, size), reference))
          << "block size " << size << " with 2^40 tables at " << region.lo << " " << sqfc::testing::seed_note();
      runs += 2;
    }
  }
  EXPECT_EQ(runs, 2 * 5 * 2);
  // The largest block size, 2^24, holds the whole of a 10^5 range in one block.
  const SieveTables small(100000);
  std::uint64_t blocks = 0;
  const auto one_block = sieve_values(small, 1, 100001, 1U << 24, &blocks);
  EXPECT_EQ(blocks, 1U);
  EXPECT_TRUE(sqfc::testing::same_values(one_block, sieve_values(small, 1, 100001, 1U << 10)));
}

TEST(Sieve, RandomSplitsCombineToTheWhole) {
  // Cut [lo, hi) into random pieces (some empty), sieve each with reset() on one reused
  // sieve of a random block size, and concatenate: the result equals one pass over [lo, hi).
  auto rng = sqfc::testing::test_rng(402);
  // From 1, below 2^32, and across 2^32 = 4294967296.
  const std::vector<std::pair<Natural, Natural>> ranges = {
      {1, 60001}, {4'000'000'000ULL, 4'000'060'000ULL}, {4294937296ULL, 4294997296ULL}};
  const SieveTables tables(4294997296ULL);
  int splits = 0;
  for (const auto& [range_lo, range_hi] : ranges) {
    const auto whole = sieve_values(tables, range_lo, range_hi, 1U << 17);
    for (int round = 0; round < 4; ++round) {
      std::uniform_int_distribution<std::size_t> block_sizes(1U << 10, 1U << 13);
      SegmentedSieve sieve(tables, block_sizes(rng));
      std::vector<sqfc::testing::SievedValue> joined;
      Natural at = range_lo;
      int pieces = 0;
      while (at < range_hi) {
        std::uniform_int_distribution<Natural> length(0, 9000);
        const Natural piece_hi = std::min(range_hi, at + length(rng));
        sieve.reset(at, piece_hi);
        Natural expected_lo = at;
        while (sieve.next_block()) {
          const auto& block = sieve.block();
          ASSERT_EQ(block.lo(), expected_lo);
          for (std::size_t i = 0; i < block.size(); ++i)
            joined.push_back({block.mu(i), block.omega(i), block.big_omega(i), block.liouville(i), block.is_squarefree(i),
                              block.code(i)});
          expected_lo = block.hi();
        }
        ASSERT_EQ(expected_lo, piece_hi) << sqfc::testing::seed_note();
        at = piece_hi;
        ++pieces;
      }
      EXPECT_TRUE(sqfc::testing::same_values(joined, whole))
          << "split into " << pieces << " pieces at " << range_lo << " " << sqfc::testing::seed_note();
      ++splits;
    }
  }
  EXPECT_EQ(splits, 12);
}

TEST(Sieve, BlockEdgesAndRangeEnds) {
  // Odd block sizes at an unaligned start: the first and last n of every block, and the first
  // and last n of the range, against FLINT.
  const Natural lo = (Natural{1} << 40) + 12345;
  const Natural hi = lo + 50000;
  const SieveTables tables(hi - 1);
  std::uint64_t checked = 0;
  for (const std::size_t size : {std::size_t{1024}, std::size_t{1031}, std::size_t{4099}}) {
    SegmentedSieve sieve(tables, size);
    sieve.reset(lo, hi);
    std::uint64_t blocks = 0;
    while (sieve.next_block()) {
      const auto& block = sieve.block();
      for (const std::size_t i : {std::size_t{0}, std::size_t{1}, block.size() - 2, block.size() - 1}) {
        const Natural n = block.lo() + i;
        const auto expected = sqfc::arith::arithmetic_values(n);
        ASSERT_EQ(block.mu(i), expected.mu) << n;
        ASSERT_EQ(block.omega(i), expected.omega) << n;
        ASSERT_EQ(block.big_omega(i), expected.big_omega) << n;
        ++checked;
      }
      ++blocks;
    }
    EXPECT_EQ(blocks, (hi - lo + size - 1) / size);
  }
  EXPECT_EQ(checked, 4 * ((50000 + 1023) / 1024 + (50000 + 1030) / 1031 + (50000 + 4098) / 4099));
}

TEST(Sieve, RangesStartingAtOneTwoThree) {
  // Every [lo, hi) with 1 <= lo <= hi <= 201, with tables sized exactly to hi - 1: covers
  // tables so small that no base prime is left (max_n < 4), single-value ranges and the
  // pre-sieved pattern of 2, 3, 5, 7 beyond the square root of the range.
  std::uint64_t ranges = 0;
  std::uint64_t values_checked = 0;
  for (Natural hi = 2; hi <= 201; ++hi) {
    const SieveTables tables(hi - 1);
    for (Natural lo = 1; lo <= hi; ++lo) {
      const auto values = sieve_values(tables, lo, hi, 1U << 10);
      ASSERT_EQ(values.size(), hi - lo);
      std::string report;
      ASSERT_EQ(count_mismatches(values, lo, naive, &report), 0U) << "[" << lo << ", " << hi << ")" << report;
      values_checked += values.size();
      ++ranges;
    }
  }
  EXPECT_EQ(ranges, 20300U);           // sum_{hi=2}^{201} hi
  EXPECT_EQ(values_checked, 1353400U);  // sum_{hi=2}^{201} hi (hi - 1) / 2 = C(202, 3)
}

TEST(Sieve, RangesAroundPowersOfTwo) {
  // [2^k - 300, 2^k + 300) for every k in [9, 40], where the large-prime threshold changes,
  // with tables sized to the range and with one shared table for 2^40 + 300; and ranges
  // starting exactly at 2^k. Larger k (up to 2^53 < 10^16) are in test_sieve_reference_slow.
  const SieveTables shared((Natural{1} << 40) + 300);
  std::uint64_t checked = 0;
  for (int k = 9; k <= 40; ++k) {
    const Natural p = Natural{1} << k;
    const SieveTables tight(p + 299);
    const auto values = sieve_values(tight, p - 300, p + 300, 1U << 10);
    ASSERT_EQ(values.size(), 600U);
    std::string report;
    ASSERT_EQ(count_mismatches(values, p - 300, flint, &report), 0U) << "around 2^" << k << report;
    EXPECT_TRUE(sqfc::testing::same_values(sieve_values(shared, p - 300, p + 300, 1U << 10), values)) << k;
    EXPECT_TRUE(sqfc::testing::same_values(sieve_values(tight, p, p + 300, 1U << 10),
                                           std::vector<sqfc::testing::SievedValue>(values.begin() + 300, values.end())))
        << "starting at 2^" << k;
    EXPECT_EQ(values[300].big_omega, k);  // n = 2^k
    EXPECT_EQ(values[300].omega, 1);
    checked += values.size();
  }
  EXPECT_EQ(checked, 32U * 600);
}

TEST(Sieve, RangesNextToTwoToThe32) {
  const Natural two_32 = Natural{1} << 32;
  const SieveTables tables(two_32 + 4999);
  const auto values = sieve_values(tables, two_32 - 5000, two_32 + 5000, 1U << 12);
  ASSERT_EQ(values.size(), 10000U);
  std::string report;
  EXPECT_EQ(count_mismatches(values, two_32 - 5000, flint, &report), 0U) << report;
  // 2^32 - 5 = 4294967291 is prime (from memory; FLINT agrees above) and 2^32 + 1 =
  // 641 * 6700417 (from memory).
  EXPECT_EQ(values[5000 - 5].mu, -1);
  EXPECT_EQ(values[5000 - 5].omega, 1);
  EXPECT_EQ(values[5000 + 1].omega, 2);
  EXPECT_EQ(values[5000 + 1].mu, 1);
  EXPECT_EQ(values[5000].big_omega, 32);
}

TEST(Sieve, LastNOfTheTables) {
  // hi - 1 == max_n is allowed, one more is not; a single-value range at the last n.
  for (const Natural max_n : {Natural{1}, Natural{2}, Natural{3}, Natural{4}, Natural{48}, Natural{49}, Natural{1000003},
                              Natural{999999999989ULL}}) {
    const SieveTables tables(max_n);
    EXPECT_EQ(tables.max_n(), max_n);
    const auto last = sieve_values(tables, max_n, max_n + 1, 1U << 10);
    ASSERT_EQ(last.size(), 1U);
    const auto expected = sqfc::arith::arithmetic_values(max_n);
    EXPECT_EQ(last[0].mu, expected.mu) << max_n;
    EXPECT_EQ(last[0].omega, expected.omega) << max_n;
    EXPECT_EQ(last[0].big_omega, expected.big_omega) << max_n;
    SegmentedSieve sieve(tables, 1U << 10);
    EXPECT_THROW(sieve.reset(max_n, max_n + 2), sqfc::InvalidArgument) << max_n;
    EXPECT_THROW(sieve.reset(1, max_n + 2), sqfc::InvalidArgument) << max_n;
  }
}

TEST(Sieve, TableStructure) {
  // prime_count() is pi(floor(sqrt(max_n))) (OEIS A000720 / A006880 values); the entries are
  // sorted, and together with the pattern modulus 151200 = 2^5 3^3 5^2 7 they hold every
  // prime power q <= max_n of a prime p <= sqrt(max_n) exactly once.
  struct Case {
    Natural max_n;
    std::size_t prime_count;
  };
  const std::vector<Case> cases = {{1, 0},       {3, 0},        {4, 1},           {8, 1},          {9, 2},
                                   {120, 4},     {121, 5},      {10'000, 25},     {1'000'000, 168},
                                   {999'999, 168}, {100'000'000, 1229}, {1'000'000'000'000ULL, 78498}};
  for (const auto& c : cases) {
    const SieveTables tables(c.max_n);
    EXPECT_EQ(tables.prime_count(), c.prime_count) << c.max_n;
    const auto& entries = tables.entries();
    EXPECT_TRUE(std::is_sorted(entries.begin(), entries.end(),
                               [](const auto& a, const auto& b) { return a.modulus < b.modulus; }));
    if (c.max_n > 1'000'000) continue;  // the enumeration below is by trial division
    std::vector<std::uint64_t> expected;
    for (std::uint64_t p = 2; p * p <= c.max_n; ++p) {
      if (sqfc::oracles::arithmetic_naive(p).omega != 1 || sqfc::oracles::arithmetic_naive(p).big_omega != 1) continue;
      for (std::uint64_t q = p; q <= c.max_n; q *= p)
        if (151200 % q != 0) expected.push_back(q);
    }
    std::sort(expected.begin(), expected.end());
    std::vector<std::uint64_t> moduli;
    for (const auto& e : entries) moduli.push_back(e.modulus);
    EXPECT_EQ(moduli, expected) << c.max_n;
    EXPECT_EQ(tables.pattern().size(), 151200U);
  }
}

TEST(Sieve, Preconditions) {
  const SieveTables tables(100000);
  EXPECT_THROW(SegmentedSieve(tables, 0), sqfc::InvalidArgument);
  EXPECT_THROW(SegmentedSieve(tables, (1U << 10) - 1), sqfc::InvalidArgument);
  EXPECT_THROW(SegmentedSieve(tables, (1U << 24) + 1), sqfc::InvalidArgument);
  EXPECT_THROW(SegmentedSieve(tables, std::size_t{1} << 40), sqfc::InvalidArgument);
  EXPECT_NO_THROW(SegmentedSieve(tables, 1U << 10));
  EXPECT_NO_THROW(SegmentedSieve(tables, 1U << 24));

  SegmentedSieve sieve(tables, 1U << 10);
  EXPECT_THROW(sieve.reset(0, 10), sqfc::InvalidArgument);
  EXPECT_THROW(sieve.reset(0, 0), sqfc::InvalidArgument);
  EXPECT_THROW(sieve.reset(10, 9), sqfc::InvalidArgument);
  EXPECT_THROW(sieve.reset(1, 100002), sqfc::InvalidArgument);
  EXPECT_THROW(sieve.reset(200000, 200001), sqfc::InvalidArgument);
  EXPECT_NO_THROW(sieve.reset(1, 100001));
  // An empty range yields no block.
  sieve.reset(500, 500);
  EXPECT_FALSE(sieve.next_block());
  sieve.reset(100001, 100001);
  EXPECT_FALSE(sieve.next_block());

  EXPECT_THROW(SieveTables(0), sqfc::InvalidArgument);
  EXPECT_THROW(SieveTables(sqfc::config::max_sieve_n + 1), sqfc::InvalidArgument);
  EXPECT_THROW(SieveTables(~Natural{0}), sqfc::InvalidArgument);
  // The accepted maximum, SieveTables(10^16), takes 0.5 s: test_sieve_reference_slow.cpp.

  // sieve_range: nothing for an empty range, InvalidArgument for lo = 0 or beyond the maximum.
  int visits = 0;
  sqfc::arith::sieve_range(7, 7, [&](const sqfc::arith::SieveBlock&) { ++visits; });
  sqfc::arith::sieve_range(9, 3, [&](const sqfc::arith::SieveBlock&) { ++visits; });
  EXPECT_EQ(visits, 0);
  EXPECT_THROW(sqfc::arith::sieve_range(0, 5, [&](const sqfc::arith::SieveBlock&) { ++visits; }), sqfc::InvalidArgument);
  EXPECT_THROW(sqfc::arith::sieve_range(5, sqfc::config::max_sieve_n + 2, [&](const sqfc::arith::SieveBlock&) { ++visits; }),
               sqfc::InvalidArgument);
  EXPECT_EQ(visits, 0);
  Natural seen = 0;
  sqfc::arith::sieve_range(
      3, 5003, [&](const sqfc::arith::SieveBlock& block) { seen += block.size(); ++visits; }, 1U << 10);
  EXPECT_EQ(seen, 5000U);
  EXPECT_EQ(visits, 5);
}

}  // namespace

namespace {

// The code-only path (the table engine's) must equal the word path for every n, on ranges
// that cross powers of two and pattern periods, with odd block sizes. Both paths share the
// sieving step, so the trial-division oracle checks the codes too.
TEST(Sieve, CodeOnlyBlocksMatchWordBlocks) {
  auto rng = sqfc::testing::test_rng(77);
  std::size_t compared = 0;
  const std::vector<std::pair<Natural, Natural>> ranges = {
      {1, 5000}, {151190, 151210 + 3000}, {(Natural{1} << 20) - 1500, (Natural{1} << 20) + 1500}};
  std::vector<std::pair<Natural, Natural>> all = ranges;
  for (int r = 0; r < 5; ++r) {
    const Natural lo = 1 + rng() % 100'000'000ULL;  // trial division stays cheap below 10^8
    all.emplace_back(lo, lo + 2000 + rng() % 3000);
  }
  for (const auto& [lo, hi] : all) {
    const SieveTables tables(hi - 1);
    const std::size_t block = 1024 + rng() % 2000;
    SegmentedSieve words(tables, block), codes(tables, block);
    words.reset(lo, hi);
    codes.reset(lo, hi);
    std::vector<sqfc::arith::FactorCode> out(block);
    while (words.next_block()) {
      ASSERT_TRUE(codes.next_block_codes(out.data()));
      ASSERT_EQ(codes.last_lo(), words.block().lo());
      ASSERT_EQ(codes.last_size(), words.block().size());
      for (std::size_t i = 0; i < codes.last_size(); ++i) {
        ASSERT_EQ(out[i], words.block().code(i)) << "n = " << (codes.last_lo() + i) << " " << sqfc::testing::seed_note();
        const auto expected = sqfc::oracles::arithmetic_naive(codes.last_lo() + i);
        ASSERT_EQ(sqfc::arith::code_mu(out[i]), expected.mu) << "n = " << (codes.last_lo() + i);
        ++compared;
      }
    }
    EXPECT_FALSE(codes.next_block_codes(out.data()));
  }
  EXPECT_GT(compared, 5000U + 3020U + 3000U + 5 * 2000U - 1);
}

}  // namespace
