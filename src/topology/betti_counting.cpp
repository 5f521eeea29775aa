// SPDX-License-Identifier: MIT
// Betti counting is header-only (constexpr); this unit keeps the layer a real library and
// checks at compile time the landmarks of design.md identity 2.
#include "sqfc/topology/betti_counting.hpp"

namespace sqfc::topology {
namespace {
// K_1 is empty: all Betti numbers vanish (m = 1 is the only odd squarefree in (1/2, 1]).
constexpr bool empty_complex_has_no_homology() {
  OddIntervalCounts counts{};
  advance_interval_counts(counts, 1, 0, true);
  return betti_from_interval_counts(counts, 0) == 0;
}
static_assert(empty_complex_has_no_homology());
}  // namespace
}  // namespace sqfc::topology
