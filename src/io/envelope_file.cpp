// SPDX-License-Identifier: MIT
// Envelope files: writer and the reader of their first lines.
#include "sqfc/io/envelope_file.hpp"

#include <cmath>
#include <fstream>
#include <sstream>

#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/io/table_writer.hpp"

namespace sqfc::io {
namespace {

const track::SeriesExtremes& series_of(const track::EnvelopeColumn& c, const std::string& name) {
  if (name == "mertens") return c.mertens;
  if (name == "scaled") return c.scaled;
  if (name == "squarefree") return c.squarefree;
  if (name == "fredholm") return c.fredholm;
  const int d = std::stoi(name.substr(1));
  return name[0] == 'f' ? c.faces[static_cast<std::size_t>(d)] : c.betti[static_cast<std::size_t>(d)];
}

std::string scaled_text(SignedSum m, Natural n) {
  return format_decimal(static_cast<double>(m) / std::sqrt(static_cast<double>(n)), 12);
}

}  // namespace

std::vector<std::string> envelope_series(const track::Envelope& envelope, int top_dimension) {
  std::vector<std::string> names = {"mertens", "scaled", "squarefree", "fredholm"};
  for (int d = 0; d <= top_dimension; ++d) names.push_back("f" + std::to_string(d));
  if (envelope.options.betti)
    for (int d = 0; d <= top_dimension; ++d) names.push_back("b" + std::to_string(d));
  return names;
}

void write_envelope(std::ostream& out, const track::Envelope& envelope, int top_dimension) {
  const auto& o = envelope.options;
  const auto names = envelope_series(envelope, top_dimension);
  out << envelope_signature << ": exact extremes of each series over pixel columns [lo, hi) of n\n";
  out << "# first=" << o.first << " last=" << o.last << " columns=" << envelope.columns.size()
      << " requested=" << o.width << " x=" << (o.log_x ? "log" : "linear") << " betti=" << (o.betti ? "yes" : "no") << '\n';
  out << "column,lo,hi";
  for (const auto& s : names)
    out << ',' << s << "_first," << s << "_last," << s << "_min," << s << "_min_n," << s << "_max," << s << "_max_n";
  out << '\n';
  for (std::size_t i = 0; i < envelope.columns.size(); ++i) {
    const auto& c = envelope.columns[i];
    out << i << ',' << c.lo << ',' << c.hi;
    for (const auto& s : names) {
      const auto& e = series_of(c, s);
      if (s == "scaled") {
        out << ',' << scaled_text(e.first, c.lo) << ',' << scaled_text(e.last, c.hi - 1) << ',' << scaled_text(e.min, e.min_n)
            << ',' << e.min_n << ',' << scaled_text(e.max, e.max_n) << ',' << e.max_n;
      } else {
        out << ',' << e.first << ',' << e.last << ',' << e.min << ',' << e.min_n << ',' << e.max << ',' << e.max_n;
      }
    }
    out << '\n';
  }
}

EnvelopeFileInfo read_envelope_info(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw IoError("cannot read '" + path + "'");
  std::string signature, facts, header;
  std::getline(in, signature);
  std::getline(in, facts);
  std::getline(in, header);
  if (signature.rfind(envelope_signature, 0) != 0)
    throw InvalidArgument("'" + path + "' is not an sqfc envelope file (its first line does not start with '" +
                          envelope_signature + "')");
  EnvelopeFileInfo info;
  std::istringstream words(facts.substr(facts.empty() ? 0 : 1));
  std::string word;
  bool have_first = false, have_last = false;
  while (words >> word) {
    const auto eq = word.find('=');
    if (eq == std::string::npos) continue;
    const std::string key = word.substr(0, eq), value = word.substr(eq + 1);
    if (key == "first") info.first = parse_natural(value, "envelope first"), have_first = true;
    else if (key == "last") info.last = parse_natural(value, "envelope last"), have_last = true;
    else if (key == "columns") info.columns = static_cast<std::size_t>(parse_natural(value, "envelope columns"));
    else if (key == "x") info.log_x = value == "log";
  }
  if (!have_first || !have_last || header.rfind("column,lo,hi", 0) != 0)
    throw InvalidArgument("'" + path + "' is a damaged envelope file (line 2 or the header is missing)");
  std::stringstream h(header);
  for (std::string name; std::getline(h, name, ',');) info.header.push_back(name);
  return info;
}

}  // namespace sqfc::io
