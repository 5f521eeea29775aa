// SPDX-License-Identifier: MIT
// Checkpointed table runs: the engine writes segments into the store; the outputs replay it.
#include "sqfc/io/stored_run.hpp"

#include <vector>

#include "sqfc/core/error.hpp"

namespace sqfc::io {
namespace {

// Keeps a segment's rows and events until the engine reports the segment done, then commits
// all of it in one transaction.
class StoreSink : public track::TableSink {
 public:
  explicit StoreSink(RunStore& store) : store_(store) {}
  void on_row(const track::TableRow& row) override { rows_.push_back(row); }
  void on_event(const track::Event& event) override { events_.push_back(event); }
  void on_segment_committed(const track::SegmentCommit& commit) override {
    store_.commit_segment(commit, rows_, events_);
    rows_.clear();
    events_.clear();
  }

 private:
  RunStore& store_;
  std::vector<track::TableRow> rows_;
  std::vector<track::Event> events_;
};

}  // namespace

std::unique_ptr<track::TableSink> make_store_sink(RunStore& store) { return std::make_unique<StoreSink>(store); }

void replay_store(const RunStore& store, track::TableSink& output) {
  store.for_each_row([&](const track::TableRow& row) { output.on_row(row); });
  store.for_each_event([&](const track::Event& event) { output.on_event(event); });
}

track::TableRunReport report_from_store(const RunStore& store) {
  const auto last = store.last_checkpoint();
  if (!last) throw InvalidArgument("run store holds no segment yet");
  track::TableRunReport report;
  report.final_state = last->state();
  report.rows = last->rows;
  report.events = last->events;
  report.blocks = last->blocks;
  report.scanned_blocks = last->scanned_blocks;
  report.checks = last->checks;
  return report;
}

track::TableRunReport run_table_stored(const track::TableRunOptions& options, RunStore& store,
                                       track::TableSink& output, const track::ProgressFn& progress) {
  track::TableRunOptions run = options;
  run.resume_from = store.last_checkpoint();
  if (store.done() < options.to) {
    StoreSink sink(store);
    const track::TableRunReport computed = track::run_table(run, sink, progress);
    if (!(computed.final_state == store.last_checkpoint()->state()) || store.done() != options.to)
      throw InternalError("the run store does not end in the state the engine reached");
  }
  replay_store(store, output);
  return report_from_store(store);
}

}  // namespace sqfc::io
