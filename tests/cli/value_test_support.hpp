// SPDX-License-Identifier: MIT
// Runs `sqfc value` and `sqfc table` at the same n and reads their CSV rows by column name.
// Expected values: none of its own; the oracle is the other command (`sqfc table`) at the same n.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "cli_runner.hpp"

namespace sqfc::cli_test {

/// The rows of a CSV text as column name -> value maps.
inline std::vector<std::map<std::string, std::string>> csv_rows(const std::string& text) {
  const auto lines = split_lines(text);
  std::vector<std::map<std::string, std::string>> rows;
  if (lines.empty()) return rows;
  const auto header = split_fields(lines[0]);
  for (std::size_t i = 1; i < lines.size(); ++i) {
    if (lines[i].empty()) continue;
    const auto fields = split_fields(lines[i]);
    std::map<std::string, std::string> row;
    for (std::size_t c = 0; c < header.size() && c < fields.size(); ++c) row[header[c]] = fields[c];
    rows.push_back(row);
  }
  return rows;
}

/// Every column of `value` equals the same column of `table` (which has more columns); returns
/// the number of values compared, or -1 after reporting a difference through gtest.
inline long compare_value_with_table(const std::map<std::string, std::string>& value,
                                     const std::map<std::string, std::string>& table) {
  long compared = 0;
  for (const auto& [name, text] : value) {
    const auto it = table.find(name);
    if (it == table.end()) {
      ADD_FAILURE() << "table has no column " << name;
      return -1;
    }
    if (it->second != text) {
      ADD_FAILURE() << "n=" << value.at("n") << " column " << name << ": value " << text << ", table " << it->second;
      return -1;
    }
    ++compared;
  }
  return compared;
}

}  // namespace sqfc::cli_test
