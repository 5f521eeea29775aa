// SPDX-License-Identifier: MIT
/// @file mpi_run.hpp  A table run spread over the ranks of an MPI job (built with SQFC_ENABLE_MPI).
/// Segments are dealt round-robin; the state after each segment travels to the next segment's
/// rank, a sequential prefix scan over the mergeable summaries; rank 0 writes everything in order,
/// so the outputs equal those of one process. MPI types stay in mpi_run.cpp.
#pragma once

#include "sqfc/io/run_store.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::io {

/// MPI_Init_thread (MPI_THREAD_SERIALIZED: the engine's ordered pass calls MPI from whichever
/// worker thread commits, one at a time) on construction, MPI_Finalize on destruction.
/// Invariant: at most one session per process. Throws: IoError when MPI cannot start or lacks
/// the thread level.
class MpiSession {
 public:
  MpiSession();
  ~MpiSession();
  MpiSession(const MpiSession&) = delete;
  MpiSession& operator=(const MpiSession&) = delete;
  [[nodiscard]] unsigned rank() const noexcept { return rank_; }
  [[nodiscard]] unsigned size() const noexcept { return size_; }
  /// Ends every rank of the job (MPI_Abort) with @p exit_code: used when one rank fails, since
  /// the others would wait for it forever.
  [[noreturn]] void abort(int exit_code) const;

 private:
  unsigned rank_ = 0, size_ = 1;
};

/// Runs the tabulation of @p options on every rank of @p session; every rank must call it with
/// the same options. On rank 0, @p output receives every row and event in increasing n, and with
/// @p store (rank 0 only; nullptr elsewhere or without a store) each segment is committed there
/// and the outputs are replayed from it, as run_table_stored does; the run resumes from the
/// store's checkpoint, which rank 0 broadcasts. On other ranks @p output is unused.
/// Returns: on rank 0 the report of the whole run; elsewhere the report of the rank's own part.
/// Pre: options.ranks == 1, options.rank == 0, no resume_from (the function sets them).
/// Complexity: that of track::run_table divided over the ranks, plus one message of O(rows +
/// events + blocks) per segment to rank 0 and one checkpoint (O(1)) to the next rank.
/// Throws: IoError, InternalError; an exception on one rank leaves the others waiting, so the
/// caller should abort the session.
track::TableRunReport run_table_distributed(const track::TableRunOptions& options, const MpiSession& session,
                                            track::TableSink& output, RunStore* store,
                                            const track::ProgressFn& progress = {});

}  // namespace sqfc::io
