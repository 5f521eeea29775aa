// SPDX-License-Identifier: MIT
// Column names, defaults, parsing and values.
#include "sqfc/io/columns.hpp"

#include <algorithm>
#include <charconv>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::io {
namespace {

struct Named {
  std::string_view name;
  Column::Kind kind;
};
constexpr Named scalar_columns[] = {
    {"n", Column::Kind::n},           {"mu", Column::Kind::mu},
    {"mertens", Column::Kind::mertens}, {"euler", Column::Kind::euler},
    {"squarefree", Column::Kind::squarefree}, {"liouville", Column::Kind::liouville},
    {"fredholm", Column::Kind::fredholm}, {"div_edges", Column::Kind::div_edges},
};

// Dimensions 0..14 exist as columns: omega <= 15 covers every n < 2^64.
constexpr int max_column_dimension = 14;

int top_dimension(Natural to) { return std::max(0, complex::max_face_dimension(to)); }

}  // namespace

std::string column_name(const Column& c) {
  if (c.kind == Column::Kind::face) return "f" + std::to_string(c.dimension);
  if (c.kind == Column::Kind::betti) return "b" + std::to_string(c.dimension);
  for (const auto& s : scalar_columns)
    if (s.kind == c.kind) return std::string(s.name);
  return "?";
}

std::vector<Column> default_columns(Natural to) {
  using K = Column::Kind;
  std::vector<Column> columns = {{K::n}, {K::mu}, {K::mertens}, {K::euler}, {K::squarefree}, {K::liouville}, {K::fredholm}};
  const int top = top_dimension(to);
  for (int d = 0; d <= top; ++d) columns.push_back({K::face, d});
  for (int d = 0; d <= top; ++d) columns.push_back({K::betti, d});
  columns.push_back({K::div_edges});
  return columns;
}

std::vector<Column> parse_columns(std::string_view list, Natural to) {
  std::vector<Column> columns;
  if (list.empty()) throw InvalidArgument("--columns: empty column list");
  std::size_t start = 0;
  while (start <= list.size()) {
    const auto comma = list.find(',', start);
    const auto name = list.substr(start, comma == std::string_view::npos ? std::string_view::npos : comma - start);
    if (name.empty()) throw InvalidArgument("--columns: empty column name in '" + std::string(list) + "'");
    bool found = false;
    for (const auto& s : scalar_columns)
      if (s.name == name) columns.push_back({s.kind}), found = true;
    if (!found && (name == "f" || name == "b")) {
      const auto kind = name == "f" ? Column::Kind::face : Column::Kind::betti;
      for (int d = 0; d <= top_dimension(to); ++d) columns.push_back({kind, d});
      found = true;
    }
    if (!found && name.size() >= 2 && (name[0] == 'f' || name[0] == 'b')) {
      int d = -1;
      const auto digits = name.substr(1);
      const auto [end, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), d);
      if (ec == std::errc() && end == digits.data() + digits.size() && d >= 0 && d <= max_column_dimension &&
          (digits.size() == 1 || digits[0] != '0')) {
        columns.push_back({name[0] == 'f' ? Column::Kind::face : Column::Kind::betti, d});
        found = true;
      }
    }
    if (!found)
      throw InvalidArgument("--columns: unknown column '" + std::string(name) +
                            "' (known: n, mu, mertens, euler, squarefree, liouville, fredholm, f0..f14, b0..b14, div_edges)");
    if (comma == std::string_view::npos) break;
    start = comma + 1;
  }
  // Keep the first occurrence of each column; n leads.
  std::vector<Column> unique;
  for (const auto& c : columns)
    if (std::find(unique.begin(), unique.end(), c) == unique.end()) unique.push_back(c);
  const auto n_it = std::find(unique.begin(), unique.end(), Column{Column::Kind::n});
  if (n_it == unique.end()) unique.insert(unique.begin(), Column{Column::Kind::n});
  else std::rotate(unique.begin(), n_it, n_it + 1);
  return unique;
}

std::string column_value(const Column& c, const track::TableRow& r) {
  using K = Column::Kind;
  switch (c.kind) {
    case K::n: return std::to_string(r.n);
    case K::mu: return std::to_string(r.mu);
    case K::mertens: return std::to_string(r.mertens);
    case K::euler: return std::to_string(r.euler);
    case K::squarefree: return std::to_string(r.squarefree);
    case K::liouville: return std::to_string(r.liouville);
    case K::fredholm: return std::to_string(r.fredholm);
    case K::face: return std::to_string(r.faces[static_cast<std::size_t>(c.dimension)]);
    case K::betti: return std::to_string(r.betti[static_cast<std::size_t>(c.dimension)]);
    case K::div_edges: return std::to_string(r.div_edges);
  }
  return "";
}

}  // namespace sqfc::io
