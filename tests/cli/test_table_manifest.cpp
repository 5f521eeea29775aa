// SPDX-License-Identifier: MIT
// The JSON manifest written beside a file output of `sqfc table` (design.md section 4): version,
// command line, parameters, times, checks and the final row.
#include <gtest/gtest.h>

#include <chrono>
#include <ctime>
#include <nlohmann/json.hpp>
#include <regex>

#include "cli_runner.hpp"
#include "sqfc/core/version.hpp"

namespace sqfc::cli_test {
namespace {

using nlohmann::json;

std::string utc_now() {
  const std::time_t t = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm tm{};
  gmtime_r(&t, &tm);
  char buffer[32];
  std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buffer;
}

json parse_manifest(const std::filesystem::path& p) {
  EXPECT_TRUE(std::filesystem::exists(p)) << p;
  try {
    return json::parse(read_file(p));
  } catch (const json::exception& e) {
    ADD_FAILURE() << p << " is not JSON: " << e.what();
    return json::object();
  }
}

// Compares the manifest's "final" object with the last CSV row; returns the values compared.
int check_final_row(const json& final_row, const std::vector<std::string>& header,
                    const std::vector<std::string>& last) {
  int compared = 0;
  for (std::size_t c = 0; c < header.size(); ++c) {
    const auto& name = header[c];
    json value;
    if ((name[0] == 'f' || name[0] == 'b') && name != "fredholm" && std::isdigit(static_cast<unsigned char>(name[1]))) {
      const auto d = std::stoul(name.substr(1));
      const auto& list = final_row.at(std::string(1, name[0]));
      value = d < list.size() ? list.at(d) : json();
    } else {
      value = final_row.contains(name) ? final_row.at(name) : json();
    }
    EXPECT_TRUE(value.is_number_integer()) << "final." << name << " = " << value.dump();
    EXPECT_EQ(value.dump(), last.at(c)) << "final." << name;
    ++compared;
  }
  return compared;
}

TEST(TableManifest, HoldsVersionArgvParametersTimesChecksAndFinalRow) {
  ScratchDir dir;
  const std::string before = utc_now();
  const auto t0 = std::chrono::steady_clock::now();
  const auto r = run_sqfc(
      dir, {"table", "--to", "1e4", "--every", "500", "--threads", "2", "--events", "e.csv", "--out", "t.csv"});
  const double elapsed = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  const std::string after = utc_now();
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  // Outputs and one manifest beside the table; nothing partial.
  EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"e.csv", "t.csv", "t.csv.manifest.json"}));
  const json m = parse_manifest(dir.path("t.csv.manifest.json"));
  int checked = 0;

  EXPECT_EQ(m.value("version", ""), std::string(sqfc::version_string));
  ++checked;
  EXPECT_EQ(m.at("command_line").get<std::vector<std::string>>(), r.argv);
  ++checked;

  const auto& p = m.at("parameters");
  EXPECT_EQ(p.at("to"), 10000);
  ++checked;
  EXPECT_EQ(p.at("from"), 1);
  ++checked;
  EXPECT_EQ(p.at("format"), "csv");
  ++checked;
  EXPECT_EQ(p.at("threads"), 2);
  ++checked;
  EXPECT_EQ(p.at("sample_points"), 20);
  ++checked;
  const auto lines = split_lines(read_file(dir.path("t.csv")));
  ASSERT_EQ(lines.size(), 21u);
  const auto header = split_fields(lines[0]);
  EXPECT_EQ(p.at("columns").get<std::vector<std::string>>(), header);
  ++checked;

  // Times: ISO 8601 UTC with seconds, ordered, inside the window this test watched.
  const std::regex iso(R"(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ)");
  const std::string started = m.value("started_utc", ""), finished = m.value("finished_utc", "");
  EXPECT_TRUE(std::regex_match(started, iso)) << started;
  ++checked;
  EXPECT_TRUE(std::regex_match(finished, iso)) << finished;
  ++checked;
  // Same-format UTC strings order like the times; the seconds are truncated on both sides.
  EXPECT_LE(before, started);
  ++checked;
  EXPECT_LE(started, finished);
  ++checked;
  EXPECT_LE(finished, after);
  ++checked;
  ASSERT_TRUE(m.at("wall_seconds").is_number());
  EXPECT_GE(m.at("wall_seconds").get<double>(), 0.0);
  ++checked;
  EXPECT_LE(m.at("wall_seconds").get<double>(), elapsed);
  ++checked;
  EXPECT_EQ(m.at("threads"), 2);
  ++checked;

  // Checks: a non-empty list, every one run and passed.
  const auto& checks = m.at("checks");
  ASSERT_TRUE(checks.is_array());
  EXPECT_GE(checks.size(), 3u);
  ++checked;
  for (const auto& c : checks) {
    EXPECT_TRUE(c.at("name").is_string());
    EXPECT_EQ(c.at("failed"), 0) << c.dump();
    EXPECT_GT(c.at("passed").get<long long>(), 0) << c.dump();
    EXPECT_TRUE(c.at("first_failure_n").is_null()) << c.dump();
  }
  EXPECT_EQ(m.at("checks_passed"), true);
  ++checked;

  // The final row is the table's last row, n = N, value for value.
  EXPECT_EQ(check_final_row(m.at("final"), header, split_fields(lines.back())), 7 + 5 + 5 + 1);  // D = 4 at 10^4
  ++checked;
  EXPECT_EQ(m.at("final").at("n"), 10000);
  ++checked;
  EXPECT_EQ(m.at("final").at("mertens"), -23);  // M(10^4) = -23, OEIS A084237
  ++checked;
  EXPECT_EQ(m.at("final").at("squarefree"), 6083);  // Q(10^4) = 6083, OEIS A071172
  ++checked;
  EXPECT_EQ(m.at("final").at("liouville"), -94);  // L(10^4) = -94, OEIS A090410
  ++checked;
  EXPECT_EQ(checked, 23);
}

