// SPDX-License-Identifier: MIT
/// @file bordered_green.hpp  Exact Green function of H_n, grown one vertex at a time by bordering.
#pragma once

#include <cstdint>
#include <span>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/linalg/green_statistics.hpp"

namespace sqfc::linalg {

/// Keeps g = M^-1 for M = 1 + A of the graph on the vertices added so far, exactly, in 32-bit
/// integers (the entries are tiny: |g(x,y)| <= |M_l(n/l)|; 32 bits halve the memory traffic
/// that bounds the run time). Adding a vertex with adjacency vector a borders M; with u = g a the Schur
/// complement is s = 1 - a^T u and
///   M'^-1 = [[g + u u^T / s, -u / s], [-u^T / s, 1 / s]],   det M' = s det M.
/// Every step requires s = +1 or -1 (so the inverse stays integral; design.md identity 3) and
/// throws otherwise. Before each update it proves |g| + |u|^2 < 2^31, so no entry can overflow.
/// By Sylvester's law of inertia the signs of the s are the signs of M's eigenvalues
/// (the bordering is a block LDL^T factorisation).
/// Invariant: after k additions, the leading k x k block of storage is the exact inverse.
class BorderedGreen {
 public:
  /// Reserves room for `capacity` vertices: 4 * capacity^2 bytes.
  /// Throws: InvalidArgument when that exceeds `memory_limit_bytes` (message names the estimate).
  BorderedGreen(std::size_t capacity, std::uint64_t memory_limit_bytes, unsigned threads = 1);

  /// Adds the next vertex; `neighbours` are indices of earlier vertices, increasing.
  /// Returns s = 1 - a^T g a (+1 or -1).
  /// Throws: InternalError when s is not +-1; OverflowError when the bound check fails;
  /// InvalidArgument beyond the capacity or for an index >= size().
  /// Complexity: O(k * |neighbours| + k^2) time for the k-th vertex, spread over the threads.
  int add_vertex(std::span<const std::uint32_t> neighbours);

  [[nodiscard]] std::size_t size() const noexcept { return size_; }
  /// det(1 + A) of the current graph: the product of all s (1 for the empty graph).
  [[nodiscard]] int determinant() const noexcept { return determinant_; }
  /// Entry g(i, j). Pre: i, j < size() (assumed).
  [[nodiscard]] std::int64_t entry(std::size_t i, std::size_t j) const noexcept { return g_[i * capacity_ + j]; }
  /// Sum of all entries, kept in O(k) per step: sum(g') = sum(g) + s (1 - sum(u))^2.
  [[nodiscard]] Wide energy() const noexcept { return energy_; }
  /// Number of s = +1 and s = -1 so far: the positive and negative eigenvalues of 1 + A.
  [[nodiscard]] Count positive_pivots() const noexcept { return positive_; }
  [[nodiscard]] Count negative_pivots() const noexcept { return negative_; }
  /// Histogram, extremes and energy of all entries. Complexity: O(size^2 log distinct).
  [[nodiscard]] GreenStatistics statistics(Natural n) const;
  /// Throws InvalidArgument (naming the estimate in bytes and MiB, and --method closed) when
  /// `capacity` vertices need more than `memory_limit_bytes`. Complexity: O(1).
  static void check_memory(std::size_t capacity, std::uint64_t memory_limit_bytes);
  /// Bytes needed for `capacity` vertices.
  static std::uint64_t bytes_for(std::size_t capacity) noexcept { return 4ULL * capacity * capacity; }

 private:
  std::size_t capacity_;
  std::size_t size_ = 0;
  unsigned threads_;
  std::vector<std::int32_t> g_;  // row-major, capacity_ x capacity_, both triangles
  std::vector<std::int64_t> u_;    // g a, summed in 64 bits
  std::vector<std::int32_t> u32_;  // the same after the bound check
  std::int64_t max_abs_ = 0;     // max |entry| of g, for the overflow proof
  int determinant_ = 1;
  Wide energy_ = 0;
  Count positive_ = 0, negative_ = 0;
};

}  // namespace sqfc::linalg
