// SPDX-License-Identifier: MIT
/// @file squarefree_vertices.hpp  The vertex set of G_n and H_n: the squarefree k in [2, n].
#pragma once

#include <cstdint>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::complex {

/// The squarefree integers in [2, n] in increasing order (vertex index = position).
/// Pre: n <= 10^9 (checked; InvalidArgument). Complexity: O(n log log n) time, 8 bytes per vertex.
std::vector<Natural> squarefree_vertices(Natural n);

/// Indices j < i with gcd(vertices[j], vertices[i]) > 1: the neighbours of vertex i among the
/// earlier vertices of the shared-factor graph H_n, in increasing order.
/// Pre: i < vertices.size() (assumed). Complexity: O(i log max) (one gcd per earlier vertex).
std::vector<std::uint32_t> shared_factor_neighbours_below(const std::vector<Natural>& vertices, std::size_t i);

/// Edges of H_n between vertices [0, count): pairs with a common prime factor.
/// Complexity: O(count^2 log max); meant for explicit graphs.
Count count_shared_factor_edges(const std::vector<Natural>& vertices, std::size_t count);

}  // namespace sqfc::complex
