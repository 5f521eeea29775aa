// SPDX-License-Identifier: MIT
/// @file run_store.hpp  A durable record of a table run (SQLite, WAL mode): one transaction per
/// committed segment, so a killed run resumes where it stopped and its outputs can be rebuilt.
#pragma once

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/track/events.hpp"
#include "sqfc/track/table_engine.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace sqfc::io {

/// Schema version written into every store (PRAGMA user_version); a store with another is refused.
inline constexpr int run_store_schema_version = 1;

/// A parameter that fixes a run's results; a store is resumed only with equal parameters.
struct RunParameter {
  std::string name;
  std::string value;
  friend bool operator==(const RunParameter&, const RunParameter&) = default;
};

/// One invocation that worked on a store.
struct RunAttempt {
  Count index = 0;
  std::string started_utc, finished_utc;  ///< finished: time of its last commit
  Natural first_n = 0;  ///< first n it computed (resume point + 1)
  Natural last_n = 0;   ///< last n it committed (first_n - 1 when it committed nothing)
  double wall_seconds = 0;  ///< from its start to its last commit
  unsigned threads = 0, ranks = 0;
};

/// What `sqfc runs` reports about a store.
struct RunStoreSummary {
  std::string path;
  int schema_version = 0;
  std::string sqfc_version, created_utc;
  std::vector<RunParameter> parameters;
  Natural to = 0;    ///< the run's last n
  Natural done = 0;  ///< last committed n (0 when nothing is committed)
  Count segments = 0, blocks = 0, rows = 0, events = 0;
  std::vector<RunAttempt> attempts;
  std::optional<track::RunCheckpoint> last;  ///< the checkpoint after `done`
};

/// A run store file. Layout and checks: docs/output-formats.md, "Run store".
/// Invariant: the file holds contiguous segments [1, done]; each segment's blocks, rows and events
/// arrived in the same transaction as its checkpoint, so a store is never half-way through a segment.
/// Opening verifies the whole store (schema, SQLite quick_check, a checksum per stored row,
/// contiguity, summaries re-merging to every checkpoint, row and event counts) and refuses a
/// damaged one with IoError. Thread-safety: one thread at a time.
class RunStore {
 public:
  /// Creates a new store at @p path with @p parameters (which must include "to").
  /// Pre: the file does not exist (checked; InvalidArgument). Throws: IoError.
  static RunStore create(const std::string& path, const std::vector<RunParameter>& parameters);
  /// Opens an existing store for writing and verifies it. Pre: its parameters equal @p parameters
  /// (checked; InvalidArgument naming each parameter that differs, with both values).
  /// Throws: IoError for a damaged store or a file that is not one. Complexity: O(stored rows).
  static RunStore open_for_resume(const std::string& path, const std::vector<RunParameter>& parameters);
  /// Opens a store read-only and verifies it. Throws: IoError.
  static RunStore open_read_only(const std::string& path);

  RunStore(RunStore&&) noexcept;
  RunStore& operator=(RunStore&&) noexcept;
  ~RunStore();

  /// The checkpoint after the last committed segment, or nullopt for an empty store.
  [[nodiscard]] std::optional<track::RunCheckpoint> last_checkpoint() const;
  /// Last committed n (0 when empty) and the run's last n.
  [[nodiscard]] Natural done() const;
  [[nodiscard]] Natural to() const;
  [[nodiscard]] std::vector<RunParameter> parameters() const;

  /// Records the start of an invocation (timings for `sqfc runs`). Throws: IoError.
  void begin_attempt(unsigned threads, unsigned ranks);
  /// Commits one segment with the rows and events it emitted, in one transaction.
  /// Pre: commit.lo == done() + 1 (checked; InternalError). Throws: IoError (disk full, file-size
  /// limit, unwritable); the transaction is then rolled back and the store keeps its previous state.
  void commit_segment(const track::SegmentCommit& commit, const std::vector<track::TableRow>& rows,
                      const std::vector<track::Event>& events);

  /// Visits the stored rows in increasing n and the events in order, checking each checksum.
  /// Throws: IoError on damage; whatever @p visit throws.
  void for_each_row(const std::function<void(const track::TableRow&)>& visit) const;
  void for_each_event(const std::function<void(const track::Event&)>& visit) const;

  /// Everything `sqfc runs show` prints.
  [[nodiscard]] RunStoreSummary summary() const;

 private:
  struct Impl;
  explicit RunStore(std::unique_ptr<Impl> impl);
  std::unique_ptr<Impl> impl_;
};

}  // namespace sqfc::io
