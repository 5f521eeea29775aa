// SPDX-License-Identifier: MIT
// `sqfc check --bfile`: round trips of `sqfc table --format bfile`, the published b-files in
// tests/data/bfile/ (cross-checked against trial division first), mutations, malformed lines,
// findings that are not failures, and bad input.
#include <gtest/gtest.h>

#include <fstream>
#include <map>
#include <regex>

#include "cli_runner.hpp"
#include "oracles/brute_force.hpp"

namespace sqfc::cli_test {
namespace {

std::filesystem::path bfile_data(const std::string& name) {
  return std::filesystem::path(SQFC_TEST_DATA_DIR) / "bfile" / name;
}

// The terms of a b-file, read with plain stream code that shares nothing with the library reader.
std::map<long long, long long> simple_terms(const std::filesystem::path& path) {
  std::ifstream in(path);
  std::map<long long, long long> terms;
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#') continue;
    std::istringstream fields(line);
    long long n = 0, v = 0;
    fields >> n >> v;
    EXPECT_TRUE(fields && terms.count(n) == 0) << path << ": " << line;
    terms[n] = v;
  }
  return terms;
}

void write_file(const std::filesystem::path& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
}

// Expects `pattern` somewhere in the report.
void expect_line(const RunResult& r, const std::string& line) {
  EXPECT_NE(r.out.find(line + "\n"), std::string::npos) << "missing line '" << line << "'\n" << describe(r) << "\n" << r.out;
}

RunResult check(const ScratchDir& dir, const std::string& file, const std::string& sequence,
                std::vector<std::string> extra = {}) {
  std::vector<std::string> args = {"check", "--bfile", file, "--sequence", sequence, "--threads", "2"};
  args.insert(args.end(), extra.begin(), extra.end());
  return run_sqfc(dir, args);
}

std::string table_bfile(const ScratchDir& dir, const std::string& column, const std::string& name) {
  const auto r = run_sqfc(dir, {"table", "--format", "bfile", "--columns", column, "--every", "1", "--to", "2000",
                                "--out", name, "--quiet"});
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  return read_file(dir.path(name));
}

TEST(CheckBfile, TableOutputReadsBackEqual) {
  ScratchDir dir;
  int checked = 0;
  for (const std::string column : {"mertens", "squarefree", "liouville", "b1", "f2"}) {
    const std::string name = column + ".txt";
    const auto text = table_bfile(dir, column, name);
    ASSERT_EQ(split_lines(text).size(), 2001u) << column;  // one comment line, n = 1..2000
    const auto r = check(dir, name, column);
    EXPECT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(r.err, "");
    expect_line(r, "file: " + name);
    expect_line(r, "lines read: 2001 (2000 terms, 1 comments, 0 blank, 0 malformed)");
    expect_line(r, "terms compared: 2000");
    expect_line(r, "terms skipped: 0 (0 need n above 10000000000, 0 outside the sequence's indices)");
    expect_line(r, "values: all equal");
    expect_line(r, "malformed lines: 0");
    expect_line(r, "verdict: PASS");
    ++checked;
  }
  EXPECT_EQ(checked, 5);
}

TEST(CheckBfile, PublishedFilesAgreeWithTrialDivisionAndCompareEqual) {
  // Values typed from memory (sources in each file's comment line); trusted only after trial division.
  const auto naive = oracles::prefix_naive(1 << 16);
  int oracle_checked = 0;
  const auto m002321 = simple_terms(bfile_data("a002321_mertens_1_100.txt"));  // OEIS A002321 M(n)
  ASSERT_EQ(m002321.size(), 100u);
  for (const auto& [n, v] : m002321) {
    EXPECT_EQ(v, naive.mertens[static_cast<std::size_t>(n)]) << "M(" << n << ")";
    ++oracle_checked;
  }
  const auto m084237 = simple_terms(bfile_data("a084237_mertens_pow10.txt"));  // OEIS A084237 M(10^k)
  ASSERT_EQ(m084237.size(), 10u);
  EXPECT_EQ(m084237.at(8), 1928);  // M(10^8) = 1928 (A084237)
  std::size_t p = 1;
  for (long long k = 0; k <= 4; ++k, p *= 10) {
    EXPECT_EQ(m084237.at(k), naive.mertens[p]) << "M(10^" << k << ")";
    ++oracle_checked;
  }
  const auto m084236 = simple_terms(bfile_data("a084236_mertens_pow2.txt"));  // OEIS A084236 M(2^k)
  ASSERT_EQ(m084236.size(), 31u);
  for (long long k = 0; k <= 16; ++k) {
    EXPECT_EQ(m084236.at(k), naive.mertens[std::size_t{1} << k]) << "M(2^" << k << ")";
    ++oracle_checked;
  }
  const auto z028442 = simple_terms(bfile_data("a028442_mertens_zeros.txt"));  // OEIS A028442 zeros of M
  ASSERT_EQ(z028442.size(), 20u);
  std::vector<long long> zeros;
  for (std::size_t n = 1; n <= 1000 && zeros.size() < 20; ++n)
    if (naive.mertens[n] == 0) zeros.push_back(static_cast<long long>(n));
  for (const auto& [k, v] : z028442) {
    EXPECT_EQ(v, zeros.at(static_cast<std::size_t>(k - 1))) << "zero " << k;
    ++oracle_checked;
  }
  EXPECT_EQ(oracle_checked, 100 + 5 + 17 + 20);

  // The command: the larger powers come from the engine; M(10^9) and M(2^25..2^30) are left to the
  // slow test and counted here as skipped by --to.
  ScratchDir dir;
  int runs = 0;
  struct Case {
    std::string file, sequence;
    std::vector<std::string> extra;
    std::string compared, skipped;
  };
  const std::vector<Case> cases = {
      {"a002321_mertens_1_100.txt", "mertens", {}, "100", "0 (0 need n above 10000000000, 0 outside"},
      {"a084237_mertens_pow10.txt", "mertens_pow10", {"--to", "1e8"}, "9", "1 (1 need n above 100000000, 0 outside"},
      {"a084236_mertens_pow2.txt", "mertens_pow2", {"--to", "2^24"}, "25", "6 (6 need n above 16777216, 0 outside"},
      {"a028442_mertens_zeros.txt", "mertens_zeros", {}, "20", "0 (0 need n above 10000000000, 0 outside"},
  };
  for (const auto& c : cases) {
    const auto r = check(dir, bfile_data(c.file).string(), c.sequence, c.extra);
    EXPECT_EQ(r.exit_code, 0) << describe(r) << r.out;
    expect_line(r, "terms compared: " + c.compared);
    EXPECT_NE(r.out.find("terms skipped: " + c.skipped), std::string::npos) << r.out;
    expect_line(r, "values: all equal");
    expect_line(r, "verdict: PASS");
    ++runs;
  }
  EXPECT_EQ(runs, 4);
}

TEST(CheckBfile, FlippedValueIsTheFirstMismatch) {
  ScratchDir dir;
  auto lines = split_lines(table_bfile(dir, "mertens", "m.txt"));
  ASSERT_EQ(lines.size(), 2001u);
  // Line 1235 holds n = 1234 (line 1 is the comment); change its value by one.
  const auto fields = split_fields(lines[1234], ' ');
  ASSERT_EQ(fields.at(0), "1234");
  const long long right = std::stoll(fields.at(1));
  lines[1234] = "1234 " + std::to_string(right + 1);
  lines[1900] = "1900 " + std::to_string(std::stoll(split_fields(lines[1900], ' ').at(1)) - 5);  // a second, later one
  write_file(dir.path("m.txt"), join(lines, "\n") + "\n");
  const auto r = check(dir, "m.txt", "mertens");
  EXPECT_EQ(r.exit_code, 1) << describe(r);
  expect_line(r, "values: 2 of 2000 differ");
  expect_line(r, "first mismatch: line 1235, n = 1234: expected " + std::to_string(right + 1) + " (file), got " +
                     std::to_string(right) + " (sqfc)");
  expect_line(r, "malformed lines: 0");
  expect_line(r, "verdict: FAIL");

  // The same in a published file: M(10^3) = 2 (OEIS A084237) changed to 3 on line 5.
  auto pub = split_lines(read_file(bfile_data("a084237_mertens_pow10.txt")));
  ASSERT_EQ(pub.at(4), "3 2");
  pub[4] = "3 3";
  write_file(dir.path("p.txt"), join(pub, "\n") + "\n");
  const auto p = check(dir, "p.txt", "mertens_pow10", {"--to", "1e6"});
  EXPECT_EQ(p.exit_code, 1) << describe(p);
  expect_line(p, "first mismatch: line 5, n = 3: expected 3 (file), got 2 (sqfc)");
  expect_line(p, "terms compared: 7");
}

TEST(CheckBfile, MalformedLineFailsWithItsLineNumber) {
  ScratchDir dir;
  auto lines = split_lines(table_bfile(dir, "squarefree", "q.txt"));
  lines.insert(lines.begin() + 500, "499.5 300");  // becomes line 501
  lines.insert(lines.begin() + 800, "799 480 extra");  // line 801
  write_file(dir.path("q.txt"), join(lines, "\n") + "\n");
  const auto r = check(dir, "q.txt", "squarefree");
  EXPECT_EQ(r.exit_code, 1) << describe(r);
  expect_line(r, "values: all equal");
  expect_line(r, "malformed lines: 2");
  expect_line(r, "  line 501: n is not an integer: '499.5 300'");
  expect_line(r, "  line 801: extra text after 'n a(n)': '799 480 extra'");
  expect_line(r, "verdict: FAIL");
}

TEST(CheckBfile, RepeatsOrderCrlfAndHugeValues) {
  ScratchDir dir;
  // M(1..6) = 1, 0, -1, -1, -2, -1 (OEIS A002321), with CRLF, a repeat and a step back: not failures.
  write_file(dir.path("r.txt"), "# M(n), OEIS A002321\r\n1 1\r\n2 0\r\n\r\n3 -1\r\n2 0\r\n6 -1\r\n5 -2\r\n4 -1\r\n");
  const auto r = check(dir, "r.txt", "mertens");
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  expect_line(r, "terms compared: 7");
  expect_line(r, "values: all equal");
  expect_line(r, "repeated n: 1");
  expect_line(r, "  line 6: n = 2 already on line 3");
  expect_line(r, "n out of order: 3");
  expect_line(r, "  line 6: n = 2 after n = 3 on line 5");
  expect_line(r, "  line 8: n = 5 after n = 6 on line 7");
  expect_line(r, "  line 9: n = 4 after n = 5 on line 8");
  expect_line(r, "verdict: PASS");

  // A value beyond 64 bits is compared as text: a mismatch, not an error. Negative n and k < 1 are skipped.
  write_file(dir.path("h.txt"), "-1 5\n0 0\n1 99999999999999999999999999\n2 39\n");
  const auto h = check(dir, "h.txt", "mertens_zeros");
  EXPECT_EQ(h.exit_code, 1) << describe(h);
  expect_line(h, "terms compared: 2");
  expect_line(h, "terms skipped: 2 (0 need n above 10000000000, 2 outside the sequence's indices)");
  expect_line(h, "first mismatch: line 3, n = 1: expected 99999999999999999999999999 (file), got 2 (sqfc)");

  // Terms past --to are skipped, not compared: Q(n) (OEIS A013928 shifted) at n = 10 and 1000.
  write_file(dir.path("s.txt"), "10 7\n1000 608\n");
  const auto s = check(dir, "s.txt", "squarefree", {"--to", "100"});
  EXPECT_EQ(s.exit_code, 0) << describe(s);
  expect_line(s, "terms compared: 1");
  expect_line(s, "terms skipped: 1 (1 need n above 100, 0 outside the sequence's indices)");

  // An empty file compares nothing and says so.
  write_file(dir.path("e.txt"), "");
  const auto e = check(dir, "e.txt", "liouville");
  EXPECT_EQ(e.exit_code, 0) << describe(e);
  expect_line(e, "values: nothing to compare");
}

TEST(CheckBfile, BadInputIsExitTwoWithOneLine) {
  ScratchDir dir;
  write_file(dir.path("ok.txt"), "1 1\n");
  const std::vector<std::pair<std::vector<std::string>, std::string>> cases = {
      {{"check", "--bfile", "ok.txt", "--sequence", "moebius"}, "unknown sequence 'moebius'"},
      {{"check", "--bfile", "ok.txt", "--sequence", "b16"}, "unknown sequence 'b16'"},
      {{"check", "--bfile", "missing.txt", "--sequence", "mertens"}, "cannot open b-file 'missing.txt'"},
      {{"check", "--bfile", ".", "--sequence", "mertens"}, "is a directory"},
      {{"check", "--bfile", "ok.txt"}, "--bfile needs --sequence"},
      {{"check", "--sequence", "mertens"}, "--sequence needs --bfile"},
      {{"check", "--bfile", "ok.txt", "--sequence", "mertens", "--only", "1"}, "--only applies to the identity suite"},
      {{"check", "--bfile", "ok.txt", "--sequence", "mertens", "--to", "0"}, "--to"},
      {{"check", "--bfile", "ok.txt", "--sequence", "mertens", "--to", "1e17"}, "--to"},
      {{"check", "--bfile", "ok.txt", "--sequence", "mertens", "--threads", "0"}, "--threads"},
  };
  int checked = 0;
  for (const auto& [args, message] : cases) {
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(r.out, "") << describe(r);
    EXPECT_EQ(split_lines(r.err).size(), 1u) << describe(r);
    EXPECT_NE(r.err.find(message), std::string::npos) << describe(r);
    ++checked;
  }
  EXPECT_EQ(checked, 10);
}

TEST(CheckBfile, CommandIsRegistered) {
  ScratchDir dir;
  const auto help = run_sqfc(dir, {"check", "--help"});
  EXPECT_EQ(help.exit_code, 0) << describe(help);
  EXPECT_NE(help.out.find("--sequence"), std::string::npos) << help.out;
  const auto unknown = run_sqfc(dir, {"chekc"});
  EXPECT_EQ(unknown.exit_code, 2) << describe(unknown);
  EXPECT_TRUE(std::regex_search(unknown.err, std::regex("commands: [a-z, ]*\\bcheck\\b"))) << unknown.err;
}

}  // namespace
}  // namespace sqfc::cli_test
