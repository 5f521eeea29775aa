// SPDX-License-Identifier: MIT
// Tests of for_each_segment_ordered: coverage, ordered and serialized commits, one segment in
// flight per worker, real parallelism, and propagation of the first exception.
// Expected values: the segment partition of [lo, hi) recomputed in each test by plain arithmetic
// (common practice); no outside data.
#include "sqfc/arith/parallel_segments.hpp"

#include <gtest/gtest.h>

#include <atomic>
#include <chrono>
#include <condition_variable>
#include <cstdint>
#include <limits>
#include <memory>
#include <mutex>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::for_each_segment_ordered;
constexpr Natural u64_max = std::numeric_limits<Natural>::max();

// Everything one run records. Slots are atomics so that a broken implementation shows up as
// a failed check rather than a data race.
struct Recorder {
  explicit Recorder(Natural segment_count, unsigned threads)
      : work_count(segment_count), work_worker(segment_count), work_lo(segment_count), work_hi(segment_count),
        commit_order(segment_count + 1), outstanding(threads) {
    for (auto& w : work_worker) w = -1;
    for (auto& o : outstanding) o = -1;
  }
  std::vector<std::atomic<int>> work_count;
  std::vector<std::atomic<int>> work_worker;
  std::vector<std::atomic<Natural>> work_lo, work_hi;
  std::vector<std::atomic<Natural>> commit_order;
  std::vector<std::atomic<std::int64_t>> outstanding;  // per worker: segment worked, not committed
  std::atomic<Natural> commits{0};
  std::atomic<bool> in_commit{false};
  std::atomic<int> violations{0};  // overlapping commits, bad worker ids, two segments in flight
  std::atomic<int> wrong_worker_commits{0};

  void on_work(unsigned worker, Natural s, Natural seg_lo, Natural seg_hi) {
    if (worker >= outstanding.size() || s >= work_count.size()) {
      ++violations;
      return;
    }
    if (outstanding[worker].exchange(static_cast<std::int64_t>(s)) != -1) ++violations;
    ++work_count[s];
    work_worker[s] = static_cast<int>(worker);
    work_lo[s] = seg_lo;
    work_hi[s] = seg_hi;
  }
  void on_commit(unsigned worker, Natural s) {
    if (in_commit.exchange(true)) ++violations;
    const Natural position = commits.fetch_add(1);
    if (position < commit_order.size()) commit_order[position] = s;
    if (worker >= outstanding.size()) {
      ++violations;
    } else if (outstanding[worker].exchange(-1) != static_cast<std::int64_t>(s)) {
      ++wrong_worker_commits;
    }
    in_commit = false;
  }
};

Natural segments_of(Natural lo, Natural hi, Natural size) { return hi <= lo ? 0 : (hi - lo - 1) / size + 1; }

