// SPDX-License-Identifier: MIT
/// @file manifest.hpp  JSON manifests written beside every output, so a table can be reproduced.
#pragma once

#include <chrono>
#include <string>
#include <vector>

#include "sqfc/io/json.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::io {

/// Current UTC time as ISO 8601 with seconds, e.g. 2026-12-01T23:02:56Z.
std::string utc_timestamp(std::chrono::system_clock::time_point when);

/// Compact UTC time for run folder names, e.g. 20261201T230256Z.
std::string utc_compact_timestamp(std::chrono::system_clock::time_point when);

/// The common head of a manifest: tool, version, command line, host facts.
Json manifest_head(const std::vector<std::string>& command_line);

/// The check outcomes of a run as a JSON array of objects.
Json checks_to_json(const std::vector<track::CheckOutcome>& checks);

/// The final row of a run (every column) as a JSON object.
Json row_to_json(const track::TableRow& row, int top_dimension);

/// Sets started_utc, finished_utc (now) and wall_seconds, the times every manifest records.
void set_run_times(Json& manifest, std::chrono::system_clock::time_point started, double wall_seconds);

/// Writes @p manifest to @p path atomically. Throws: IoError.
void write_manifest(const std::string& path, const Json& manifest);

}  // namespace sqfc::io
