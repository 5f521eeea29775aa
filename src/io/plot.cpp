// SPDX-License-Identifier: MIT
// Plots: input recognition, per-kind data files, generated gnuplot scripts, and the gnuplot run.
#include "sqfc/io/plot.hpp"

#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include "sqfc/core/error.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/envelope_file.hpp"

namespace sqfc::io {
namespace {

namespace fs = std::filesystem;

// ---- our look: one palette, one font, one layout for every picture --------------------------
// Colours are chosen to stay apart for the usual colour-vision deficiencies and in grey print.
constexpr const char* paper = "#fbfaf7";   // warm off-white background
constexpr const char* ink = "#1d2433";     // text and axes
constexpr const char* rule = "#e4e0d6";    // grid
constexpr const char* series_blue = "#2a6f97";
constexpr const char* guide_ochre = "#c08a1e";
constexpr const char* zero_rose = "#c8435a";
constexpr const char* high_green = "#2e8b57";
constexpr const char* low_violet = "#7b4fa0";
// One colour per dimension (faces, Betti numbers, bars), cycled beyond ten.
constexpr std::array<const char*, 10> dimension_colours = {"#2a6f97", "#c8435a", "#2e8b57", "#c08a1e", "#7b4fa0",
                                                           "#e07a1f", "#4f5d75", "#139ea8", "#a0522d", "#6b8e23"};


// ---- small text helpers ----------------------------------------------------------------------

std::vector<std::string> split(const std::string& line, char separator) {
  std::vector<std::string> fields;
  std::string field;
  std::istringstream s(line);
  while (std::getline(s, field, separator)) fields.push_back(field);
  if (!line.empty() && line.back() == separator) fields.emplace_back();
  return fields;
}

std::string strip_cr(std::string line) {
  if (!line.empty() && line.back() == '\r') line.pop_back();
  return line;
}

// gnuplot string literal in double quotes.
std::string quoted(const std::string& text) {
  std::string q = "\"";
  for (const char c : text) {
    if (c == '"' || c == '\\') q += '\\';
    q += c;
  }
  return q + "\"";
}

std::string file_name(const std::string& path) { return fs::path(path).filename().string(); }

// A table of sqfc text output (CSV, TSV or JSON lines) read row by row, by column name.
class TableReader {
 public:
  explicit TableReader(const std::string& path) : in_(path), path_(path) {
    if (!in_) throw IoError("cannot read '" + path + "'");
    std::string line;
    while (std::getline(in_, line)) {
      line = strip_cr(line);
      if (line.empty() || line[0] == '#') continue;
      if (line[0] == '{') {
        json_ = true;
        pending_ = line;
        for (const auto& [key, value] : json_fields(line)) names_.push_back(key);
      } else {
        separator_ = line.find('\t') != std::string::npos ? '\t' : ',';
        names_ = split(line, separator_);
      }
      break;
    }
    if (names_.empty()) throw InvalidArgument("'" + path + "' has no header line");
  }
  [[nodiscard]] const std::vector<std::string>& names() const { return names_; }
  [[nodiscard]] std::optional<std::size_t> index(const std::string& name) const {
    const auto it = std::find(names_.begin(), names_.end(), name);
    if (it == names_.end()) return std::nullopt;
    return static_cast<std::size_t>(it - names_.begin());
  }
  // Next data row (fields in header order); false at the end.
  bool next(std::vector<std::string>& fields) {
    std::string line;
    while (true) {
      if (!pending_.empty()) {
        line = pending_;
        pending_.clear();
      } else if (!std::getline(in_, line)) {
        return false;
      }
      line = strip_cr(line);
      if (line.empty() || line[0] == '#') continue;
      break;
    }
    ++row_;
    if (json_) {
      fields.clear();
      for (const auto& [key, value] : json_fields(line)) fields.push_back(value);
    } else {
      fields = split(line, separator_);
    }
    if (fields.size() != names_.size())
      throw InvalidArgument("'" + path_ + "' row " + std::to_string(row_) + " has " + std::to_string(fields.size()) +
                            " fields, the header " + std::to_string(names_.size()));
    return true;
  }

