// SPDX-License-Identifier: MIT
// compute_persistence against GUDHI 3.7 Simplex_tree + Persistent_cohomology (Debian
// libgudhi-dev) on the same filtration: every squarefree k in [2, n] as the simplex of its
// primes, entering at time k. Small n here; n = 10^4 in test_persistence_gudhi_slow.cpp.
#include <gtest/gtest.h>

#include <map>

#include "topology/gudhi_filtration.hpp"

namespace {

using sqfc::Natural;
using sqfc::gudhi_test::expect_same_bars;
using sqfc::gudhi_test::gudhi_persistence;
using sqfc::topology::Bar;
using sqfc::topology::FaceFamily;

// Source: GUDHI 3.7 Simplex_tree + Persistent_cohomology, Field_Zp with init_coefficients(2).
TEST(PersistenceGudhi, FullComplexOverZ2) {
  std::size_t cases = 0;
  std::map<Natural, std::size_t> faces;
  for (const Natural n : {10ULL, 30ULL, 105ULL, 210ULL, 1000ULL, 3000ULL}) {
    faces[n] = expect_same_bars(n, {}, 2);
    ++cases;
  }
  EXPECT_EQ(cases, 6u);
  // Q(10) = 7 and Q(1000) = 608 squarefree numbers (OEIS A071172), 1 not being a face.
  EXPECT_EQ(faces[10], 6u);
  EXPECT_EQ(faces[1000], 607u);
}

// Source: GUDHI 3.7 Simplex_tree + Persistent_cohomology, Field_Zp with init_coefficients(3).
TEST(PersistenceGudhi, FullComplexOverZ3) {
  std::size_t cases = 0;
  for (const Natural n : {210ULL, 1000ULL}) {
    EXPECT_GT(expect_same_bars(n, {}, 3), 0u);
    ++cases;
  }
  EXPECT_EQ(cases, 2u);
}

// Source: GUDHI 3.7 Simplex_tree + Persistent_cohomology over Z/2 and Z/3. Families where the
// [m, 2m) pairing of the full complex does not hold, so agreement is not a formula in disguise.
TEST(PersistenceGudhi, FamiliesAt1000) {
  std::vector<FaceFamily> families(4);
  families[0].smooth_bound = 13;
  families[0].coprime_to = 3;
  families[1].smooth_bound = 29;
  families[2].coprime_to = 2;
  families[3].max_dimension = 1;
  families[3].coprime_to = 5;
  std::size_t cases = 0;
  for (const auto& family : families)
    for (const unsigned p : {2u, 3u}) {
      EXPECT_GT(expect_same_bars(1000, family, p), 0u);
      ++cases;
    }
  EXPECT_EQ(cases, 8u);
}

// Hand-derived at n = 10 (faces 2, 3, 5, 6 = {2,3}, 7, 10 = {2,5}): the two edges join 3 and 5 to 2.
TEST(PersistenceGudhi, SmallestCaseByHand) {
  const std::vector<Bar> expected{{0, 2, 0}, {0, 3, 6}, {0, 5, 10}, {0, 7, 0}};
  EXPECT_EQ(gudhi_persistence(10, {}, 2).bars, expected);
  EXPECT_EQ(sqfc::topology::compute_persistence(10, {}, 2).bars, expected);
}

}  // namespace
