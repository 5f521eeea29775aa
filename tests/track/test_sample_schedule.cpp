// SPDX-License-Identifier: MIT
// Tests of track/sample_schedule: multiples, explicit lists, log-spaced points, the end point,
// clipping to [from, to], empty schedules and size().
#include "sqfc/track/sample_schedule.hpp"

#include <gmp.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <limits>
#include <optional>
#include <random>
#include <set>
#include <vector>

#include "oracles/test_support.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Count;
using sqfc::Natural;
using sqfc::track::SampleSchedule;

// Every point of a schedule, by walking next_at_or_after from `from`.
std::vector<Natural> walk(const SampleSchedule& s, Natural from) {
  std::vector<Natural> points;
  for (auto p = s.next_at_or_after(from); p; p = s.next_at_or_after(*p + 1)) {
    if (!points.empty() && *p <= points.back()) {
      ADD_FAILURE() << "next_at_or_after is not increasing at " << *p;
      break;
    }
    points.push_back(*p);
  }
  return points;
}

// round(10^(e / k)) exactly: floor((2 * 10^(e/k) + 1) / 2) = (floor((2^k 10^e)^(1/k)) + 1) / 2,
// with the integer k-th root of GMP (reference library). Returns nullopt above 2^64 - 1.
std::optional<Natural> rounded_power_of_ten(unsigned e, unsigned k) {
  mpz_t x;
  mpz_init(x);
  mpz_ui_pow_ui(x, 10, e);
  mpz_mul_2exp(x, x, k);
  mpz_root(x, x, k);
  mpz_add_ui(x, x, 1);
  mpz_fdiv_q_2exp(x, x, 1);
  const bool fits = mpz_sizeinbase(x, 2) <= 64;
  const Natural value = fits ? mpz_get_ui(x) : 0;
  mpz_clear(x);
  return fits ? std::optional<Natural>(value) : std::nullopt;
}

// The log-spaced points of the header's definition, {round(10^(d + j/k))} inside [from, to].
std::set<Natural> log_points(Natural from, Natural to, unsigned k) {
  std::set<Natural> points;
  for (unsigned e = 0;; ++e) {
    const auto p = rounded_power_of_ten(e, k);
    if (!p || *p > to) break;
    if (*p >= from) points.insert(*p);
  }
  return points;
}

TEST(SampleSchedule, EveryGivesTheMultiplesInsideTheRange) {
  int checked = 0;
  for (const auto& [from, to, every] : {std::tuple<Natural, Natural, Natural>{1, 100, 7}, {1, 100, 1}, {5, 50, 5},
                                        {6, 50, 5}, {1, 10, 11}, {13, 13, 13}, {14, 27, 13}, {1, 1, 1}}) {
    const SampleSchedule s(from, to, every, {}, std::nullopt, false);
    std::vector<Natural> expected;
    for (Natural n = from; n <= to; ++n)
      if (n % every == 0) expected.push_back(n);
    EXPECT_EQ(walk(s, from), expected) << from << " " << to << " " << every;
    EXPECT_EQ(s.size(), expected.size()) << from << " " << to << " " << every;
    EXPECT_EQ(s.empty(), expected.empty());
    ++checked;
  }
  EXPECT_EQ(checked, 8);
}

TEST(SampleSchedule, ExplicitListIsSortedUniqueAndClipped) {
  const SampleSchedule s(10, 100, std::nullopt, {100, 5, 50, 10, 50, 101, 0, 9, 99, 1000}, std::nullopt, false);
  EXPECT_EQ(walk(s, 1), (std::vector<Natural>{10, 50, 99, 100}));
  EXPECT_EQ(s.size(), 4U);
  int checked = 0;
  for (const auto& [probe, want] : {std::pair<Natural, std::optional<Natural>>{0, 10}, {10, 10}, {11, 50}, {51, 99},
                                    {100, 100}, {101, std::nullopt}, {5000, std::nullopt}}) {
    EXPECT_EQ(s.next_at_or_after(probe), want) << probe;
    ++checked;
  }
  EXPECT_EQ(checked, 7);
}