 private:
  // {"n":5,"mu":-1}: keys are quoted names and values bare integers (docs/output-formats.md).
  static std::vector<std::pair<std::string, std::string>> json_fields(const std::string& line) {
    std::vector<std::pair<std::string, std::string>> out;
    std::string body = line;
    if (body.size() >= 2 && body.front() == '{' && body.back() == '}') body = body.substr(1, body.size() - 2);
    for (const auto& item : split(body, ',')) {
      const auto colon = item.find(':');
      if (colon == std::string::npos) continue;
      std::string key = item.substr(0, colon);
      key.erase(std::remove(key.begin(), key.end(), '"'), key.end());
      out.emplace_back(key, item.substr(colon + 1));
    }
    return out;
  }
  std::ifstream in_;
  std::string path_;
  std::vector<std::string> names_;
  std::string pending_;
  char separator_ = ',';
  bool json_ = false;
  std::size_t row_ = 0;
};

std::string first_data_line(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw IoError("cannot read '" + path + "'");
  std::string line;
  bool first = true;
  while (std::getline(in, line)) {
    line = strip_cr(line);
    if (first && line.rfind(envelope_signature, 0) == 0) return line;
    first = false;
    if (line.empty() || line[0] == '#') continue;
    return line;
  }
  throw InvalidArgument("'" + path + "' is empty: nothing to plot");
}

int dimensions_with_prefix(const std::vector<std::string>& names, char prefix, const std::string& suffix) {
  int top = -1;
  for (int d = 0; d < 16; ++d)
    if (std::find(names.begin(), names.end(), std::string(1, prefix) + std::to_string(d) + suffix) != names.end()) top = d;
  return top;
}

// ---- the common head of every script ---------------------------------------------------------

struct Frame {
  std::string stem;       // file name stem of the picture: <prefix file name>-<kind>
  std::string title;      // first title line
  std::string subtitle;   // second line (plain text, not enhanced)
  std::string x_label, y_label;
  bool log_x = false, log_y = false;
  std::string x_range, y_range;  // gnuplot ranges such as "[1:1000]" or ""
  std::string x_format;          // tic format of a linear x axis (empty: gnuplot's)
  std::string extra;             // further settings of this kind
};

std::string script_head(const Frame& f, const PlotRequest& r, const std::string& data_name) {
  std::ostringstream s;
  s << "# sqfc plot script (" << f.stem << "). Re-run in this folder:\n"
    << "#   gnuplot " << f.stem << ".gp                      -> " << f.stem << ".png\n"
    << "#   gnuplot -e 'fmt=\"svg\"' " << f.stem << ".gp       (or \"pdf\"); set outfile, width, height the same way.\n"
    << "# Restyle: edit the palette, font and layout variables below (docs/plots.md).\n"
    << "if (!exists(\"fmt\")) fmt = \"png\"\n"
    << "if (!exists(\"outfile\")) outfile = " << quoted(f.stem) << " . \".\" . fmt\n"
    << "if (!exists(\"width\")) width = " << r.width << "\n"
    << "if (!exists(\"height\")) height = " << r.height << "\n"
    << "datafile = " << quoted(data_name) << "\n"
    << "# palette\n"
    << "paper = \"" << paper << "\"; ink = \"" << ink << "\"; rule = \"" << rule << "\"\n"
    << "series = \"" << series_blue << "\"; guide = \"" << guide_ochre << "\"; zero = \"" << zero_rose
    << "\"; high = \"" << high_green << "\"; low = \"" << low_violet << "\"\n"
    << "array dim[" << dimension_colours.size() << "]\n";
  for (std::size_t d = 0; d < dimension_colours.size(); ++d) s << "dim[" << d + 1 << "] = \"" << dimension_colours[d] << "\"\n";
  s << "# font and layout\n"
    << "font_name = \"DejaVu Sans\"; font_size = 11\n"
    << "set encoding utf8\n"
    << "if (fmt eq \"png\") { set terminal pngcairo size width,height enhanced font font_name.\",\".font_size background rgb paper }\n"
    << "if (fmt eq \"svg\") { set terminal svg size width,height enhanced font font_name.\",\".font_size background rgb paper }\n"
    << "if (fmt eq \"pdf\") { set terminal pdfcairo size width/100.0,height/100.0 enhanced font font_name.\",\".(font_size-2) background rgb paper }\n"
    << "set output outfile\n"
    << "set datafile separator comma\n"
    << "set lmargin 12; set rmargin 4; set tmargin 5\n"
    << "set border 3 lc rgb ink lw 1\n"
    << "set tics out nomirror textcolor rgb ink\n"
    << "set grid xtics ytics lc rgb rule lw 1 dt 1\n"
    << "set key outside below center horizontal Left reverse samplen 2 width 2 textcolor rgb ink\n"
    << "set label 1 " << quoted(f.title) << " at screen 0.012, screen 0.955 left font font_name.\",\".(font_size+4) textcolor rgb ink\n"
    << "set label 2 " << quoted(f.subtitle) << " at screen 0.012, screen 0.905 left noenhanced textcolor rgb \"#5d6d7e\"\n"
    << "set xlabel " << quoted(f.x_label) << " textcolor rgb ink\n"
    << "set ylabel " << quoted(f.y_label) << " textcolor rgb ink\n";
  if (f.log_x) s << "set logscale x\nset format x \"10^{%T}\"\n";
  if (!f.log_x && !f.x_format.empty()) s << "set format x " << quoted(f.x_format) << "\n";
  if (f.log_y) s << "set logscale y\nset format y \"10^{%T}\"\n";
  if (!f.x_range.empty()) s << "set xrange " << f.x_range << "\n";
  if (!f.y_range.empty()) s << "set yrange " << f.y_range << "\n";
  s << f.extra;
  return s.str();
}

// A data file of gnuplot blocks (separated by two blank lines), each with a comment naming it.
class BlockFile {
 public:
  void begin(const std::string& comment) {
    if (blocks_ > 0) text_ << "\n\n";
    text_ << "# block " << blocks_ << ": " << comment << '\n';
    ++blocks_;
    rows_.push_back(0);
  }
  std::ostringstream& row() {
    ++rows_.back();
    return text_;
  }
  [[nodiscard]] int last_block() const { return blocks_ - 1; }
  [[nodiscard]] std::size_t rows(int block) const { return rows_[static_cast<std::size_t>(block)]; }
  [[nodiscard]] std::string text() const { return text_.str(); }

