// SPDX-License-Identifier: MIT
// Slow tests of M(x) by the Helfgott–Thompson boxes: published M(10^11..10^13) (OEIS A084237)
// and agreement with the Deléglise–Rivat sweep at random x up to 10^12, default and forced boxes.
#include "sqfc/arith/mertens_helfgott_thompson.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "oracles/test_support.hpp"
#include "sqfc/arith/isolated_values.hpp"

namespace {

using sqfc::Natural;

TEST(MertensHelfgottThompsonSlow, PublishedPowersOfTen) {
  EXPECT_EQ(sqfc::arith::mertens_isolated_helfgott_thompson(100'000'000'000ULL), -87856);       // OEIS A084237
  EXPECT_EQ(sqfc::arith::mertens_isolated_helfgott_thompson(1'000'000'000'000ULL), 62366);      // OEIS A084237
  EXPECT_EQ(sqfc::arith::mertens_isolated_helfgott_thompson(10'000'000'000'000ULL), 599582);    // OEIS A084237
}

TEST(MertensHelfgottThompsonSlow, RandomXUpTo1e12AgainstDelegliseRivat) {
  auto rng = sqfc::testing::test_rng(37);
  std::uint64_t cases = 0;
  for (int i = 0; i < 12; ++i) {
    const auto x = static_cast<Natural>(std::pow(10.0, 9.0 + 3.0 * std::uniform_real_distribution<double>(0, 1)(rng)));
    sqfc::arith::HelfgottThompsonOptions o;
    if (i % 2 == 1) o.min_box_height = 8;  // many more boxes than the default
    sqfc::arith::IsolatedOptions dr;
    dr.threads = 2;
    ASSERT_EQ(sqfc::arith::mertens_isolated_helfgott_thompson(x, o), sqfc::arith::mertens_isolated(x, dr))
        << "x=" << x << " " << sqfc::testing::seed_note();
    ++cases;
  }
  EXPECT_EQ(cases, 12U);
}

}  // namespace
