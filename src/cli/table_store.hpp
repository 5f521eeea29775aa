// SPDX-License-Identifier: MIT
// `sqfc table --store`: the parameters a run store records, and opening it for a job.
#pragma once

#include <optional>
#include <vector>

#include "cli_support.hpp"
#include "cmd_table.hpp"
#include "sqfc/io/run_store.hpp"

namespace sqfc::cli {

/// Every parameter that changes the bytes of the outputs (not --threads, not --quiet), as text.
std::vector<io::RunParameter> store_parameters(const TableJob& job, const SampleRequest& samples);

/// Creates job.store_path, or with --resume opens it (creating it when missing), checks its
/// parameters, and records this invocation. Throws: InvalidArgument, IoError.
io::RunStore open_run_store(const TableJob& job);

/// Starts MPI for the table command when this process was launched by an MPI launcher (and the
/// build has MPI), and ends it on destruction. Invariant: one scope per process.
class DistributedScope {
 public:
  DistributedScope();
  ~DistributedScope();
  DistributedScope(const DistributedScope&) = delete;
  DistributedScope& operator=(const DistributedScope&) = delete;
  [[nodiscard]] unsigned rank() const noexcept;
  [[nodiscard]] unsigned ranks() const noexcept;
};

/// Runs the engine for a job: with or without a store, in one process or over the ranks of the
/// current DistributedScope. A failure during a distributed run prints one line and aborts every
/// rank, since the others would wait for the failed one. Throws: Error.
track::TableRunReport run_table_engine(const TableJob& job, track::TableSink& sink, const track::ProgressFn& progress);

/// On ranks other than 0 of a distributed run: runs this rank's share of the job and returns
/// its exit code; nullopt on rank 0 and in a single process (which write the outputs).
std::optional<int> run_worker_rank(const TableJob& job);

}  // namespace sqfc::cli
