// SPDX-License-Identifier: MIT
// The eigenvalue-sign check of design.md identity 5 at one n, shared by the default and the slow
// spectrum tests: LAPACK's sign counts of 1 + A(H_n) against the even- and odd-dimensional face
// counts of K_n from the oracle's depth-first census (eigenvalue signs, published 2017).
#pragma once

#include <gtest/gtest.h>

#include <cstdint>

#include "oracles/squarefree_enumeration.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/linalg/spectrum.hpp"

namespace sqfc::testing {

/// Face counts of K_n by parity of dimension.
struct FaceParity {
  std::uint64_t even = 0, odd = 0;
};

inline FaceParity face_parity(std::uint64_t n) {
  FaceParity parity;
  const auto census = oracles::squarefree_census_dfs(n);
  for (std::size_t d = 0; d < census.faces.size(); ++d) (d % 2 == 0 ? parity.even : parity.odd) += census.faces[d];
  return parity;
}

/// Checks identity 5 at n; returns the computed signs for further checks.
inline linalg::SpectrumSigns expect_spectrum_matches_faces(std::uint64_t n) {
  const auto vertices = complex::squarefree_vertices(n);
  const auto signs = linalg::fredholm_spectrum_signs(vertices, vertices.size());
  const auto faces = face_parity(n);
  EXPECT_TRUE(signs.verified) << "n = " << n << ": smallest |eigenvalue| " << signs.smallest_magnitude
                              << " does not exceed the error bound " << signs.error_bound;
  EXPECT_EQ(signs.dimension, vertices.size()) << "n = " << n;
  EXPECT_EQ(signs.positive, faces.even) << "n = " << n;
  EXPECT_EQ(signs.negative, faces.odd) << "n = " << n;
  EXPECT_GT(signs.margin(), 0.0) << "n = " << n;
  return signs;
}

}  // namespace sqfc::testing