TEST(ParallelSegments, EverySegmentOnceCommittedInOrder) {
  struct Range {
    Natural lo, hi;
  };
  const std::vector<Range> ranges = {{0, 1}, {5, 15}, {5, 1006}, {(Natural{1} << 32) - 3, (Natural{1} << 32) + 997}};
  const std::vector<Natural> sizes = {1, 3, 7, 97, 1001, 5000};
  int runs = 0;
  for (unsigned threads = 1; threads <= 4; ++threads) {
    for (const auto& range : ranges) {
      for (const Natural size : sizes) {
        const Natural count = segments_of(range.lo, range.hi, size);
        Recorder rec(count, threads);
        // The commits fold the segment bounds in order: a value that depends on the order.
        Natural fold = 0;
        for_each_segment_ordered(
            range.lo, range.hi, size, threads,
            [&](unsigned w, Natural s, Natural a, Natural b) { rec.on_work(w, s, a, b); },
            [&](unsigned w, Natural s) {
              rec.on_commit(w, s);
              if (s < count) fold = fold * 1000003 + rec.work_lo[s] * 31 + rec.work_hi[s];
            });
        const std::string where = "threads " + std::to_string(threads) + " size " + std::to_string(size) + " range [" +
                                  std::to_string(range.lo) + ", " + std::to_string(range.hi) + ")";
        ASSERT_EQ(rec.commits.load(), count) << where;
        ASSERT_EQ(rec.violations.load(), 0) << where;
        ASSERT_EQ(rec.wrong_worker_commits.load(), 0) << where;
        Natural expected_fold = 0;
        const unsigned worker_count = static_cast<unsigned>(std::min<Natural>(threads, count));
        for (Natural s = 0; s < count; ++s) {
          const Natural seg_lo = range.lo + s * size;
          const Natural seg_hi = std::min(range.hi, seg_lo + size);
          ASSERT_EQ(rec.work_count[s].load(), 1) << where << " segment " << s;
          ASSERT_EQ(rec.commit_order[s].load(), s) << where;
          ASSERT_EQ(rec.work_lo[s].load(), seg_lo) << where << " segment " << s;
          ASSERT_EQ(rec.work_hi[s].load(), seg_hi) << where << " segment " << s;
          ASSERT_LT(static_cast<unsigned>(rec.work_worker[s].load()), worker_count) << where;
          expected_fold = expected_fold * 1000003 + seg_lo * 31 + seg_hi;
        }
        ASSERT_EQ(fold, expected_fold) << where;
        ++runs;
      }
    }
  }
  EXPECT_EQ(runs, 4 * 4 * 6);
}

TEST(ParallelSegments, EmptyRangesAndPreconditions) {
  std::atomic<int> calls{0};
  auto work = [&](unsigned, Natural, Natural, Natural) { ++calls; };
  auto commit = [&](unsigned, Natural) { ++calls; };
  for_each_segment_ordered(10, 10, 3, 2, work, commit);
  for_each_segment_ordered(10, 9, 3, 2, work, commit);
  for_each_segment_ordered(0, 0, 1, 1, work, commit);
  EXPECT_EQ(calls.load(), 0);
  EXPECT_THROW(for_each_segment_ordered(0, 10, 0, 2, work, commit), sqfc::InvalidArgument);
  EXPECT_THROW(for_each_segment_ordered(0, 10, 3, 0, work, commit), sqfc::InvalidArgument);
  EXPECT_THROW(for_each_segment_ordered(10, 10, 0, 1, work, commit), sqfc::InvalidArgument);
  EXPECT_EQ(calls.load(), 0);
  // More threads than segments: only as many workers as segments, ids 0 and 1.
  std::mutex m;
  unsigned max_worker = 0;
  for_each_segment_ordered(
      0, 6, 3, 16,
      [&](unsigned w, Natural, Natural, Natural) {
        std::lock_guard<std::mutex> lock(m);
        max_worker = std::max(max_worker, w);
        ++calls;
      },
      [&](unsigned, Natural) { ++calls; });
  EXPECT_LE(max_worker, 1U);
  EXPECT_EQ(calls.load(), 4);
}

TEST(ParallelSegments, WorkRunsConcurrently) {
  // Segment 0's work waits until segment 1's work has started: it can only finish if two
  // workers run at once. The wait is bounded so that a serial implementation fails instead
  // of hanging.
  for (unsigned threads = 2; threads <= 4; ++threads) {
    std::mutex m;
    std::condition_variable cv;
    bool second_started = false;
    bool timed_out = false;
    for_each_segment_ordered(
        0, 4 * threads, 1, threads,
        [&](unsigned, Natural s, Natural, Natural) {
          std::unique_lock<std::mutex> lock(m);
          if (s == 1) {
            second_started = true;
            cv.notify_all();
          } else if (s == 0) {
            if (!cv.wait_for(lock, std::chrono::seconds(20), [&] { return second_started; })) timed_out = true;
          }
        },
        [](unsigned, Natural) {});
    EXPECT_FALSE(timed_out) << threads << " threads";
    EXPECT_TRUE(second_started);
  }
}

struct SegmentFailure : std::runtime_error {
  SegmentFailure(Natural s, const char* where)
      : std::runtime_error(std::string(where) + " failed at " + std::to_string(s)), segment(s) {}
  Natural segment;
};

