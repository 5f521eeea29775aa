// SPDX-License-Identifier: MIT
// Tests of the graph and face writers: the size bound against the bytes written for every object,
// format and N in a sweep; round trips (edge list and Matrix Market parsed back and compared with
// the enumeration); the word parsers; and the count checks after writing.
#include "sqfc/io/graph_export.hpp"

#include <gtest/gtest.h>

#include <map>
#include <sstream>
#include <utility>
#include <vector>

#include "sqfc/complex/graph_enumeration.hpp"
#include "sqfc/core/error.hpp"

namespace {

using namespace sqfc::io;
using Pair = std::pair<std::uint64_t, std::uint64_t>;

ComplexCounts counts_for(ComplexObject object, std::uint64_t n) {
  ComplexCounts c;
  c.n = n;
  c.vertices = sqfc::complex::count_vertices(n);
  if (object == ComplexObject::divisibility) c.edges = sqfc::complex::count_divisibility_edges(n);
  if (object == ComplexObject::shared_factor) c.edges = sqfc::complex::count_shared_factor_edges_formula(n);
  return c;
}

std::vector<Pair> enumerated(ComplexObject object, std::uint64_t n) {
  std::vector<Pair> edges;
  const sqfc::complex::EdgeBatchVisitor visit = [&](std::span<const sqfc::complex::GraphEdge> batch) {
    for (const auto& e : batch) edges.emplace_back(e.a, e.b);
  };
  if (object == ComplexObject::divisibility)
    sqfc::complex::for_each_divisibility_edge(n, visit);
  else
    sqfc::complex::for_each_shared_factor_edge(n, visit);
  return edges;
}

const std::vector<std::pair<ComplexObject, GraphFormat>> all_pairs = {
    {ComplexObject::faces, GraphFormat::jsonl},          {ComplexObject::divisibility, GraphFormat::edges},
    {ComplexObject::divisibility, GraphFormat::graphml}, {ComplexObject::divisibility, GraphFormat::dot},
    {ComplexObject::divisibility, GraphFormat::mtx},     {ComplexObject::shared_factor, GraphFormat::edges},
    {ComplexObject::shared_factor, GraphFormat::graphml}, {ComplexObject::shared_factor, GraphFormat::dot},
    {ComplexObject::shared_factor, GraphFormat::mtx},
};

TEST(GraphExport, EstimateBoundsTheBytesWritten) {
  // The bound must hold at the digit boundaries (9/10, 99/100, ...) and past the first primorials.
  const std::vector<std::uint64_t> ns = {1, 2, 3, 9, 10, 29, 30, 99, 100, 210, 999, 1000, 2310, 9999, 10000};
  std::size_t checked = 0;
  for (const auto& [object, format] : all_pairs)
    for (const auto n : ns) {
      if (object == ComplexObject::shared_factor && n > 3000) continue;  // H_10^4 alone is 30 MiB of text
      const ComplexCounts c = counts_for(object, n);
      std::ostringstream out;
      const ExportReport r = write_complex(out, object, format, c);
      EXPECT_EQ(r.bytes, out.str().size());
      EXPECT_LE(r.bytes, estimate_export_bytes(object, format, c))
          << complex_object_name(object) << ' ' << graph_format_name(format) << " n = " << n;
      // A bound far above the truth would refuse harmless exports: within 3x plus the header.
      EXPECT_LE(estimate_export_bytes(object, format, c), 3 * r.bytes + 512) << graph_format_name(format) << ' ' << n;
      ++checked;
    }
  // 9 pairs x 15 values of n, less 4 shared-factor formats x 2 values above 3000.
  EXPECT_EQ(checked, all_pairs.size() * ns.size() - 8);
  EXPECT_EQ(checked, 127U);
}

TEST(GraphExport, EdgeListAndMatrixMarketRoundTrip) {
  const std::uint64_t n = 2000;
  std::size_t checked = 0;
  for (const auto object : {ComplexObject::divisibility, ComplexObject::shared_factor}) {
    const ComplexCounts c = counts_for(object, n);
    const auto expected = enumerated(object, n);
    ASSERT_EQ(expected.size(), c.edges);
    {
      std::ostringstream out;
      (void)write_complex(out, object, GraphFormat::edges, c);
      std::istringstream in(out.str());
      std::vector<Pair> read;
      std::string line;
      while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        std::istringstream fields(line);
        Pair e;
        fields >> e.first >> e.second;
        read.push_back(e);
      }
      EXPECT_EQ(read, expected);
    }
    {
      std::ostringstream out;
      (void)write_complex(out, object, GraphFormat::mtx, c);
      std::istringstream in(out.str());
      std::string line;
      std::getline(in, line);
      EXPECT_EQ(line, "%%MatrixMarket matrix coordinate pattern symmetric");
      std::map<std::uint64_t, std::uint64_t> integer_of;  // index -> integer, from the comments
      std::uint64_t rows = 0, cols = 0, entries = 0;
      while (std::getline(in, line)) {
        if (line.rfind("% ", 0) == 0) {
          std::istringstream fields(line.substr(2));
          std::uint64_t i = 0, k = 0;
          if (fields >> i >> k) integer_of[i] = k;
          continue;
        }
        std::istringstream(line) >> rows >> cols >> entries;
        break;
      }
      EXPECT_EQ(rows, c.vertices);
      EXPECT_EQ(cols, c.vertices);
      EXPECT_EQ(entries, c.edges);
      EXPECT_EQ(integer_of.size(), c.vertices);
      std::vector<Pair> read;
      std::uint64_t i = 0, j = 0;
      while (in >> i >> j) {
        ASSERT_GT(i, j) << "symmetric storage keeps the strict lower triangle";
        read.emplace_back(integer_of.at(j), integer_of.at(i));
      }
      EXPECT_EQ(read, expected);
    }
    ++checked;
  }
  EXPECT_EQ(checked, 2U);
}