TEST(SampleSchedule, LogPointsAreRoundedPowersOfTen) {
  // Exact comparison with round(10^(j/K)) for K = 1..12 and several ranges.
  int checked = 0;
  for (unsigned k = 1; k <= 12; ++k) {
    for (const auto& [from, to] : {std::pair<Natural, Natural>{1, 1'000'000}, {1, 999}, {37, 123'456}, {1, 1}, {2, 9}}) {
      const SampleSchedule s(from, to, std::nullopt, {}, k, false);
      const auto expected = log_points(from, to, k);
      const auto points = walk(s, from);
      EXPECT_EQ(std::vector<Natural>(expected.begin(), expected.end()), points) << "K = " << k << " [" << from << ", " << to << "]";
      EXPECT_EQ(s.size(), expected.size()) << "K = " << k;
      ++checked;
    }
  }
  EXPECT_EQ(checked, 60);
}

TEST(SampleSchedule, LogPointsNearTheTopOfTheRange) {
  // Powers of ten stay exact up to 10^16 = config::max_sieve_n.
  const Natural top = sqfc::config::max_sieve_n;
  int checked = 0;
  // 16 decades of K points and 10^16 itself, less the repeats of the first decade: for K = 10,
  // 10^0.1 and 10^0.3 round to 1 and 2 again and 10^0.5 to 3 again.
  for (const auto& [k, count] : {std::pair<unsigned, Count>{1, 17}, {3, 49}, {10, 158}}) {
    const SampleSchedule s(1, top, std::nullopt, {}, k, false);
    const auto expected = log_points(1, top, k);
    EXPECT_EQ(walk(s, 1), std::vector<Natural>(expected.begin(), expected.end())) << "K = " << k;
    EXPECT_EQ(s.size(), count) << "K = " << k;
    EXPECT_EQ(s.next_at_or_after(top), top);
    ++checked;
  }
  // Examples written out by hand: K = 1 gives the powers of ten, K = 2 adds round(10^(d+1/2)).
  EXPECT_EQ(walk(SampleSchedule(1, 1000, std::nullopt, {}, 1U, false), 1), (std::vector<Natural>{1, 10, 100, 1000}));
  EXPECT_EQ(walk(SampleSchedule(1, 1000, std::nullopt, {}, 2U, false), 1),
            (std::vector<Natural>{1, 3, 10, 32, 100, 316, 1000}));
  EXPECT_EQ(checked, 3);
}

TEST(SampleSchedule, LogPointsAreExactForEveryDensityUpTo40) {
  // Every K = 1..40 over the whole sieve range [1, 10^16] against exact integer roots.
  // Regression, smallest failing input: K = 35, to = 10^16 (`--log 35 --to 1e16`) lists
  // 5907837911587945, but 10^(15 + 27/35) = 5907837911587944.497... (PARI/GP 2.15 at 60
  // digits), so the point is 5907837911587944. K = 38 fails likewise at 7.4e15.
  const Natural top = sqfc::config::max_sieve_n;
  int checked = 0;
  for (unsigned k = 1; k <= 40; ++k) {
    const SampleSchedule s(1, top, std::nullopt, {}, k, false);
    const auto expected = log_points(1, top, k);
    EXPECT_EQ(walk(s, 1), std::vector<Natural>(expected.begin(), expected.end())) << "K = " << k;
    ++checked;
  }
  EXPECT_EQ(checked, 40);
  EXPECT_EQ(rounded_power_of_ten(15 * 35 + 27, 35), 5'907'837'911'587'944ULL);  // the oracle agrees with PARI/GP
  const SampleSchedule s35(1, top, std::nullopt, {}, 35U, false);
  EXPECT_EQ(s35.next_at_or_after(5'907'837'911'587'900ULL), 5'907'837'911'587'944ULL);
}

TEST(SampleSchedule, LogPointsAboveTwoToTheSixtyThree) {
  // The header allows any to >= from. Regression, smallest failing input: from = 1, K = 4,
  // to = round(10^19.25) = 17782794100389228012, the smallest density with a point between
  // 2^63 and 2^64 - 1; that point comes out as 2^63 (a rounding through a signed 64-bit
  // integer) and the schedule then has no point >= 10^19 + 1. K = 1 and 2 have no such point.
  const Natural top = std::numeric_limits<Natural>::max();
  const Natural point = rounded_power_of_ten(19 * 4 + 1, 4).value();
  EXPECT_EQ(point, 17'782'794'100'389'228'012ULL);
  const SampleSchedule smallest(1, point, std::nullopt, {}, 4U, false);
  EXPECT_EQ(smallest.next_at_or_after(10'000'000'000'000'000'001ULL), point);
  EXPECT_EQ(smallest.next_at_or_after((Natural{1} << 63) - 1), 10'000'000'000'000'000'000ULL);  // not 2^63
  int checked = 0;
  for (const unsigned k : {1U, 2U, 4U}) {
    const SampleSchedule s(1, top, std::nullopt, {}, k, false);
    const auto expected = log_points(1, top, k);
    EXPECT_EQ(s.size(), expected.size()) << "K = " << k;
    EXPECT_EQ(s.next_at_or_after(Natural{1} << 63), *expected.lower_bound(Natural{1} << 63)) << "K = " << k;
    ++checked;
  }
  EXPECT_EQ(checked, 3);
}

TEST(SampleSchedule, EndPoint) {
  int checked = 0;
  for (const Natural to : {Natural{1}, Natural{7}, Natural{10}, Natural{1'000'003}}) {
    const SampleSchedule with_end(1, to, std::nullopt, {}, std::nullopt, true);
    EXPECT_EQ(walk(with_end, 1), std::vector<Natural>{to});
    EXPECT_EQ(with_end.size(), 1U);
    // The end point is not counted twice when it is also a multiple or a listed point.
    const SampleSchedule overlap(1, to, Natural{1}, {to}, std::nullopt, true);
    EXPECT_EQ(overlap.size(), to);
    const SampleSchedule no_end(1, to, std::nullopt, {}, std::nullopt, false);
    EXPECT_TRUE(no_end.empty());
    ++checked;
  }
  // from == to: a single point.
  const SampleSchedule single(42, 42, std::nullopt, {}, std::nullopt, true);
  EXPECT_EQ(walk(single, 1), std::vector<Natural>{42});
  EXPECT_EQ(checked, 4);
}

TEST(SampleSchedule, EmptySchedules) {
  int checked = 0;
  const SampleSchedule none;  // default: no points at all
  EXPECT_TRUE(none.empty());
  EXPECT_EQ(none.size(), 0U);
  EXPECT_EQ(none.next_at_or_after(1), std::nullopt);
  ++checked;
  const SampleSchedule nothing(1, 100, std::nullopt, {}, std::nullopt, false);
  const SampleSchedule big_step(1, 100, Natural{101}, {}, std::nullopt, false);
  const SampleSchedule outside(50, 100, std::nullopt, {1, 49, 101}, std::nullopt, false);
  const SampleSchedule between_powers(11, 99, std::nullopt, {}, 1U, false);
  const SampleSchedule no_multiple(21, 29, Natural{10}, {}, std::nullopt, false);
  for (const auto* s : {&nothing, &big_step, &outside, &between_powers, &no_multiple}) {
    EXPECT_TRUE(s->empty());
    EXPECT_EQ(s->size(), 0U);
    EXPECT_TRUE(walk(*s, 1).empty());
    ++checked;
  }
  EXPECT_EQ(checked, 6);
}

TEST(SampleSchedule, RangeClipping) {
  // Points below `from` are dropped from every source; next_at_or_after(n < from) starts at from.
  const SampleSchedule s(95, 1000, Natural{100}, {50, 94, 95, 150, 1001}, 1U, true);
  EXPECT_EQ(walk(s, 1), (std::vector<Natural>{95, 100, 150, 200, 300, 400, 500, 600, 700, 800, 900, 1000}));
  EXPECT_EQ(s.size(), 12U);
  EXPECT_EQ(s.next_at_or_after(1), 95U);
  EXPECT_EQ(s.next_at_or_after(1001), std::nullopt);
  // Multiples of a step close to the 64-bit limit do not wrap.
  const Natural top = sqfc::config::max_sieve_n;
  int checked = 0;
  for (const Natural step : {Natural{3'000'000'000'000'000}, top - 1, top, top / 2}) {
    const SampleSchedule wide(1, top, step, {}, std::nullopt, false);
    std::vector<Natural> expected;
    for (Natural m = step; m <= top; m += step) expected.push_back(m);
    EXPECT_EQ(walk(wide, 1), expected) << step;
    EXPECT_EQ(wide.size(), expected.size()) << step;
    const auto last = std::lower_bound(expected.begin(), expected.end(), top - 1);
    EXPECT_EQ(wide.next_at_or_after(top - 1), last == expected.end() ? std::nullopt : std::optional<Natural>(*last)) << step;
    ++checked;
  }
  EXPECT_EQ(checked, 4);
}

TEST(SampleSchedule, SizeMatchesWalkOnRandomSchedules) {
  auto rng = sqfc::testing::test_rng(21);
  const Count trials = 300 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    const Natural from = std::uniform_int_distribution<Natural>(1, 3000)(rng);
    const Natural to = from + std::uniform_int_distribution<Natural>(0, 20000)(rng);
    std::optional<Natural> every;
    if (rng() % 2) every = std::uniform_int_distribution<Natural>(1, 2000)(rng);
    std::vector<Natural> at;
    const int listed = static_cast<int>(rng() % 30);
    for (int i = 0; i < listed; ++i) at.push_back(std::uniform_int_distribution<Natural>(0, to + 100)(rng));
    std::optional<unsigned> per_decade;
    if (rng() % 2) per_decade = std::uniform_int_distribution<unsigned>(1, 20)(rng);
    const bool end = rng() % 2;
    const SampleSchedule s(from, to, every, at, per_decade, end);
    // The union by brute force.
    std::set<Natural> expected;
    if (every)
      for (Natural n = from; n <= to; ++n)
        if (n % *every == 0) expected.insert(n);
    for (const Natural a : at)
      if (a >= from && a <= to) expected.insert(a);
    if (per_decade)
      for (const Natural p : log_points(from, to, *per_decade)) expected.insert(p);
    if (end) expected.insert(to);
    const auto points = walk(s, 1);
    ASSERT_EQ(points, std::vector<Natural>(expected.begin(), expected.end())) << "trial " << t << " " << sqfc::testing::seed_note();
    ASSERT_EQ(s.size(), expected.size()) << "trial " << t << " " << sqfc::testing::seed_note();
    ASSERT_EQ(s.empty(), expected.empty());
    // next_at_or_after at random probes: the least point >= probe.
    for (int probe = 0; probe < 20; ++probe) {
      const Natural n = std::uniform_int_distribution<Natural>(0, to + 10)(rng);
      const auto it = expected.lower_bound(std::max(n, from));
      const auto want = it == expected.end() ? std::nullopt : std::optional<Natural>(*it);
      ASSERT_EQ(s.next_at_or_after(n), want) << "probe " << n << " trial " << t << " " << sqfc::testing::seed_note();
    }
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

TEST(SampleSchedule, PreconditionsThrow) {
  struct Bad {
    Natural from, to;
    std::optional<Natural> every;
    std::optional<unsigned> per_decade;
  };
  const Bad cases[] = {{0, 10, std::nullopt, std::nullopt}, {11, 10, std::nullopt, std::nullopt},
                       {1, 10, Natural{0}, std::nullopt},    {1, 10, std::nullopt, 0U},
                       {1, 10, std::nullopt, 1001U},         {0, 0, std::nullopt, std::nullopt}};
  int checked = 0;
  for (const auto& c : cases) {
    EXPECT_THROW(SampleSchedule(c.from, c.to, c.every, {}, c.per_decade, true), sqfc::InvalidArgument)
        << "case " << checked;
    ++checked;
  }
  EXPECT_EQ(checked, 6);
  // The largest allowed density is accepted.
  EXPECT_NO_THROW(SampleSchedule(1, 1, std::nullopt, {}, 1000U, true));  // largest --log (exact rounding stays cheap)
}

}  // namespace