TEST(ParallelSegments, AnExceptionFromWorkStopsTheRunAndPropagates) {
  int runs = 0;
  for (unsigned threads = 1; threads <= 4; ++threads) {
    for (const Natural size : {Natural{1}, Natural{3}, Natural{7}}) {
      const Natural lo = 11;
      const Natural hi = lo + 40 * size - size / 2;  // 40 segments, the last one short for size > 1
      const Natural count = segments_of(lo, hi, size);
      ASSERT_EQ(count, 40U);
      for (const Natural bad : {Natural{0}, Natural{1}, Natural{5}, Natural{39}}) {
        Recorder rec(count, threads);
        bool caught = false;
        try {
          for_each_segment_ordered(
              lo, hi, size, threads,
              [&](unsigned w, Natural s, Natural a, Natural b) {
                rec.on_work(w, s, a, b);
                if (s == bad) throw SegmentFailure(s, "work");
              },
              [&](unsigned w, Natural s) { rec.on_commit(w, s); });
        } catch (const SegmentFailure& e) {
          caught = true;
          EXPECT_EQ(e.segment, bad);
          EXPECT_EQ(std::string(e.what()), "work failed at " + std::to_string(bad));
        }
        const std::string where = "threads " + std::to_string(threads) + " size " + std::to_string(size) + " bad " +
                                  std::to_string(bad);
        ASSERT_TRUE(caught) << where;
        EXPECT_EQ(rec.violations.load(), 0) << where;
        // Commits are a prefix 0 .. c-1 of the order that stops before the failed segment;
        // with one thread it is exactly 0 .. bad-1.
        const Natural commits = rec.commits.load();
        EXPECT_LE(commits, bad) << where;
        if (threads == 1) {
          EXPECT_EQ(commits, bad) << where;
        }
        for (Natural i = 0; i < commits; ++i) EXPECT_EQ(rec.commit_order[i].load(), i) << where;
        // It stops: every segment before the failure at most once, and beyond it at most one
        // segment in flight per other worker.
        Natural worked = 0;
        Natural highest = 0;
        for (Natural s = 0; s < count; ++s) {
          EXPECT_LE(rec.work_count[s].load(), 1) << where;
          if (rec.work_count[s].load() > 0) ++worked, highest = s;
        }
        EXPECT_LE(worked, bad + threads) << where;
        EXPECT_LE(highest, bad + threads - 1) << where;
        if (threads == 1) {
          EXPECT_EQ(worked, bad + 1) << where;
        }
        ++runs;
      }
    }
  }
  EXPECT_EQ(runs, 4 * 3 * 4);
}

TEST(ParallelSegments, AnExceptionFromCommitStopsTheRunAndPropagates) {
  int runs = 0;
  for (unsigned threads = 1; threads <= 4; ++threads) {
    for (const Natural size : {Natural{1}, Natural{5}}) {
      const Natural count = 30;
      for (const Natural bad : {Natural{0}, Natural{2}, Natural{29}}) {
        Recorder rec(count, threads);
        bool caught = false;
        try {
          for_each_segment_ordered(
              0, count * size, size, threads, [&](unsigned w, Natural s, Natural a, Natural b) { rec.on_work(w, s, a, b); },
              [&](unsigned w, Natural s) {
                rec.on_commit(w, s);
                if (s == bad) throw SegmentFailure(s, "commit");
              });
        } catch (const SegmentFailure& e) {
          caught = true;
          EXPECT_EQ(e.segment, bad);
          EXPECT_EQ(std::string(e.what()), "commit failed at " + std::to_string(bad));
        }
        const std::string where = "threads " + std::to_string(threads) + " size " + std::to_string(size) + " bad " +
                                  std::to_string(bad);
        ASSERT_TRUE(caught) << where;
        // Commits are ordered, so exactly 0 .. bad were attempted, whatever the thread count.
        EXPECT_EQ(rec.commits.load(), bad + 1) << where;
        for (Natural i = 0; i <= bad; ++i) EXPECT_EQ(rec.commit_order[i].load(), i) << where;
        Natural worked = 0;
        for (Natural s = 0; s < count; ++s) worked += static_cast<Natural>(rec.work_count[s].load());
        EXPECT_LE(worked, bad + threads) << where;
        ++runs;
      }
    }
  }
  EXPECT_EQ(runs, 4 * 2 * 3);
}

