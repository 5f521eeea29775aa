// SPDX-License-Identifier: MIT
// `sqfc demo --to 1e5 --out-dir DIR`: the worked scenario writes its table, events, b-files,
// manifests, every kind of picture and a check report, prints a summary and exits 0.
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <regex>

#include "cli_runner.hpp"
#include "golden_reference.hpp"
#include "oracles/brute_force.hpp"

namespace sqfc::cli_test {
namespace {

TEST(Demo, WritesEveryFileAndASummary) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"demo", "--to", "1e5", "--out-dir", "poster", "--threads", "2"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);  // stderr is a file: no progress bar
  EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{"poster"});
  const std::vector<std::string> expected_files = {"b1.bfile.txt",
                                                   "b1.bfile.txt.manifest.json",
                                                   "barcode.csv",
                                                   "check_report.json",
                                                   "check_report.txt",
                                                   "envelope.csv",
                                                   "events.csv",
                                                   "fredholm.csv",
                                                   "fredholm.csv.manifest.json",
                                                   "green_histogram.csv",
                                                   "homology.csv",
                                                   "homology.csv.manifest.json",
                                                   "liouville.bfile.txt",
                                                   "liouville.bfile.txt.manifest.json",
                                                   "mertens.bfile.txt",
                                                   "mertens.bfile.txt.manifest.json",
                                                   "pictures",
                                                   "squarefree.bfile.txt",
                                                   "squarefree.bfile.txt.manifest.json",
                                                   "table.csv",
                                                   "table.csv.manifest.json"};
  EXPECT_EQ(list_dir(dir.path("poster")), expected_files);

  // Every manifest parses and reports passed checks.
  int manifests = 0;
  for (const auto& name : expected_files) {
    if (name.find(".manifest.json") == std::string::npos) continue;
    const auto m = nlohmann::json::parse(read_file(dir.path("poster/" + name)));
    EXPECT_EQ(m.at("checks_passed"), true) << name;
    ++manifests;
  }
  EXPECT_EQ(manifests, 7);

  // Every picture kind in all three formats, each with its data file and gnuplot script.
  std::vector<std::string> expected_pictures;
  for (const std::string kind : {"filtration-barcode", "filtration-diagram", "green-green", "poster-betti", "poster-faces",
                                 "poster-fredholm", "poster-mertens", "poster-scaled"})
    for (const std::string ext : {".dat", ".gp", ".pdf", ".png", ".svg"}) expected_pictures.push_back(kind + ext);
  EXPECT_EQ(list_dir(dir.path("poster/pictures")), expected_pictures);
  for (const auto& name : expected_pictures) {
    const auto bytes = read_file(dir.path("poster/pictures/" + name));
    if (name.ends_with(".png")) {
      EXPECT_EQ(bytes.substr(0, 8), std::string("\x89PNG\r\n\x1a\n", 8)) << name;  // PNG signature (common practice)
    } else if (name.ends_with(".pdf")) {
      EXPECT_EQ(bytes.substr(0, 5), "%PDF-") << name;
    } else if (name.ends_with(".svg")) {
      EXPECT_NE(bytes.find("<svg"), std::string::npos) << name;
    }
  }

  // The check report: the identity suite passed to N, and both b-files read back equal.
  const auto report = read_file(dir.path("poster/check_report.txt"));
  EXPECT_NE(report.find("range: n = 1..100000"), std::string::npos) << report;
  EXPECT_NE(report.find("verdict: PASS"), std::string::npos) << report;
  EXPECT_EQ(report.find("FAIL "), std::string::npos) << report;
  std::size_t bfile_verdicts = 0;
  for (auto at = report.find("b-file check"); at != std::string::npos; at = report.find("b-file check", at + 1))
    ++bfile_verdicts;
  EXPECT_EQ(bfile_verdicts, 2u) << report;
  const auto report_json = nlohmann::json::parse(read_file(dir.path("poster/check_report.json")));
  EXPECT_FALSE(report_json.empty());

  // The poster table: all columns of N = 10^5 (D = 5: 30030 <= 10^5 < 510510, OEIS A002110),
  // 20 log points per decade, ending at N with the published values.
  const auto table = split_lines(read_file(dir.path("poster/table.csv")));
  ASSERT_GE(table.size(), 2u);
  EXPECT_EQ(split_fields(table[0]), expected_columns(100000));
  // Sample points round(10^(j/20)) for j = 0..100, duplicates merged (no ties: 10^(j/20) is
  // irrational unless 20 | j).
  std::vector<std::string> points;
  for (int j = 0; j <= 100; ++j) {
    const auto p = std::to_string(std::llround(std::pow(10.0, j / 20.0)));
    if (points.empty() || points.back() != p) points.push_back(p);
  }
  std::vector<std::string> rows_n;
  for (std::size_t i = 1; i < table.size(); ++i) rows_n.push_back(split_fields(table[i]).at(0));
  EXPECT_EQ(rows_n, points);
  EXPECT_EQ(points.size(), 90u);
  const auto last = split_fields(table.back());
  const auto header = split_fields(table[0]);
  auto value = [&](const std::string& column) {
    return last.at(static_cast<std::size_t>(std::find(header.begin(), header.end(), column) - header.begin()));
  };
  EXPECT_EQ(value("n"), "100000");
  EXPECT_EQ(value("mertens"), "-48");       // M(10^5) = -48, OEIS A084237
  EXPECT_EQ(value("squarefree"), "60794");  // Q(10^5) = 60794, OEIS A071172
  EXPECT_EQ(value("liouville"), "-288");    // L(10^5) = -288, OEIS A090410
  EXPECT_EQ(value("f0"), "9592");           // pi(10^5) = 9592, OEIS A006880

  // The b-files: n = 1..10^4, compared with trial division. b1 is compared with Z/2 homology up to
  // 1000, and beyond with the homotopy count of design.md identity 2 (Adv. Appl. Math. 46, 2011):
  // b1(n) = number of odd squarefree m in (n/2, n] with two prime factors, kept up to date as n
  // grows, and itself checked against Z/2 homology for n <= 1000 first.
  const auto prefix = oracles::prefix_naive(10000);
  const auto& betti = golden_reference().betti;
  const auto is_odd_edge = [&](std::uint64_t m) { return m % 2 == 1 && prefix.mu[m] != 0 && prefix.omega[m] == 2; };
  std::vector<std::int64_t> b1_count(10001, 0);
  for (std::uint64_t n = 1; n <= 10000; ++n)
    b1_count[n] = b1_count[n - 1] + (is_odd_edge(n) ? 1 : 0) - (n % 2 == 0 && is_odd_edge(n / 2) ? 1 : 0);
  int formula_checked = 0;
  for (std::uint64_t n = 1; n <= 1000; ++n, ++formula_checked)
    ASSERT_EQ(b1_count[n], betti[n].size() > 1 ? betti[n][1] : 0) << "identity-2 count against Z/2 homology, n = " << n;
  EXPECT_EQ(formula_checked, 1000);
  int lines_checked = 0, homology_checked = 0, count_checked = 0;
  for (const std::string column : {"mertens", "squarefree", "liouville", "b1"}) {
    const auto lines = split_lines(read_file(dir.path("poster/" + column + ".bfile.txt")));
    std::uint64_t n = 1;
    for (const auto& line : lines) {
      if (!line.empty() && line[0] == '#') continue;
      const auto f = split_fields(line, ' ');
      ASSERT_EQ(f.size(), 2u) << column << ": " << line;
      ASSERT_EQ(f[0], std::to_string(n)) << column;
      std::int64_t expected = 0;
      if (column == "mertens")
        expected = prefix.mertens[n];
      else if (column == "squarefree")
        expected = prefix.squarefree[n];
      else if (column == "liouville")
        expected = prefix.liouville[n];
      else if (n <= 1000)
        expected = betti[n].size() > 1 ? betti[n][1] : 0, ++homology_checked;
      else
        expected = b1_count[n], ++count_checked;
      EXPECT_EQ(f[1], std::to_string(expected)) << column << " at n = " << n;
      ++n;
      ++lines_checked;
    }
    EXPECT_EQ(n, 10001u) << column;
  }
  EXPECT_EQ(lines_checked, 4 * 10000);
  EXPECT_EQ(homology_checked, 1000);
  EXPECT_EQ(count_checked, 9000);

  // Events: a CSV with its header; the births of homology at 2, 15, 105, 1155, 15015 (products of the
  // first odd primes, OEIS A070826; design.md identity 2).
  const auto events = split_lines(read_file(dir.path("poster/events.csv")));
  ASSERT_FALSE(events.empty());
  EXPECT_EQ(events[0], "kind,n,value");
  std::vector<std::string> births;
  for (const auto& e : events)
    if (e.rfind("first_homology_dimension,", 0) == 0) births.push_back(e);
  EXPECT_EQ(births, (std::vector<std::string>{"first_homology_dimension,2,0", "first_homology_dimension,15,1",
                                              "first_homology_dimension,105,2", "first_homology_dimension,1155,3",
                                              "first_homology_dimension,15015,4"}));

  // The summary on stdout names the files and the results.
  int patterns = 0;
  for (const std::string pattern :
       {R"(poster/table\.csv)", R"(poster/events\.csv)", R"(poster/mertens\.bfile\.txt)", R"(M = -48\b)",
        R"(Q = 60794\b)", R"(dim 2 at n = 105\b)", R"(pictures: 24 files)", R"(check report: .*poster/check_report\.txt)",
        R"(identity checks: all passed)"}) {
    EXPECT_TRUE(std::regex_search(r.out, std::regex(pattern))) << "summary lacks /" << pattern << "/\n" << r.out;
    ++patterns;
  }
  EXPECT_EQ(patterns, 9);
}

}  // namespace
}  // namespace sqfc::cli_test
