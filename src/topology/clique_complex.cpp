// SPDX-License-Identifier: MIT
// Clique complexes of small graphs over Z/2.
#include "sqfc/topology/clique_complex.hpp"

#include <algorithm>
#include <map>
#include <string>

#include "sqfc/complex/graph_enumeration.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::topology {
namespace {

constexpr std::size_t max_cliques = 20000;

// Rank over Z/2 of rows given as bit vectors.
std::size_t rank_mod2(std::vector<std::vector<std::uint64_t>> rows, std::size_t columns) {
  std::size_t rank = 0;
  for (std::size_t c = 0; c < columns && rank < rows.size(); ++c) {
    const std::size_t word = c / 64;
    const std::uint64_t bit = std::uint64_t{1} << (c % 64);
    std::size_t pivot = rank;
    while (pivot < rows.size() && !(rows[pivot][word] & bit)) ++pivot;
    if (pivot == rows.size()) continue;
    std::swap(rows[rank], rows[pivot]);
    for (std::size_t r = 0; r < rows.size(); ++r)
      if (r != rank && (rows[r][word] & bit))
        for (std::size_t w = 0; w < rows[r].size(); ++w) rows[r][w] ^= rows[rank][w];
    ++rank;
  }
  return rank;
}

}  // namespace

std::vector<Count> clique_complex_betti(std::size_t vertex_count, const std::vector<std::pair<std::uint32_t, std::uint32_t>>& edges) {
  std::vector<std::vector<bool>> adjacent(vertex_count, std::vector<bool>(vertex_count, false));
  for (const auto& [a, b] : edges) {
    if (a >= vertex_count || b >= vertex_count || a == b) throw InvalidArgument("clique complex: bad edge");
    adjacent[a][b] = adjacent[b][a] = true;
  }
  // Cliques by dimension, each a sorted vertex list; extend with higher common neighbours.
  std::vector<std::vector<std::vector<std::uint32_t>>> cliques(1);
  for (std::uint32_t v = 0; v < vertex_count; ++v) cliques[0].push_back({v});
  std::size_t total = vertex_count;
  for (std::size_t d = 0; !cliques[d].empty(); ++d) {
    std::vector<std::vector<std::uint32_t>> next;
    for (const auto& c : cliques[d])
      for (std::uint32_t v = c.back() + 1; v < vertex_count; ++v) {
        if (!std::all_of(c.begin(), c.end(), [&](std::uint32_t u) { return adjacent[u][v]; })) continue;
        auto bigger = c;
        bigger.push_back(v);
        next.push_back(std::move(bigger));
        if (++total > max_cliques) throw InvalidArgument("clique complex: more than 20000 cliques; meant for small graphs");
      }
    cliques.push_back(std::move(next));
  }
  cliques.pop_back();  // the empty last level
  // rank of the boundary from dimension d to d - 1.
  std::vector<std::size_t> rank(cliques.size() + 1, 0);
  for (std::size_t d = 1; d < cliques.size(); ++d) {
    std::map<std::vector<std::uint32_t>, std::size_t> index;
    for (std::size_t i = 0; i < cliques[d - 1].size(); ++i) index[cliques[d - 1][i]] = i;
    const std::size_t columns = cliques[d - 1].size();
    std::vector<std::vector<std::uint64_t>> rows;
    for (const auto& c : cliques[d]) {
      std::vector<std::uint64_t> row((columns + 63) / 64, 0);
      for (std::size_t drop = 0; drop < c.size(); ++drop) {
        std::vector<std::uint32_t> face;
        for (std::size_t i = 0; i < c.size(); ++i)
          if (i != drop) face.push_back(c[i]);
        const auto col = index.at(face);
        row[col / 64] |= std::uint64_t{1} << (col % 64);
      }
      rows.push_back(std::move(row));
    }
    rank[d] = rank_mod2(std::move(rows), columns);
  }
  std::vector<Count> betti(cliques.size(), 0);
  for (std::size_t d = 0; d < cliques.size(); ++d) betti[d] = cliques[d].size() - rank[d] - rank[d + 1];
  return betti;
}

std::vector<Count> divisibility_clique_complex_betti(Natural n) {
  if (n > 200) throw InvalidArgument("the clique complex of G_n is built for n <= 200 only");
  const auto vertices = complex::squarefree_vertices(n);
  std::map<Natural, std::uint32_t> index;
  for (std::size_t i = 0; i < vertices.size(); ++i) index[vertices[i]] = static_cast<std::uint32_t>(i);
  std::vector<std::pair<std::uint32_t, std::uint32_t>> edges;
  if (n >= 2)
    complex::for_each_divisibility_edge(n, [&](std::span<const complex::GraphEdge> batch) {
      for (const auto& e : batch) edges.emplace_back(index.at(e.a), index.at(e.b));
    });
  return clique_complex_betti(vertices.size(), edges);
}

}  // namespace sqfc::topology
