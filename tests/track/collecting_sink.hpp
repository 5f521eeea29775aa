// SPDX-License-Identifier: MIT
// A TableSink for tests: keeps every row and event of a run in memory. No expected values here;
// the tests that use it name their oracles.
#pragma once

#include <vector>

#include "sqfc/track/table_engine.hpp"

namespace sqfc::testing {

/// Stores what run_table emits, in emission order.
class CollectingSink : public track::TableSink {
 public:
  void on_row(const track::TableRow& row) override { rows.push_back(row); }
  void on_event(const track::Event& event) override { events.push_back(event); }

  std::vector<track::TableRow> rows;
  std::vector<track::Event> events;
};

/// Field-by-field equality of rows (TableRow has no operator==).
inline bool same_row(const track::TableRow& a, const track::TableRow& b) {
  return a.n == b.n && a.mu == b.mu && a.mertens == b.mertens && a.euler == b.euler &&
         a.squarefree == b.squarefree && a.liouville == b.liouville && a.fredholm == b.fredholm &&
         a.faces == b.faces && a.betti == b.betti && a.div_edges == b.div_edges;
}

}  // namespace sqfc::testing
