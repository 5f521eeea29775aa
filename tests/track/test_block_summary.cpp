// SPDX-License-Identifier: MIT
// Tests of track/block_summary: summaries from sieve codes agree with trial division, and
// summaries of adjacent pieces merge into the summary of their union.
#include "sqfc/track/block_summary.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Count;
using sqfc::Natural;
using sqfc::SignedSum;
using sqfc::arith::FactorCode;
using sqfc::track::BlockSummary;
using sqfc::track::merge_summaries;
using sqfc::track::summarize_codes;
namespace oracles = sqfc::oracles;

constexpr Natural kLimit = 60'000;

// Factor codes of n = 1..limit from the library sieve (index n - 1), block size 2^10 so that
// many sieve blocks are involved.
const std::vector<FactorCode>& sieve_codes() {
  static const std::vector<FactorCode> codes = [] {
    std::vector<FactorCode> c;
    sqfc::arith::sieve_range(
        1, kLimit + 1,
        [&](const sqfc::arith::SieveBlock& b) {
          for (std::size_t i = 0; i < b.size(); ++i) c.push_back(b.code(i));
        },
        1024);
    return c;
  }();
  return codes;
}

const oracles::NaivePrefix& naive() {
  static const oracles::NaivePrefix prefix = oracles::prefix_naive(kLimit);
  return prefix;
}

BlockSummary summary_of(Natural lo, Natural hi) {
  return summarize_codes(lo, sieve_codes().data() + (lo - 1), static_cast<std::size_t>(hi - lo));
}

// The summary of [lo, hi) computed directly from trial division.
BlockSummary naive_summary(Natural lo, Natural hi) {
  const auto& p = naive();
  BlockSummary s;
  s.lo = lo;
  s.hi = hi;
  if (hi <= lo) return s;
  SignedSum prefix = 0;
  s.prefix_low = s.prefix_high = p.mu[lo];
  for (Natural n = lo; n < hi; ++n) {
    prefix += p.mu[n];
    s.prefix_low = std::min(s.prefix_low, prefix);
    s.prefix_high = std::max(s.prefix_high, prefix);
    s.liouville += (p.big_omega[n] % 2) ? -1 : 1;
    if (p.mu[n] != 0) ++((n & 1) ? s.odd_squarefree : s.even_squarefree)[static_cast<std::size_t>(p.omega[n])];
  }
  s.mertens = prefix;
  s.mu_last = p.mu[hi - 1];
  return s;
}

TEST(BlockSummary, SieveCodesAgreeWithTrialDivision) {
  // Guard for everything below: the codes the tests summarise are right.
  const auto& p = naive();
  Natural checked = 0;
  for (Natural n = 1; n <= kLimit; ++n) {
    const FactorCode expected = sqfc::arith::make_factor_code(p.omega[n], p.mu[n] != 0, p.big_omega[n]);
    ASSERT_EQ(sieve_codes()[n - 1], expected) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, kLimit);
}

TEST(BlockSummary, WholeRangeMatchesTrialDivision) {
  const auto whole = summary_of(1, kLimit + 1);
  EXPECT_EQ(whole, naive_summary(1, kLimit + 1));
  EXPECT_EQ(whole.mertens, naive().mertens[kLimit]);
  EXPECT_EQ(whole.liouville, naive().liouville[kLimit]);
  EXPECT_EQ(whole.squarefree(), static_cast<Count>(naive().squarefree[kLimit]));
  // Divisibility edges by testing every pair (oracle, O(n^2)) on a shorter prefix.
  const Natural edge_limit = 3000;
  EXPECT_EQ(summary_of(1, edge_limit + 1).divisibility_edges(), oracles::divisibility_edges_naive(edge_limit));
}

