// SPDX-License-Identifier: MIT
// Tests of linalg/spectrum: LAPACK's eigenvalue signs of 1 + A(H_n) equal the numbers of even-
// and odd-dimensional faces of K_n (design.md identity 5; published 2017) with a positive margin,
// for every n <= 200 and at samples up to 1000 (to 5000 in test_spectrum_slow.cpp); hand-computed
// spectra; the refusals.
#include "sqfc/linalg/spectrum.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

#include "linalg/linalg_test_support.hpp"
#include "linalg/spectrum_test_support.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/linalg/bordered_green.hpp"

namespace {

using sqfc::Natural;
using sqfc::linalg::SquareMatrix;
namespace linalg = sqfc::linalg;
namespace testing_support = sqfc::testing;

TEST(Spectrum, SignCountsAreFaceCountsForEveryNUpTo200) {
  std::uint64_t checked = 0;
  for (Natural n = 1; n <= 200; ++n) {
    testing_support::expect_spectrum_matches_faces(n);
    ++checked;
  }
  EXPECT_EQ(checked, 200U);
}

TEST(Spectrum, SignCountsAreFaceCountsAtSamplesUpTo1000) {
  std::uint64_t checked = 0;
  double smallest_margin = 1;
  for (const Natural n : {210, 300, 420, 500, 750, 1000}) {
    smallest_margin = std::min(smallest_margin, testing_support::expect_spectrum_matches_faces(n).margin());
    ++checked;
  }
  EXPECT_EQ(checked, 6U);
  ::testing::Test::RecordProperty("smallest_margin", std::to_string(smallest_margin));
}

TEST(Spectrum, SignCountsAgreeWithTheBorderedPivotsAtN1000) {
  // Two independent routes to the inertia: floating-point eigenvalues, and the exact pivot signs
  // of the bordering (Sylvester's law of inertia).
  const auto vertices = sqfc::complex::squarefree_vertices(1000);
  linalg::BorderedGreen g(vertices.size(), 1 << 24);
  for (std::size_t i = 0; i < vertices.size(); ++i)
    g.add_vertex(sqfc::complex::shared_factor_neighbours_below(vertices, i));
  const auto signs = linalg::fredholm_spectrum_signs(vertices, vertices.size());
  EXPECT_EQ(signs.positive, g.positive_pivots());
  EXPECT_EQ(signs.negative, g.negative_pivots());
  // H_1000 has 607 vertices (Q(1000) = 608, OEIS A071172); trace(1 + A) = 607 = sum of eigenvalues.
  EXPECT_EQ(signs.dimension, 607U);
  const auto eigenvalues = linalg::symmetric_eigenvalues(linalg::shared_factor_fredholm_matrix(vertices, vertices.size()));
  double trace = 0;
  for (const double lambda : eigenvalues) trace += lambda;
  EXPECT_NEAR(trace, 607.0, 1e-8);
  EXPECT_EQ(eigenvalues.front(), signs.minimum);
  EXPECT_EQ(eigenvalues.back(), signs.maximum);
}

TEST(Spectrum, HandComputedSpectra) {
  int checked = 0;
  {  // diag(2, -3, 5): eigenvalues -3, 2, 5.
    const auto m = testing_support::matrix_from_rows({{2, 0, 0}, {0, -3, 0}, {0, 0, 5}});
    const auto w = linalg::symmetric_eigenvalues(m);
    ASSERT_EQ(w.size(), 3U);
    EXPECT_NEAR(w[0], -3, 1e-14);
    EXPECT_NEAR(w[1], 2, 1e-14);
    EXPECT_NEAR(w[2], 5, 1e-14);
    const auto s = linalg::symmetric_spectrum_signs(m);
    EXPECT_EQ(s.positive, 2U);
    EXPECT_EQ(s.negative, 1U);
    EXPECT_NEAR(s.smallest_magnitude, 2, 1e-14);
    EXPECT_NEAR(s.frobenius_norm, std::sqrt(38.0), 1e-14);  // 4 + 9 + 25
    EXPECT_TRUE(s.verified);
    ++checked;
  }
  {  // 1 + A of H_6 (path 2 - 6 - 3 plus 5): 1 + A(P_3) has eigenvalues 1 - sqrt 2, 1, 1 + sqrt 2; 5 adds 1.
    const auto m = testing_support::matrix_from_bits({"1001", "0101", "0010", "1101"});
    const auto w = linalg::symmetric_eigenvalues(m);
    ASSERT_EQ(w.size(), 4U);
    EXPECT_NEAR(w[0], 1 - std::sqrt(2.0), 1e-14);
    EXPECT_NEAR(w[1], 1, 1e-14);
    EXPECT_NEAR(w[2], 1, 1e-14);
    EXPECT_NEAR(w[3], 1 + std::sqrt(2.0), 1e-14);
    const auto s = linalg::symmetric_spectrum_signs(m);
    EXPECT_EQ(s.positive, 3U);  // faces 2, 3, 5 (dimension 0)
    EXPECT_EQ(s.negative, 1U);  // face 6 (dimension 1)
    ++checked;
  }
  {  // [[1, 1], [1, 1]] is singular (eigenvalues 0, 2): the margin must not verify it.
    const auto s = linalg::symmetric_spectrum_signs(testing_support::matrix_from_rows({{1, 1}, {1, 1}}));
    EXPECT_FALSE(s.verified);
    EXPECT_LE(s.margin(), 0.0);
    ++checked;
  }
  {  // The 4-cycle 6, 15, 35, 14 (see test_fredholm_checks.cpp): 1 + A has eigenvalues 3, 1, 1, -1.
    const std::vector<Natural> cycle{6, 15, 35, 14};
    const auto s = linalg::fredholm_spectrum_signs(cycle, 4);
    EXPECT_EQ(s.positive, 3U);
    EXPECT_EQ(s.negative, 1U);
    EXPECT_NEAR(s.minimum, -1, 1e-14);
    EXPECT_NEAR(s.maximum, 3, 1e-14);
    ++checked;
  }
  {  // The empty matrix.
    const auto s = linalg::symmetric_spectrum_signs(SquareMatrix(0));
    EXPECT_EQ(s.dimension, 0U);
    EXPECT_EQ(s.positive + s.negative, 0U);
    EXPECT_TRUE(s.verified);
    ++checked;
  }
  EXPECT_EQ(checked, 5);
}

TEST(Spectrum, Refusals) {
  // 5002 = 2 * 41 * 61 is squarefree: the vertices of H_5002 end beyond n = 5000.
  const auto vertices = sqfc::complex::squarefree_vertices(5002);
  ASSERT_EQ(vertices.back(), 5002U);
  try {
    static_cast<void>(linalg::fredholm_spectrum_signs(vertices, vertices.size()));
    ADD_FAILURE() << "n = 5002 was accepted";
  } catch (const sqfc::InvalidArgument& e) {
    EXPECT_NE(std::string(e.what()).find("n <= 5000"), std::string::npos) << e.what();
  }
  EXPECT_THROW(static_cast<void>(linalg::fredholm_spectrum_signs(vertices, vertices.size() + 1)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::symmetric_eigenvalues(testing_support::matrix_from_rows({{1, 2}, {3, 1}}))),
               sqfc::InvalidArgument);  // not symmetric
  const std::int64_t big = (std::int64_t{1} << 53) + 1;
  EXPECT_THROW(static_cast<void>(linalg::symmetric_eigenvalues(testing_support::matrix_from_rows({{big}}))),
               sqfc::InvalidArgument);  // not an exact double
  EXPECT_THROW(static_cast<void>(linalg::symmetric_eigenvalues(SquareMatrix(linalg::max_spectrum_dimension + 1))),
               sqfc::InvalidArgument);
  // n = 5000 itself is accepted: test_spectrum_slow.cpp runs it.
}

}  // namespace
