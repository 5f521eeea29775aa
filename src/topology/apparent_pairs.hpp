// SPDX-License-Identifier: MIT
// Internal to the topology layer: the apparent-pairs reduction behind compute_persistence.
#pragma once

#include <numeric>
#include <optional>

#include "sqfc/topology/persistence.hpp"

namespace sqfc::topology::detail {

/// True when the squarefree k >= 2, with `omega` primes of which `largest_prime` is the largest,
/// is a face of the family. Complexity: one gcd at most.
inline bool family_accepts(const FaceFamily& family, Natural k, Natural largest_prime, int omega) {
  if (family.max_dimension && omega - 1 > *family.max_dimension) return false;
  if (family.smooth_bound && largest_prime > *family.smooth_bound) return false;
  if (family.coprime_to && std::gcd(k, *family.coprime_to) != 1) return false;
  return true;
}

/// Persistence of the family's filtration on [2, n] over Z/field by apparent pairs (see
/// persistence.hpp, ReductionOrder::apparent_pairs), or nullopt when some column meets a pivot
/// that no apparent column owns (the caller then runs the general reduction).
/// Pre: arguments validated by compute_persistence.
std::optional<PersistenceResult> persistence_by_apparent_pairs(Natural n, const FaceFamily& family, unsigned field,
                                                               unsigned threads);

}  // namespace sqfc::topology::detail
