// SPDX-License-Identifier: MIT
// The filtration of K_n (every squarefree k in [2, n] as the simplex of its primes, entering at
// time k) built in GUDHI 3.7 Simplex_tree + Persistent_cohomology (Debian libgudhi-dev, a
// reference library), and the comparison with compute_persistence; shared by the GUDHI tests.
#pragma once

#include "sqfc/topology/persistence.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <map>
#include <numeric>
#include <vector>

#include <gudhi/Persistent_cohomology.h>
#include <gudhi/Simplex_tree.h>

namespace sqfc::gudhi_test {

using sqfc::Natural;
using sqfc::topology::Bar;
using sqfc::topology::FaceFamily;

using SimplexTree = Gudhi::Simplex_tree<>;  // double filtration values: exact for integers < 2^53
using Field = Gudhi::persistent_cohomology::Field_Zp;
using Cohomology = Gudhi::persistent_cohomology::Persistent_cohomology<SimplexTree, Field>;

struct GudhiRun {
  std::vector<Bar> bars;           // sorted like PersistenceResult::bars
  std::size_t simplices = 0;       // simplices in the Simplex_tree
  std::size_t filtration_ok = 0;   // simplices whose filtration value is the product of their vertices
};

inline Natural exact_natural(double value) {
  // Filtration values are integers below 2^53, so the double holds them exactly.
  EXPECT_TRUE(value >= 0.0 && value < 9007199254740992.0 && std::floor(value) == value) << value;
  return static_cast<Natural>(value);
}

// The family's filtration in a Simplex_tree, factored by trial division here (nothing shared with
// sqfc), then GUDHI's persistence over Z/p with the top dimension included.
inline GudhiRun gudhi_persistence(Natural n, const FaceFamily& family, int p) {
  SimplexTree tree;
  std::vector<int> primes;
  for (Natural k = 2; k <= n; ++k) {
    primes.clear();
    Natural m = k;
    bool squarefree = true;
    for (Natural q = 2; q * q <= m && squarefree; ++q) {
      if (m % q != 0) continue;
      m /= q;
      if (m % q == 0) squarefree = false;
      primes.push_back(static_cast<int>(q));
    }
    if (!squarefree) continue;
    if (m > 1) primes.push_back(static_cast<int>(m));
    if (family.smooth_bound && static_cast<Natural>(primes.back()) > *family.smooth_bound) continue;
    if (family.coprime_to && std::gcd(k, *family.coprime_to) != 1) continue;
    if (family.max_dimension && static_cast<int>(primes.size()) - 1 > *family.max_dimension) continue;
    // Every proper face of k is a divisor < k of the family, already inserted with its own value,
    // so this adds exactly the one new simplex with value k.
    const auto inserted = tree.insert_simplex_and_subfaces(primes, static_cast<double>(k));
    EXPECT_TRUE(inserted.second) << "k = " << k << " was already present";
  }
  GudhiRun run;
  run.simplices = tree.num_simplices();
  for (const auto& sh : tree.complex_simplex_range()) {
    Natural product = 1;
    for (const auto& v : tree.simplex_vertex_range(sh)) product *= static_cast<Natural>(v);
    if (exact_natural(tree.filtration(sh)) == product) ++run.filtration_ok;
  }
  Cohomology cohomology(tree, /*persistence_dim_max=*/true);
  cohomology.init_coefficients(p);
  cohomology.compute_persistent_cohomology(0.0);
  for (const auto& pair : cohomology.get_persistent_pairs()) {
    const auto birth = std::get<0>(pair);
    const auto death = std::get<1>(pair);
    run.bars.push_back({tree.dimension(birth), exact_natural(tree.filtration(birth)),
                        death == tree.null_simplex() ? 0 : exact_natural(tree.filtration(death))});
  }
  std::sort(run.bars.begin(), run.bars.end());
  return run;
}

// Compares one (n, family, field) case; returns the number of faces (simplices) whose bars were compared.
inline std::size_t expect_same_bars(Natural n, const FaceFamily& family, unsigned p) {
  const auto ours = sqfc::topology::compute_persistence(n, family, p);
  const auto theirs = gudhi_persistence(n, family, static_cast<int>(p));
  const auto faces = std::accumulate(ours.faces_by_dimension.begin(), ours.faces_by_dimension.end(), std::size_t{0});
  EXPECT_EQ(theirs.simplices, faces) << "n = " << n << ", Z/" << p;
  EXPECT_EQ(theirs.filtration_ok, theirs.simplices) << "n = " << n;
  EXPECT_EQ(ours.bars.size(), theirs.bars.size()) << "n = " << n << ", Z/" << p;
  EXPECT_EQ(ours.bars, theirs.bars) << "n = " << n << ", Z/" << p;
  if (ours.bars != theirs.bars) {
    std::size_t i = 0;
    while (i < ours.bars.size() && i < theirs.bars.size() && ours.bars[i] == theirs.bars[i]) ++i;
    if (i < ours.bars.size()) {
      const auto& b = ours.bars[i];
      ADD_FAILURE() << "first difference at bar " << i << ": sqfc (" << b.dimension << ", " << b.birth << ", "
                    << b.death << ")";
    }
  }
  EXPECT_EQ(2 * std::count_if(ours.bars.begin(), ours.bars.end(), [](const Bar& b) { return b.death != 0; }) +
                std::count_if(ours.bars.begin(), ours.bars.end(), [](const Bar& b) { return b.death == 0; }),
            static_cast<std::ptrdiff_t>(faces))
      << "every face is a bar end or an essential class";
  return faces;
}

}  // namespace sqfc::gudhi_test
