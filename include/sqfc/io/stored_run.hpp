// SPDX-License-Identifier: MIT
/// @file stored_run.hpp  A table run checkpointed into a run store, and its outputs rebuilt from it.
#pragma once

#include <memory>

#include "sqfc/io/run_store.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::io {

/// Runs (or continues) the tabulation of @p options into @p store, one transaction per segment,
/// then replays every stored row and event, in order, into @p output. Because the outputs come
/// from the store in both cases, a run killed and resumed any number of times writes exactly
/// the bytes of an uninterrupted one.
/// Pre: @p store was opened with the parameters of @p options (the caller checks them);
/// options.resume_from is empty (it is taken from the store).
/// Returns: the report of the whole run [1, to], rebuilt from the store's last checkpoint.
/// Complexity: that of track::run_table for the part not yet stored, plus O(rows + events) to
/// replay. Throws: IoError (store), InternalError when the engine and the store disagree;
/// whatever @p output throws.
track::TableRunReport run_table_stored(const track::TableRunOptions& options, RunStore& store,
                                       track::TableSink& output, const track::ProgressFn& progress = {});

/// A sink that keeps each segment's rows and events and commits them with the segment, in one
/// transaction, when the engine reports the segment done (on_segment_committed).
std::unique_ptr<track::TableSink> make_store_sink(RunStore& store);

/// Replays every stored row (increasing n) and event (in order) into @p output. Throws: IoError.
void replay_store(const RunStore& store, track::TableSink& output);

/// The report a store's last checkpoint describes (rows, events, blocks, checks, final state).
/// Pre: the store holds at least one segment (checked; InvalidArgument).
track::TableRunReport report_from_store(const RunStore& store);

}  // namespace sqfc::io
