// SPDX-License-Identifier: MIT
// `sqfc value X... [--what ...]` run as a program (issue 3): every column against `sqfc table`
// at small n, face counts and Betti numbers against the table at 10^6 and 10^7 (10^8 in
// test_value_slow.cpp), the output formats, the manifest, and bad input (one line on stderr,
// exit 2, no file left behind).
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "cli_runner.hpp"
#include "value_test_support.hpp"

namespace sqfc::cli_test {
namespace {

const std::string all_what = "mertens,squarefree,liouville,fredholm,faces,betti";

TEST(ValueCommand, EveryColumnEqualsTheTableAtSmallN) {
  ScratchDir dir;
  const std::vector<std::string> ns = {"1", "2", "3", "4", "30", "100", "105", "209", "210", "211", "1000", "2^12", "1e4"};
  std::vector<std::string> args = {"value"};
  args.insert(args.end(), ns.begin(), ns.end());
  args.insert(args.end(), {"--what", all_what, "--out", "-", "--threads", "2"});
  const auto v = run_sqfc(dir, args);
  ASSERT_EQ(v.exit_code, 0) << describe(v);
  const auto t = run_sqfc(dir, {"table", "--to", "10000", "--at", "1,2,3,4,30,100,105,209,210,211,1000,4096,10000", "--out", "-"});
  ASSERT_EQ(t.exit_code, 0) << describe(t);
  const auto value_rows = csv_rows(v.out);
  auto table_rows = csv_rows(t.out);
  ASSERT_EQ(value_rows.size(), ns.size());
  std::map<std::string, std::map<std::string, std::string>> table_by_n;
  for (const auto& r : table_rows) table_by_n[r.at("n")] = r;
  long compared = 0;
  for (const auto& r : value_rows) {
    ASSERT_TRUE(table_by_n.count(r.at("n"))) << "n=" << r.at("n");
    const long c = compare_value_with_table(r, table_by_n.at(r.at("n")));
    ASSERT_GT(c, 0);
    compared += c;
  }
  EXPECT_GE(compared, static_cast<long>(ns.size() * 10));
  EXPECT_TRUE(list_dir(dir.work()).empty()) << "--out - wrote files";
}

TEST(ValueCommand, FacesAndBettiEqualTheTableAt1e6And1e7) {
  ScratchDir dir;
  // Columns f0..fD and b0..bD with D = 6 at 10^6 (510510 = 2*3*...*17) and 7 at 10^7 (9699690), plus n and mertens.
  for (const auto& [n, columns] : std::vector<std::pair<std::string, long>>{{"1000000", 16}, {"10000000", 18}}) {
    const auto v = run_sqfc(dir, {"value", n, "--what", "faces,betti,mertens", "--out", "-"});
    ASSERT_EQ(v.exit_code, 0) << describe(v);
    const auto t = run_sqfc(dir, {"table", "--to", n, "--at", n, "--out", "-", "--quiet"});
    ASSERT_EQ(t.exit_code, 0) << describe(t);
    const auto vr = csv_rows(v.out), tr = csv_rows(t.out);
    ASSERT_EQ(vr.size(), 1U);
    ASSERT_EQ(tr.size(), 1U);
    EXPECT_EQ(compare_value_with_table(vr[0], tr[0]), columns) << "n=" << n;
  }
}

TEST(ValueCommand, DefaultWhatAtSmallXIsEverything) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"value", "1000", "--out", "-"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto lines = split_lines(r.out);
  ASSERT_GE(lines.size(), 2U);
  EXPECT_EQ(lines[0], "n,mertens,squarefree,liouville,fredholm,f0,f1,f2,f3,b0,b1,b2,b3");
  // M(1000) = 2 (OEIS A084237), Q(1000) = 608 (OEIS A071172); the rest equals `sqfc table` (test above).
  EXPECT_EQ(split_fields(lines[1])[1], "2");
  EXPECT_EQ(split_fields(lines[1])[2], "608");
}

TEST(ValueCommand, FormatsAndManifest) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"value", "1e6", "10^5", "--what", "mertens,fredholm", "--format", "jsonl", "--out", "v.jsonl"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto lines = split_lines(read_file(dir.path("v.jsonl")));
  ASSERT_GE(lines.size(), 2U);
  const auto first = nlohmann::json::parse(lines[0]);
  EXPECT_EQ(first.at("n"), 1000000);
  EXPECT_EQ(first.at("mertens"), 212);  // OEIS A084237
  const auto manifest = nlohmann::json::parse(read_file(dir.path("v.jsonl.manifest.json")));
  EXPECT_EQ(manifest.at("command"), "value");
  EXPECT_EQ(manifest.at("parameters").at("x").size(), 2U);
  EXPECT_EQ(manifest.at("results").at(1).at("mertens"), -48);  // M(10^5), OEIS A084237
  const auto tsv = run_sqfc(dir, {"value", "100", "--what", "squarefree", "--format", "tsv", "--out", "-"});
  ASSERT_EQ(tsv.exit_code, 0) << describe(tsv);
  EXPECT_EQ(tsv.out, "n\tsquarefree\n100\t61\n");  // OEIS A071172
}

TEST(ValueCommand, BadInputIsOneLineAndExitTwo) {
  struct Case {
    std::vector<std::string> args;
    std::string must_mention;
  };
  const std::vector<Case> cases = {
      {{"value", "0"}, "0"},
      {{"value", "abc"}, "abc"},
      {{"value", "1x"}, "1x"},
      {{"value", "-5"}, "-5"},
      {{"value", "2^64"}, "2^64"},
      {{"value", "100", "10000000000000000001", "--what", "mertens"}, "10000000000000000001"},
      {{"value", "1e17", "--what", "liouville"}, "1e17"},
      {{"value", "10000000000000001", "--what", "liouville"}, "10000000000000001"},
      {{"value", "1e20", "--what", "squarefree"}, "1e20"},
      {{"value", "1e15", "--what", "faces"}, "1e15"},
      {{"value", "100", "--what", "mertens,foo"}, "foo"},
      {{"value", "100", "--what", ""}, "--what"},
      {{"value", "100", "--format", "bfile"}, "bfile"},
      {{"value", "100", "--format", "xml"}, "xml"},
      {{"value", "100", "--threads", "0"}, "--threads"},
      {{"value", "100", "--out", ""}, "--out"},
      {{"value"}, "x"},
  };
  long checked = 0;
  for (const auto& c : cases) {
    ScratchDir dir;
    auto args = c.args;
    if (std::find(args.begin(), args.end(), "--out") == args.end()) args.insert(args.end(), {"--out", "v.csv"});
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << describe(r);
    EXPECT_NE(r.err.find(c.must_mention), std::string::npos) << describe(r);
    EXPECT_TRUE(r.out.empty()) << describe(r);
    EXPECT_TRUE(list_dir(dir.work()).empty()) << describe(r);
    ++checked;
  }
  EXPECT_EQ(checked, static_cast<long>(cases.size()));
}

}  // namespace
}  // namespace sqfc::cli_test
