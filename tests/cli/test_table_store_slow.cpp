// SPDX-License-Identifier: MIT
// Many SIGKILL points across longer `sqfc table --store` runs, each resumed: the final table,
// events and manifest equal those of an uninterrupted run (helpers in store_kill_support.hpp).
#include <gtest/gtest.h>

#include "cli/store_kill_support.hpp"
#include "oracles/test_support.hpp"

namespace {

using namespace sqfc::cli_test;

TEST(TableStoreSlow, TwelveKillsAcrossARunTo1e9) {
  auto rng = sqfc::testing::test_rng(81);
  std::vector<unsigned long long> points;
  const int kills = 12 * static_cast<int>(sqfc::testing::test_multiplier());
  for (int i = 0; i < kills; ++i) points.push_back(1 + rng() % 1'000'000'000ULL);
  const int inside = kill_resume_and_compare("1e9", points, 82);
  // Kill points are n values; a kill can only miss when two points fall in one segment's time.
  EXPECT_GE(inside, kills / 2) << sqfc::testing::seed_note();
}

TEST(TableStoreSlow, KillsRightAfterCommitsOfShortRuns) {
  // Many short runs killed with no extra delay: the kill lands just after a commit.
  auto rng = sqfc::testing::test_rng(83);
  int inside = 0;
  for (int run = 0; run < 4; ++run) {
    std::vector<unsigned long long> points;
    for (int i = 0; i < 3; ++i) points.push_back(1 + rng() % 100'000'000ULL);
    inside += kill_resume_and_compare("1e8", points, 84 + static_cast<unsigned>(run));
  }
  EXPECT_GE(inside, 6) << sqfc::testing::seed_note();
}

}  // namespace
