// SPDX-License-Identifier: MIT
// Vertices and adjacency of the shared-factor graph.
#include "sqfc/complex/squarefree_vertices.hpp"

#include <numeric>
#include <string>

#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::complex {

std::vector<Natural> squarefree_vertices(Natural n) {
  if (n > 1'000'000'000ULL) throw InvalidArgument("explicit vertex lists are limited to n <= 10^9, got " + std::to_string(n));
  std::vector<Natural> vertices;
  if (n < 2) return vertices;
  arith::sieve_range(2, n + 1, [&](const arith::SieveBlock& block) {
    for (std::size_t i = 0; i < block.size(); ++i)
      if (block.is_squarefree(i)) vertices.push_back(block.lo() + i);
  });
  return vertices;
}

std::vector<std::uint32_t> shared_factor_neighbours_below(const std::vector<Natural>& vertices, std::size_t i) {
  std::vector<std::uint32_t> neighbours;
  const Natural k = vertices[i];
  for (std::size_t j = 0; j < i; ++j)
    if (std::gcd(vertices[j], k) > 1) neighbours.push_back(static_cast<std::uint32_t>(j));
  return neighbours;
}

Count count_shared_factor_edges(const std::vector<Natural>& vertices, std::size_t count) {
  Count edges = 0;
  for (std::size_t i = 0; i < count; ++i)
    for (std::size_t j = 0; j < i; ++j) edges += std::gcd(vertices[j], vertices[i]) > 1;
  return edges;
}

}  // namespace sqfc::complex
