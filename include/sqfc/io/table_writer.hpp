// SPDX-License-Identifier: MIT
/// @file table_writer.hpp  Table and events output in CSV, TSV, JSON lines and OEIS b-file form.
#pragma once

#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include "sqfc/io/columns.hpp"
#include "sqfc/track/events.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace sqfc::io {

/// Table formats (docs/output-formats.md).
enum class TableFormat { csv, tsv, jsonl, bfile };

/// Parses "csv", "tsv", "jsonl" or "bfile". Throws: InvalidArgument on anything else.
TableFormat parse_table_format(std::string_view name);
/// File extension for a format: csv, tsv, jsonl, txt.
std::string_view table_format_extension(TableFormat format) noexcept;

/// Writes rows in one format. A b-file holds `n value` lines for its one value column, after
/// `#` comment lines given to the constructor.
/// Invariant: the header (if any) is written by the constructor, rows follow in call order.
class TableWriter {
 public:
  /// Pre: for bfile, columns are n plus exactly one other column (checked; InvalidArgument).
  TableWriter(std::ostream& out, TableFormat format, std::vector<Column> columns,
              const std::vector<std::string>& bfile_comments = {});
  void write(const track::TableRow& row);

 private:
  std::ostream& out_;
  TableFormat format_;
  std::vector<Column> columns_;
  std::vector<std::string> names_;
};

/// Writes events as CSV lines `kind,n,value` after the header; the value of a scaled record
/// is M(n)/sqrt(n) with 12 significant digits, otherwise an exact integer.
class EventWriter {
 public:
  explicit EventWriter(std::ostream& out);
  void write(const track::Event& event);

 private:
  std::ostream& out_;
};

/// Shortest round-trip text of a double with `digits` significant digits, '.' as the
/// decimal point in every locale.
std::string format_decimal(double value, int digits);

}  // namespace sqfc::io