TEST(BlockSummary, RandomBlocksMatchTrialDivision) {
  auto rng = sqfc::testing::test_rng(1);
  const Count trials = 300 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    const Natural lo = std::uniform_int_distribution<Natural>(1, kLimit)(rng);
    const Natural length = std::uniform_int_distribution<Natural>(0, std::min<Natural>(kLimit + 1 - lo, 700))(rng);
    ASSERT_EQ(summary_of(lo, lo + length), naive_summary(lo, lo + length))
        << "[" << lo << ", " << lo + length << ") " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

TEST(BlockSummary, MergingRandomSplitsGivesTheWhole) {
  const auto whole = summary_of(1, kLimit + 1);
  auto rng = sqfc::testing::test_rng(2);
  const Count trials = 40 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    // Random cut points (repeats allowed, so empty pieces occur), merged left to right.
    const int cuts = std::uniform_int_distribution<int>(0, t % 2 ? 12 : 400)(rng);
    std::vector<Natural> edges = {1, kLimit + 1};
    for (int c = 0; c < cuts; ++c) edges.push_back(std::uniform_int_distribution<Natural>(1, kLimit + 1)(rng));
    std::sort(edges.begin(), edges.end());
    BlockSummary merged = summary_of(1, 1);
    for (std::size_t i = 0; i + 1 < edges.size(); ++i) merged = merge_summaries(merged, summary_of(edges[i], edges[i + 1]));
    ASSERT_EQ(merged, whole) << cuts << " cuts; " << sqfc::testing::seed_note();
    // The same pieces merged right to left.
    BlockSummary from_right = summary_of(kLimit + 1, kLimit + 1);
    for (std::size_t i = edges.size() - 1; i > 0; --i)
      from_right = merge_summaries(summary_of(edges[i - 1], edges[i]), from_right);
    ASSERT_EQ(from_right, whole) << cuts << " cuts; " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

TEST(BlockSummary, SplitsOfInnerRangesGiveTheWhole) {
  // Pieces of [lo, hi) with lo > 1 and lo of both parities (the odd/even histograms swap).
  auto rng = sqfc::testing::test_rng(3);
  const Count trials = 200 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    const Natural lo = std::uniform_int_distribution<Natural>(1, kLimit - 2000)(rng);
    const Natural hi = lo + std::uniform_int_distribution<Natural>(0, 2000)(rng);
    const Natural mid = std::uniform_int_distribution<Natural>(lo, hi)(rng);
    const auto merged = merge_summaries(summary_of(lo, mid), summary_of(mid, hi));
    ASSERT_EQ(merged, summary_of(lo, hi)) << "[" << lo << ", " << mid << ", " << hi << ") " << sqfc::testing::seed_note();
    ASSERT_EQ(merged, naive_summary(lo, hi)) << "[" << lo << ", " << hi << ") " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

TEST(BlockSummary, MergeIsAssociative) {
  auto rng = sqfc::testing::test_rng(4);
  const Count trials = 500 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    Natural e[4];
    for (auto& x : e) x = std::uniform_int_distribution<Natural>(1, kLimit + 1)(rng);
    std::sort(e, e + 4);
    const auto a = summary_of(e[0], e[1]), b = summary_of(e[1], e[2]), c = summary_of(e[2], e[3]);
    const auto left = merge_summaries(merge_summaries(a, b), c);
    const auto right = merge_summaries(a, merge_summaries(b, c));
    ASSERT_EQ(left, right) << e[0] << " " << e[1] << " " << e[2] << " " << e[3] << " " << sqfc::testing::seed_note();
    ASSERT_EQ(left, summary_of(e[0], e[3])) << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

TEST(BlockSummary, EmptyBlocks) {
  int checked = 0;
  for (const Natural lo : {Natural{1}, Natural{2}, Natural{777}, Natural{kLimit}}) {
    const auto empty = summary_of(lo, lo);
    EXPECT_TRUE(empty.empty());
    EXPECT_EQ(empty.lo, lo);
    EXPECT_EQ(empty.hi, lo);
    EXPECT_EQ(empty.mertens, 0);
    EXPECT_EQ(empty.liouville, 0);
    EXPECT_EQ(empty.prefix_low, 0);
    EXPECT_EQ(empty.prefix_high, 0);
    EXPECT_EQ(empty.mu_last, 0);
    EXPECT_EQ(empty.squarefree(), 0U);
    EXPECT_EQ(empty.divisibility_edges(), 0U);
    // Empty on either side is neutral; two empties merge to an empty.
    const auto block = summary_of(lo, lo + 37 <= kLimit + 1 ? lo + 37 : kLimit + 1);
    EXPECT_EQ(merge_summaries(empty, block), block);
    const auto after = summary_of(block.hi, block.hi);
    EXPECT_EQ(merge_summaries(block, after), block);
    EXPECT_EQ(merge_summaries(empty, summary_of(lo, lo)), empty);
    ++checked;
  }
  // A default summary is the empty block [1, 1).
  EXPECT_TRUE(BlockSummary{}.empty());
  EXPECT_EQ(BlockSummary{}, summary_of(1, 1));
  EXPECT_EQ(checked, 4);
}

TEST(BlockSummary, ExtremesOfASingleValue) {
  // A block of one n: its prefix extremes and mu_last are mu(n) itself, and a block that
  // goes down first has prefix_high below zero (n = 2, 3: mu = -1, -1).
  int checked = 0;
  for (Natural n = 1; n <= 30; ++n) {
    const auto s = summary_of(n, n + 1);
    EXPECT_EQ(s.prefix_low, naive().mu[n]) << n;
    EXPECT_EQ(s.prefix_high, naive().mu[n]) << n;
    EXPECT_EQ(s.mu_last, naive().mu[n]) << n;
    ++checked;
  }
  const auto s = summary_of(2, 4);
  EXPECT_EQ(s.prefix_high, -1);
  EXPECT_EQ(s.prefix_low, -2);
  EXPECT_EQ(checked, 30);
}

TEST(BlockSummary, NonAdjacentMergeThrows) {
  // (left, right) pairs whose seam does not match: gaps, overlaps, the wrong order, and
  // empty pieces away from the seam.
  const std::pair<Natural, Natural> cases[][2] = {
      {{1, 100}, {101, 200}}, {{1, 100}, {99, 200}}, {{1, 100}, {1, 100}},   {{1, 100}, {50, 60}},
      {{1, 100}, {200, 200}}, {{100, 150}, {1, 100}}, {{5, 5}, {1, 100}},    {{1, 100}, {5, 5}}};
  int checked = 0;
  for (const auto& [left, right] : cases) {
    EXPECT_THROW(static_cast<void>(merge_summaries(summary_of(left.first, left.second), summary_of(right.first, right.second))),
                 sqfc::InvalidArgument)
        << "[" << left.first << ", " << left.second << ") + [" << right.first << ", " << right.second << ")";
    ++checked;
  }
  EXPECT_EQ(checked, 8);
  // The adjacent order of the same kind of pieces merges.
  EXPECT_NO_THROW(static_cast<void>(merge_summaries(summary_of(1, 100), summary_of(100, 150))));
}

TEST(BlockSummary, DivisibilityEdgesFromCounts) {
  // divisibility_edges() = sum over squarefree n >= 2 of 2^omega(n) - 2 (design.md identity 8),
  // here summed directly by trial division on random blocks.
  auto rng = sqfc::testing::test_rng(5);
  const Count trials = 200 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    const Natural lo = std::uniform_int_distribution<Natural>(1, kLimit)(rng);
    const Natural hi = std::min<Natural>(kLimit + 1, lo + std::uniform_int_distribution<Natural>(0, 500)(rng));
    Count edges = 0, squarefree = 0;
    for (Natural n = lo; n < hi; ++n) {
      if (naive().mu[n] == 0) continue;
      ++squarefree;
      if (n >= 2) edges += (Count{1} << naive().omega[n]) - 2;
    }
    const auto s = summary_of(lo, hi);
    ASSERT_EQ(s.divisibility_edges(), edges) << "[" << lo << ", " << hi << ") " << sqfc::testing::seed_note();
    ASSERT_EQ(s.squarefree(), squarefree) << "[" << lo << ", " << hi << ") " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

}  // namespace
