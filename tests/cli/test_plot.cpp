// SPDX-License-Identifier: MIT
// `sqfc plot` and the --plot / --envelope options run as a program: envelopes keep every extreme
// of the full series (compared with `sqfc table --every 1`), pictures beside each output, and
// one-line refusals with exit code 2 that leave no file behind.
// Expected values: every extreme is computed from a full `sqfc table --every 1` run (the
// oracle); no outside value is used.
#include <gtest/gtest.h>

#include <map>

#include "cli_runner.hpp"

namespace sqfc::cli_test {
namespace {

struct Csv {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  [[nodiscard]] std::size_t at(const std::string& name) const {
    const auto it = std::find(header.begin(), header.end(), name);
    if (it == header.end()) throw std::runtime_error("no column " + name);
    return static_cast<std::size_t>(it - header.begin());
  }
};

Csv read_csv(const std::filesystem::path& p) {
  Csv c;
  for (const auto& line : split_lines(read_file(p))) {
    if (line.empty() || line[0] == '#') continue;
    if (c.header.empty()) c.header = split_fields(line);
    else c.rows.push_back(split_fields(line));
  }
  return c;
}

// Compares the envelope of M, b1 and f1 with the full series of a --every 1 table: per column
// the min and max, their first positions (last n for the non-decreasing f1), first and last.
// Returns the number of columns compared.
std::size_t compare_with_full(const Csv& full, const Csv& env, unsigned long long first, unsigned long long last,
                              const std::vector<std::string>& series_list) {
  std::map<unsigned long long, std::size_t> row_of;  // n -> row of the full table
  for (std::size_t i = 0; i < full.rows.size(); ++i) row_of[std::stoull(full.rows[i][0])] = i;
  unsigned long long expected_lo = first;
  std::size_t columns = 0;
  for (const auto& row : env.rows) {
    const auto lo = std::stoull(row[env.at("lo")]), hi = std::stoull(row[env.at("hi")]);
    EXPECT_EQ(lo, expected_lo) << "columns must tile [first, last]";
    EXPECT_LT(lo, hi);
    expected_lo = hi;
    for (const std::string& series : series_list) {
      const std::size_t col = full.at(series);
      long long mn = 0, mx = 0;
      unsigned long long mn_n = 0, mx_n = 0;
      for (auto n = lo; n < hi; ++n) {
        const long long v = std::stoll(full.rows[row_of.at(n)][col]);
        if (n == lo || v < mn) mn = v, mn_n = n;
        if (n == lo || v > mx) mx = v, mx_n = n;
      }
      if (series == "f1") mx_n = hi - 1;  // non-decreasing: the maximum is placed at the column's last n
      const std::string at = series + " in [" + std::to_string(lo) + ", " + std::to_string(hi) + ")";
      EXPECT_EQ(std::stoll(row[env.at(series + "_min")]), mn) << at;
      EXPECT_EQ(std::stoll(row[env.at(series + "_max")]), mx) << at;
      EXPECT_EQ(std::stoull(row[env.at(series + "_min_n")]), mn_n) << at;
      EXPECT_EQ(std::stoull(row[env.at(series + "_max_n")]), mx_n) << at;
      EXPECT_EQ(std::stoll(row[env.at(series + "_first")]), std::stoll(full.rows[row_of.at(lo)][col])) << at;
      EXPECT_EQ(std::stoll(row[env.at(series + "_last")]), std::stoll(full.rows[row_of.at(hi - 1)][col])) << at;
    }
    ++columns;
  }
  EXPECT_EQ(expected_lo, last + 1);
  return columns;
}

TEST(Plot, EnvelopeKeepsEveryExtremeOfTheFullSeries) {
  ScratchDir dir;
  struct Case {
    std::string to, from, width;
    bool log_x, betti;
  };
  const std::vector<Case> cases = {{"30000", "1", "200", false, true},   {"30000", "1", "1200", true, true},
                                   {"30000", "777", "37", false, true},  {"123457", "1", "640", false, true},
                                   {"123457", "1", "300", true, true},   {"123457", "1", "50", false, false},
                                   {"123457", "99", "700", true, false}};
  std::size_t columns = 0;
  for (const auto& c : cases) {
    const auto full_run = run_sqfc(dir, {"table", "--to", c.to, "--from", c.from, "--every", "1", "--columns", "mertens,b1,f1",
                                         "--out", "full.csv", "--quiet"});
    ASSERT_EQ(full_run.exit_code, 0) << describe(full_run);
    std::vector<std::string> args = {"table", "--to", c.to, "--from", c.from, "--block-size", "1024", "--envelope", "env.csv",
                                     "--plot-width", c.width, "--out", "t.csv", "--quiet"};
    if (c.log_x) args.push_back("--plot-log-x");
    if (c.betti) args.push_back("--envelope-betti");
    const auto env_run = run_sqfc(dir, args);
    ASSERT_EQ(env_run.exit_code, 0) << describe(env_run);
    const auto env = read_csv(dir.path("env.csv"));
    EXPECT_EQ(std::find(env.header.begin(), env.header.end(), "b1_max") != env.header.end(), c.betti);
    const auto n = compare_with_full(read_csv(dir.path("full.csv")), env, std::stoull(c.from), std::stoull(c.to),
                                     c.betti ? std::vector<std::string>{"mertens", "b1", "f1"} : std::vector<std::string>{"mertens", "f1"});
    EXPECT_LE(n, std::stoull(c.width));
    if (!c.log_x) {
      EXPECT_EQ(n, std::stoull(c.width));  // linear columns: as many as asked
    }
    columns += n;
  }
  EXPECT_GT(columns, 1500U);
}

TEST(Plot, RefusalsAreOneLineExitTwoAndWriteNothing) {
  ScratchDir dir;
  ASSERT_EQ(run_sqfc(dir, {"table", "--to", "3000", "--out", "t.csv", "--quiet"}).exit_code, 0);
  const auto before = list_dir(dir.work());
  const std::vector<std::pair<std::vector<std::string>, std::string>> cases = {
      {{"plot", "missing.csv"}, "does not exist"},
      {{"plot", "t.csv", "--kind", "green"}, "cannot be drawn"},
      {{"plot", "t.csv", "--kind", "png"}, "names a format"},
      {{"plot", "t.csv", "--format", "gif"}, "unknown picture kind or format 'gif'"},
      {{"plot", "t.csv", "--gnuplot", "/nonexistent/gnuplot", "--out", "x"}, "gnuplot-nox"},
      {{"plot", "t.csv", "--width", "5", "--out", "x"}, "--width"},
      {{"plot", "t.csv.manifest.json"}, "not a file sqfc can plot"},
      {{"table", "--to", "1000", "--plot", "--out", "-"}, "--plot draws beside the table file"},
      {{"table", "--to", "1000", "--plot", "barcode", "--out", "u.csv"}, "sqfc table cannot draw 'barcode'"},
      {{"table", "--to", "1000", "--plot", "--gnuplot", "/nonexistent/gnuplot", "--out", "u.csv"}, "gnuplot-nox"},
      {{"homology", "--to", "100000", "--plot", "barcode", "--out", "u.csv"}, "small N"},
      {{"fredholm", "--to", "100", "--plot", "mertens", "--out", "u.csv"}, "not 'mertens'"},
      {{"table", "--to", "1000", "--envelope-betti", "--out", "u.csv"}, "needs --envelope or --plot"},
  };
  for (const auto& [args, message] : cases) {
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(split_lines(r.err).size(), 1U) << describe(r);
    EXPECT_NE(r.err.find(message), std::string::npos) << describe(r);
  }
  EXPECT_EQ(list_dir(dir.work()), before);
}

}  // namespace
}  // namespace sqfc::cli_test
