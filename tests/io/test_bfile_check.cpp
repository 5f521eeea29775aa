// SPDX-License-Identifier: MIT
// Tests of io/bfile_check: the tally of a comparison, the verdict and the report lines. Expected
// counts are read off the small hand-made b-files in each test (no outside values).
#include "sqfc/io/bfile_check.hpp"

#include <gtest/gtest.h>

#include <sstream>

#include "sqfc/core/error.hpp"

namespace {

namespace io = sqfc::io;
using sqfc::track::TermStatus;
using sqfc::track::TermValue;

io::BfileContents read_text(const std::string& text) {
  std::istringstream in(text);
  return io::read_bfile(in);
}

TEST(BfileCheck, TallyAndFirstMismatch) {
  const auto c = read_text("# t\n1 1\n2 0\n3 -2\n4 7\n5 123456789012345678901234567890\n-1 0\n");
  ASSERT_EQ(c.terms.size(), 6u);
  EXPECT_EQ(io::bfile_indices(c), (std::vector<std::int64_t>{1, 2, 3, 4, 5, -1}));
  const std::vector<TermValue> values = {{TermStatus::computed, 1, 1},  {TermStatus::computed, 2, 0},
                                         {TermStatus::computed, 3, -1}, {TermStatus::beyond_limit, 4, 0},
                                         {TermStatus::computed, 5, -2}, {TermStatus::outside_domain, 0, 0}};
  const auto r = io::compare_bfile_terms(c, values);
  EXPECT_EQ(r.compared, 4u);
  EXPECT_EQ(r.mismatched, 2u);
  EXPECT_EQ(r.beyond_limit, 1u);
  EXPECT_EQ(r.outside_domain, 1u);
  EXPECT_EQ(r.skipped(), 2u);
  ASSERT_TRUE(r.first_mismatch.has_value());
  EXPECT_EQ(r.first_mismatch->line, 4u);
  EXPECT_EQ(r.first_mismatch->n, 3);
  EXPECT_EQ(r.first_mismatch->expected, "-2");
  EXPECT_EQ(r.first_mismatch->got, "-1");
  EXPECT_FALSE(io::bfile_check_passed(c, r));
  EXPECT_THROW(io::compare_bfile_terms(c, {}), sqfc::InvalidArgument);
}

TEST(BfileCheck, VerdictNeedsNoMismatchAndNoMalformedLine) {
  const std::vector<TermValue> one = {{TermStatus::computed, 1, 1}};
  const auto good = read_text("1 1\n1 1\n");  // a repeat is a finding, not a failure
  const std::vector<TermValue> two = {{TermStatus::computed, 1, 1}, {TermStatus::computed, 1, 1}};
  EXPECT_TRUE(io::bfile_check_passed(good, io::compare_bfile_terms(good, two)));
  const auto bad = read_text("1 1\nx\n");
  EXPECT_FALSE(io::bfile_check_passed(bad, io::compare_bfile_terms(bad, one)));
}

TEST(BfileCheck, ReportListsFindingsUpToTheLimit) {
  std::string text;
  for (int i = 0; i < 5; ++i) text += "bad\n";
  text += "1 1\n";
  const auto c = read_text(text);
  const auto r = io::compare_bfile_terms(c, {{TermStatus::computed, 1, 1}});
  std::ostringstream out;
  io::write_bfile_check_report(out, {"f.txt", "mertens", "M(n)", 10}, c, r, 2);
  const std::string s = out.str();
  for (const char* line : {"file: f.txt\n", "sequence: mertens (M(n))\n", "terms compared: 1\n", "values: all equal\n",
                           "malformed lines: 5\n", "  line 1: n is not an integer: 'bad'\n",
                           "  line 2: n is not an integer: 'bad'\n", "  (3 more not listed)\n", "verdict: FAIL\n"})
    EXPECT_NE(s.find(line), std::string::npos) << line << "\n" << s;
  EXPECT_EQ(s.find("line 3:"), std::string::npos) << s;
}

}  // namespace
