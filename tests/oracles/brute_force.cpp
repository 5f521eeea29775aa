// SPDX-License-Identifier: MIT
// Brute-force oracles: trial division, enumeration, dense Z/2 homology.
#include "oracles/brute_force.hpp"

#include <algorithm>
#include <map>

namespace sqfc::oracles {

NaiveArithmetic arithmetic_naive(std::uint64_t n) {
  NaiveArithmetic a{1, 0, 0};
  bool squarefree = true;
  for (std::uint64_t p = 2; p * p <= n; ++p) {
    if (n % p) continue;
    int e = 0;
    while (n % p == 0) n /= p, ++e;
    ++a.omega;
    a.big_omega += e;
    if (e > 1) squarefree = false;
  }
  if (n > 1) ++a.omega, ++a.big_omega;
  a.mu = squarefree ? (a.omega % 2 ? -1 : 1) : 0;
  return a;
}

NaivePrefix prefix_naive(std::uint64_t n_max) {
  NaivePrefix p;
  const auto size = n_max + 1;
  p.mu.assign(size, 0);
  p.omega.assign(size, 0);
  p.big_omega.assign(size, 0);
  p.mertens.assign(size, 0);
  p.liouville.assign(size, 0);
  p.squarefree.assign(size, 0);
  for (std::uint64_t n = 1; n <= n_max; ++n) {
    const auto a = arithmetic_naive(n);
    p.mu[n] = a.mu;
    p.omega[n] = a.omega;
    p.big_omega[n] = a.big_omega;
    p.mertens[n] = p.mertens[n - 1] + a.mu;
    p.liouville[n] = p.liouville[n - 1] + (a.big_omega % 2 ? -1 : 1);
    p.squarefree[n] = p.squarefree[n - 1] + (a.mu != 0);
  }
  return p;
}

std::vector<std::uint64_t> f_vector_naive(std::uint64_t n) {
  std::vector<std::uint64_t> f;
  for (std::uint64_t k = 2; k <= n; ++k) {
    const auto a = arithmetic_naive(k);
    if (a.mu == 0) continue;
    if (f.size() < static_cast<std::size_t>(a.omega)) f.resize(a.omega, 0);
    ++f[a.omega - 1];
  }
  return f;
}

std::uint64_t divisibility_edges_naive(std::uint64_t n) {
  std::vector<std::uint64_t> squarefree;
  for (std::uint64_t k = 2; k <= n; ++k)
    if (arithmetic_naive(k).mu != 0) squarefree.push_back(k);
  std::uint64_t edges = 0;
  for (std::size_t i = 0; i < squarefree.size(); ++i)
    for (std::size_t j = i + 1; j < squarefree.size(); ++j)
      if (squarefree[j] % squarefree[i] == 0) ++edges;
  return edges;
}

namespace {
// Rank over Z/2 of a dense matrix whose rows are bit vectors.
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

std::vector<std::int64_t> betti_mod2_naive(std::uint64_t n) {
  // Faces by dimension, each a squarefree k; its boundary faces are k / p.
  std::vector<std::vector<std::uint64_t>> faces;
  std::map<std::uint64_t, std::size_t> index;
  for (std::uint64_t k = 2; k <= n; ++k) {
    const auto a = arithmetic_naive(k);
    if (a.mu == 0) continue;
    const auto d = static_cast<std::size_t>(a.omega - 1);
    if (faces.size() <= d) faces.resize(d + 1);
    index[k] = faces[d].size();
    faces[d].push_back(k);
  }
  const std::size_t top = faces.size();
  // rank of the boundary map from dimension d to d - 1, for d = 1..top-1.
  std::vector<std::size_t> boundary_rank(top + 1, 0);
  for (std::size_t d = 1; d < top; ++d) {
    const std::size_t columns = faces[d - 1].size();
    std::vector<std::vector<std::uint64_t>> rows;
    for (const auto k : faces[d]) {
      std::vector<std::uint64_t> row((columns + 63) / 64, 0);
      std::uint64_t m = k;
      for (std::uint64_t p = 2; p <= m; ++p) {
        if (m % p) continue;
        m /= p;
        const auto c = index.at(k / p);
        row[c / 64] |= std::uint64_t{1} << (c % 64);
      }
      rows.push_back(std::move(row));
    }
    boundary_rank[d] = rank_mod2(std::move(rows), columns);
  }
  std::vector<std::int64_t> betti(top, 0);
  for (std::size_t d = 0; d < top; ++d)
    betti[d] = static_cast<std::int64_t>(faces[d].size() - boundary_rank[d] - boundary_rank[d + 1]);
  return betti;
}

}  // namespace sqfc::oracles
