// SPDX-License-Identifier: MIT
// Reader for the published-value tables in tests/data/*.csv: a header row, one row per value,
// and a `source` column naming where each value was published.
#pragma once

#include <cstddef>
#include <cstdint>
#include <fstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace sqfc::oracles {

/// A CSV table read as text. Fields may be double-quoted (a quoted field may hold commas;
/// "" inside quotes is one quote). Blank lines are skipped.
struct PublishedTable {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;

  /// Index of a header name. Throws std::out_of_range when the column is missing.
  [[nodiscard]] std::size_t column(const std::string& name) const {
    for (std::size_t i = 0; i < header.size(); ++i)
      if (header[i] == name) return i;
    throw std::out_of_range("no column '" + name + "'");
  }
  /// Field of a row as a signed integer. Throws std::invalid_argument on text that is not one.
  [[nodiscard]] std::int64_t integer(std::size_t row, const std::string& name) const {
    const std::string& text = rows.at(row).at(column(name));
    std::size_t used = 0;
    const long long value = std::stoll(text, &used);
    if (used != text.size()) throw std::invalid_argument("not an integer: '" + text + "'");
    return value;
  }
  [[nodiscard]] const std::string& text(std::size_t row, const std::string& name) const {
    return rows.at(row).at(column(name));
  }
};

/// Splits one CSV line into fields.
inline std::vector<std::string> split_csv_line(const std::string& line) {
  std::vector<std::string> fields(1);
  bool quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char c = line[i];
    if (quoted) {
      if (c == '"' && i + 1 < line.size() && line[i + 1] == '"') fields.back() += '"', ++i;
      else if (c == '"') quoted = false;
      else fields.back() += c;
    } else if (c == '"') {
      quoted = true;
    } else if (c == ',') {
      fields.emplace_back();
    } else if (c != '\r') {
      fields.back() += c;
    }
  }
  if (quoted) throw std::invalid_argument("unterminated quote in '" + line + "'");
  return fields;
}

/// Reads a published table. Every row must have as many fields as the header and a
/// non-empty `source` field, so that no value enters a test without its provenance.
/// Throws std::runtime_error on a missing file or a malformed row.
inline PublishedTable read_published_csv(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw std::runtime_error("cannot open published table '" + path + "'");
  PublishedTable table;
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line == "\r") continue;
    auto fields = split_csv_line(line);
    if (table.header.empty()) {
      table.header = std::move(fields);
      continue;
    }
    if (fields.size() != table.header.size())
      throw std::runtime_error(path + ": row '" + line + "' has the wrong number of fields");
    table.rows.push_back(std::move(fields));
  }
  const std::size_t source = table.column("source");
  for (const auto& row : table.rows)
    if (row[source].empty()) throw std::runtime_error(path + ": a row has an empty source");
  return table;
}

}  // namespace sqfc::oracles
