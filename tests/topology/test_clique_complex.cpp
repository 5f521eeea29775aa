// SPDX-License-Identifier: MIT
// Clique complexes: textbook graphs, and the clique complex of G_n against K_n's Betti numbers.
#include "sqfc/topology/clique_complex.hpp"

#include <gtest/gtest.h>

#include "oracles/brute_force.hpp"
#include "sqfc/core/error.hpp"

namespace {

using Edges = std::vector<std::pair<std::uint32_t, std::uint32_t>>;

TEST(CliqueComplex, TextbookGraphs) {
  // A 4-cycle is a circle: b0 = 1, b1 = 1; a triangle is a filled disk: b0 = 1 (common practice).
  EXPECT_EQ(sqfc::topology::clique_complex_betti(4, Edges{{0, 1}, {1, 2}, {2, 3}, {3, 0}}), (std::vector<sqfc::Count>{1, 1}));
  EXPECT_EQ(sqfc::topology::clique_complex_betti(3, Edges{{0, 1}, {1, 2}, {0, 2}}), (std::vector<sqfc::Count>{1, 0, 0}));
  // The octahedron graph (K_{2,2,2}) is a 2-sphere: b = (1, 0, 1).
  Edges octahedron;
  for (std::uint32_t a = 0; a < 6; ++a)
    for (std::uint32_t b = a + 1; b < 6; ++b)
      if (b != a + 3) octahedron.emplace_back(a, b);
  EXPECT_EQ(sqfc::topology::clique_complex_betti(6, octahedron), (std::vector<sqfc::Count>{1, 0, 1}));
  EXPECT_EQ(sqfc::topology::clique_complex_betti(2, Edges{}), (std::vector<sqfc::Count>{2}));
  EXPECT_THROW(sqfc::topology::clique_complex_betti(2, Edges{{0, 0}}), sqfc::InvalidArgument);
  EXPECT_THROW(sqfc::topology::clique_complex_betti(2, Edges{{0, 5}}), sqfc::InvalidArgument);
}

TEST(CliqueComplex, DivisibilityGraphHasTheHomologyOfKn) {
  // G_n is the 1-skeleton of the barycentric refinement of K_n (design.md section 1), so its
  // clique complex has K_n's Betti numbers; those come from direct Z/2 homology of K_n.
  int checked = 0;
  for (sqfc::Natural n = 2; n <= 120; ++n) {
    const auto clique = sqfc::topology::divisibility_clique_complex_betti(n);
    const auto direct = sqfc::oracles::betti_mod2_naive(n);
    const std::size_t top = std::max(clique.size(), direct.size());
    for (std::size_t d = 0; d < top; ++d) {
      const sqfc::Count a = d < clique.size() ? clique[d] : 0;
      const auto b = d < direct.size() ? static_cast<sqfc::Count>(direct[d]) : sqfc::Count{0};
      ASSERT_EQ(a, b) << "n = " << n << ", d = " << d;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 119);
  EXPECT_THROW(sqfc::topology::divisibility_clique_complex_betti(201), sqfc::InvalidArgument);
}

}  // namespace
