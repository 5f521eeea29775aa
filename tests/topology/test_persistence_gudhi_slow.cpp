// SPDX-License-Identifier: MIT
// compute_persistence against GUDHI 3.7 Simplex_tree + Persistent_cohomology (Debian
// libgudhi-dev) at n = 10^4 (label slow); the filtration builder is in gudhi_filtration.hpp.
#include <gtest/gtest.h>

#include <map>

#include "topology/gudhi_filtration.hpp"

namespace {

using sqfc::Natural;
using sqfc::gudhi_test::expect_same_bars;
using sqfc::topology::Bar;
using sqfc::topology::FaceFamily;

// Source: GUDHI 3.7 Simplex_tree + Persistent_cohomology, Field_Zp with init_coefficients(2) and (3).
TEST(PersistenceGudhiSlow, FullComplexAt10000) {
  std::size_t cases = 0;
  for (const unsigned p : {2u, 3u}) {
    // Q(10^4) = 6083 squarefree numbers (OEIS A071172), 1 not being a face.
    EXPECT_EQ(expect_same_bars(10000, {}, p), 6082u);
    ++cases;
  }
  EXPECT_EQ(cases, 2u);
}

// Source: GUDHI 3.7 Simplex_tree + Persistent_cohomology over Z/2 and Z/3.
TEST(PersistenceGudhiSlow, FamiliesAt10000) {
  std::vector<FaceFamily> families(3);
  families[0].smooth_bound = 13;
  families[0].coprime_to = 3;
  families[1].coprime_to = 6;
  families[2].max_dimension = 2;
  std::size_t cases = 0;
  for (const auto& family : families)
    for (const unsigned p : {2u, 3u}) {
      EXPECT_GT(expect_same_bars(10000, family, p), 0u);
      ++cases;
    }
  EXPECT_EQ(cases, 6u);
}

}  // namespace
