// SPDX-License-Identifier: MIT
// Table and event formatting.
#include "sqfc/io/table_writer.hpp"

#include <charconv>

#include "sqfc/core/error.hpp"

namespace sqfc::io {

TableFormat parse_table_format(std::string_view name) {
  if (name == "csv") return TableFormat::csv;
  if (name == "tsv") return TableFormat::tsv;
  if (name == "jsonl") return TableFormat::jsonl;
  if (name == "bfile") return TableFormat::bfile;
  throw InvalidArgument("--format: unknown format '" + std::string(name) + "' (use csv, tsv, jsonl or bfile)");
}

std::string_view table_format_extension(TableFormat format) noexcept {
  switch (format) {
    case TableFormat::csv: return "csv";
    case TableFormat::tsv: return "tsv";
    case TableFormat::jsonl: return "jsonl";
    case TableFormat::bfile: return "txt";
  }
  return "txt";
}

TableWriter::TableWriter(std::ostream& out, TableFormat format, std::vector<Column> columns,
                         const std::vector<std::string>& bfile_comments)
    : out_(out), format_(format), columns_(std::move(columns)) {
  for (const auto& c : columns_) names_.push_back(column_name(c));
  if (format_ == TableFormat::bfile) {
    if (columns_.size() != 2 || columns_[0].kind != Column::Kind::n)
      throw InvalidArgument("--format bfile needs exactly one value column, e.g. --columns mertens");
    for (const auto& line : bfile_comments) out_ << "# " << line << '\n';
    return;
  }
  if (format_ == TableFormat::jsonl) return;
  const char separator = format_ == TableFormat::csv ? ',' : '\t';
  for (std::size_t i = 0; i < names_.size(); ++i) out_ << (i ? std::string(1, separator) : "") << names_[i];
  out_ << '\n';
}

void TableWriter::write(const track::TableRow& row) {
  switch (format_) {
    case TableFormat::bfile:
      out_ << std::to_string(row.n) << ' ' << column_value(columns_[1], row) << '\n';
      return;
    case TableFormat::jsonl:
      out_ << '{';
      for (std::size_t i = 0; i < columns_.size(); ++i)
        out_ << (i ? "," : "") << '"' << names_[i] << "\":" << column_value(columns_[i], row);
      out_ << "}\n";
      return;
    case TableFormat::csv:
    case TableFormat::tsv: {
      const char separator = format_ == TableFormat::csv ? ',' : '\t';
      for (std::size_t i = 0; i < columns_.size(); ++i) {
        if (i) out_ << separator;
        out_ << column_value(columns_[i], row);
      }
      out_ << '\n';
      return;
    }
  }
}

EventWriter::EventWriter(std::ostream& out) : out_(out) { out_ << "kind,n,value\n"; }

void EventWriter::write(const track::Event& e) {
  // std::to_string, not operator<<, so that the stream's locale cannot group digits.
  out_ << track::event_kind_name(e.kind) << ',' << std::to_string(e.n) << ',';
  if (e.kind == track::EventKind::scaled_high || e.kind == track::EventKind::scaled_low) out_ << format_decimal(e.scaled, 12);
  else out_ << std::to_string(e.value);
  out_ << '\n';
}

std::string format_decimal(double value, int digits) {
  char buffer[64];
  const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::general, digits);
  if (ec != std::errc()) return "nan";
  return std::string(buffer, end);
}

}  // namespace sqfc::io
