// SPDX-License-Identifier: MIT
// Envelopes built during a run against a per-n walk (tests/oracles/envelope_naive.hpp) over
// several N, widths, block sizes, thread counts, --from values, linear and log columns.
#include <gtest/gtest.h>

#include <string>

#include "oracles/envelope_naive.hpp"
#include "oracles/squarefree_enumeration.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/track/envelope.hpp"
#include "track/table_engine_support.hpp"

namespace sqfc::testing {
namespace {

using track::EnvelopeAxis;
using track::SeriesExtremes;

::testing::AssertionResult same(const SeriesExtremes& got, const oracles::NaiveExtremes& want, const std::string& what) {
  if (got.first == want.first && got.last == want.last && got.min == want.min && got.max == want.max &&
      got.min_n == want.min_n && got.max_n == want.max_n)
    return ::testing::AssertionSuccess();
  return ::testing::AssertionFailure() << what << ": got first " << got.first << " last " << got.last << " min " << got.min
                                       << "@" << got.min_n << " max " << got.max << "@" << got.max_n << "; want first "
                                       << want.first << " last " << want.last << " min " << want.min << "@" << want.min_n
                                       << " max " << want.max << "@" << want.max_n;
}

// Runs the engine with an envelope and compares every column and series with the walk.
// Returns the number of (column, series) pairs compared.
int compare_run(Natural to, Natural from, unsigned width, bool log_x, std::size_t block, unsigned threads, bool betti = true) {
  auto o = options(to, from, threads, block, 4 * block + 3 * 1024, track::SampleSchedule(from, to, std::nullopt, {to}, std::nullopt, false));
  o.envelope = track::EnvelopeOptions{from, to, width, log_x, betti};
  const auto run = run_engine(o);
  EXPECT_TRUE(run.report.all_checks_passed());
  const auto& env = *run.report.envelope;
  const EnvelopeAxis axis(from, to, width, log_x);
  const auto omega = oracles::squarefree_omega_table_dfs(to);
  const auto want = oracles::envelope_naive(omega, axis.boundaries());
  EXPECT_EQ(env.columns.size(), want.size());
  int compared = 0;
  const std::string where = "N=" + std::to_string(to) + " from=" + std::to_string(from) + " W=" + std::to_string(width) +
                            (log_x ? " log" : " linear") + " block=" + std::to_string(block);
  for (std::size_t c = 0; c < std::min(env.columns.size(), want.size()); ++c) {
    const auto& g = env.columns[c];
    const auto& w = want[c];
    const std::string at = where + " column " + std::to_string(c) + " [" + std::to_string(w.lo) + "," + std::to_string(w.hi) + ") ";
    EXPECT_EQ(g.lo, w.lo) << at;
    EXPECT_EQ(g.hi, w.hi) << at;
    EXPECT_TRUE(same(g.mertens, w.mertens, at + "M"));
    EXPECT_TRUE(same(g.scaled, w.scaled, at + "M/sqrt(n)"));
    EXPECT_TRUE(same(g.squarefree, w.squarefree, at + "Q"));
    EXPECT_TRUE(same(g.fredholm, w.fredholm, at + "D"));
    compared += 4;
    for (int d = 0; d < 8; ++d) {
      EXPECT_TRUE(same(g.faces[d], w.faces[d], at + "f" + std::to_string(d)));
      if (betti) {
        EXPECT_TRUE(same(g.betti[d], w.betti[d], at + "b" + std::to_string(d)));
      } else {
        EXPECT_EQ(g.betti[d], SeriesExtremes{}) << at;  // not built: left zero
      }
      compared += 2;
    }
  }
  return compared;
}

TEST(Envelope, AxisBoundariesAreStrictlyIncreasingAndCoverTheRange) {
  int checked = 0;
  for (const bool log_x : {false, true}) {
    for (const Natural first : {Natural{1}, Natural{7}, Natural{1000}}) {
      for (const Natural last : {Natural{1000}, Natural{1001}, Natural{123457}}) {
        for (const unsigned width : {1U, 2U, 37U, 1200U}) {
          const EnvelopeAxis a(first, last, width, log_x);
          const auto& b = a.boundaries();
          ASSERT_EQ(b.front(), first);
          ASSERT_EQ(b.back(), last + 1);
          ASSERT_LE(a.columns(), width);
          for (std::size_t i = 1; i < b.size(); ++i) ASSERT_LT(b[i - 1], b[i]);
          // linear columns: as many as asked while there are enough values
          if (!log_x && last - first + 1 >= width) {
            EXPECT_EQ(a.columns(), width);
          }
          for (std::size_t i = 0; i + 1 < b.size(); ++i) EXPECT_EQ(a.next_boundary_after(b[i]), b[i + 1]);
          EXPECT_EQ(a.next_boundary_after(last + 1), 0U);
          ++checked;
        }
      }
    }
  }
  EXPECT_EQ(checked, 72);
  EXPECT_THROW(EnvelopeAxis(0, 10, 3, false), InvalidArgument);
  EXPECT_THROW(EnvelopeAxis(5, 4, 3, false), InvalidArgument);
  EXPECT_THROW(EnvelopeAxis(1, 4, 0, false), InvalidArgument);
}

TEST(Envelope, LinearColumnsMatchTheWalk) {
  int compared = 0;
  compared += compare_run(100'000, 1, 300, false, 1024, 2);
  compared += compare_run(100'000, 1, 7, false, 4096, 1);
  compared += compare_run(50'000, 1, 50'000, false, 1024, 2);  // one n per column
  compared += compare_run(1000, 1, 1, false, 1024, 1);
  EXPECT_EQ(compared, (300 + 7 + 50'000 + 1) * 20);
}

TEST(Envelope, LogColumnsMatchTheWalk) {
  int compared = 0;
  compared += compare_run(200'000, 1, 400, true, 1024, 2);
  compared += compare_run(100'000, 1, 1200, true, 2048, 2);
  compared += compare_run(3, 1, 10, true, 1024, 1);
  EXPECT_GT(compared, 400 * 20);
}

TEST(Envelope, FromValueStartsTheFirstColumn) {
  int compared = 0;
  compared += compare_run(80'000, 12'345, 111, false, 1024, 2);
  compared += compare_run(80'000, 999, 64, true, 1024, 2);
  EXPECT_GT(compared, 100 * 20);
}

TEST(Envelope, WithoutBettiTheOtherSeriesComeFromScans) {
  int compared = 0;
  compared += compare_run(100'000, 1, 300, false, 1024, 2, false);
  compared += compare_run(100'000, 1, 20, false, 4096, 2, false);  // pieces inside long columns
  compared += compare_run(60'000, 501, 500, true, 1024, 1, false);
  EXPECT_GT(compared, 500 * 20);
}

TEST(Envelope, ScansOnlyPartOfALongRun) {
  // 10^6 over 100 columns: the targeted scans visit much less than every n.
  auto o = options(1'000'000, 1, 2, 1 << 14, 1 << 16, track::SampleSchedule(1, 1'000'000, std::nullopt, {1'000'000}, std::nullopt, false));
  o.envelope = track::EnvelopeOptions{1, 1'000'000, 100, false, true};
  const auto run = run_engine(o);
  ASSERT_TRUE(run.report.envelope);
  EXPECT_EQ(run.report.envelope->columns.size(), 100U);
  EXPECT_LT(run.report.envelope->scanned_values, 1'000'000U);
  EXPECT_EQ(run.report.envelope->columns.back().mertens.last, 212);  // M(10^6) = 212, OEIS A084237
}

}  // namespace
}  // namespace sqfc::testing
