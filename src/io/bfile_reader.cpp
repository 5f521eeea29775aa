// SPDX-License-Identifier: MIT
// Line classification and streaming read of OEIS b-files.
#include "sqfc/io/bfile_reader.hpp"

#include <charconv>
#include <filesystem>
#include <fstream>
#include <limits>
#include <string_view>

#include "sqfc/core/error.hpp"

namespace sqfc::io {
namespace {

bool is_blank_char(char c) { return c == ' ' || c == '\t'; }

// An integer token: its normalised text, and its value when it fits in int64.
struct ParsedInteger {
  std::string text;
  std::optional<std::int64_t> value;
};

std::optional<ParsedInteger> parse_integer(std::string_view token) {
  const bool negative = !token.empty() && token.front() == '-';
  std::string_view digits = negative ? token.substr(1) : token;
  if (digits.empty()) return std::nullopt;
  for (const char c : digits)
    if (c < '0' || c > '9') return std::nullopt;
  const auto first = digits.find_first_not_of('0');
  digits = first == std::string_view::npos ? std::string_view("0") : digits.substr(first);
  ParsedInteger out;
  const bool zero = digits == "0";
  out.text = (negative && !zero ? "-" : "") + std::string(digits);
  // Magnitudes up to 2^63 (the most negative int64) are read as unsigned; 20 digits at most.
  std::uint64_t magnitude = 0;
  const auto [end, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), magnitude);
  if (ec == std::errc() && end == digits.data() + digits.size()) {
    constexpr std::uint64_t max_positive = static_cast<std::uint64_t>(std::numeric_limits<std::int64_t>::max());
    if (!negative && magnitude <= max_positive) out.value = static_cast<std::int64_t>(magnitude);
    if (negative && magnitude <= max_positive + 1)
      out.value = magnitude == max_positive + 1 ? std::numeric_limits<std::int64_t>::min()
                                                : -static_cast<std::int64_t>(magnitude);
  }
  return out;
}

}  // namespace

std::string bfile_problem_text(BfileProblem problem) {
  switch (problem) {
    case BfileProblem::field_count: return "one field only; a term is 'n a(n)'";
    case BfileProblem::extra_text: return "extra text after 'n a(n)'";
    case BfileProblem::bad_index: return "n is not an integer";
    case BfileProblem::bad_value: return "a(n) is not an integer";
    case BfileProblem::index_too_big: return "n does not fit in a signed 64-bit integer";
  }
  return "unknown problem";
}

BfileLine parse_bfile_line(std::string text, Count line_number) {
  if (!text.empty() && text.back() == '\r') text.pop_back();  // CRLF files
  BfileLine out;
  std::string_view rest = text;
  while (!rest.empty() && is_blank_char(rest.front())) rest.remove_prefix(1);
  while (!rest.empty() && is_blank_char(rest.back())) rest.remove_suffix(1);
  if (rest.empty()) return out;  // blank
  if (rest.front() == '#') {
    out.kind = BfileLine::Kind::comment;
    return out;
  }
  std::vector<std::string_view> fields;
  while (!rest.empty()) {
    std::size_t end = 0;
    while (end < rest.size() && !is_blank_char(rest[end])) ++end;
    fields.push_back(rest.substr(0, end));
    rest.remove_prefix(end);
    while (!rest.empty() && is_blank_char(rest.front())) rest.remove_prefix(1);
  }
  auto malformed = [&](BfileProblem p) {
    out.kind = BfileLine::Kind::malformed;
    out.malformed = {line_number, p, text.size() > 80 ? text.substr(0, 77) + "..." : text};
    return out;
  };
  // The index is judged first, so "x 1 2" reports the bad n rather than the extra field.
  const auto index = parse_integer(fields[0]);
  if (!index) return malformed(BfileProblem::bad_index);
  if (fields.size() == 1) return malformed(BfileProblem::field_count);
  const auto value = parse_integer(fields[1]);
  if (!value) return malformed(BfileProblem::bad_value);
  if (fields.size() > 2) return malformed(BfileProblem::extra_text);
  if (!index->value) return malformed(BfileProblem::index_too_big);
  out.kind = BfileLine::Kind::term;
  out.term = {line_number, *index->value, value->text, value->value};
  return out;
}

std::optional<BfileLine> BfileReader::next() {
  std::string text;
  if (!std::getline(in_, text)) {
    if (in_.bad()) throw IoError("reading the b-file failed after line " + std::to_string(line_));
    return std::nullopt;
  }
  ++line_;
  BfileLine out = parse_bfile_line(std::move(text), line_);
  if (out.kind == BfileLine::Kind::term) {
    const BfileTerm& t = out.term;
    const auto [it, inserted] = first_line_.try_emplace(t.n, t.line);
    if (!inserted) duplicates_.push_back({t.line, it->second, t.n});
    if (previous_ && t.n < previous_->n) out_of_order_.push_back({t.line, t.n, previous_->line, previous_->n});
    previous_ = BfileTerm{t.line, t.n, {}, {}};
  }
  return out;
}

BfileContents read_bfile(std::istream& in) {
  BfileContents contents;
  BfileReader reader(in);
  while (auto line = reader.next()) {
    switch (line->kind) {
      case BfileLine::Kind::term: contents.terms.push_back(std::move(line->term)); break;
      case BfileLine::Kind::comment: ++contents.comments; break;
      case BfileLine::Kind::blank: ++contents.blanks; break;
      case BfileLine::Kind::malformed: contents.malformed.push_back(std::move(line->malformed)); break;
    }
  }
  contents.lines = reader.lines();
  contents.duplicates = reader.duplicates();
  contents.out_of_order = reader.out_of_order();
  return contents;
}

BfileContents read_bfile_file(const std::string& path) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) throw IoError("cannot read b-file '" + path + "': it is a directory");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw IoError("cannot open b-file '" + path + "'");
  try {
    return read_bfile(in);
  } catch (const IoError&) {
    throw IoError("reading b-file '" + path + "' failed");
  }
}

}  // namespace sqfc::io
