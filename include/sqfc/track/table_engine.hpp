// SPDX-License-Identifier: MIT
/// @file table_engine.hpp  The main job: every invariant of K_n for n = 1..N, emitted at sample points.
#pragma once

#include <cstddef>
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
  /// Build per-pixel-column extremes (envelope.hpp); blocks are then split at its boundaries.
  std::optional<EnvelopeOptions> envelope;
};

/// Receives the output of a run, in increasing n, always from one thread at a time.
class TableSink {
 public:
  virtual ~TableSink() = default;
  virtual void on_row(const TableRow& row) = 0;
  virtual void on_event(const Event& event) = 0;
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
/// Throws: InvalidArgument; whatever the sink throws (the run stops).
TableRunReport run_table(const TableRunOptions& options, TableSink& sink, const ProgressFn& progress = {});

}  // namespace sqfc::track
