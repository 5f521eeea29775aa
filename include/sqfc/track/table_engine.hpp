// SPDX-License-Identifier: MIT
/// @file table_engine.hpp  The main job: every invariant of K_n for n = 1..N, emitted at sample points.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "sqfc/core/config.hpp"
#include "sqfc/core/types.hpp"
#include "sqfc/track/check_tally.hpp"
#include "sqfc/track/envelope.hpp"
#include "sqfc/track/events.hpp"
#include "sqfc/track/sample_schedule.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace sqfc::track {

/// Everything a run must know to continue after segment boundary n = total.hi - 1: written by
/// a run store after each segment and passed between the ranks of a distributed run.
/// Invariant: `total` summarises [1, total.hi), so TrackerState{}.apply(total) is the state at
/// n = total.hi - 1; the counts and checks cover the same n.
struct RunCheckpoint {
  BlockSummary total;     ///< merged summary of every block so far; total.lo == 1
  EventRecords records;   ///< the event detector after total.hi - 1
  Count rows = 0;
  Count events = 0;
  Count blocks = 0;
  Count scanned_blocks = 0;
  std::vector<CheckOutcome> checks;  ///< the run's identity checks so far
  /// The tracker state the checkpoint describes. Complexity: O(omega_slots).
  [[nodiscard]] TrackerState state() const;
  friend bool operator==(const RunCheckpoint&, const RunCheckpoint&);
};

/// One committed segment, as the ordered pass reports it to TableSink::on_segment_committed.
struct SegmentCommit {
  Natural index = 0;  ///< segment number g: the segment covers [1 + g * segment_size, ...)
  Natural lo = 0, hi = 0;  ///< the half-open range [lo, hi) of the segment
  const std::vector<BlockSummary>* blocks = nullptr;  ///< its blocks, in order
  const std::vector<std::uint8_t>* scanned = nullptr;  ///< per block: 1 when it was rescanned per n
  const RunCheckpoint* after = nullptr;  ///< the state after hi - 1
};

/// Parameters of one tabulation.
struct TableRunOptions {
  Natural from = 1;  ///< first n whose row or events are reported (the run still starts at 1)
  Natural to = 1;    ///< last n, inclusive
  unsigned threads = 1;
  std::size_t block_size = config::default_block_size;  ///< values per cache block
  Natural segment_size = config::default_segment_size;  ///< values per unit of thread work
  SampleSchedule samples;
  bool events = false;  ///< detect events
  bool self_checks = true;  ///< run the per-row identity checks
  /// Continue after this checkpoint instead of starting at n = 1 (a resumed run). Its n must
  /// be a segment boundary: a multiple of segment_size (the segment grid starts at 1), or to.
  std::optional<RunCheckpoint> resume_from;
  /// Distributed runs: this process works on the segments g with g % ranks == rank only.
  unsigned ranks = 1;
  unsigned rank = 0;
  /// With ranks > 1: returns the checkpoint after segment g - 1, committed by another process.
  /// Called from the ordered pass just before segment g is committed here.
  std::function<RunCheckpoint(Natural g)> await_checkpoint;
  /// Build per-pixel-column extremes (envelope.hpp); blocks are then split at its boundaries.
  std::optional<EnvelopeOptions> envelope;
};

/// Receives the output of a run, in increasing n, always from one thread at a time.
class TableSink {
 public:
  virtual ~TableSink() = default;
  virtual void on_row(const TableRow& row) = 0;
  virtual void on_event(const Event& event) = 0;
  /// Called after the last row and event of each segment, with the state after it (for run
  /// stores and distributed runs). The default does nothing.
  virtual void on_segment_committed(const SegmentCommit& /*commit*/) {}
};


/// What a finished run reports besides its rows and events.
struct TableRunReport {
  TrackerState final_state;
  Count rows = 0;
  Count events = 0;
  Count blocks = 0;
  Count scanned_blocks = 0;  ///< blocks that needed the per-n pass (samples or possible events)
  std::vector<CheckOutcome> checks;
  std::optional<Envelope> envelope;  ///< when TableRunOptions::envelope was set
  [[nodiscard]] bool all_checks_passed() const;
};

/// Called from the ordered pass with (last n done, total n); may be called often.
using ProgressFn = std::function<void(Natural done, Natural total)>;

/// Runs the tabulation of n = 1..to. Blocks are sieved in parallel; an ordered pass applies
/// each block's summary and rescans only blocks that hold a sample point or may hold an event.
/// Rows and events for n < from are not reported; all values equal those of a run from 1.
/// Pre: 1 <= from <= to <= config::max_sieve_n (checked; InvalidArgument); threads >= 1;
/// segment_size >= block_size (checked).
/// Complexity: O(to log log to) time over `threads` threads; memory per thread
/// segment_size + 4 * block_size bytes, plus the sieve tables (O(sqrt(to)/log(to))).
/// With resume_from, the run continues after its n and the report covers the whole of [1, to]
/// (its counts and checks continue the checkpoint's); with ranks > 1 the report holds the
/// state after this process's last segment.
/// Throws: InvalidArgument (also for a resume point off the segment grid or checks that do not
/// match this engine's); whatever the sink or await_checkpoint throws (the run stops).
TableRunReport run_table(const TableRunOptions& options, TableSink& sink, const ProgressFn& progress = {});

}  // namespace sqfc::track
