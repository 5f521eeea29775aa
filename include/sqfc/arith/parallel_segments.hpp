// SPDX-License-Identifier: MIT
/// @file parallel_segments.hpp  Runs work on segments of a range in parallel and commits them in order.
#pragma once

#include <algorithm>
#include <atomic>
#include <condition_variable>
#include <cstddef>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

#include "sqfc/core/error.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// Splits [lo, hi) into segments of segment_size values (the last one shorter), runs
/// work(worker, segment_index, seg_lo, seg_hi) for each on `threads` worker threads, and
/// commit(worker, segment_index) for each in increasing segment order, one at a time, on the
/// worker that did the work. A worker does not take a new segment before committing its
/// last, so each worker needs buffers for one segment only.
/// Results are deterministic: they do not depend on the thread count or on timing.
/// Pre: segment_size >= 1, threads >= 1 (checked; InvalidArgument).
/// Throws: the first exception thrown by work or commit, after all workers have stopped.
/// Thread-safety: work runs concurrently with other work and with commit; commit calls are
/// serialized and ordered.
template <class Work, class Commit>
void for_each_segment_ordered(Natural lo, Natural hi, Natural segment_size, unsigned threads, Work&& work,
                              Commit&& commit) {
  if (segment_size < 1) throw InvalidArgument("segment size must be at least 1");
  if (threads < 1) throw InvalidArgument("thread count must be at least 1");
  if (hi <= lo) return;
  // Written so that nothing wraps even for ranges next to 2^64.
  const Natural segment_count = (hi - lo - 1) / segment_size + 1;
  const unsigned worker_count = static_cast<unsigned>(std::min<Natural>(threads, segment_count));

  std::atomic<Natural> next_segment{0};
  std::atomic<bool> failed{false};
  std::mutex turn_mutex;
  std::condition_variable turn_changed;
  Natural committed = 0;  // guarded by turn_mutex
  std::exception_ptr first_error;

  auto run_worker = [&](unsigned worker) {
    try {
      while (!failed.load(std::memory_order_relaxed)) {
        const Natural s = next_segment.fetch_add(1);
        if (s >= segment_count) break;
        const Natural seg_lo = lo + s * segment_size;
        const Natural seg_hi = seg_lo + std::min(segment_size, hi - seg_lo);
        work(worker, s, seg_lo, seg_hi);
        std::unique_lock<std::mutex> lock(turn_mutex);
        turn_changed.wait(lock, [&] { return committed == s || failed.load(); });
        if (failed.load()) break;
        lock.unlock();
        commit(worker, s);
        lock.lock();
        committed = s + 1;
        lock.unlock();
        turn_changed.notify_all();
      }
    } catch (...) {
      std::lock_guard<std::mutex> lock(turn_mutex);
      if (!first_error) first_error = std::current_exception();
      failed.store(true);
      turn_changed.notify_all();
    }
  };

  if (worker_count == 1) {
    run_worker(0);
  } else {
    std::vector<std::thread> pool;
    pool.reserve(worker_count);
    for (unsigned t = 0; t < worker_count; ++t) pool.emplace_back(run_worker, t);
    for (auto& thread : pool) thread.join();
  }
  if (first_error) std::rethrow_exception(first_error);
}

}  // namespace sqfc::arith
