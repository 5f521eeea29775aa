// SPDX-License-Identifier: MIT
// Face counts and Betti numbers of K_x by counting over primes against the table engine at 10^8
// and at random x <= 10^8.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <vector>

#include "oracles/test_support.hpp"
#include "track/omega_counting_faces_support.hpp"

namespace {

using sqfc::Natural;

TEST(OmegaCountingFacesSlow, SameAsTheTableEngineTo10To8) {
  std::vector<Natural> points = {67'108'864 /* 2^26 */, 100'000'000};
  auto rng = sqfc::testing::test_rng(3102);
  std::uniform_int_distribution<Natural> pick(10'000'000, 100'000'000);
  for (int i = 0; i < 10; ++i) points.push_back(pick(rng));
  std::sort(points.begin(), points.end());
  points.erase(std::unique(points.begin(), points.end()), points.end());
  EXPECT_EQ(sqfc::testing::compare_with_table_engine(points, 2), static_cast<int>(points.size()))
      << sqfc::testing::seed_note();
}

}  // namespace
