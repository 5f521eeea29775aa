// SPDX-License-Identifier: MIT
// The sweep's mu sieve (src/arith/detail_mu_sieve.hpp) against the general SegmentedSieve,
// which sieves every prime power into 32-bit words by a different method: chunks whose
// tables reach primes far above the segment length (the bucket ring) and squares far above it
// (the heap), chunks that start at arbitrary n and end in a short segment, and a sieve reused
// across resets.
// Expected values: the oracle is SegmentedSieve; no outside value is used.
#include <gtest/gtest.h>

#include <cstdint>
#include <vector>

#include "../../src/arith/detail_mu_sieve.hpp"
#include "sqfc/arith/sieve.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::detail::MuSieve;
using sqfc::arith::detail::MuSieveTables;
using sqfc::arith::detail::sweep_segment_length;

// mu over [lo, lo + count) from SegmentedSieve.
std::vector<std::int8_t> reference_mu(Natural lo, Natural count) {
  const sqfc::arith::SieveTables tables(lo + count - 1);
  sqfc::arith::SegmentedSieve sieve(tables);
  sieve.reset(lo, lo + count);
  std::vector<std::int8_t> mu;
  mu.reserve(static_cast<std::size_t>(count));
  while (sieve.next_block())
    for (std::size_t i = 0; i < sieve.block().size(); ++i) mu.push_back(static_cast<std::int8_t>(sieve.block().mu(i)));
  return mu;
}

// Runs `sieve` over one chunk [lo, lo + count) the way the sweep does and compares every value.
void expect_chunk(MuSieve& sieve, Natural lo, Natural count) {
  const auto expected = reference_mu(lo, count);
  std::vector<std::int8_t> out(sweep_segment_length);
  sieve.reset(lo);
  std::size_t mismatches = 0;
  for (Natural done = 0; done < count; done += sweep_segment_length) {
    const auto len = static_cast<std::size_t>(std::min<Natural>(sweep_segment_length, count - done));
    sieve.next(len, out.data());
    for (std::size_t i = 0; i < len; ++i)
      if (out[i] != expected[static_cast<std::size_t>(done) + i] && ++mismatches <= 5)
        ADD_FAILURE() << "mu(" << lo + done + i << "): sieve " << int{out[i]} << ", reference "
                      << int{expected[static_cast<std::size_t>(done) + i]};
  }
  EXPECT_EQ(mismatches, 0U) << "chunk [" << lo << ", " << lo + count << ")";
}

TEST(MuSieve, PrimesAndSquaresAboveTheSegmentLengthAsAtTenToTheNineteen) {
  // Tables for max_n = 2.3e12, the sieve limit at x = 10^19: primes to 1.5e6, eleven times the
  // segment length, so every bucket of the ring is used. Chunks start at odd places and end
  // in short segments; one sieve serves all of them, so the ring and heap must reset cleanly.
  const Natural max_n = 2'300'000'000'000ULL;
  const MuSieveTables tables(max_n);
  MuSieve sieve(tables, sweep_segment_length);
  expect_chunk(sieve, 1'000'000'000'007ULL, 40 * Natural{sweep_segment_length} + 12'345);
  expect_chunk(sieve, max_n - 9 * Natural{sweep_segment_length} - 3, 9 * Natural{sweep_segment_length} + 3);
  expect_chunk(sieve, 1, 3 * Natural{sweep_segment_length} + 1);
  expect_chunk(sieve, 17'179'869'184ULL, Natural{sweep_segment_length} - 1);  // 2^34, one short segment
}

TEST(MuSieve, LimitNextTo2To44) {
  // The sweep's largest limit: primes up to 2^22, log sums near the 12-bit field's top.
  const Natural max_n = (Natural{1} << 44) - 1;
  const MuSieveTables tables(max_n);
  MuSieve sieve(tables, sweep_segment_length);
  expect_chunk(sieve, max_n - 6 * Natural{sweep_segment_length} + 1, 6 * Natural{sweep_segment_length});
}

TEST(MuSieve, SmallBlockForSmallSweeps) {
  // Small sweeps use a buffer shorter than the segment length; tables whose primes end below it.
  const MuSieveTables tables(99'999);
  MuSieve sieve(tables, 100'000);
  expect_chunk(sieve, 1, 99'999);
}

}  // namespace
