// SPDX-License-Identifier: MIT
// Slow checks of track/table_engine: published values at 10^9 and thread-count independence
// at 10^8.
#include <gtest/gtest.h>

#include "track/table_engine_support.hpp"

namespace {

using sqfc::Natural;
using namespace sqfc::testing;

TEST(TableEngineSlow, PublishedValuesAtPowersOfTenTo10To9) {
  // M(10^k) (OEIS A084237), Q(10^k) (OEIS A071172), L(10^k) (OEIS A090410), k = 0..9.
  EXPECT_EQ(check_powers_of_ten(9, 2), 10);
}

TEST(TableEngineSlow, SameResultsForOneAndThreeThreadsTo10To8) {
  const Natural to = 100'000'000;
  const auto schedule = [&] { return sqfc::track::SampleSchedule(1, to, Natural{1'000'003}, {}, 20U, true); };
  const auto one = run_engine(options(to, 1, 1, 1 << 16, 1 << 20, schedule(), true));
  const auto three = run_engine(options(to, 1, 3, 1 << 17, 1 << 22, schedule(), true));
  EXPECT_TRUE(same_rows(one.sink.rows, three.sink.rows));
  EXPECT_EQ(one.sink.events, three.sink.events);
  EXPECT_EQ(one.report.final_state, three.report.final_state);
  // 99 multiples of 1000003; 8 decades of 20 log points and 10^8, less the 11 repeats of the
  // first decade (round(10^(j/20)) takes only the values 1..9 there).
  EXPECT_EQ(one.sink.rows.size(), 99U + (20U * 8U + 1U - 11U));
  EXPECT_TRUE(one.report.all_checks_passed() && three.report.all_checks_passed());
}

}  // namespace
