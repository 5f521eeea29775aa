// SPDX-License-Identifier: MIT
// The apparent-pairs reduction (the default of compute_persistence) against the general twist
// and standard reductions, which share none of its code: same bars for every n up to 600, at
// segment boundaries, for every family, both fields and any thread count. The twist reduction
// is itself checked against dense homology and GUDHI in test_persistence*.cpp.
#include <gtest/gtest.h>

#include <algorithm>
#include <vector>

#include "sqfc/topology/persistence.hpp"

namespace {

using sqfc::Natural;
using sqfc::topology::compute_persistence;
using sqfc::topology::FaceFamily;
using sqfc::topology::PersistenceResult;
using sqfc::topology::ReductionOrder;

void expect_same(const PersistenceResult& apparent, const PersistenceResult& twist, const std::string& what) {
  EXPECT_EQ(apparent.method, ReductionOrder::apparent_pairs) << what << ": fell back to the general reduction";
  EXPECT_EQ(twist.method, ReductionOrder::twist) << what;
  EXPECT_EQ(apparent.bars, twist.bars) << what;
  EXPECT_EQ(apparent.faces_by_dimension, twist.faces_by_dimension) << what;
  EXPECT_EQ(apparent.top_dimension, twist.top_dimension) << what;
  // Each apparent pair clears exactly the column of its birth.
  EXPECT_EQ(apparent.apparent_pairs, apparent.cleared_columns) << what;
}

TEST(ApparentPairs, EqualsTwistForEveryNUpTo600) {
  for (Natural n = 1; n <= 600; ++n)
    for (const unsigned field : {2U, 3U})
      expect_same(compute_persistence(n, {}, field, ReductionOrder::apparent_pairs, 1),
                  compute_persistence(n, {}, field, ReductionOrder::twist), "n = " + std::to_string(n));
}

TEST(ApparentPairs, EqualsTwistAtSegmentBoundariesAndLargerN) {
  // Segments hold 2^16 integers; the candidates (odd k > n/2) start mid-segment.
  for (const Natural n : {65535ULL, 65536ULL, 65537ULL, 131072ULL, 131073ULL, 196609ULL, 300007ULL})
    expect_same(compute_persistence(n, {}, 2, ReductionOrder::apparent_pairs, 2),
                compute_persistence(n, {}, 2, ReductionOrder::twist), "n = " + std::to_string(n));
  expect_same(compute_persistence(10000, {}, 3, ReductionOrder::apparent_pairs, 2),
              compute_persistence(10000, {}, 3, ReductionOrder::twist), "n = 10000 over Z/3");
}

TEST(ApparentPairs, ResultDoesNotDependOnTheThreadCount) {
  const auto one = compute_persistence(250000, {}, 2, ReductionOrder::apparent_pairs, 1);
  for (const unsigned threads : {2U, 3U, 7U}) {
    const auto many = compute_persistence(250000, {}, 2, ReductionOrder::apparent_pairs, threads);
    EXPECT_EQ(many.bars, one.bars) << threads << " threads";
    EXPECT_EQ(many.column_additions, one.column_additions) << threads << " threads";
  }
  EXPECT_EQ(compute_persistence(250000, {}, 2).bars, one.bars);  // the default dispatcher
}

TEST(ApparentPairs, EqualsTwistForEveryFamily) {
  // Smallest allowed prime 2, 3, 7 and 11 (coprime to 1, 2, 30, 210), smooth bounds including
  // the degenerate ones (only the vertex 2; no vertex at all), skeleta, and combinations.
  const std::vector<FaceFamily> families = {
      {Natural{1}, std::nullopt, std::nullopt},  {Natural{2}, std::nullopt, std::nullopt},
      {Natural{5}, std::nullopt, std::nullopt},  {Natural{13}, std::nullopt, std::nullopt},
      {std::nullopt, Natural{1}, std::nullopt},  {std::nullopt, Natural{2}, std::nullopt},
      {std::nullopt, Natural{6}, std::nullopt},  {std::nullopt, Natural{30}, std::nullopt},
      {std::nullopt, Natural{210}, std::nullopt}, {std::nullopt, Natural{35}, std::nullopt},
      {std::nullopt, std::nullopt, 0},           {std::nullopt, std::nullopt, 1},
      {std::nullopt, std::nullopt, 2},           {Natural{11}, Natural{3}, 1},
      {Natural{31}, Natural{10}, 2},             {std::nullopt, Natural{2}, 1}};
  int checked = 0;
  for (std::size_t f = 0; f < families.size(); ++f)
    for (const Natural n : {1ULL, 2ULL, 3ULL, 30ULL, 105ULL, 211ULL, 1000ULL, 70001ULL})
      for (const unsigned field : {2U, 3U}) {
        if (field == 3 && n > 1000) continue;
        expect_same(compute_persistence(n, families[f], field, ReductionOrder::apparent_pairs, 2),
                    compute_persistence(n, families[f], field, ReductionOrder::twist),
                    "family " + std::to_string(f) + " n = " + std::to_string(n) + " field " + std::to_string(field));
        ++checked;
      }
  EXPECT_EQ(checked, 16 * (7 * 2 + 1));
}

TEST(ApparentPairs, CountsAddUp) {
  // Every face is a bar end: 2 * finite + essential = faces (common practice for barcodes).
  const auto r = compute_persistence(100000, {}, 2, ReductionOrder::apparent_pairs, 2);
  std::uint64_t finite = 0, essential = 0, faces = 0;
  for (const auto& bar : r.bars) (bar.death == 0 ? essential : finite) += 1;
  for (const auto f : r.faces_by_dimension) faces += f;
  EXPECT_EQ(2 * finite + essential, faces);
  EXPECT_EQ(faces, 60794U - 1);  // Q(10^5) - 1 (OEIS A071172): the faces are the squarefree k >= 2
  EXPECT_EQ(r.apparent_pairs, finite);
  EXPECT_TRUE(std::is_sorted(r.bars.begin(), r.bars.end()));
}

}  // namespace
