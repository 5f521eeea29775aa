// SPDX-License-Identifier: MIT
// Tests of the engine's checkpoint hooks: a run resumed from any segment checkpoint, and a run
// whose segments are dealt to several ranks, emit exactly the rows, events and report of one
// uninterrupted run (the reference is the engine itself, cross-checked against trial division
// by test_table_engine.cpp).
#include <gtest/gtest.h>

#include <map>
#include <random>
#include <vector>

#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/track/table_engine.hpp"
#include "track/table_engine_support.hpp"

namespace {

using sqfc::Natural;
using sqfc::track::Event;
using sqfc::track::RunCheckpoint;
using sqfc::track::SampleSchedule;
using sqfc::track::SegmentCommit;
using sqfc::track::TableRow;

// Keeps every row and event, and per segment the checkpoint after it and what it emitted.
class SegmentSink : public sqfc::testing::CollectingSink {
 public:
  void on_segment_committed(const SegmentCommit& c) override {
    ASSERT_NE(c.after, nullptr);
    ASSERT_EQ(c.after->total.hi, c.hi);
    checkpoints[c.index] = *c.after;
    segment_rows[c.index] = std::vector<TableRow>(rows.begin() + static_cast<long>(row_mark), rows.end());
    segment_events[c.index] = std::vector<Event>(events.begin() + static_cast<long>(event_mark), events.end());
    row_mark = rows.size();
    event_mark = events.size();
    std::size_t scanned = 0;
    for (auto s : *c.scanned) scanned += s;
    scanned_per_segment[c.index] = scanned;
  }
  std::map<Natural, RunCheckpoint> checkpoints;
  std::map<Natural, std::vector<TableRow>> segment_rows;
  std::map<Natural, std::vector<Event>> segment_events;
  std::map<Natural, std::size_t> scanned_per_segment;
  std::size_t row_mark = 0, event_mark = 0;
};

constexpr Natural kTo = 60'000;
constexpr std::size_t kBlock = 1024;
constexpr Natural kSegment = 4096;

sqfc::track::TableRunOptions small_options(unsigned threads) {
  auto o = sqfc::testing::options(kTo, 1, threads, kBlock, kSegment,
                                  SampleSchedule(1, kTo, Natural{997}, {1, 2, 4096, 4097, 8192}, 10U, true), true);
  return o;
}

TEST(TableEngineResume, EveryCheckpointResumesToTheSameRun) {
  SegmentSink full;
  const auto full_report = sqfc::track::run_table(small_options(2), full);
  const Natural segments = (kTo + kSegment - 1) / kSegment;
  ASSERT_EQ(full.checkpoints.size(), segments);
  ASSERT_TRUE(full_report.all_checks_passed());
  std::size_t resumed = 0;
  for (const auto& [g, checkpoint] : full.checkpoints) {
    auto o = small_options(1 + static_cast<unsigned>(g % 2));
    o.resume_from = checkpoint;
    SegmentSink part;
    const auto report = sqfc::track::run_table(o, part);
    // Rows and events after the checkpoint are those of the full run after it.
    std::vector<TableRow> want_rows;
    std::vector<Event> want_events;
    for (Natural h = g + 1; h < segments; ++h) {
      want_rows.insert(want_rows.end(), full.segment_rows[h].begin(), full.segment_rows[h].end());
      want_events.insert(want_events.end(), full.segment_events[h].begin(), full.segment_events[h].end());
    }
    ASSERT_TRUE(sqfc::testing::same_rows(part.rows, want_rows)) << "resumed after segment " << g;
    ASSERT_EQ(part.events, want_events) << "resumed after segment " << g;
    EXPECT_EQ(report.final_state, full_report.final_state);
    EXPECT_EQ(report.rows, full_report.rows);
    EXPECT_EQ(report.events, full_report.events);
    EXPECT_EQ(report.blocks, full_report.blocks);
    EXPECT_EQ(report.scanned_blocks, full_report.scanned_blocks);
    ASSERT_EQ(report.checks.size(), full_report.checks.size());
    for (std::size_t i = 0; i < report.checks.size(); ++i) EXPECT_EQ(report.checks[i].passed, full_report.checks[i].passed);
    ++resumed;
  }
  EXPECT_EQ(resumed, segments);
}

TEST(TableEngineResume, CheckpointStateEqualsSteppedState) {
  SegmentSink full;
  (void)sqfc::track::run_table(small_options(2), full);
  std::size_t compared = 0;
  for (const auto& [g, c] : full.checkpoints) {
    const Natural n = c.total.hi - 1;
    EXPECT_EQ(c.state(), sqfc::testing::stepped_state(n)) << "n = " << n;
    ++compared;
    if (compared == 4) break;  // trial division is slow; four segments cover the boundary cases
  }
  EXPECT_EQ(compared, 4U);
}

TEST(TableEngineResume, ResumePointOffTheSegmentGridIsRefused) {
  SegmentSink full;
  (void)sqfc::track::run_table(small_options(1), full);
  auto o = small_options(1);
  RunCheckpoint c = full.checkpoints.at(0);
  c.total.hi -= 1;  // n = 4095 is not a segment boundary
  o.resume_from = c;
  SegmentSink part;
  EXPECT_THROW((void)sqfc::track::run_table(o, part), sqfc::InvalidArgument);
}

// Segments dealt round-robin to K ranks: each rank, given the checkpoints the others would send,
// emits exactly the full run's rows and events for its own segments, in order.
TEST(TableEngineResume, DealtSegmentsMatchTheSingleRun) {
  SegmentSink full;
  const auto full_report = sqfc::track::run_table(small_options(2), full);
  const Natural segments = full.checkpoints.size();
  std::size_t checked = 0;
  for (unsigned ranks : {2U, 3U, 5U}) {
    for (unsigned rank = 0; rank < ranks; ++rank) {
      auto o = small_options(2);
      o.ranks = ranks;
      o.rank = rank;
      Natural awaited = 0;
      o.await_checkpoint = [&](Natural g) {
        ++awaited;
        return full.checkpoints.at(g - 1);
      };
      SegmentSink part;
      const auto report = sqfc::track::run_table(o, part);
      for (Natural g = 0; g < segments; ++g) {
        if (g % ranks != rank) {
          EXPECT_EQ(part.checkpoints.count(g), 0U);
          continue;
        }
        ASSERT_EQ(part.checkpoints.count(g), 1U) << "ranks " << ranks << " rank " << rank << " segment " << g;
        EXPECT_EQ(part.checkpoints.at(g), full.checkpoints.at(g));
        EXPECT_TRUE(sqfc::testing::same_rows(part.segment_rows.at(g), full.segment_rows.at(g)));
        EXPECT_EQ(part.segment_events.at(g), full.segment_events.at(g));
        ++checked;
      }
      if ((segments - 1) % ranks == rank) {
        EXPECT_EQ(report.final_state, full_report.final_state);
      }
      EXPECT_EQ(awaited, part.checkpoints.size() - (rank == 0 ? 1 : 0));
    }
  }
  EXPECT_EQ(checked, 3 * segments);
}

}  // namespace
