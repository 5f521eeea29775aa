// SPDX-License-Identifier: MIT
// Tests of io/table_writer: exact text of every table format and of the events file, b-file
// round trip (write, parse back, compare), format names and locale independence.
#include "sqfc/io/table_writer.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cstdint>
#include <locale>
#include <sstream>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/published_csv.hpp"
#include "sqfc/arith/factor_code.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/columns.hpp"
#include "sqfc/track/tracker_state.hpp"
#include "track/collecting_sink.hpp"

namespace {

using sqfc::Natural;
using sqfc::io::Column;
using sqfc::io::TableFormat;
using sqfc::io::TableWriter;
using sqfc::track::TableRow;
using K = sqfc::io::Column::Kind;
namespace io = sqfc::io;
namespace oracles = sqfc::oracles;

// Two input rows counted by hand (the writer only formats them): K_6 (faces 2, 3, 5 and
// 6 = 2*3; components {2, 3} and {5}) and K_30 (10 vertices, 7 edges, the triangle 30;
// b_0 = 1 + #{17, 19, 23, 29}, b_1 = #{21}; seven k in [2, 30] with mu(k) = +1, so D = -1).
TableRow row_6() {
  TableRow r;
  r.n = 6;
  r.mu = 1;
  r.mertens = -1;
  r.euler = 2;
  r.squarefree = 5;
  r.liouville = 0;
  r.fredholm = -1;
  r.faces[0] = 3;
  r.faces[1] = 1;
  r.betti[0] = 2;
  r.div_edges = 2;
  return r;
}
TableRow row_30() {
  TableRow r;
  r.n = 30;
  r.mu = -1;
  r.mertens = -3;
  r.euler = 4;
  r.squarefree = 19;
  r.liouville = -4;
  r.fredholm = -1;
  r.faces[0] = 10;
  r.faces[1] = 7;
  r.faces[2] = 1;
  r.betti[0] = 5;
  r.betti[1] = 1;
  r.betti[2] = 0;
  r.div_edges = 20;
  return r;
}

std::string written(TableFormat format, const std::vector<Column>& columns, const std::vector<std::string>& comments = {}) {
  std::ostringstream out;
  TableWriter writer(out, format, columns, comments);
  writer.write(row_6());
  writer.write(row_30());
  return out.str();
}

const std::vector<Column> some_columns = {{K::n}, {K::mertens}, {K::squarefree}, {K::face, 1}, {K::betti, 0}, {K::fredholm}};

TEST(TableWriter, HandRowsAgreeWithTheTracker) {
  // The rows counted by hand are the tracker's rows at 6 and 30 (trial-division codes).
  sqfc::track::TrackerState s;
  int checked = 0;
  for (Natural n = 1; n <= 30; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    s.step(sqfc::arith::make_factor_code(a.omega, a.mu != 0, a.big_omega));
    if (n != 6 && n != 30) continue;
    const TableRow want = n == 6 ? row_6() : row_30();
    std::ostringstream got_text, want_text;
    TableWriter(got_text, TableFormat::csv, io::default_columns(30)).write(s.row());
    TableWriter(want_text, TableFormat::csv, io::default_columns(30)).write(want);
    EXPECT_TRUE(sqfc::testing::same_row(s.row(), want)) << got_text.str() << want_text.str();
    ++checked;
  }
  EXPECT_EQ(checked, 2);
}

TEST(TableWriter, CsvText) {
  EXPECT_EQ(written(TableFormat::csv, some_columns), "n,mertens,squarefree,f1,b0,fredholm\n6,-1,5,1,2,-1\n30,-3,19,7,5,-1\n");
}

TEST(TableWriter, CsvTextWithDefaultColumns) {
  EXPECT_EQ(written(TableFormat::csv, io::default_columns(30)),
            "n,mu,mertens,euler,squarefree,liouville,fredholm,f0,f1,f2,b0,b1,b2,div_edges\n"
            "6,1,-1,2,5,0,-1,3,1,0,2,0,0,2\n"
            "30,-1,-3,4,19,-4,-1,10,7,1,5,1,0,20\n");
}

TEST(TableWriter, TsvText) {
  EXPECT_EQ(written(TableFormat::tsv, some_columns),
            "n\tmertens\tsquarefree\tf1\tb0\tfredholm\n6\t-1\t5\t1\t2\t-1\n30\t-3\t19\t7\t5\t-1\n");
}

TEST(TableWriter, JsonLinesText) {
  const std::string text = written(TableFormat::jsonl, some_columns);
  EXPECT_EQ(text,
            "{\"n\":6,\"mertens\":-1,\"squarefree\":5,\"f1\":1,\"b0\":2,\"fredholm\":-1}\n"
            "{\"n\":30,\"mertens\":-3,\"squarefree\":19,\"f1\":7,\"b0\":5,\"fredholm\":-1}\n");
  // Each line is a JSON object (parsed with nlohmann-json) with the columns in order.
  std::istringstream lines(text);
  std::string line;
  int parsed = 0;
  const std::vector<std::string> names = {"n", "mertens", "squarefree", "f1", "b0", "fredholm"};
  while (std::getline(lines, line)) {
    const auto object = nlohmann::ordered_json::parse(line);
    ASSERT_TRUE(object.is_object());
    std::vector<std::string> keys;
    for (const auto& [key, value] : object.items()) keys.push_back(key);
    EXPECT_EQ(keys, names);
    EXPECT_EQ(object["n"].get<std::int64_t>(), parsed == 0 ? 6 : 30);
    ++parsed;
  }
  EXPECT_EQ(parsed, 2);
}

TEST(TableWriter, BfileText) {
  EXPECT_EQ(written(TableFormat::bfile, {{K::n}, {K::mertens}}, {"M(n) for n in [6, 30]", "second line"}),
            "# M(n) for n in [6, 30]\n# second line\n6 -1\n30 -3\n");
  EXPECT_EQ(written(TableFormat::bfile, {{K::n}, {K::betti, 0}}), "6 2\n30 5\n");
}

TEST(TableWriter, BfileNeedsNAndExactlyOneValueColumn) {
  std::ostringstream out;
  int checked = 0;
  for (const auto& columns : {std::vector<Column>{{K::n}}, std::vector<Column>{{K::n}, {K::mu}, {K::mertens}},
                              std::vector<Column>{{K::mertens}, {K::n}}, std::vector<Column>{{K::mu}, {K::mertens}},
                              std::vector<Column>{}}) {
    EXPECT_THROW(TableWriter(out, TableFormat::bfile, columns), sqfc::InvalidArgument) << checked;
    ++checked;
  }
  EXPECT_EQ(checked, 5);
  EXPECT_TRUE(out.str().empty());  // nothing was written by a rejected writer
}

// Parses OEIS b-file text: `#` comment lines and blank lines are skipped, every other line
// is two integers separated by white space.
std::vector<std::pair<std::int64_t, std::int64_t>> parse_bfile(const std::string& text) {
  std::vector<std::pair<std::int64_t, std::int64_t>> pairs;
  std::istringstream lines(text);
  std::string line;
  while (std::getline(lines, line)) {
    if (line.empty() || line[0] == '#') continue;
    std::istringstream fields(line);
    std::int64_t n = 0, value = 0;
    std::string rest;
    if (!(fields >> n >> value) || (fields >> rest)) {
      ADD_FAILURE() << "malformed b-file line '" << line << "'";
      continue;
    }
    pairs.emplace_back(n, value);
  }
  return pairs;
}

TEST(TableWriter, BfileRoundTrip) {
  // Rows of a tracker stepped over trial-division codes, n = 1..3000, written as b-files of
  // several columns and parsed back.
  const Natural limit = 3000;
  std::vector<TableRow> rows;
  sqfc::track::TrackerState s;
  for (Natural n = 1; n <= limit; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    s.step(sqfc::arith::make_factor_code(a.omega, a.mu != 0, a.big_omega));
    rows.push_back(s.row());
  }
  int columns_checked = 0;
  for (const auto& column : {Column{K::mertens}, Column{K::liouville}, Column{K::squarefree}, Column{K::face, 2},
                             Column{K::betti, 1}, Column{K::div_edges}, Column{K::fredholm}}) {
    std::ostringstream out;
    TableWriter writer(out, TableFormat::bfile, {{K::n}, column}, {"round trip of " + io::column_name(column)});
    for (const auto& r : rows) writer.write(r);
    const auto pairs = parse_bfile(out.str());
    ASSERT_EQ(pairs.size(), rows.size()) << io::column_name(column);
    for (std::size_t i = 0; i < rows.size(); ++i) {
      ASSERT_EQ(pairs[i].first, static_cast<std::int64_t>(rows[i].n));
      ASSERT_EQ(std::to_string(pairs[i].second), io::column_value(column, rows[i])) << "n = " << rows[i].n;
    }
    ++columns_checked;
  }
  EXPECT_EQ(columns_checked, 7);
  // The parsed Mertens b-file agrees with the published M(n), n <= 100 (OEIS A002321).
  std::ostringstream out;
  TableWriter writer(out, TableFormat::bfile, {{K::n}, {K::mertens}});
  for (const auto& r : rows) writer.write(r);
  const auto pairs = parse_bfile(out.str());
  const auto published = oracles::read_published_csv(std::string(SQFC_TEST_DATA_DIR) + "/mertens_small.csv");
  int published_checked = 0;
  for (std::size_t r = 0; r < published.rows.size(); ++r) {
    const auto n = published.integer(r, "n");
    EXPECT_EQ(pairs[static_cast<std::size_t>(n - 1)].second, published.integer(r, "value")) << "n = " << n;
    ++published_checked;
  }
  EXPECT_EQ(published_checked, 100);
}

TEST(TableWriter, FormatNamesAndExtensions) {
  const std::vector<std::tuple<std::string, TableFormat, std::string>> cases = {
      {"csv", TableFormat::csv, "csv"}, {"tsv", TableFormat::tsv, "tsv"}, {"jsonl", TableFormat::jsonl, "jsonl"},
      {"bfile", TableFormat::bfile, "txt"}};
  int checked = 0;
  for (const auto& [name, format, extension] : cases) {
    EXPECT_EQ(io::parse_table_format(name), format);
    EXPECT_EQ(io::table_format_extension(format), extension);
    ++checked;
  }
  for (const std::string bad : {"", "CSV", "json", "b-file", "csv ", "txt"}) {
    EXPECT_THROW(static_cast<void>(io::parse_table_format(bad)), sqfc::InvalidArgument) << "'" << bad << "'";
    ++checked;
  }
  EXPECT_EQ(checked, 10);
}

TEST(TableWriter, EventsText) {
  using sqfc::track::Event;
  using sqfc::track::EventKind;
  std::ostringstream out;
  io::EventWriter writer(out);
  const Event events[] = {{EventKind::mertens_zero, 39, 0, 0.0},
                          {EventKind::mertens_high, 94, 2, 0.0},
                          {EventKind::mertens_low, 3, -1, 0.0},
                          {EventKind::scaled_high, 400, 5, 0.25},  // 5 / sqrt(400)
                          {EventKind::scaled_low, 1000, -40, -40.0 / 31.622776601683793},  // sqrt(1000) = 31.6227766016837933...
                          {EventKind::first_face_dimension, 210, 3, 0.0},
                          {EventKind::first_homology_dimension, 105, 2, 0.0}};
  for (const auto& e : events) writer.write(e);
  EXPECT_EQ(out.str(),
            "kind,n,value\n"
            "mertens_zero,39,0\n"
            "mertens_high,94,2\n"
            "mertens_low,3,-1\n"
            "scaled_high,400,0.25\n"
            "scaled_low,1000,-1.26491106407\n"
            "first_face_dimension,210,3\n"
            "first_homology_dimension,105,2\n");
}

TEST(TableWriter, FormatDecimal) {
  const std::vector<std::tuple<double, int, std::string>> cases = {
      {0.5, 12, "0.5"},        {1.0 / 3.0, 12, "0.333333333333"}, {-2.0 / 3.0, 6, "-0.666667"},
      {0.0, 12, "0"},          {1e-7, 12, "1e-07"},               {123456789.0, 4, "1.235e+08"},
      {100.0, 12, "100"},      {-0.1, 3, "-0.1"}};
  int checked = 0;
  for (const auto& [value, digits, text] : cases) {
    EXPECT_EQ(io::format_decimal(value, digits), text) << value << " " << digits;
    ++checked;
  }
  EXPECT_EQ(checked, 8);
}

// A numeric facet that groups digits in threes with ',' and writes ',' as the decimal point,
// as a user locale might (built here, so no system locale is needed).
struct CommaNumbers : std::numpunct<char> {
  char do_decimal_point() const override { return ','; }
  char do_thousands_sep() const override { return '.'; }
  std::string do_grouping() const override { return "\3"; }
};

TEST(TableWriter, OutputDoesNotDependOnTheStreamLocale) {
  // style.md section 8: integers printed exactly and '.' as the decimal point in every locale.
  // Regression: the b-file writer and the events writer print n (and an event's value)
  // through the stream, so a grouping locale turns n = 1000, the smallest n with four
  // digits, into "1.000". CSV, TSV and JSON lines do not depend on the locale.
  TableRow r = row_30();
  r.n = 1000;
  r.mertens = -1000;
  const std::locale comma(std::locale::classic(), new CommaNumbers);
  int checked = 0;
  for (const auto format : {TableFormat::csv, TableFormat::tsv, TableFormat::jsonl, TableFormat::bfile}) {
    std::ostringstream plain, local;
    local.imbue(comma);
    const std::vector<Column> columns = {{K::n}, {K::mertens}};
    TableWriter a(plain, format, columns), b(local, format, columns);
    a.write(r);
    b.write(r);
    EXPECT_EQ(local.str(), plain.str()) << "format " << io::table_format_extension(format);
    ++checked;
  }
  std::ostringstream plain, local;
  local.imbue(comma);
  io::EventWriter a(plain), b(local);
  for (const sqfc::track::Event& e : {sqfc::track::Event{sqfc::track::EventKind::mertens_low, 1000, -1000, 0.0},
                                      sqfc::track::Event{sqfc::track::EventKind::scaled_low, 1000, -40, -1.25}}) {
    a.write(e);
    b.write(e);
  }
  EXPECT_EQ(plain.str(), "kind,n,value\nmertens_low,1000,-1000\nscaled_low,1000,-1.25\n");
  EXPECT_EQ(local.str(), plain.str()) << "events";
  ++checked;
  EXPECT_EQ(checked, 5);
}

}  // namespace