TEST(GraphExport, WordsAndFits) {
  std::size_t checked = 0;
  for (const auto& [object, format] : all_pairs) {
    EXPECT_EQ(parse_complex_object(complex_object_name(object)), object);
    EXPECT_EQ(parse_graph_format(graph_format_name(format)), format);
    EXPECT_NO_THROW(check_format_fits(object, format));
    ++checked;
  }
  EXPECT_EQ(checked, 9U);
  EXPECT_EQ(default_graph_format(ComplexObject::faces), GraphFormat::jsonl);
  EXPECT_EQ(default_graph_format(ComplexObject::shared_factor), GraphFormat::edges);
  EXPECT_THROW(parse_complex_object("Faces"), sqfc::InvalidArgument);
  EXPECT_THROW(parse_graph_format(""), sqfc::InvalidArgument);
  EXPECT_THROW(check_format_fits(ComplexObject::faces, GraphFormat::mtx), sqfc::InvalidArgument);
  EXPECT_THROW(check_format_fits(ComplexObject::divisibility, GraphFormat::jsonl), sqfc::InvalidArgument);
}

TEST(GraphExport, WrongCountsAreCaught) {
  ComplexCounts c = counts_for(ComplexObject::divisibility, 100);
  c.edges += 1;
  std::ostringstream out;
  EXPECT_THROW((void)write_complex(out, ComplexObject::divisibility, GraphFormat::dot, c), sqfc::InternalError);
  ComplexCounts f = counts_for(ComplexObject::faces, 100);
  f.vertices -= 1;
  std::ostringstream faces;
  EXPECT_THROW((void)write_complex(faces, ComplexObject::faces, GraphFormat::jsonl, f), sqfc::InternalError);
}

TEST(GraphExport, StreamFailureIsAnIoError) {
  std::ostringstream out;
  out.setstate(std::ios::badbit);
  EXPECT_THROW((void)write_complex(out, ComplexObject::faces, GraphFormat::jsonl, counts_for(ComplexObject::faces, 10)),
               sqfc::IoError);
}

}  // namespace
