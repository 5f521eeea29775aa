// SPDX-License-Identifier: MIT
// `sqfc table --store`: the parameters a run store records, and opening it for a job.
#pragma once

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

}  // namespace sqfc::cli
