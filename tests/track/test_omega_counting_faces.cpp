// SPDX-License-Identifier: MIT
// Face counts and Betti numbers of K_x by counting over primes (arith::count_by_omega) against
// the table engine's f-vector and Betti numbers (sieving every n <= x) at 10^6, 10^7 and at
// random x <= 10^7; 10^8 is in the _slow file.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <vector>

#include "oracles/test_support.hpp"
#include "track/omega_counting_faces_support.hpp"

namespace {

using sqfc::Natural;

TEST(OmegaCountingFaces, SameAsTheTableEngineAtPowersOfTenAndRandomX) {
  std::vector<Natural> points = {1, 2, 3, 105, 209, 210, 211, 1'000'000, 10'000'000};
  auto rng = sqfc::testing::test_rng(3101);
  std::uniform_int_distribution<Natural> pick(1, 10'000'000);
  for (int i = 0; i < 12; ++i) points.push_back(pick(rng));
  std::sort(points.begin(), points.end());
  points.erase(std::unique(points.begin(), points.end()), points.end());
  EXPECT_EQ(sqfc::testing::compare_with_table_engine(points, 2), static_cast<int>(points.size()))
      << sqfc::testing::seed_note();
}

}  // namespace