 private:
  std::ostringstream text_;
  int blocks_ = 0;
  std::vector<std::size_t> rows_;
};

// ---- inputs to data ---------------------------------------------------------------------------

struct Range {
  double lo = 0, hi = 0;
  bool empty = true;
  void add(double v) {
    if (empty) lo = hi = v, empty = false;
    lo = std::min(lo, v), hi = std::max(hi, v);
  }
};

// Events of the kinds we mark, zeros thinned to one mark per pixel column of the picture.
struct Markers {
  std::vector<std::pair<std::string, std::string>> zeros, highs, lows, scaled_highs, scaled_lows;  // (n, value)
  std::size_t zero_count = 0;
  Range n_range;
};

Markers read_markers(const std::string& path, bool log_x, unsigned width, std::optional<Range> x) {
  TableReader events(path);
  const auto kind = events.index("kind"), n = events.index("n"), value = events.index("value");
  if (!kind || !n || !value) throw InvalidArgument("'" + path + "' is not an events file (header kind,n,value)");
  Markers m;
  std::vector<std::string> f;
  std::vector<std::vector<std::string>> zeros;
  while (events.next(f)) {
    const double nv = std::stod(f[*n]);
    m.n_range.add(nv);
    const auto& k = f[*kind];
    if (k == "mertens_zero") zeros.push_back({f[*n], "0"});
    else if (k == "mertens_high") m.highs.emplace_back(f[*n], f[*value]);
    else if (k == "mertens_low") m.lows.emplace_back(f[*n], f[*value]);
    else if (k == "scaled_high") m.scaled_highs.emplace_back(f[*n], f[*value]);
    else if (k == "scaled_low") m.scaled_lows.emplace_back(f[*n], f[*value]);
  }
  m.zero_count = zeros.size();
  const Range span = x && !x->empty ? *x : m.n_range;
  long last_bucket = -1;
  for (const auto& z : zeros) {
    const double v = std::stod(z[0]);
    double t = 0;
    if (span.hi > span.lo)
      t = log_x ? (std::log(v) - std::log(std::max(span.lo, 1.0))) / (std::log(span.hi) - std::log(std::max(span.lo, 1.0)))
                : (v - span.lo) / (span.hi - span.lo);
    const long bucket = static_cast<long>(std::floor(t * width));
    if (bucket != last_bucket) m.zeros.emplace_back(z[0], z[1]), last_bucket = bucket;
  }
  return m;
}

std::string range_text(double lo, double hi) {
  std::ostringstream s;
  s.precision(17);
  s << '[' << lo << ':' << hi << ']';
  return s.str();
}

std::string count_text(Natural n) {
  std::string digits = std::to_string(n), out;
  for (std::size_t i = 0; i < digits.size(); ++i) {
    if (i > 0 && (digits.size() - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return out;
}

struct Picture {
  std::string data, script;
};

// Line kinds (mertens, scaled, betti, faces, fredholm) from a table or an envelope.
Picture line_picture(PlotKind kind, const PlotRequest& r, PlotInput input, const std::string& stem) {
  BlockFile data;
  Frame f;
  f.stem = stem;
  f.log_x = r.log_x;
  f.x_label = "n";
  const bool envelope = input == PlotInput::envelope;
  std::vector<std::string> names;
  std::string source_note;
  Range x, y;
  std::vector<bool> nonzero(16, false);  // curves that are not identically 0
  std::vector<std::string> fields;
  std::vector<std::pair<std::string, int>> curves;  // (series name, dimension or -1)
  int top = -1;
  Natural rows = 0;

  // The series of this kind.
  auto series_for = [&](const std::vector<std::string>& header, const std::string& suffix) {
    curves.clear();
    if (kind == PlotKind::mertens) curves.push_back({"mertens", -1});
    if (kind == PlotKind::scaled) curves.push_back({envelope ? "scaled" : "mertens", -1});
    if (kind == PlotKind::fredholm) curves.push_back({"fredholm", -1});
    if (kind == PlotKind::betti || kind == PlotKind::faces) {
      const char p = kind == PlotKind::betti ? 'b' : 'f';
      top = dimensions_with_prefix(header, p, suffix);
      for (int d = 0; d <= top; ++d) curves.push_back({std::string(1, p) + std::to_string(d), d});
    }
  };

  const bool events_only = input == PlotInput::events;
  if (events_only) {
    source_note = "events only (no table)";
  } else if (envelope) {
    const auto info = read_envelope_info(r.input);
    series_for(info.header, "_min");
    TableReader t(r.input);
    const auto lo = t.index("lo"), hi = t.index("hi");
    std::vector<std::pair<std::size_t, std::size_t>> cols;
    for (const auto& c : curves) {
      const auto mn = t.index(c.first + "_min"), mx = t.index(c.first + "_max");
      if (!mn || !mx) throw InvalidArgument("'" + r.input + "' has no " + c.first + " columns");
      cols.emplace_back(*mn, *mx);
    }
    // Read once, write one block per series.
    std::vector<std::ostringstream> blocks(curves.size());
    while (t.next(fields)) {
      ++rows;
      x.add(std::stod(fields[*lo]));
      x.add(std::stod(fields[*hi]) - 1);
      for (std::size_t i = 0; i < curves.size(); ++i) {
        blocks[i] << fields[*lo] << ',' << fields[*hi] << ',' << fields[cols[i].first] << ',' << fields[cols[i].second] << '\n';
        y.add(std::stod(fields[cols[i].first]));
        y.add(std::stod(fields[cols[i].second]));
        if (std::stod(fields[cols[i].second]) != 0) nonzero[i] = true;
      }
    }
    BlockFile rebuilt;
    for (std::size_t i = 0; i < curves.size(); ++i) {
      rebuilt.begin(curves[i].first + " per pixel column: lo,hi,min,max (n in [lo, hi))");
      const std::string text = blocks[i].str();
      rebuilt.row() << text;
    }
    data = std::move(rebuilt);
    source_note = "envelope of " + count_text(rows) + " pixel columns (exact min and max per column) from " + file_name(r.input);
  } else {
    TableReader t(r.input);
    series_for(t.names(), "");
    const auto n = t.index("n");
    if (!n) throw InvalidArgument("'" + r.input + "' has no n column");
    std::vector<std::size_t> cols;
    for (const auto& c : curves) {
      const auto i = t.index(c.first);
      if (!i) throw InvalidArgument("'" + r.input + "' has no " + c.first + " column");
      cols.push_back(*i);
    }
    data.begin("n," + [&] {
      std::string s;
      for (std::size_t i = 0; i < curves.size(); ++i) s += (i ? "," : "") + curves[i].first;
      return s;
    }() + " at the sample points of the table");
    while (t.next(fields)) {
      ++rows;
      x.add(std::stod(fields[*n]));
      auto& o = data.row();
      o << fields[*n];
      for (std::size_t i = 0; i < cols.size(); ++i) {
        o << ',' << fields[cols[i]];
        const double v = std::stod(fields[cols[i]]);
        y.add(kind == PlotKind::scaled ? v / std::sqrt(std::stod(fields[*n])) : v);
        if (v != 0) nonzero[i] = true;
      }
      o << '\n';
    }
    source_note = count_text(rows) + " sample points from " + file_name(r.input);
  }
  if (rows == 0 && !events_only) throw InvalidArgument("'" + r.input + "' has no rows: nothing to plot");

  std::optional<Markers> markers;
  if (r.events && (kind == PlotKind::mertens || kind == PlotKind::scaled))
    markers = read_markers(*r.events, r.log_x, r.width, events_only ? std::nullopt : std::optional<Range>(x));
  if (events_only) {
    if (markers->n_range.empty) throw InvalidArgument("'" + r.input + "' has no events: nothing to plot");
    x = markers->n_range;
  }

  const double x_lo = std::max(x.lo, 1.0), x_hi = std::max(x.hi, x_lo + 1);
  f.x_range = range_text(x_lo, x_hi);
  if (!r.log_x && x_hi >= 1e6) f.x_format = "%.2h";
  // M and M/sqrt(n): the data fill the height; the guides are clipped.
  if ((kind == PlotKind::mertens || kind == PlotKind::scaled) && (!y.empty || markers)) {
    double extent = std::max({y.empty ? 0.0 : std::abs(y.lo), y.empty ? 0.0 : std::abs(y.hi), kind == PlotKind::scaled ? 0.2 : 1.0});
    if (markers)
      for (const auto* list : {&markers->highs, &markers->lows, &markers->scaled_highs, &markers->scaled_lows})
        for (const auto& point : *list) {
          if (kind == PlotKind::mertens && (list == &markers->scaled_highs || list == &markers->scaled_lows)) continue;
          if (kind == PlotKind::scaled && (list == &markers->highs || list == &markers->lows)) continue;
          extent = std::max(extent, std::abs(std::stod(point.second)));
        }
    f.y_range = range_text(-1.15 * extent, 1.15 * extent);
  }
  std::ostringstream plot;
  std::vector<std::string> clauses;
  const std::string N = count_text(static_cast<Natural>(x.hi));
  auto band = [&](int block, const std::string& colour, const std::string& title) {
    return "datafile index " + std::to_string(block) + " using 1:3:1:2:3:4 with boxxyerror lc rgb " + colour +
           " fs solid 0.85 border lc rgb " + colour + " title " + quoted(title);
  };
  auto step_line = [&](int column, const std::string& colour, const std::string& title, const std::string& using_y = "") {
    return "datafile index 0 using 1:" + (using_y.empty() ? std::to_string(column) : using_y) + " with steps lw 1.6 lc rgb " + colour +
           " title " + quoted(title);
  };
  switch (kind) {
    case PlotKind::mertens:
      f.title = "Mertens function M(n), n ≤ " + N;
      f.y_label = "M(n)";
      if (!events_only) clauses.push_back(envelope ? band(0, "series", "M(n), min–max per column") : step_line(2, "series", "M(n)"));
      clauses.push_back("sqrt(x) with lines dt (6,4) lw 1.4 lc rgb guide title \"±√n\"");
      clauses.push_back("-sqrt(x) with lines dt (6,4) lw 1.4 lc rgb guide notitle");
      break;
    case PlotKind::scaled:
      f.title = "Scaled Mertens function M(n)/√n, n ≤ " + N;
      f.y_label = "M(n)/√n";
      if (!events_only)
        clauses.push_back(envelope ? band(0, "series", "M(n)/√n, min–max per column")
                                   : step_line(0, "series", "M(n)/√n", "($2/sqrt($1))"));
      clauses.push_back("1 with lines dt (6,4) lw 1.4 lc rgb guide title \"±1\"");
      clauses.push_back("-1 with lines dt (6,4) lw 1.4 lc rgb guide notitle");
      clauses.push_back("0 with lines lw 1 lc rgb ink notitle");
      break;
    case PlotKind::fredholm:
      f.title = "Fredholm determinant D(n) = det(1 + A(H_n)), n ≤ " + N;
      f.y_label = "D(n)";
      f.y_range = "[-1.6:1.6]";
      f.extra = "set ytics (\"−1\" -1, \"0\" 0, \"+1\" 1)\n";
      clauses.push_back(envelope ? band(0, "series", "values taken in each column") : step_line(2, "series", "D(n)"));
      break;
    case PlotKind::betti:
    case PlotKind::faces: {
      const bool betti = kind == PlotKind::betti;
      f.title = betti ? "Betti numbers b_d(K_n), n ≤ " + N : "Face counts f_d(K_n), n ≤ " + N;
      f.y_label = betti ? "b_d(n)" : "f_d(n)";
      f.log_y = r.log_y;
      for (std::size_t i = 0; i < curves.size(); ++i) {
        if (!nonzero[i]) continue;  // e.g. b_6 before its first sphere
        const int d = curves[i].second;
        const std::string colour = "dim[" + std::to_string(d % static_cast<int>(dimension_colours.size()) + 1) + "]";
        const std::string title = std::string(betti ? "b_" : "f_") + std::to_string(d);
        if (envelope) {
          clauses.push_back(band(static_cast<int>(i), colour, title));
        } else {
          const std::string col = std::to_string(i + 2);
          clauses.push_back(step_line(0, colour, title, r.log_y ? "($" + col + " > 0 ? $" + col + " : NaN)" : col));
        }
      }
      break;
    }
    default: break;
  }
  if (markers) {
    auto add_block = [&](const std::vector<std::pair<std::string, std::string>>& points, const std::string& comment) {
      data.begin(comment);
      for (const auto& [n, v] : points) data.row() << n << ',' << v << '\n';
      return data.last_block();
    };
    auto marks = [&](int block, const std::string& style, const std::string& title) {
      if (data.rows(block) == 0) return;
      clauses.push_back("datafile index " + std::to_string(block) + " using 1:2 with points " + style + " title " + quoted(title));
    };
    if (kind == PlotKind::mertens) {
      const int z = add_block(markers->zeros, "zeros of M: n,0 (at most one per pixel column)");
      const int h = add_block(markers->highs, "record highs of M: n,M(n)");
      const int l = add_block(markers->lows, "record lows of M: n,M(n)");
      marks(z, "pt 2 ps 0.5 lc rgb zero",
            "zeros (" + count_text(markers->zero_count) + (markers->zeros.size() < markers->zero_count ? ", one mark per column)" : ")"));
      marks(h, "pt 9 ps 0.9 lc rgb high", "record highs");
      marks(l, "pt 11 ps 0.9 lc rgb low", "record lows");
    } else {
      const int h = add_block(markers->scaled_highs, "records of M(n)/sqrt(n) from n = 200: n,value");
      const int l = add_block(markers->scaled_lows, "record lows of M(n)/sqrt(n) from n = 200: n,value");
      marks(h, "pt 9 ps 0.9 lc rgb high", "record highs");
      marks(l, "pt 11 ps 0.9 lc rgb low", "record lows");
    }
  }
  f.subtitle = source_note + (markers ? "; markers from " + file_name(*r.events) : "");
  std::string script = script_head(f, r, stem + ".dat");
  script += "plot ";
  for (std::size_t i = 0; i < clauses.size(); ++i) script += (i ? ", \\\n     " : "") + clauses[i];
  script += "\n";
  return {data.text(), script};
}

struct Bar {
  int dimension;
  Natural birth;
  std::optional<Natural> death;
};

std::vector<Bar> read_bars(const PlotRequest& r) {
  TableReader t(r.input);
  const auto d = t.index("dimension"), b = t.index("birth"), e = t.index("death");
  if (!d || !b || !e) throw InvalidArgument("'" + r.input + "' is not a barcode file (header dimension,birth,death)");
  std::vector<Bar> bars;
  std::vector<std::string> f;
  while (t.next(f)) {
    bars.push_back({std::stoi(f[*d]), std::stoull(f[*b]), f[*e] == "inf" ? std::nullopt : std::optional<Natural>(std::stoull(f[*e]))});
    if (bars.size() > r.max_bars)
      throw InvalidArgument("'" + r.input + "' has more than " + std::to_string(r.max_bars) +
                            " bars; the barcode and diagram pictures are for small N (sqfc homology --to 50000 or less)");
  }
  if (bars.empty()) throw InvalidArgument("'" + r.input + "' has no bars: nothing to plot");
  std::stable_sort(bars.begin(), bars.end(), [](const Bar& a, const Bar& c) {
    return a.dimension != c.dimension ? a.dimension < c.dimension : a.birth < c.birth;
  });
  return bars;
}

Picture barcode_picture(PlotKind kind, const PlotRequest& r, const std::string& stem) {
  const auto bars = read_bars(r);
  Natural far = 1;
  int top = 0;
  for (const auto& b : bars) {
    far = std::max(far, b.death.value_or(b.birth));
    far = std::max(far, b.birth);
    top = std::max(top, b.dimension);
  }
  const double end = static_cast<double>(far) * (r.log_x ? 1.6 : 1.08);  // where essential bars stop
  BlockFile data;
  Frame f;
  f.stem = stem;
  f.log_x = r.log_x;
  std::vector<std::string> clauses;
  Natural essential = 0;
  for (const auto& b : bars) essential += !b.death;
  f.subtitle = count_text(bars.size()) + " bars (" + count_text(essential) + " essential) from " + file_name(r.input);
  if (kind == PlotKind::barcode) {
    f.title = "Barcode of the filtration K_1 ⊂ K_2 ⊂ …, by dimension";
    f.x_label = "n (birth to death)";
    f.y_label = "bars";
    std::size_t row = 0;
    for (int d = 0; d <= top; ++d) {
      data.begin("dimension " + std::to_string(d) + ": birth,length,row,essential (1: no death, drawn to the right edge)");
      const int block = data.last_block();
      for (const auto& b : bars) {
        if (b.dimension != d) continue;
        const double death = b.death ? static_cast<double>(*b.death) : end;
        data.row() << b.birth << ',' << (death - static_cast<double>(b.birth)) << ',' << row++ << ',' << (b.death ? 0 : 1) << '\n';
      }
      if (data.rows(block) == 0) continue;
      const std::string colour = "dim[" + std::to_string(d % static_cast<int>(dimension_colours.size()) + 1) + "]";
      clauses.push_back("datafile index " + std::to_string(block) +
                        " using 1:3:2:(0) with vectors nohead lw 1.5 lc rgb " + colour + " title \"dimension " +
                        std::to_string(d) + "\"");
      clauses.push_back("datafile index " + std::to_string(block) + " using ($4 > 0 ? $1 : NaN):3:2:(0) with vectors head size screen 0.008,25 filled lw 1.5 lc rgb " +
                        colour + " notitle");
    }
    f.x_range = range_text(r.log_x ? 1.0 : 0.0, end);
    f.y_range = range_text(-1.0, static_cast<double>(row));
    std::string script = script_head(f, r, stem + ".dat");
    script += "set ytics format \"\"\nunset grid; set grid xtics lc rgb rule\n";
    script += "plot ";
    for (std::size_t i = 0; i < clauses.size(); ++i) script += (i ? ", \\\n     " : "") + clauses[i];
    return {data.text(), script + "\n"};
  }
  // Persistence diagram: (birth, death) points; essential classes on a line above the others.
  f.title = "Persistence diagram of the filtration K_1 ⊂ K_2 ⊂ …";
  f.x_label = "birth n";
  f.y_label = "death n";
  f.log_y = r.log_x;
  const double inf_level = static_cast<double>(far) * (r.log_x ? 1.5 : 1.1);
  for (int d = 0; d <= top; ++d) {
    data.begin("dimension " + std::to_string(d) + ": birth,death (essential classes at the ∞ line " +
               std::to_string(static_cast<Natural>(inf_level)) + ")");
    const int block = data.last_block();
    for (const auto& b : bars)
      if (b.dimension == d) data.row() << b.birth << ',' << (b.death ? static_cast<double>(*b.death) : inf_level) << '\n';
    if (data.rows(block) == 0) continue;
    const std::string colour = "dim[" + std::to_string(d % static_cast<int>(dimension_colours.size()) + 1) + "]";
    clauses.push_back("datafile index " + std::to_string(block) + " using 1:2 with points pt 7 ps 0.6 lc rgb " + colour +
                      " title \"dimension " + std::to_string(d) + "\"");
  }
  clauses.insert(clauses.begin(), "x with lines lw 1 lc rgb ink title \"death = birth\"");
  clauses.push_back(std::to_string(inf_level) + " with lines dt (6,4) lw 1.2 lc rgb guide title \"∞ (essential)\"");
  const double lo = r.log_x ? 1.0 : 0.0;
  f.x_range = range_text(lo, inf_level * 1.04);
  f.y_range = range_text(lo, inf_level * 1.08);
  std::string script = script_head(f, r, stem + ".dat");
  script += "set size ratio -1\n";
  script += "plot ";
  for (std::size_t i = 0; i < clauses.size(); ++i) script += (i ? ", \\\n     " : "") + clauses[i];
  return {data.text(), script + "\n"};
}

Picture green_picture(const PlotRequest& r, const std::string& stem) {
  TableReader t(r.input);
  const auto n = t.index("n"), value = t.index("value"), count = t.index("count"), diagonal = t.index("diagonal_count");
  if (!n || !value || !count || !diagonal)
    throw InvalidArgument("'" + r.input + "' is not a Green histogram (header n,value,count,diagonal_count)");
  std::map<Natural, std::vector<std::array<std::string, 3>>> by_n;
  std::vector<std::string> f;
  while (t.next(f)) by_n[std::stoull(f[*n])].push_back({f[*value], f[*count], f[*diagonal]});
  if (by_n.empty()) throw InvalidArgument("'" + r.input + "' has no rows: nothing to plot");
  const Natural at = r.histogram_n.value_or(by_n.rbegin()->first);
  const auto it = by_n.find(at);
  if (it == by_n.end()) throw InvalidArgument("'" + r.input + "' has no histogram for n = " + std::to_string(at));
  BlockFile data;
  data.begin("Green values at n = " + std::to_string(at) + ": value,count,diagonal_count");
  Count entries = 0;
  for (const auto& row : it->second) {
    data.row() << row[0] << ',' << row[1] << ',' << row[2] << '\n';
    entries += std::stoull(row[1]);
  }
  Frame fr;
  fr.stem = stem;
  fr.title = "Green function g_n = (1 + A(H_n))^{-1}: value histogram at n = " + count_text(at);
  fr.subtitle = count_text(it->second.size()) + " distinct values, " + count_text(entries) + " entries, from " + file_name(r.input);
  fr.x_label = "entry value";
  fr.y_label = "entries";
  fr.log_y = r.log_y;
  std::string script = script_head(fr, r, stem + ".dat");
  script += "set style fill solid 0.85 noborder\nset boxwidth 0.8 absolute\n";
  script += "plot datafile index 0 using 1:2 with boxes lc rgb series title \"all entries\", \\\n"
            "     datafile index 0 using 1:($3 > 0 ? $3 : NaN) with boxes lc rgb zero fs solid 0.9 title \"diagonal entries\"\n";
  return {data.text(), script};
}

// ---- running gnuplot --------------------------------------------------------------------------

bool is_executable(const std::string& path) { return !path.empty() && ::access(path.c_str(), X_OK) == 0; }

// Runs `gnuplot -e SETTINGS SCRIPT` in `folder`; returns its exit status and error text.
std::pair<int, std::string> run_gnuplot(const std::string& program, const std::string& folder, const std::string& settings,
                                        const std::string& script) {
  const std::string err_path = (fs::path(folder) / (script + ".stderr-" + std::to_string(::getpid()))).string();
  const pid_t pid = ::fork();
  if (pid < 0) throw IoError("cannot start gnuplot (fork failed)");
  if (pid == 0) {
    const int in = ::open("/dev/null", O_RDONLY);
    const int err = ::open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    if (in < 0 || err < 0 || ::chdir(folder.c_str()) != 0) ::_exit(126);
    ::dup2(in, 0);
    ::dup2(err, 1);
    ::dup2(err, 2);
    std::vector<std::string> args = {program, "-e", settings, script};
    std::vector<char*> argv;
    for (auto& a : args) argv.push_back(a.data());
    argv.push_back(nullptr);
    ::execv(program.c_str(), argv.data());
    ::_exit(127);
  }
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0) {
    if (errno != EINTR) throw IoError("waiting for gnuplot failed");
  }
  std::string text;
  {
    std::ifstream in(err_path);
    std::ostringstream s;
    s << in.rdbuf();
    text = s.str();
  }
  std::error_code ec;
  fs::remove(err_path, ec);
  return {WIFEXITED(status) ? WEXITSTATUS(status) : 128 + (WIFSIGNALED(status) ? WTERMSIG(status) : 0), text};
}

std::string first_error_line(const std::string& text) {
  std::istringstream s(text);
  std::string line, best;
  while (std::getline(s, line)) {
    if (line.find_first_not_of(" \t^") == std::string::npos) continue;
    if (best.empty()) best = line;
    if (line.find("error") != std::string::npos || line.find("rror") != std::string::npos) return line;
  }
  return best.empty() ? "no message" : best;
}

std::string gnuplot_missing(const std::string& program) {
  return "gnuplot is not available" + (program.empty() ? std::string() : " at '" + program + "'") +
         " (install the Debian package gnuplot-nox: apt-get install gnuplot-nox)";
}

}  // namespace

std::string_view plot_kind_name(PlotKind kind) noexcept {
  switch (kind) {
    case PlotKind::mertens: return "mertens";
    case PlotKind::scaled: return "scaled";
    case PlotKind::betti: return "betti";
    case PlotKind::faces: return "faces";
    case PlotKind::fredholm: return "fredholm";
    case PlotKind::barcode: return "barcode";
    case PlotKind::diagram: return "diagram";
    case PlotKind::green: return "green";
  }
  return "unknown";
}

std::string_view plot_format_name(PlotFormat format) noexcept {
  switch (format) {
    case PlotFormat::png: return "png";
    case PlotFormat::svg: return "svg";
    case PlotFormat::pdf: return "pdf";
  }
  return "unknown";
}

std::string_view plot_input_name(PlotInput input) noexcept {
  switch (input) {
    case PlotInput::table: return "table";
    case PlotInput::envelope: return "envelope";
    case PlotInput::events: return "events";
    case PlotInput::barcode: return "barcode";
    case PlotInput::histogram: return "histogram";
  }
  return "unknown";
}

std::vector<PlotKind> all_plot_kinds() {
  return {PlotKind::mertens, PlotKind::scaled, PlotKind::betti, PlotKind::faces,
          PlotKind::fredholm, PlotKind::barcode, PlotKind::diagram, PlotKind::green};
}

std::optional<PlotKind> find_plot_kind(std::string_view name) noexcept {
  for (const auto k : all_plot_kinds())
    if (plot_kind_name(k) == name) return k;
  return std::nullopt;
}

std::optional<PlotFormat> find_plot_format(std::string_view name) noexcept {
  for (const auto f : {PlotFormat::png, PlotFormat::svg, PlotFormat::pdf})
    if (plot_format_name(f) == name) return f;
  return std::nullopt;
}

PlotInput detect_plot_input(const std::string& path) {
  if (fs::is_directory(path)) throw InvalidArgument("'" + path + "' is a folder, not a data file");
  const std::string line = first_data_line(path);
  if (line.rfind(envelope_signature, 0) == 0) return PlotInput::envelope;
  if (line == "kind,n,value") return PlotInput::events;
  if (line == "dimension,birth,death") return PlotInput::barcode;
  if (line == "n,value,count,diagonal_count") return PlotInput::histogram;
  if (line.rfind("{\"n\":", 0) == 0 || line == "n" || line.rfind("n,", 0) == 0 || line.rfind("n\t", 0) == 0)
    return PlotInput::table;
  throw InvalidArgument("'" + path + "' is not a file sqfc can plot (a table, envelope, events, barcode or histogram file)");
}

std::vector<PlotKind> supported_plot_kinds(const std::string& path, PlotInput input) {
  switch (input) {
    case PlotInput::events: return {PlotKind::mertens, PlotKind::scaled};
    case PlotInput::barcode: return {PlotKind::barcode, PlotKind::diagram};
    case PlotInput::histogram: return {PlotKind::green};
    case PlotInput::table:
    case PlotInput::envelope: break;
  }
  std::vector<std::string> names;
  std::string suffix;
  if (input == PlotInput::envelope) {
    names = read_envelope_info(path).header;
    suffix = "_min";
  } else {
    names = TableReader(path).names();
  }
  const auto has = [&](const std::string& n) { return std::find(names.begin(), names.end(), n + suffix) != names.end(); };
  std::vector<PlotKind> kinds;
  if (has("mertens")) kinds.push_back(PlotKind::mertens);
  if (has("mertens")) kinds.push_back(PlotKind::scaled);
  if (has("b0")) kinds.push_back(PlotKind::betti);
  if (has("f0")) kinds.push_back(PlotKind::faces);
  if (has("fredholm")) kinds.push_back(PlotKind::fredholm);
  return kinds;
}

void check_gnuplot(const std::string& program) {
  if (!is_executable(program)) throw IoError(gnuplot_missing(program));
}

void check_plot_request(const PlotRequest& r) {
  if (r.input.empty()) throw InvalidArgument("no input file given");
  if (!fs::exists(r.input)) throw InvalidArgument("input file '" + r.input + "' does not exist");
  const PlotInput input = r.input_kind.value_or(detect_plot_input(r.input));
  const auto supported = supported_plot_kinds(r.input, input);
  for (const auto k : r.kinds)
    if (k == PlotKind::betti && input == PlotInput::envelope &&
        std::find(supported.begin(), supported.end(), k) == supported.end())
      throw InvalidArgument("the envelope file '" + r.input + "' has no Betti extremes (make it with sqfc table --plot betti or --envelope-betti)");
  for (const auto k : r.kinds)
    if (std::find(supported.begin(), supported.end(), k) == supported.end())
      throw InvalidArgument("picture kind '" + std::string(plot_kind_name(k)) + "' cannot be drawn from the " +
                            std::string(plot_input_name(input)) + " file '" + r.input + "'");
  if (supported.empty()) throw InvalidArgument("'" + r.input + "' has no column sqfc can plot");
  if (r.events) {
    if (!fs::exists(*r.events)) throw InvalidArgument("events file '" + *r.events + "' does not exist");
    if (detect_plot_input(*r.events) != PlotInput::events)
      throw InvalidArgument("'" + *r.events + "' is not an events file (header kind,n,value)");
  }
  if (r.formats.empty()) throw InvalidArgument("no picture format given");
  if (r.width < 200 || r.width > 20000 || r.height < 150 || r.height > 20000)
    throw InvalidArgument("picture size " + std::to_string(r.width) + "x" + std::to_string(r.height) +
                          " is outside 200..20000 by 150..20000 pixels");
  if (r.prefix.empty()) throw InvalidArgument("no output prefix given");
  if (!is_executable(r.gnuplot)) throw IoError(gnuplot_missing(r.gnuplot));
  if (input == PlotInput::barcode) static_cast<void>(read_bars(r));
}

std::vector<PlotOutput> make_plots(const PlotRequest& request) {
  check_plot_request(request);
  const PlotInput input = request.input_kind.value_or(detect_plot_input(request.input));
  PlotRequest r = request;
  if (r.kinds.empty()) r.kinds = supported_plot_kinds(r.input, input);
  const fs::path prefix(r.prefix);
  const fs::path folder = prefix.has_parent_path() ? prefix.parent_path() : fs::path(".");
  const fs::path shown = prefix.parent_path();  // reported paths: as the prefix was given, no "./" added
  ensure_directory(folder.string());
  std::vector<PlotOutput> outputs;
  for (const auto kind : r.kinds) {
    const std::string stem = prefix.filename().string() + "-" + std::string(plot_kind_name(kind));
    Picture p;
    if (kind == PlotKind::barcode || kind == PlotKind::diagram) p = barcode_picture(kind, r, stem);
    else if (kind == PlotKind::green) p = green_picture(r, stem);
    else if (input == PlotInput::events) {
      // Markers only: an events file has no series; its markers are drawn on the guides.
      PlotRequest e = r;
      e.events = r.input;
      p = line_picture(kind, e, input, stem);
    } else {
      p = line_picture(kind, r, input, stem);
    }
    PlotOutput out;
    out.kind = kind;
    out.data = (shown / (stem + ".dat")).string();
    out.script = (shown / (stem + ".gp")).string();
    AtomicOutputFile data(out.data), script(out.script);
    data.stream() << p.data;
    script.stream() << p.script;
    data.commit();
    script.commit();
    for (const auto format : r.formats) {
      const std::string picture = stem + "." + std::string(plot_format_name(format));
      const std::string temporary = picture + ".part-" + std::to_string(::getpid());
      const std::string settings = "fmt=\"" + std::string(plot_format_name(format)) + "\"; outfile=\"" + temporary + "\"";
      const auto [status, text] = run_gnuplot(r.gnuplot, folder.string(), settings, stem + ".gp");
      const fs::path temp_path = folder / temporary;
      std::error_code ec;
      if (status == 127 || status == 126) {
        fs::remove(temp_path, ec);
        throw IoError(gnuplot_missing(r.gnuplot));
      }
      if (status != 0 || !fs::exists(temp_path) || fs::file_size(temp_path, ec) == 0) {
        fs::remove(temp_path, ec);
        throw IoError("gnuplot failed on " + out.script + ": " + first_error_line(text));
      }
      fs::rename(temp_path, folder / picture, ec);
      if (ec) throw IoError("cannot rename " + temp_path.string() + ": " + ec.message());
      out.pictures.push_back((shown / picture).string());
    }
    outputs.push_back(std::move(out));
  }
  return outputs;
}

}  // namespace sqfc::io
