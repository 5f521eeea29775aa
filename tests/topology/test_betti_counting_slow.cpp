// SPDX-License-Identifier: MIT
// Slow check of topology/betti_counting: counting against the direct Z/2 homology of K_n
// (tests/oracles/brute_force.hpp) for every n up to 3000.
#include <gtest/gtest.h>

#include "topology/betti_test_support.hpp"

namespace {

TEST(BettiCountingSlow, MatchesDirectHomologyForEveryNUpTo3000) {
  EXPECT_EQ(sqfc::testing::compare_counting_with_homology(3000), 3000U);
}

}  // namespace
