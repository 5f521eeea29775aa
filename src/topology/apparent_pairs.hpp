// SPDX-License-Identifier: MIT
// Internal to the topology layer: the apparent-pairs reduction behind compute_persistence.
#pragma once

#include <optional>

#include "sqfc/topology/persistence.hpp"

namespace sqfc::topology::detail {

/// Persistence of the family's filtration on [2, n] over Z/field by apparent pairs (see
/// persistence.hpp, ReductionOrder::apparent_pairs), or nullopt when some column meets a pivot
/// that no apparent column owns (the caller then runs the general reduction).
/// Pre: arguments validated by compute_persistence.
std::optional<PersistenceResult> persistence_by_apparent_pairs(Natural n, const FaceFamily& family, unsigned field,
                                                               unsigned threads);

}  // namespace sqfc::topology::detail
