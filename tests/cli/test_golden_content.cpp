// SPDX-License-Identifier: MIT
// Verifies the CONTENT of every golden file in tests/data/golden/ without running sqfc: each row is
// compared with the brute-force reference (tests/oracles, Z/2 homology, a determinant mod a prime)
// and a few published values, so a golden file is never just "whatever the code printed".
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <set>

#include "cli_runner.hpp"
#include "golden_cases.hpp"
#include "golden_reference.hpp"

namespace sqfc::cli_test {
namespace {

std::vector<std::string> golden_lines(const std::string& name) {
  const auto path = golden_dir() / name;
  EXPECT_TRUE(std::filesystem::exists(path)) << path;
  return split_lines(read_file(path));
}

// Checks a CSV or TSV golden table: header, the n of every row, every value against the reference.
// Returns the number of rows checked.
int check_delimited_table(const std::string& name, char separator, const std::vector<std::string>& header,
                          const std::vector<std::uint64_t>& expected_n, int* values_compared) {
  const auto lines = golden_lines(name);
  EXPECT_EQ(lines.size(), expected_n.size() + 1) << name;
  if (lines.empty()) return 0;
  EXPECT_EQ(split_fields(lines[0], separator), header) << name;
  int rows = 0;
  for (std::size_t i = 1; i < lines.size() && i <= expected_n.size(); ++i) {
    const auto fields = split_fields(lines[i], separator);
    EXPECT_EQ(fields.size(), header.size()) << name << " line " << i + 1;
    if (fields.size() != header.size()) continue;
    EXPECT_EQ(fields[0], std::to_string(expected_n[i - 1])) << name << " line " << i + 1;
    std::map<std::string, std::string> row;
    for (std::size_t c = 0; c < header.size(); ++c) row[header[c]] = fields[c];
    *values_compared += check_row_against_reference(row, name + " line " + std::to_string(i + 1));
    ++rows;
  }
  return rows;
}

std::vector<std::uint64_t> multiples(std::uint64_t from, std::uint64_t to, std::uint64_t step) {
  std::vector<std::uint64_t> v;
  for (std::uint64_t n = (from + step - 1) / step * step; n <= to; n += step) v.push_back(n);
  return v;
}

// Value of a column in a golden CSV row, found by name.
std::string csv_value(const std::vector<std::string>& lines, std::uint64_t n, const std::string& column) {
  const auto header = split_fields(lines.at(0));
  const auto c = static_cast<std::size_t>(std::find(header.begin(), header.end(), column) - header.begin());
  for (std::size_t i = 1; i < lines.size(); ++i) {
    const auto fields = split_fields(lines[i]);
    if (fields.at(0) == std::to_string(n) && c < fields.size()) return fields[c];
  }
  return "(no row " + std::to_string(n) + ")";
}

TEST(GoldenContent, EveryGoldenFileIsListedAndVerifiedHere) {
  // The files this test file verifies one by one, below; any other file would be unverified.
  const std::set<std::string> verified = {"table_to1000_every50.csv",      "table_from101_to500_every25.tsv",
                                          "table_to300_at_selected.jsonl", "table_to1000_log.csv",
                                          "mertens_to200.bfile.txt",       "events_to1000.csv"};
  std::set<std::string> listed, on_disk;
  for (const auto& c : golden_cases()) listed.insert(c.file);
  for (const auto& name : list_dir(golden_dir()))
    if (name != "README.md") on_disk.insert(name);
  EXPECT_EQ(listed, verified);
  EXPECT_EQ(on_disk, verified);
  EXPECT_EQ(verified.size(), 6u);
}

TEST(GoldenContent, TableEvery50MatchesBruteForceAndPublishedValues) {
  int values = 0;
  const int rows =
      check_delimited_table("table_to1000_every50.csv", ',', expected_columns(1000), multiples(1, 1000, 50), &values);
  EXPECT_EQ(rows, 20);
  EXPECT_EQ(values, 20 * 16);  // 16 columns: D = 3 for N = 1000 (210 <= 1000 < 2310)

  // Published values, independent of the oracle code.
  const auto lines = golden_lines("table_to1000_every50.csv");
  EXPECT_EQ(csv_value(lines, 100, "mertens"), "1");        // M(10^2) = 1, OEIS A084237
  EXPECT_EQ(csv_value(lines, 1000, "mertens"), "2");       // M(10^3) = 2, OEIS A084237
  EXPECT_EQ(csv_value(lines, 100, "squarefree"), "61");    // Q(10^2) = 61, OEIS A071172
  EXPECT_EQ(csv_value(lines, 1000, "squarefree"), "608");  // Q(10^3) = 608, OEIS A071172
  EXPECT_EQ(csv_value(lines, 100, "liouville"), "-2");     // L(10^2) = -2, OEIS A090410
  EXPECT_EQ(csv_value(lines, 1000, "liouville"), "-14");   // L(10^3) = -14, OEIS A090410
  EXPECT_EQ(csv_value(lines, 1000, "f0"), "168");          // pi(1000) = 168 vertices, OEIS A006880
  EXPECT_EQ(csv_value(lines, 100, "f0"), "25");            // pi(100) = 25, OEIS A006880
}

TEST(GoldenContent, TsvFrom101MatchesBruteForce) {
  int values = 0;
  const int rows = check_delimited_table("table_from101_to500_every25.tsv", '\t', expected_columns(500),
                                         multiples(101, 500, 25), &values);
  EXPECT_EQ(rows, 16);  // 125, 150, ..., 500
  EXPECT_EQ(values, 16 * 16);
}

TEST(GoldenContent, LogSampledTableMatchesBruteForce) {
  // Default sampling: round(10^(j/10)) for j = 0..30 (design: 10 points per decade), duplicates
  // merged. 10^(j/10) is irrational unless 10 | j, so rounding has no ties.
  std::vector<std::uint64_t> points;
  for (int j = 0; j <= 30; ++j) {
    const auto p = static_cast<std::uint64_t>(std::llround(std::pow(10.0, j / 10.0)));
    if (points.empty() || points.back() != p) points.push_back(p);
  }
  ASSERT_EQ(points.size(), 28u);
  int values = 0;
  const int rows = check_delimited_table("table_to1000_log.csv", ',', expected_columns(1000), points, &values);
  EXPECT_EQ(rows, 28);
  EXPECT_EQ(values, 28 * 16);
  const auto lines = golden_lines("table_to1000_log.csv");
  EXPECT_EQ(csv_value(lines, 10, "mertens"), "-1");    // M(10) = -1, OEIS A084237
  EXPECT_EQ(csv_value(lines, 10, "squarefree"), "7");  // Q(10) = 7, OEIS A071172
  EXPECT_EQ(csv_value(lines, 1, "euler"), "0");        // K_1 is empty: chi = 0 = 1 - M(1) (design.md identity 1)
  EXPECT_EQ(csv_value(lines, 1, "b0"), "0");           // the empty complex has no component
}

TEST(GoldenContent, JsonLinesSelectedColumnsMatchBruteForce) {
  const auto lines = golden_lines("table_to300_at_selected.jsonl");
  const std::vector<std::uint64_t> at = {1, 2, 6, 15, 30, 105, 210, 300};
  // --columns liouville,b,mertens,f2: n leads, then the given order, `b` expanded to b0..b3 (D = 3 at 300).
  const std::vector<std::string> keys = {"n", "liouville", "b0", "b1", "b2", "b3", "mertens", "f2"};
  ASSERT_EQ(lines.size(), at.size());
  int values = 0;
  for (std::size_t i = 0; i < lines.size(); ++i) {
    const auto object = nlohmann::ordered_json::parse(lines[i]);
    std::vector<std::string> seen;
    std::map<std::string, std::string> row;
    for (const auto& [key, value] : object.items()) {
      seen.push_back(key);
      EXPECT_TRUE(value.is_number_integer()) << lines[i];
      row[key] = value.dump();
    }
    EXPECT_EQ(seen, keys) << lines[i];
    EXPECT_EQ(row["n"], std::to_string(at[i]));
    values += check_row_against_reference(row, "jsonl line " + std::to_string(i + 1));
  }
  EXPECT_EQ(values, 8 * 8);
  // Landmarks: the first 2-sphere appears at 105 = 3*5*7 (design.md, common knowledge of the field);
  // the first 2-face is 30 = 2*3*5 (primorials, OEIS A002110).
  EXPECT_EQ(nlohmann::json::parse(lines[3])["b2"], 0);  // n = 15
  EXPECT_EQ(nlohmann::json::parse(lines[5])["b2"], 1);  // n = 105
  EXPECT_EQ(nlohmann::json::parse(lines[3])["f2"], 0);  // n = 15
  EXPECT_EQ(nlohmann::json::parse(lines[4])["f2"], 1);  // n = 30
}

TEST(GoldenContent, MertensBfileMatchesBruteForceAndOeis) {
  const auto lines = golden_lines("mertens_to200.bfile.txt");
  const auto& ref = golden_reference();
  // A002321, M(1..30); terms from memory, re-derived by hand from mu(1..30).
  const std::vector<int> a002321 = {1,  0,  -1, -1, -2, -1, -2, -2, -2, -1, -2, -2, -3, -2, -1,
                                    -1, -2, -2, -3, -3, -2, -1, -2, -2, -2, -1, -1, -1, -2, -3};
  int comments = 0, checked = 0, published = 0;
  std::uint64_t next = 1;
  for (const auto& line : lines) {
    if (!line.empty() && line[0] == '#') {
      EXPECT_EQ(checked, 0) << "comment after data: " << line;
      ++comments;
      continue;
    }
    // OEIS b-file: "n value", one space, nothing else.
    const auto fields = split_fields(line, ' ');
    ASSERT_EQ(fields.size(), 2u) << line;
    EXPECT_EQ(fields[0], std::to_string(next)) << line;
    EXPECT_EQ(fields[1], std::to_string(ref.prefix.mertens[next])) << line;
    if (next <= a002321.size()) {
      EXPECT_EQ(fields[1], std::to_string(a002321[next - 1])) << "OEIS A002321 at n = " << next;
      ++published;
    }
    ++next;
    ++checked;
  }
  EXPECT_EQ(comments, 1);
  EXPECT_EQ(checked, 200);
  EXPECT_EQ(published, 30);
}

// Exact comparison of M1/sqrt(n1) with M2/sqrt(n2): -1, 0 or +1.
int compare_scaled_exact(std::int64_t m1, std::int64_t n1, std::int64_t m2, std::int64_t n2) {
  const int s1 = (m1 > 0) - (m1 < 0), s2 = (m2 > 0) - (m2 < 0);
  if (s1 != s2) return s1 < s2 ? -1 : 1;
  const std::int64_t left = m1 * m1 * n2, right = m2 * m2 * n1;  // |M| <= n <= 1000: no overflow
  const int magnitude = (left > right) - (left < right);
  return s1 >= 0 ? magnitude : -magnitude;
}

TEST(GoldenContent, EventsMatchBruteForce) {
  const auto& ref = golden_reference();
  const auto& mertens = ref.prefix.mertens;
  // The events of design.md / include/sqfc/track/events.hpp, recomputed from the definitions.
  // Within one n they are listed in the declaration order of the event kinds.
  std::vector<std::string> expected = {"kind,n,value"};
  std::int64_t high = mertens[1], low = mertens[1];
  std::int64_t scaled_high_m = 0, scaled_high_n = 0, scaled_low_m = 0, scaled_low_n = 0;
  std::set<int> face_dims, homology_dims;
  const auto scaled_text = [&](std::uint64_t n) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.12g",
                  static_cast<double>(mertens[n]) / std::sqrt(static_cast<double>(n)));  // 12 significant digits
    return std::string(buffer);
  };
  for (std::uint64_t n = 2; n <= 1000; ++n) {
    const auto m = mertens[n];
    const std::string at = "," + std::to_string(n) + ",";
    if (m == 0) expected.push_back("mertens_zero" + at + "0");
    if (m > high) high = m, expected.push_back("mertens_high" + at + std::to_string(m));
    if (m < low) low = m, expected.push_back("mertens_low" + at + std::to_string(m));
    const auto sn = static_cast<std::int64_t>(n);
    if (n == 200) {
      scaled_high_m = scaled_low_m = m;
      scaled_high_n = scaled_low_n = sn;
    } else if (n > 200) {
      if (compare_scaled_exact(m, sn, scaled_high_m, scaled_high_n) > 0)
        scaled_high_m = m, scaled_high_n = sn, expected.push_back("scaled_high" + at + scaled_text(n));
      if (compare_scaled_exact(m, sn, scaled_low_m, scaled_low_n) < 0)
        scaled_low_m = m, scaled_low_n = sn, expected.push_back("scaled_low" + at + scaled_text(n));
    }
    if (ref.prefix.mu[n] != 0 && face_dims.insert(ref.prefix.omega[n] - 1).second)
      expected.push_back("first_face_dimension" + at + std::to_string(ref.prefix.omega[n] - 1));
    for (std::size_t d = 0; d < ref.betti[n].size(); ++d)
      if (ref.betti[n][d] > 0 && homology_dims.insert(static_cast<int>(d)).second)
        expected.push_back("first_homology_dimension" + at + std::to_string(d));
  }
  const auto lines = golden_lines("events_to1000.csv");
  EXPECT_EQ(lines.size(), expected.size());
  std::size_t compared = 0;
  for (std::size_t i = 0; i < std::min(lines.size(), expected.size()); ++i, ++compared)
    EXPECT_EQ(lines[i], expected[i]) << "events_to1000.csv line " << i + 1;
  EXPECT_EQ(compared, 136u);  // header + 135 events

