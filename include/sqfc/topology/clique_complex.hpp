// SPDX-License-Identifier: MIT
/// @file clique_complex.hpp  Betti numbers of the clique complex of a small graph, and of G_n's.
#pragma once

#include <cstdint>
#include <utility>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::topology {

/// Unreduced Betti numbers over Z/2 of the clique complex of the graph on vertices
/// [0, vertex_count) with the given edges: every clique is a simplex. Cliques are enumerated by
/// extending each clique with common neighbours of higher index; ranks by dense elimination.
/// Pre: edges are pairs of distinct vertices < vertex_count (checked; InvalidArgument); the
/// clique count stays below 20000 (checked; InvalidArgument: meant for small graphs).
/// Complexity: O(C^2 * F / 64) for C cliques of the largest dimensions involved.
std::vector<Count> clique_complex_betti(std::size_t vertex_count, const std::vector<std::pair<std::uint32_t, std::uint32_t>>& edges);

/// The clique complex of the divisibility graph G_n (the barycentric refinement of K_n, hence
/// with the same Betti numbers), built from complex::for_each_divisibility_edge.
/// Pre: n <= 200 (checked; InvalidArgument). Complexity: as clique_complex_betti.
std::vector<Count> divisibility_clique_complex_betti(Natural n);

}  // namespace sqfc::topology
