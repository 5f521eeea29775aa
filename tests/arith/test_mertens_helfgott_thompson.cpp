// SPDX-License-Identifier: MIT
// Tests of M(x) by the Helfgott–Thompson boxes (issue 3): every x <= 3000 against trial
// division with forced boxes, random x against the Deléglise–Rivat sweep with random splits,
// tolerances and box heights, published values, the work counters (boxes, corrections and
// bisected classes really happen) and the preconditions. 10^11..10^13 are in the slow file.
#include "sqfc/arith/mertens_helfgott_thompson.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <random>
#include <string>

#include "arith/isolated_values_test_support.hpp"
#include "oracles/brute_force.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/isolated_values.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::HelfgottThompsonOptions;
using sqfc::arith::HelfgottThompsonWork;
using sqfc::arith::mertens_isolated_helfgott_thompson;

std::string data(const std::string& name) { return std::string(SQFC_TEST_DATA_DIR) + "/" + name; }

// Boxes from height 2 on, so that even small x go through the linear model.
HelfgottThompsonOptions forced_boxes(Natural split = 0, double tolerance = 0.25) {
  HelfgottThompsonOptions o;
  o.split = split;
  o.box_tolerance = tolerance;
  o.min_box_height = 2;
  return o;
}

TEST(MertensHelfgottThompson, EveryXUpTo3000AgainstTrialDivision) {
  const Natural n_max = 3000;
  const auto naive = sqfc::oracles::prefix_naive(n_max);
  std::uint64_t cases = 0;
  for (Natural x = 1; x <= n_max; ++x) {
    ASSERT_EQ(mertens_isolated_helfgott_thompson(x), naive.mertens[x]) << "x=" << x;
    ASSERT_EQ(mertens_isolated_helfgott_thompson(x, forced_boxes()), naive.mertens[x]) << "x=" << x;
    ++cases;
  }
  EXPECT_EQ(cases, n_max);
}

TEST(MertensHelfgottThompson, RandomXAgainstDelegliseRivatWithRandomTuning) {
  auto rng = sqfc::testing::test_rng(31);
  const auto rounds = 60 * sqfc::testing::test_multiplier();
  std::uint64_t cases = 0;
  for (std::uint64_t i = 0; i < rounds; ++i) {
    // Log-uniform x in [10, 10^8], every tuning in its allowed range.
    const auto x = static_cast<Natural>(std::pow(10.0, 1.0 + 7.0 * std::uniform_real_distribution<double>(0, 1)(rng)));
    HelfgottThompsonOptions o;
    Natural largest_split = 1;
    while ((largest_split + 1) * (largest_split + 2) <= x) ++largest_split;
    if (i % 2 == 0) o.split = 1 + rng() % largest_split;
    o.box_tolerance = std::uniform_real_distribution<double>(0.01, 4.0)(rng);
    o.min_box_height = 2 + static_cast<unsigned>(rng() % 30);
    if (o.split != 0 && x / o.split >= (Natural{1} << 43)) o.split = 0;
    ASSERT_EQ(mertens_isolated_helfgott_thompson(x, o), sqfc::arith::mertens_isolated(x))
        << "x=" << x << " split=" << o.split << " tolerance=" << o.box_tolerance << " height=" << o.min_box_height << " "
        << sqfc::testing::seed_note();
    ++cases;
  }
  EXPECT_EQ(cases, rounds);
}

TEST(MertensHelfgottThompson, ArgumentsNextToPowersOfTwoSquaresAndCubes) {
  std::uint64_t cases = 0;
  for (const Natural base : {Natural{1} << 20, Natural{1} << 26, Natural{1000} * 1000, Natural{7071} * 7071,
                             Natural{100} * 100 * 100, Natural{321} * 321 * 321}) {
    for (Natural d = 0; d <= 1; ++d) {
      for (const Natural x : {base - d, base + d}) {
        ASSERT_EQ(mertens_isolated_helfgott_thompson(x, forced_boxes()), sqfc::arith::mertens_isolated(x)) << "x=" << x;
        ++cases;
      }
    }
  }
  EXPECT_EQ(cases, 24U);
}

TEST(MertensHelfgottThompson, SameResultForEverySplit) {
  const Natural x = 12'345'678;
  const auto expected = sqfc::arith::mertens_isolated(x);
  std::uint64_t cases = 0;
  for (const Natural u : {Natural{2}, Natural{50}, Natural{700}, Natural{1500}, Natural{3512}}) {
    EXPECT_EQ(mertens_isolated_helfgott_thompson(x, forced_boxes(u)), expected) << "u=" << u;
    ++cases;
  }
  EXPECT_EQ(cases, 5U);
}

