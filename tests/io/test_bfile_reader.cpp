// SPDX-License-Identifier: MIT
// Tests of io/bfile_reader: terms, comments, blanks, CRLF, malformed lines with their reasons,
// huge values, negative and 64-bit-edge n, duplicates, out-of-order n, streaming of long files.
#include "sqfc/io/bfile_reader.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <limits>
#include <sstream>
#include <string>
#include <vector>

#include "sqfc/core/error.hpp"

namespace {

using sqfc::io::BfileLine;
using sqfc::io::BfileProblem;
namespace io = sqfc::io;

io::BfileContents read_text(const std::string& text) {
  std::istringstream in(text);
  return io::read_bfile(in);
}

TEST(BfileReader, EmptyInputHasNoLines) {
  const auto c = read_text("");
  EXPECT_EQ(c.lines, 0u);
  EXPECT_TRUE(c.terms.empty());
  EXPECT_TRUE(c.malformed.empty());
  EXPECT_TRUE(c.duplicates.empty());
  EXPECT_TRUE(c.out_of_order.empty());
}

TEST(BfileReader, TermsCommentsBlanksAndLineNumbers) {
  const auto c = read_text("# a comment\n\n1 1\n  \t\n2 0\n   # indented comment\n3 -1");  // no final newline
  EXPECT_EQ(c.lines, 7u);
  EXPECT_EQ(c.comments, 2u);
  EXPECT_EQ(c.blanks, 2u);
  ASSERT_EQ(c.terms.size(), 3u);
  const std::vector<std::tuple<sqfc::Count, std::int64_t, std::string>> expected = {
      {3, 1, "1"}, {5, 2, "0"}, {7, 3, "-1"}};
  for (std::size_t i = 0; i < expected.size(); ++i) {
    EXPECT_EQ(c.terms[i].line, std::get<0>(expected[i]));
    EXPECT_EQ(c.terms[i].n, std::get<1>(expected[i]));
    EXPECT_EQ(c.terms[i].value, std::get<2>(expected[i]));
    ASSERT_TRUE(c.terms[i].value_int.has_value());
    EXPECT_EQ(std::to_string(*c.terms[i].value_int), std::get<2>(expected[i]));
  }
  EXPECT_TRUE(c.malformed.empty());
}

TEST(BfileReader, CrlfSpacesAndTabsAreIgnored) {
  const auto c = read_text("# title\r\n\r\n 1\t 5 \r\n\t2   -7\t\r\n");
  EXPECT_EQ(c.lines, 4u);
  EXPECT_EQ(c.comments, 1u);
  EXPECT_EQ(c.blanks, 1u);
  ASSERT_EQ(c.terms.size(), 2u);
  EXPECT_EQ(c.terms[0].n, 1);
  EXPECT_EQ(c.terms[0].value, "5");
  EXPECT_EQ(c.terms[1].n, 2);
  EXPECT_EQ(c.terms[1].value, "-7");
  EXPECT_TRUE(c.malformed.empty());
}

TEST(BfileReader, MalformedLinesCarryLineAndReason) {
  const std::vector<std::pair<std::string, BfileProblem>> cases = {
      {"7", BfileProblem::field_count},
      {"1 2 3", BfileProblem::extra_text},
      {"1 2 # note", BfileProblem::extra_text},
      {"x 2", BfileProblem::bad_index},
      {"1.5 2", BfileProblem::bad_index},
      {"+1 2", BfileProblem::bad_index},
      {"- 2", BfileProblem::bad_index},
      {"1 2.0", BfileProblem::bad_value},
      {"1 1e5", BfileProblem::bad_value},
      {"1 --3", BfileProblem::bad_value},
      {"1,2", BfileProblem::bad_index},
      {"9223372036854775808 1", BfileProblem::index_too_big},     // 2^63
      {"-9223372036854775809 1", BfileProblem::index_too_big},    // -2^63 - 1
      {"123456789012345678901234567890 1", BfileProblem::index_too_big},
  };
  std::string text = "# header\n";
  for (const auto& [line, problem] : cases) text += line + "\n1000 0\n";  // a good line after each bad one
  const auto c = read_text(text);
  ASSERT_EQ(c.malformed.size(), cases.size());
  EXPECT_EQ(c.terms.size(), cases.size());
  std::size_t checked = 0;
  for (std::size_t i = 0; i < cases.size(); ++i) {
    EXPECT_EQ(c.malformed[i].line, 2 + 2 * i) << cases[i].first;
    EXPECT_EQ(c.malformed[i].problem, cases[i].second) << cases[i].first;
    EXPECT_EQ(c.malformed[i].text, cases[i].first);
    EXPECT_FALSE(io::bfile_problem_text(c.malformed[i].problem).empty());
    ++checked;
  }
  EXPECT_EQ(checked, 14u);
}

TEST(BfileReader, HugeValuesKeepTheirDigits) {
  const std::string big = "123456789012345678901234567890123456789012345678901234567890";
  const auto c = read_text("1 " + big + "\n2 -" + big + "\n3 000042\n4 -0\n5 -000\n6 9223372036854775807\n"
                           "7 9223372036854775808\n8 -9223372036854775808\n9 -9223372036854775809\n10 0000" + big + "\n");
  ASSERT_EQ(c.terms.size(), 10u);
  EXPECT_TRUE(c.malformed.empty());
  const std::vector<std::pair<std::string, std::optional<std::int64_t>>> expected = {
      {big, std::nullopt},
      {"-" + big, std::nullopt},
      {"42", 42},
      {"0", 0},
      {"0", 0},
      {"9223372036854775807", std::numeric_limits<std::int64_t>::max()},
      {"9223372036854775808", std::nullopt},  // 2^63 does not fit
      {"-9223372036854775808", std::numeric_limits<std::int64_t>::min()},
      {"-9223372036854775809", std::nullopt},
      {big, std::nullopt},
  };
  for (std::size_t i = 0; i < expected.size(); ++i) {
    EXPECT_EQ(c.terms[i].value, expected[i].first) << "term " << i;
    EXPECT_EQ(c.terms[i].value_int, expected[i].second) << "term " << i;
  }
}

TEST(BfileReader, NegativeAndEdgeIndices) {
  const auto c = read_text("-5 1\n0 2\n9223372036854775807 3\n-9223372036854775808 4\n007 5\n");
  ASSERT_EQ(c.terms.size(), 5u);
  EXPECT_EQ(c.terms[0].n, -5);
  EXPECT_EQ(c.terms[1].n, 0);
  EXPECT_EQ(c.terms[2].n, std::numeric_limits<std::int64_t>::max());
  EXPECT_EQ(c.terms[3].n, std::numeric_limits<std::int64_t>::min());
  EXPECT_EQ(c.terms[4].n, 7);
  EXPECT_TRUE(c.malformed.empty());
  // -5, 0, max ascend; min after max and 7 after min: one step down (line 4).
  ASSERT_EQ(c.out_of_order.size(), 1u);
  EXPECT_EQ(c.out_of_order[0].line, 4u);
  EXPECT_EQ(c.out_of_order[0].previous_line, 3u);
}

TEST(BfileReader, DuplicatesAndOutOfOrderAreFindingsNotErrors) {
  //                      line: 1    2    3    4    5    6    7
  const auto c = read_text("1 1\n2 0\n2 0\n5 -2\n3 -1\n1 1\n6 -1\n");
  EXPECT_EQ(c.terms.size(), 7u);
  EXPECT_TRUE(c.malformed.empty());
  ASSERT_EQ(c.duplicates.size(), 2u);
  EXPECT_EQ(c.duplicates[0].line, 3u);
  EXPECT_EQ(c.duplicates[0].first_line, 2u);
  EXPECT_EQ(c.duplicates[0].n, 2);
  EXPECT_EQ(c.duplicates[1].line, 6u);
  EXPECT_EQ(c.duplicates[1].first_line, 1u);
  EXPECT_EQ(c.duplicates[1].n, 1);
  ASSERT_EQ(c.out_of_order.size(), 2u);  // 3 after 5 (line 5), 1 after 3 (line 6); the equal 2, 2 is not out of order
  EXPECT_EQ(c.out_of_order[0].line, 5u);
  EXPECT_EQ(c.out_of_order[0].n, 3);
  EXPECT_EQ(c.out_of_order[0].previous_n, 5);
  EXPECT_EQ(c.out_of_order[0].previous_line, 4u);
  EXPECT_EQ(c.out_of_order[1].line, 6u);
  EXPECT_EQ(c.out_of_order[1].previous_n, 3);
}

TEST(BfileReader, MalformedLinesDoNotBreakTheOrderOfTerms) {
  // A malformed line between two terms is neither a term nor a previous term.
  const auto c = read_text("1 1\n0 zero\n2 0\n");
  EXPECT_EQ(c.terms.size(), 2u);
  ASSERT_EQ(c.malformed.size(), 1u);
  EXPECT_EQ(c.malformed[0].line, 2u);
  EXPECT_TRUE(c.out_of_order.empty());
  EXPECT_TRUE(c.duplicates.empty());
}

TEST(BfileReader, StreamsALongFile) {
  // 200000 terms with every 1000th line malformed: counts and line numbers must survive the length.
  std::string text;
  const int lines = 200000;
  for (int i = 1; i <= lines; ++i) text += (i % 1000 == 0) ? "bad line\n" : std::to_string(i) + " " + std::to_string(-i) + "\n";
  std::istringstream in(text);
  io::BfileReader reader(in);
  sqfc::Count terms = 0, malformed = 0, last_bad_line = 0;
  while (auto line = reader.next()) {
    if (line->kind == BfileLine::Kind::term) {
      ++terms;
      EXPECT_EQ(line->term.n, static_cast<std::int64_t>(line->term.line));
    } else if (line->kind == BfileLine::Kind::malformed) {
      ++malformed;
      last_bad_line = line->malformed.line;
    }
  }
  EXPECT_EQ(reader.lines(), 200000u);
  EXPECT_EQ(terms, 199800u);
  EXPECT_EQ(malformed, 200u);
  EXPECT_EQ(last_bad_line, 200000u);
  EXPECT_TRUE(reader.duplicates().empty());
  EXPECT_TRUE(reader.out_of_order().empty());
}

TEST(BfileReader, LongMalformedLineIsShortenedInTheFinding) {
  const auto c = read_text("1 2 " + std::string(500, 'z') + "\n");
  ASSERT_EQ(c.malformed.size(), 1u);
  EXPECT_EQ(c.malformed[0].text.size(), 80u);
  EXPECT_EQ(c.malformed[0].text.substr(77), "...");
}

TEST(BfileReader, MissingFileAndDirectoryAreIoErrors) {
  EXPECT_THROW(io::read_bfile_file("/nonexistent/sqfc-no-such-bfile.txt"), sqfc::IoError);
  EXPECT_THROW(io::read_bfile_file(std::filesystem::temp_directory_path().string()), sqfc::IoError);
}

}  // namespace
