// SPDX-License-Identifier: MIT
// Shared helpers of the linalg tests: the vertex set and Moebius values of H_n from the test
// oracles (depth-first enumeration, no library sieve), adjacency by gcd written out in the
// test, and growing a bordered Green function.
#pragma once

#include <cstddef>
#include <cstdint>
#include <cstring>
#include <numeric>
#include <stdexcept>
#include <vector>

#include "oracles/squarefree_enumeration.hpp"
#include "sqfc/core/types.hpp"
#include "sqfc/linalg/bordered_green.hpp"
#include "sqfc/linalg/fredholm_checks.hpp"

namespace sqfc::testing {

/// Moebius values mu(k), k = 0..n (entry 0 unused), and the vertices of H_n (squarefree k in
/// [2, n], increasing), both from the oracle's depth-first enumeration.
struct SquarefreeOracle {
  std::vector<std::int8_t> mu;
  std::vector<Natural> vertices;
  explicit SquarefreeOracle(std::uint64_t n) : mu(oracles::mobius_table_dfs(n)) {
    for (std::uint64_t k = 2; k <= n; ++k)
      if (mu[k] != 0) vertices.push_back(k);
  }
  /// Number of vertices of H_m for m <= n: the squarefree k in [2, m].
  [[nodiscard]] std::size_t vertex_count(std::uint64_t m) const {
    std::size_t count = 0;
    while (count < vertices.size() && vertices[count] <= m) ++count;
    return count;
  }
  /// M(m) = sum of mu(k) for k <= m.
  [[nodiscard]] std::int64_t mertens(std::uint64_t m) const {
    std::int64_t total = 0;
    for (std::uint64_t k = 1; k <= m; ++k) total += mu[k];
    return total;
  }
  /// prod over the vertices of H_m of -mu(k) (design.md identity 3).
  [[nodiscard]] int product_of_minus_mu(std::uint64_t m) const {
    int product = 1;
    for (std::size_t i = 0; i < vertex_count(m); ++i) product *= -mu[vertices[i]];
    return product;
  }
};

/// 1 + A(H) on the first `count` vertices, by gcd, written here independently of the library.
inline linalg::SquareMatrix fredholm_matrix_by_gcd(const std::vector<Natural>& vertices, std::size_t count) {
  linalg::SquareMatrix m(count);
  for (std::size_t i = 0; i < count; ++i)
    for (std::size_t j = 0; j < count; ++j) m.at(i, j) = (i == j || std::gcd(vertices[i], vertices[j]) > 1) ? 1 : 0;
  return m;
}

/// Neighbours of vertex i among vertices [0, i) of the matrix m (nonzero off-diagonal entries).
inline std::vector<std::uint32_t> neighbours_below(const linalg::SquareMatrix& m, std::size_t i) {
  std::vector<std::uint32_t> result;
  for (std::size_t j = 0; j < i; ++j)
    if (m.at(i, j) != 0) result.push_back(static_cast<std::uint32_t>(j));
  return result;
}

/// Adds the vertices [g.size(), count) of the graph of m to g; returns the Schur complements.
inline std::vector<int> grow_green(linalg::BorderedGreen& g, const linalg::SquareMatrix& m, std::size_t count) {
  std::vector<int> s;
  for (std::size_t i = g.size(); i < count; ++i) s.push_back(g.add_vertex(neighbours_below(m, i)));
  return s;
}

/// g as a dense matrix.
inline linalg::SquareMatrix green_matrix(const linalg::BorderedGreen& g) {
  linalg::SquareMatrix result(g.size());
  for (std::size_t i = 0; i < g.size(); ++i)
    for (std::size_t j = 0; j < g.size(); ++j) result.at(i, j) = g.entry(i, j);
  return result;
}

/// m * g computed plainly in the test (64-bit; the matrices here have tiny entries).
inline linalg::SquareMatrix multiply(const linalg::SquareMatrix& a, const linalg::SquareMatrix& b) {
  linalg::SquareMatrix c(a.dimension);
  for (std::size_t i = 0; i < a.dimension; ++i)
    for (std::size_t k = 0; k < a.dimension; ++k) {
      const std::int64_t x = a.at(i, k);
      if (x == 0) continue;
      for (std::size_t j = 0; j < a.dimension; ++j) c.at(i, j) += x * b.at(k, j);
    }
  return c;
}

inline linalg::SquareMatrix identity(std::size_t d) {
  linalg::SquareMatrix m(d);
  for (std::size_t i = 0; i < d; ++i) m.at(i, i) = 1;
  return m;
}

/// A matrix from rows written as strings of digits '0'/'1' (the hand-written 1 + A matrices).
inline linalg::SquareMatrix matrix_from_bits(const std::vector<const char*>& rows) {
  linalg::SquareMatrix m(rows.size());
  for (std::size_t i = 0; i < rows.size(); ++i) {
    if (std::strlen(rows[i]) != rows.size()) throw std::invalid_argument("matrix_from_bits: ragged row");
    for (std::size_t j = 0; j < rows.size(); ++j) m.at(i, j) = rows[i][j] == '1' ? 1 : 0;
  }
  return m;
}

/// A matrix from its rows.
inline linalg::SquareMatrix matrix_from_rows(const std::vector<std::vector<std::int64_t>>& rows) {
  linalg::SquareMatrix m(rows.size());
  for (std::size_t i = 0; i < rows.size(); ++i) {
    if (rows[i].size() != rows.size()) throw std::invalid_argument("matrix_from_rows: ragged row");
    for (std::size_t j = 0; j < rows.size(); ++j) m.at(i, j) = rows[i][j];
  }
  return m;
}

}  // namespace sqfc::testing
