// SPDX-License-Identifier: MIT
// Downstream use of the installed library: M(1000) = 2 (OEIS A002321).
#include <cstdio>

#include "sqfc/track/table_engine.hpp"

namespace {
class Last : public sqfc::track::TableSink {
 public:
  void on_row(const sqfc::track::TableRow& row) override { mertens = row.mertens; }
  void on_event(const sqfc::track::Event&) override {}
  long mertens = 0;
};
}  // namespace

int main() {
  sqfc::track::TableRunOptions options;
  options.to = 1000;
  options.samples = sqfc::track::SampleSchedule(1, 1000, std::nullopt, {1000}, std::nullopt, false);
  Last sink;
  sqfc::track::run_table(options, sink);
  std::printf("M(1000) = %ld\n", sink.mertens);
  return sink.mertens == 2 ? 0 : 1;  // OEIS A002321: M(1000) = 2
}