TEST(ParallelSegments, TheFirstOfSeveralExceptionsWinsAndAnyTypePropagates) {
  // Every segment from 3 on throws its index: with one thread the first is 3; with more it is
  // one of the segments that can be in flight when the first failure happens.
  for (unsigned threads = 1; threads <= 4; ++threads) {
    std::atomic<int> thrown{0};
    try {
      for_each_segment_ordered(
          0, 100, 1, threads,
          [&](unsigned, Natural s, Natural, Natural) {
            if (s >= 3) {
              ++thrown;
              throw static_cast<int>(s);
            }
          },
          [](unsigned, Natural) {});
      ADD_FAILURE() << "nothing thrown with " << threads << " threads";
    } catch (int s) {
      EXPECT_GE(s, 3) << threads;
      EXPECT_LE(s, static_cast<int>(3 + threads - 1)) << threads;
      if (threads == 1) {
        EXPECT_EQ(s, 3);
      }
    }
    EXPECT_GE(thrown.load(), 1);
    EXPECT_LE(thrown.load(), static_cast<int>(threads));
  }
  // An sqfc::Error keeps its type and exit code through the rethrow.
  try {
    for_each_segment_ordered(
        0, 10, 2, 3, [](unsigned, Natural s, Natural, Natural) { if (s == 2) throw sqfc::OverflowError("segment 2"); },
        [](unsigned, Natural) {});
    ADD_FAILURE() << "nothing thrown";
  } catch (const sqfc::OverflowError& e) {
    EXPECT_EQ(std::string(e.what()), "segment 2");
    EXPECT_EQ(e.exit_code(), sqfc::exit_code::bad_input);
  }
}

TEST(ParallelSegments, NoCallsAfterReturn) {
  // All workers are joined before the exception leaves: nothing runs afterwards.
  auto calls = std::make_shared<std::atomic<int>>(0);
  EXPECT_THROW(for_each_segment_ordered(
                   0, 1000, 1, 4,
                   [calls](unsigned, Natural s, Natural, Natural) {
                     ++*calls;
                     if (s == 10) throw std::runtime_error("stop");
                     std::this_thread::sleep_for(std::chrono::microseconds(200));
                   },
                   [calls](unsigned, Natural) { ++*calls; }),
               std::runtime_error);
  const int at_return = calls->load();
  std::this_thread::sleep_for(std::chrono::milliseconds(30));
  EXPECT_EQ(calls->load(), at_return);
  EXPECT_GE(at_return, 11);           // segments 0 .. 10 were worked
  EXPECT_LE(at_return, 10 + 4 + 10);  // at most 10 + 4 works and 10 commits
}

// Regression (found while writing these tests): the segment count is computed as
// (hi - lo + segment_size - 1) / segment_size, which wraps around for segment sizes near
// 2^64, and seg_lo + segment_size wraps for segments that end near 2^64. Smallest failing
// inputs: [0, 2) with segment_size 2^64 - 1 runs no segment at all; [2^64 - 2, 2^64 - 1) with
// segment_size 2 hands work the segment [2^64 - 2, 0).
TEST(ParallelSegmentsRegression, SegmentArithmeticNearTwoToThe64) {
  std::vector<std::pair<Natural, Natural>> seen;
  auto record = [&](unsigned, Natural, Natural a, Natural b) { seen.emplace_back(a, b); };
  for_each_segment_ordered(0, 2, u64_max, 1, record, [](unsigned, Natural) {});
  EXPECT_EQ(seen, (std::vector<std::pair<Natural, Natural>>{{0, 2}}));
  seen.clear();
  for_each_segment_ordered(u64_max - 1, u64_max, 2, 1, record, [](unsigned, Natural) {});
  EXPECT_EQ(seen, (std::vector<std::pair<Natural, Natural>>{{u64_max - 1, u64_max}}));
}

}  // namespace