  // Published values: the zeros of M up to 214 (OEIS A028442, from memory); first faces of each
  // dimension at the primorials 2, 6, 30, 210 (OEIS A002110); first homology in dimension d >= 1 at
  // the products of the first odd primes 15, 105 (OEIS A070826), dimension 0 at 2.
  const std::vector<std::uint64_t> a028442 = {2, 39, 40, 58, 65, 93, 101, 145, 149, 150, 159, 160, 163, 164, 166, 214};
  std::vector<std::uint64_t> zeros;
  std::map<std::string, std::string> firsts;
  for (std::size_t i = 1; i < lines.size(); ++i) {
    const auto f = split_fields(lines[i]);
    ASSERT_EQ(f.size(), 3u) << lines[i];
    if (f[0] == "mertens_zero" && std::stoull(f[1]) <= 214) zeros.push_back(std::stoull(f[1]));
    if (f[0] == "first_face_dimension" || f[0] == "first_homology_dimension") firsts[f[0] + " " + f[2]] = f[1];
  }
  EXPECT_EQ(zeros, a028442);
  const std::map<std::string, std::string> published_firsts = {
      {"first_face_dimension 0", "2"},      {"first_face_dimension 1", "6"},     {"first_face_dimension 2", "30"},
      {"first_face_dimension 3", "210"},    {"first_homology_dimension 0", "2"}, {"first_homology_dimension 1", "15"},
      {"first_homology_dimension 2", "105"}};
  EXPECT_EQ(firsts, published_firsts);
  EXPECT_EQ(zeros.size() + firsts.size(), 16u + 7u);
}

}  // namespace
}  // namespace sqfc::cli_test
