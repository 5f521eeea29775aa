// SPDX-License-Identifier: MIT
// Slow tests of linalg/green_closed_form: the closed form (design.md identity 6) against the
// bordered inverse entry by entry for every n <= 2000 (issue 4), and the statistics at every n <= 2000.
// Expected values: the bordered inverse, an independent exact route to g_n; the counts 1214 and
// 1214 is the number of squarefree k in [2, 2000] (Q(2000) - 1, the same count other tests take
// from trial division); the entry total is the sum of V^2 over V = 1..1214 (common practice).
#include "sqfc/linalg/green_closed_form.hpp"

#include <gtest/gtest.h>

#include <cstdint>

#include "linalg/closed_form_comparison.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/linalg/bordered_green.hpp"

namespace {

TEST(GreenClosedFormSlow, EqualsTheBorderedInverseEntryByEntryForEveryNUpTo2000) {
  const auto result = sqfc::testing::compare_closed_form_with_bordered(2000);
  EXPECT_FALSE(result.first_mismatch.has_value()) << *result.first_mismatch;
  // Q(2000) = 1215 (PARI/GP 2.15), so 1214 graphs; entries = sum of V^2 for V = 1..1214.
  EXPECT_EQ(result.graphs, 1214U);
  EXPECT_EQ(result.entries, 1214ULL * 1215 * 2429 / 6);
}

TEST(GreenClosedFormSlow, StatisticsMatchTheBorderedStatisticsAtEveryNUpTo2000) {
  const sqfc::Natural limit = 2000;
  const auto vertices = sqfc::complex::squarefree_vertices(limit);
  const sqfc::linalg::GreenClosedForm closed(limit);
  sqfc::linalg::BorderedGreen g(vertices.size(), 1ULL << 30, 2);
  std::size_t next = 0;
  std::uint64_t checked = 0;
  for (sqfc::Natural n = 1; n <= limit; ++n) {
    if (next < vertices.size() && vertices[next] == n) {
      g.add_vertex(sqfc::complex::shared_factor_neighbours_below(vertices, next));
      ++next;
    }
    ASSERT_EQ(closed.statistics_at(n), g.statistics(n)) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
  EXPECT_EQ(next, vertices.size());
}

}  // namespace
