// SPDX-License-Identifier: MIT
// Shared by the table determinism tests: run `sqfc table` into files, and keep the lines of a
// table or events file from a given n on.
// Expected values: none of its own; the oracle of the tests using it is another run of sqfc.
#pragma once

#include <gtest/gtest.h>

#include "cli_runner.hpp"

namespace sqfc::cli_test {

struct Outputs {
  std::string table, events;
};

// Runs `sqfc table args... --out t.csv --events e.csv` and returns both files.
inline Outputs run_table(const std::vector<std::string>& args) {
  ScratchDir dir;
  auto full = args;
  full.insert(full.begin(), "table");
  full.insert(full.end(), {"--out", "t.csv", "--events", "e.csv", "--quiet"});
  const auto r = run_sqfc(dir, full);
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);
  return {read_file(dir.path("t.csv")), read_file(dir.path("e.csv"))};
}

// The header line and the lines whose field `n_column` (the n) is >= from.
inline std::vector<std::string> lines_from(const std::string& text, unsigned long long from, std::size_t n_column) {
  const auto lines = split_lines(text);
  std::vector<std::string> kept;
  if (lines.empty()) return kept;
  kept.push_back(lines[0]);
  for (std::size_t i = 1; i < lines.size(); ++i)
    if (std::stoull(split_fields(lines[i]).at(n_column)) >= from) kept.push_back(lines[i]);
  return kept;
}

// Table rows (n is the first column) and events (kind,n,value) from n = from on.
inline std::vector<std::string> rows_from(const std::string& table, unsigned long long from) {
  return lines_from(table, from, 0);
}
inline std::vector<std::string> events_from(const std::string& events, unsigned long long from) {
  return lines_from(events, from, 1);
}

}  // namespace sqfc::cli_test
