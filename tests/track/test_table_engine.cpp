// SPDX-License-Identifier: MIT
// Tests of track/table_engine: published values, rows against a tracker stepped over
// trial-division codes, identical output for every thread count, block size and segment
// size, runs from A > 1, edges of blocks and segments, preconditions and the run report.
#include "sqfc/track/table_engine.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/published_csv.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"
#include "track/collecting_sink.hpp"
#include "track/table_engine_support.hpp"

namespace {

using sqfc::Count;
using sqfc::Natural;
using sqfc::track::SampleSchedule;
using sqfc::track::TableRow;
using sqfc::track::TableRunOptions;
using sqfc::track::TrackerState;
namespace oracles = sqfc::oracles;
namespace track = sqfc::track;
using namespace sqfc::testing;

TEST(TableEngine, PublishedValuesAtPowersOfTen) {
  // M(10^k) (OEIS A084237), Q(10^k) (OEIS A071172), L(10^k) (OEIS A090410) for k <= 8 from
  // tests/data; k = 9 in test_table_engine_slow.cpp.
  EXPECT_EQ(check_powers_of_ten(8, 2), 9);
}

TEST(TableEngine, PublishedValuesUpTo100) {
  // M(n) (OEIS A002321) and L(n) (OEIS A002819) for every n <= 100, checked against trial
  // division too, so the tables and the engine are tested against each other and an oracle.
  const auto mertens = oracles::read_published_csv(data_path("mertens_small.csv"));
  const auto liouville = oracles::read_published_csv(data_path("liouville_small.csv"));
  ASSERT_EQ(mertens.rows.size(), 100U);
  ASSERT_EQ(liouville.rows.size(), 100U);
  const auto prefix = oracles::prefix_naive(100);
  const auto run = run_engine(options(100, 1, 1, 1024, 1024, SampleSchedule(1, 100, Natural{1}, {}, std::nullopt, false)));
  ASSERT_EQ(run.sink.rows.size(), 100U);
  int checked = 0;
  for (std::size_t r = 0; r < 100; ++r) {
    const auto n = static_cast<Natural>(mertens.integer(r, "n"));
    ASSERT_EQ(static_cast<Natural>(liouville.integer(r, "n")), n);
    const TableRow& row = run.sink.rows[n - 1];
    ASSERT_EQ(row.n, n);
    EXPECT_EQ(row.mertens, mertens.integer(r, "value")) << n << " (" << mertens.text(r, "source") << ")";
    EXPECT_EQ(row.liouville, liouville.integer(r, "value")) << n << " (" << liouville.text(r, "source") << ")";
    EXPECT_EQ(prefix.mertens[n], mertens.integer(r, "value")) << n;
    EXPECT_EQ(prefix.liouville[n], liouville.integer(r, "value")) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 100);
}

TEST(TableEngine, EveryRowMatchesAStepTrackerOnTrialDivisionCodes) {
  const Natural to = 30'000;
  const auto run = run_engine(options(to, 1, 2, 1024, 3 * 1024 + 5, SampleSchedule(1, to, Natural{1}, {}, std::nullopt, false)));
  const auto expected = stepped_rows(to, [](Natural) { return true; });
  ASSERT_EQ(run.sink.rows.size(), expected.size());
  Count checked = 0;
  for (std::size_t i = 0; i < expected.size(); ++i) {
    ASSERT_TRUE(same_row(run.sink.rows[i], expected[i])) << "n = " << expected[i].n;
    ++checked;
  }
  EXPECT_EQ(checked, to);
  EXPECT_EQ(run.report.rows, to);
  EXPECT_EQ(run.report.final_state, stepped_state(to));
}

TEST(TableEngine, IdenticalOutputForEveryThreadCountBlockAndSegmentSize) {
  // Threads 1..3 x block sizes 2^10..2^17 x three segment sizes (one block, a segment that
  // ends inside a block, 2^20); rows, events, final state and counts must all be identical.
  const Natural to = 200'003;
  const auto schedule = [&] { return SampleSchedule(1, to, Natural{1009}, {1023, 1024, 1025, 65536, 131071}, 7U, true); };
  const auto reference = run_engine(options(to, 1, 1, 1024, 1024, schedule(), true));
  ASSERT_GT(reference.sink.rows.size(), 150U);
  ASSERT_GT(reference.sink.events.size(), 50U);
  int configurations = 0;
  for (unsigned threads = 1; threads <= 3; ++threads) {
    for (int log_block = 10; log_block <= 17; ++log_block) {
      const std::size_t block = std::size_t{1} << log_block;
      for (const Natural segment : {Natural{block}, Natural{3 * block + 17}, Natural{1} << 20}) {
        const auto run = run_engine(options(to, 1, threads, block, std::max<Natural>(segment, block), schedule(), true));
        const std::string what = "threads " + std::to_string(threads) + " block " + std::to_string(block) + " segment " +
                                 std::to_string(segment);
        ASSERT_TRUE(same_rows(run.sink.rows, reference.sink.rows)) << what;
        ASSERT_EQ(run.sink.events, reference.sink.events) << what;
        ASSERT_EQ(run.report.final_state, reference.report.final_state) << what;
        ASSERT_EQ(run.report.rows, reference.report.rows) << what;
        ASSERT_EQ(run.report.events, reference.report.events) << what;
        ASSERT_TRUE(run.report.all_checks_passed()) << what;
        ++configurations;
      }
    }
  }
  EXPECT_EQ(configurations, 72);
  // And the reference itself is right: its rows against the stepped tracker.
  std::vector<Natural> wanted;
  for (const auto& r : reference.sink.rows) wanted.push_back(r.n);
  const auto expected = stepped_rows(to, [&](Natural n) { return std::binary_search(wanted.begin(), wanted.end(), n); });
  EXPECT_TRUE(same_rows(reference.sink.rows, expected));
}

TEST(TableEngine, RunFromAGivesTheValuesOfARunFromOne) {
  const Natural to = 150'000;
  const auto schedule = [&](Natural from) { return SampleSchedule(from, to, Natural{997}, {1024, 4096, 4097}, 5U, true); };
  const auto full = run_engine(options(to, 1, 2, 1024, 4096, schedule(1), true));
  int checked = 0;
  for (const Natural from : {Natural{2}, Natural{3}, Natural{1023}, Natural{1024}, Natural{1025}, Natural{4097},
                             Natural{99'999}, Natural{to - 1}, Natural{to}}) {
    const auto run = run_engine(options(to, from, 2, 1024, 4096, schedule(from), true));
    std::vector<TableRow> rows;
    for (const auto& r : full.sink.rows)
      if (r.n >= from) rows.push_back(r);
    std::vector<track::Event> events;
    for (const auto& e : full.sink.events)
      if (e.n >= from) events.push_back(e);
    EXPECT_TRUE(same_rows(run.sink.rows, rows)) << "from " << from;
    EXPECT_EQ(run.sink.events, events) << "from " << from;
    EXPECT_EQ(run.report.final_state, full.report.final_state) << "from " << from;
    EXPECT_EQ(run.report.rows, rows.size()) << "from " << from;
    EXPECT_FALSE(run.sink.rows.empty());
    ++checked;
  }
  EXPECT_EQ(checked, 9);
}

TEST(TableEngine, NoRowBeforeFromWhateverTheSchedule) {
  // table_engine.hpp: "Rows and events for n < from are not reported", for any schedule in
  // the options. Regression, smallest failing input: N = 2, from = 2 and a schedule built
  // from 1 with the point 1 reports the row n = 1.
  int checked = 0;
  for (const auto& [to, from, every] : {std::tuple<Natural, Natural, Natural>{2, 2, 1}, {10'000, 500, 100}, {10'000, 4097, 1}}) {
    const auto run = run_engine(options(to, from, 2, 1024, 2048, SampleSchedule(1, to, every, {}, std::nullopt, true), true));
    Count early_rows = 0, early_events = 0;
    for (const auto& r : run.sink.rows) early_rows += r.n < from;
    for (const auto& e : run.sink.events) early_events += e.n < from;
    EXPECT_EQ(early_rows, 0U) << "N = " << to << ", from = " << from;
    EXPECT_EQ(early_events, 0U) << "N = " << to << ", from = " << from;
    ++checked;
  }
  EXPECT_EQ(checked, 3);
}

TEST(TableEngine, ValuesAtBlockAndSegmentEdges) {
  // Block 2^10, segment 5 blocks: rows at every k * 1024 + {-1, 0, 1}, every segment edge,
  // n = 1 and n = N, against the stepped tracker. N is one past a block edge.
  const Natural block = 1024, segment = 5 * block, to = 40 * block + 1;
  std::vector<Natural> at = {1, to};
  for (Natural k = 1; k * block <= to; ++k)
    for (const Natural n : {k * block - 1, k * block, k * block + 1}) at.push_back(n);
  const auto run = run_engine(options(to, 1, 3, block, segment, SampleSchedule(1, to, std::nullopt, at, std::nullopt, false)));
  std::sort(at.begin(), at.end());
  at.erase(std::unique(at.begin(), at.end()), at.end());
  const auto expected = stepped_rows(to, [&](Natural n) { return std::binary_search(at.begin(), at.end(), n); });
  ASSERT_EQ(expected.size(), at.size());
  ASSERT_EQ(run.sink.rows.size(), at.size());
  Count checked = 0;
  for (std::size_t i = 0; i < at.size(); ++i) {
    EXPECT_TRUE(same_row(run.sink.rows[i], expected[i])) << "n = " << at[i];
    ++checked;
  }
  EXPECT_EQ(checked, 3 * 40 + 1);  // 3 per block edge and n = 1 (N = 40 * 1024 + 1 is the last "+1")
  EXPECT_EQ(run.sink.rows.front().n, 1U);
  EXPECT_EQ(run.sink.rows.back().n, to);
}

TEST(TableEngine, TinyRuns) {
  // N = 1 (only the empty complex), N = 2 and N = 3, with events.
  int checked = 0;
  for (const Natural to : {Natural{1}, Natural{2}, Natural{3}}) {
    const auto run = run_engine(options(to, 1, 2, 1024, 1024, SampleSchedule(1, to, Natural{1}, {}, std::nullopt, true), true));
    EXPECT_TRUE(same_rows(run.sink.rows, stepped_rows(to, [](Natural) { return true; }))) << to;
    EXPECT_EQ(run.report.final_state.n(), to);
    EXPECT_EQ(run.report.blocks, 1U);
    ++checked;
  }
  const auto one = run_engine(options(1, 1, 1, 1024, 1024, SampleSchedule(1, 1, std::nullopt, {}, std::nullopt, true), true));
  ASSERT_EQ(one.sink.rows.size(), 1U);
  EXPECT_EQ(one.sink.rows[0].euler, 0);  // K_1 is empty
  EXPECT_TRUE(one.sink.events.empty());  // no n >= 2 yet
  EXPECT_EQ(checked, 3);
}

TEST(TableEngine, NoSamplesMeansNoRowsButTheFinalState) {
  const Natural to = 100'000;
  const auto run = run_engine(options(to, 1, 2, 1 << 12, 1 << 14, SampleSchedule()));
  EXPECT_TRUE(run.sink.rows.empty());
  EXPECT_TRUE(run.sink.events.empty());
  EXPECT_EQ(run.report.rows, 0U);
  EXPECT_EQ(run.report.scanned_blocks, 0U);  // nothing needs the per-n pass
  EXPECT_EQ(run.report.final_state, stepped_state(to));
}

TEST(TableEngine, ReportCountsAndChecks) {
  const Natural to = 100'000, block = 2048, segment = 3 * block + 100;
  const auto run = run_engine(options(to, 1, 2, block, segment, SampleSchedule(1, to, Natural{333}, {}, std::nullopt, true), true));
  // Blocks: each segment [s, s + segment) is cut into blocks of `block` values.
  Count blocks = 0;
  for (Natural lo = 1; lo <= to; lo += segment) {
    const Natural length = std::min<Natural>(segment, to + 1 - lo);
    blocks += (length + block - 1) / block;
  }
  EXPECT_EQ(run.report.blocks, blocks);
  EXPECT_EQ(run.report.rows, run.sink.rows.size());
  EXPECT_EQ(run.report.rows, to / 333 + 1);
  EXPECT_EQ(run.report.events, run.sink.events.size());
  EXPECT_LE(run.report.scanned_blocks, run.report.blocks);
  ASSERT_EQ(run.report.checks.size(), 4U);
  int checked = 0;
  for (const auto& c : run.report.checks) {
    EXPECT_EQ(c.failed, 0U) << c.name;
    EXPECT_EQ(c.first_failure, 0U) << c.name;
    EXPECT_FALSE(c.statement.empty()) << c.name;
    EXPECT_EQ(c.passed, c.name == "block_rescan" ? run.report.scanned_blocks : run.report.rows) << c.name;
    ++checked;
  }
  EXPECT_EQ(checked, 4);
  EXPECT_TRUE(run.report.all_checks_passed());
}

TEST(TableEngine, PreconditionsThrowInvalidArgument) {
  CollectingSink sink;
  const SampleSchedule none;
  const TableRunOptions bad[] = {
      options(0, 1, 1, 1024, 1024, none),                              // N = 0
      options(sqfc::config::max_sieve_n + 1, 1, 1, 1024, 1 << 22, none),  // N above the range
      options(100, 0, 1, 1024, 1024, none),                            // from = 0
      options(100, 101, 1, 1024, 1024, none),                          // from > N
      options(100, 1, 0, 1024, 1024, none),                            // no threads
      options(100'000, 1, 1, 4096, 2048, none),                        // segment < block
      options(100'000, 1, 1, 512, 512, none),                          // block below 2^10 (the sieve's bound)
  };
  int checked = 0;
  for (const auto& o : bad) {
    EXPECT_THROW(static_cast<void>(track::run_table(o, sink)), sqfc::InvalidArgument) << "case " << checked;
    ++checked;
  }
  EXPECT_EQ(checked, 7);
  EXPECT_TRUE(sink.rows.empty());
}

TEST(TableEngine, SinkExceptionStopsTheRun) {
  struct Refusal : std::runtime_error {
    Refusal() : std::runtime_error("sink refuses") {}
  };
  class RefusingSink : public track::TableSink {
   public:
    void on_row(const TableRow&) override {
      if (++rows == 3) throw Refusal();
    }
    void on_event(const track::Event&) override {}
    int rows = 0;
  };
  int checked = 0;
  for (const unsigned threads : {1U, 2U, 3U}) {
    RefusingSink sink;
    auto o = options(200'000, 1, threads, 1024, 4096, SampleSchedule(1, 200'000, Natural{1000}, {}, std::nullopt, false));
    EXPECT_THROW(static_cast<void>(track::run_table(o, sink)), Refusal) << threads;
    EXPECT_EQ(sink.rows, 3) << threads;  // no row after the refusal
    ++checked;
  }
  EXPECT_EQ(checked, 3);
}

TEST(TableEngine, ProgressIsMonotoneAndEndsAtN) {
  const Natural to = 50'000;
  CollectingSink sink;
  std::vector<Natural> done;
  bool totals_right = true;
  const auto report = track::run_table(options(to, 1, 2, 1024, 4096, SampleSchedule()), sink, [&](Natural d, Natural total) {
    done.push_back(d);
    totals_right = totals_right && total == to;
  });
  ASSERT_FALSE(done.empty());
  EXPECT_TRUE(totals_right);
  EXPECT_TRUE(std::is_sorted(done.begin(), done.end()));
  EXPECT_EQ(done.back(), to);
  EXPECT_EQ(done.size(), report.blocks);
}

}  // namespace