TEST(TableManifest, EveryFormatGetsOneBesideItsFile) {
  struct Case {
    std::string format, file;
    std::vector<std::string> extra;
  };
  const std::vector<Case> cases = {{"csv", "t.csv", {}},
                                   {"tsv", "t.tsv", {}},
                                   {"jsonl", "t.jsonl", {}},
                                   {"bfile", "t.txt", {"--columns", "mertens"}}};
  int checked = 0;
  for (const auto& c : cases) {
    ScratchDir dir;
    std::vector<std::string> args = {"table", "--to", "300", "--every", "30", "--format", c.format, "--out", c.file};
    args.insert(args.end(), c.extra.begin(), c.extra.end());
    const auto r = run_sqfc(dir, args);
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{c.file, c.file + ".manifest.json"}));
    const json m = parse_manifest(dir.path(c.file + ".manifest.json"));
    EXPECT_EQ(m.at("parameters").at("format"), c.format);
    EXPECT_EQ(m.at("command_line").get<std::vector<std::string>>(), r.argv);
    EXPECT_EQ(m.at("final").at("n"), 300);
    EXPECT_EQ(m.at("final").at("mertens"), -5);  // M(300) = -5: golden table_to300_at_selected.jsonl (verified)
    EXPECT_EQ(m.at("checks_passed"), true);
    ++checked;
  }
  EXPECT_EQ(checked, 4);
}

TEST(TableManifest, StandardOutputTableHasNoManifestButAnEventsFileHasOne) {
  int checked = 0;
  {
    ScratchDir dir;
    const auto r = run_sqfc(dir, {"table", "--to", "300", "--every", "30", "--out", "-"});
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{});
    EXPECT_EQ(split_lines(r.out).size(), 11u);
    ++checked;
  }
  {
    // The events file is a file output, so the manifest goes beside it.
    ScratchDir dir;
    const auto r = run_sqfc(dir, {"table", "--to", "300", "--every", "30", "--out", "-", "--events", "e.csv"});
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"e.csv", "e.csv.manifest.json"}));
    const json m = parse_manifest(dir.path("e.csv.manifest.json"));
    EXPECT_EQ(m.at("command_line").get<std::vector<std::string>>(), r.argv);
    ++checked;
  }
  EXPECT_EQ(checked, 2);
}

TEST(TableManifest, CommandLineSurvivesQuotesBackslashesAndUtf8) {
  // A file name with a space, a double quote, a backslash, a tab and a non-ASCII letter must come
  // back from the JSON exactly (JSON string escapes, RFC 8259).
  ScratchDir dir;
  const std::string name = "odd \"name\" back\\slash\ttab caf\xC3\xA9.csv";
  const auto r = run_sqfc(dir, {"table", "--to", "100", "--every", "50", "--out", name});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const json m = parse_manifest(dir.path(name + ".manifest.json"));
  const auto argv = m.at("command_line").get<std::vector<std::string>>();
  EXPECT_EQ(argv, r.argv);
  ASSERT_EQ(argv.size(), 8u);
  EXPECT_EQ(argv.back(), name);
}

}  // namespace
}  // namespace sqfc::cli_test
