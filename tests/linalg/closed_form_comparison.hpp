// SPDX-License-Identifier: MIT
// The entry-by-entry comparison of the closed-form Green function (design.md identity 6) with the
// bordered inverse, for every n up to a limit; shared by the default and the slow test files.
// Expected values: neither side is trusted alone; the bordered inverse (exact integer bordering)
// and the closed form of design.md identity 6 are two independent routes to g_n (the oracle is
// the bordered inverse, itself checked against FLINT in test_fredholm_checks*.cpp).
#pragma once

#include <cstdint>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/linalg/bordered_green.hpp"
#include "sqfc/linalg/green_closed_form.hpp"

namespace sqfc::testing {

/// Outcome of comparing g_n from both routes for every squarefree n in [2, limit].
struct ClosedFormComparison {
  std::uint64_t graphs = 0;    ///< values of n compared (the squarefree n in [2, limit])
  std::uint64_t entries = 0;   ///< entries compared, summed over n (V(n)^2 each)
  std::optional<std::string> first_mismatch;  ///< "n = .., x = .., y = ..: bordered .. closed .."
};

/// Grows one BorderedGreen vertex by vertex; after each vertex n compares all V^2 entries with
/// GreenClosedForm(limit).entry_at(n, x, y) and stops at the first mismatch.
inline ClosedFormComparison compare_closed_form_with_bordered(std::uint64_t limit) {
  ClosedFormComparison result;
  const auto vertices = complex::squarefree_vertices(limit);
  const linalg::GreenClosedForm closed(limit);
  linalg::BorderedGreen g(vertices.size(), std::uint64_t{1} << 30, 2);
  for (std::size_t k = 0; k < vertices.size(); ++k) {
    g.add_vertex(complex::shared_factor_neighbours_below(vertices, k));
    const Natural n = vertices[k];
    for (std::size_t i = 0; i <= k; ++i)
      for (std::size_t j = 0; j <= k; ++j) {
        const std::int64_t bordered = g.entry(i, j), formula = closed.entry_at(n, vertices[i], vertices[j]);
        if (bordered != formula) {
          std::ostringstream text;
          text << "n = " << n << ", x = " << vertices[i] << ", y = " << vertices[j] << ": bordered " << bordered
               << ", closed form " << formula;
          result.first_mismatch = text.str();
          return result;
        }
      }
    result.entries += (k + 1) * (k + 1);
    ++result.graphs;
  }
  return result;
}

}  // namespace sqfc::testing