TEST(MertensHelfgottThompson, MertensAtPowersOfTenPublished) {
  std::uint64_t cases = 0;
  for (const auto* file : {"mertens_powers_of_ten.csv", "mertens_isolated_powers_of_ten.csv"}) {
    const auto table = sqfc::oracles::read_published_csv(data(file));  // OEIS A084237, see its source column
    for (std::size_t r = 0; r < table.rows.size(); ++r) {
      const auto k = table.integer(r, "k");
      if (k > 10) continue;  // 10^11..10^13 in the slow test, 10^14..10^15 in bench_mertens_methods
      Natural x = 1;
      for (int i = 0; i < k; ++i) x *= 10;
      EXPECT_EQ(mertens_isolated_helfgott_thompson(x), table.integer(r, "value")) << "x=10^" << k;
      ++cases;
    }
  }
  EXPECT_EQ(cases, 11U);
}

TEST(MertensHelfgottThompson, MertensAtPowersOfTwoPublished) {
  // OEIS A084236, k = 0..30 (tests/data/bfile/a084236_mertens_pow2.txt, from memory).
  std::uint64_t cases = 0;
  for (const auto& [k, value] : sqfc::testing::mertens_powers_of_two(data("bfile/a084236_mertens_pow2.txt"))) {
    EXPECT_EQ(mertens_isolated_helfgott_thompson(Natural{1} << k), value) << "x=2^" << k;
    ++cases;
  }
  EXPECT_EQ(cases, 31U);
}

TEST(MertensHelfgottThompson, BoxesCorrectionsAndBisectionsHappen) {
  // With boxes from height 2 and a split of 2 x^(2/5), box sums, their exact corrections and the
  // bisection of long classes (small denominators q) all occur, and the counts add up.
  HelfgottThompsonWork work;
  const Natural x = 100'000'000;
  EXPECT_EQ(mertens_isolated_helfgott_thompson(x, forced_boxes(3169), &work), 1928);  // OEIS A084237
  EXPECT_GT(work.boxes, 1000U);
  EXPECT_GT(work.corrections, 0U);
  EXPECT_GT(work.long_classes, 0U);
  EXPECT_GT(work.direct_pairs, 0U);
  EXPECT_GT(work.lookups, 0U);
  EXPECT_LT(work.corrections, work.box_pairs / 4);  // the model is right for most pairs
  EXPECT_EQ(work.sieve_limit, x / work.split);
  // Every pair m < n <= u is in a box or summed directly: the upper triangle.
  const Natural u = work.split;
  EXPECT_LE(work.box_pairs + work.direct_pairs, u * (u - 1) / 2);
  EXPECT_GT(work.box_pairs + work.direct_pairs, u * (u - 1) / 4);  // direct pairs skip mu(m) = 0 rows
}

TEST(MertensHelfgottThompson, PreconditionsAreChecked) {
  using sqfc::InvalidArgument;
  EXPECT_THROW(mertens_isolated_helfgott_thompson(0), InvalidArgument);
  EXPECT_THROW(mertens_isolated_helfgott_thompson(sqfc::arith::max_helfgott_thompson_x + 1), InvalidArgument);
  HelfgottThompsonOptions o;
  o.split = 1000;  // 1000 * 1001 > 10^6
  EXPECT_THROW(mertens_isolated_helfgott_thompson(1'000'000, o), InvalidArgument);
  o = {};
  o.box_tolerance = 5;
  EXPECT_THROW(mertens_isolated_helfgott_thompson(1'000'000, o), InvalidArgument);
  o.box_tolerance = -1;
  EXPECT_THROW(mertens_isolated_helfgott_thompson(1'000'000, o), InvalidArgument);
  o = {};
  o.min_box_height = 1;
  EXPECT_THROW(mertens_isolated_helfgott_thompson(1'000'000, o), InvalidArgument);
  o = {};
  o.split = 2;  // x / u = 5e14 > 2^43
  EXPECT_THROW(mertens_isolated_helfgott_thompson(1'000'000'000'000'000ULL, o), InvalidArgument);
  EXPECT_EQ(mertens_isolated_helfgott_thompson(1), 1);
}

}  // namespace
