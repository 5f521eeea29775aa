// SPDX-License-Identifier: MIT
// Tests of io/columns: names, the default column set, parsing of --columns lists and values.
#include "sqfc/io/columns.hpp"

#include <gtest/gtest.h>

#include <limits>
#include <string>
#include <vector>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::io::Column;
using K = sqfc::io::Column::Kind;
namespace io = sqfc::io;

std::string joined_names(const std::vector<Column>& columns) {
  std::string text;
  for (const auto& c : columns) text += (text.empty() ? "" : ",") + io::column_name(c);
  return text;
}

TEST(Columns, NamesAreThoseOfTheDesign) {
  // design.md section 4: n, mu, mertens, euler, squarefree, liouville, fredholm, f0..fD, b0..bD, div_edges.
  const std::vector<std::pair<Column, std::string>> cases = {
      {{K::n}, "n"},           {{K::mu}, "mu"},         {{K::mertens}, "mertens"},     {{K::euler}, "euler"},
      {{K::squarefree}, "squarefree"}, {{K::liouville}, "liouville"}, {{K::fredholm}, "fredholm"},
      {{K::div_edges}, "div_edges"},   {{K::face, 0}, "f0"},  {{K::face, 14}, "f14"},   {{K::betti, 0}, "b0"},
      {{K::betti, 7}, "b7"}};
  int checked = 0;
  for (const auto& [column, name] : cases) {
    EXPECT_EQ(io::column_name(column), name);
    ++checked;
  }
  EXPECT_EQ(checked, 12);
}

TEST(Columns, DefaultColumnsFollowTheTopDimension) {
  // Top dimension D = max(0, largest face dimension of K_N): faces of dimension d first
  // appear at the primorial of d + 1 (OEIS A002110: 2, 6, 30, 210, ...).
  const std::string head = "n,mu,mertens,euler,squarefree,liouville,fredholm,";
  const std::vector<std::pair<Natural, std::string>> cases = {
      {1, head + "f0,b0,div_edges"},
      {5, head + "f0,b0,div_edges"},
      {6, head + "f0,f1,b0,b1,div_edges"},
      {29, head + "f0,f1,b0,b1,div_edges"},
      {30, head + "f0,f1,f2,b0,b1,b2,div_edges"},
      {209, head + "f0,f1,f2,b0,b1,b2,div_edges"},
      {210, head + "f0,f1,f2,f3,b0,b1,b2,b3,div_edges"},
      {sqfc::config::max_sieve_n,  // primorial(13) = 3.0e14 <= 10^16 < primorial(14)
       head + "f0,f1,f2,f3,f4,f5,f6,f7,f8,f9,f10,f11,f12,b0,b1,b2,b3,b4,b5,b6,b7,b8,b9,b10,b11,b12,div_edges"}};
  int checked = 0;
  for (const auto& [to, names] : cases) {
    EXPECT_EQ(joined_names(io::default_columns(to)), names) << "N = " << to;
    ++checked;
  }
  EXPECT_EQ(checked, 8);
}

TEST(Columns, ParseAcceptsNamesAndPutsNFirst) {
  const std::vector<std::tuple<std::string, Natural, std::string>> cases = {
      {"mertens", 100, "n,mertens"},
      {"n,mertens", 100, "n,mertens"},
      {"mertens,n", 100, "n,mertens"},
      {"mu,squarefree,n,liouville", 100, "n,mu,squarefree,liouville"},
      {"mu,mu,n,mu", 100, "n,mu"},
      {"f,b", 30, "n,f0,f1,f2,b0,b1,b2"},
      {"f", 1, "n,f0"},
      {"b", 5, "n,b0"},
      {"f14,b14", 10, "n,f14,b14"},
      {"f0,f,f1", 6, "n,f0,f1"},
      {"div_edges,fredholm,euler", 1000, "n,div_edges,fredholm,euler"}};
  int checked = 0;
  for (const auto& [list, to, names] : cases) {
    EXPECT_EQ(joined_names(io::parse_columns(list, to)), names) << "'" << list << "'";
    ++checked;
  }
  EXPECT_EQ(checked, 11);
}

TEST(Columns, ParseRejectsUnknownAndEmptyNames) {
  int checked = 0;
  for (const std::string list : {"", ",", "n,", ",n", "a,,b", "x", "N", "mertens ", " mertens", "f15", "b15", "f01",
                                 "f-1", "f1x", "fb", "bb", "mertens;mu", "div-edges"}) {
    EXPECT_THROW(static_cast<void>(io::parse_columns(list, 1000)), sqfc::InvalidArgument) << "'" << list << "'";
    ++checked;
  }
  EXPECT_EQ(checked, 18);
}

TEST(Columns, ValuesAreExactDecimalText) {
  sqfc::track::TableRow row;
  row.n = 10'000'000'000'000'000ULL;
  row.mu = -1;
  row.mertens = -33722;
  row.euler = 33723;
  row.squarefree = 6'079'271'018'540'267ULL;
  row.liouville = -(std::int64_t{1} << 62);
  row.fredholm = -1;
  for (int d = 0; d < sqfc::config::omega_slots; ++d) {
    row.faces[static_cast<std::size_t>(d)] = 1000 + static_cast<std::uint64_t>(d);
    row.betti[static_cast<std::size_t>(d)] = -static_cast<std::int64_t>(d);
  }
  row.faces[14] = std::numeric_limits<std::uint64_t>::max();
  row.div_edges = std::numeric_limits<std::uint64_t>::max() - 1;
  const std::vector<std::pair<Column, std::string>> cases = {
      {{K::n}, "10000000000000000"},
      {{K::mu}, "-1"},
      {{K::mertens}, "-33722"},
      {{K::euler}, "33723"},
      {{K::squarefree}, "6079271018540267"},
      {{K::liouville}, "-4611686018427387904"},
      {{K::fredholm}, "-1"},
      {{K::face, 0}, "1000"},
      {{K::face, 13}, "1013"},
      {{K::face, 14}, "18446744073709551615"},
      {{K::betti, 0}, "0"},
      {{K::betti, 5}, "-5"},
      {{K::div_edges}, "18446744073709551614"}};
  int checked = 0;
  for (const auto& [column, text] : cases) {
    EXPECT_EQ(io::column_value(column, row), text) << io::column_name(column);
    ++checked;
  }
  EXPECT_EQ(checked, 13);
}

}  // namespace
