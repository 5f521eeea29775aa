// SPDX-License-Identifier: MIT
/// @file green_statistics.hpp  Summary of the entries of a Green function g_n = (1 + A(H_n))^-1.
#pragma once

#include <cstdint>
#include <map>

#include "sqfc/core/types.hpp"

namespace sqfc::linalg {

/// Distribution of the V*V entries of g_n (ordered pairs of vertices, zeros included).
/// Invariant: the histogram's counts add up to vertices^2; energy is the sum of all entries.
struct GreenStatistics {
  Natural n = 0;
  Count vertices = 0;
  std::map<std::int64_t, Count> histogram;           ///< value -> number of entries
  std::map<std::int64_t, Count> diagonal_histogram;  ///< value -> number of diagonal entries
  Wide energy = 0;                                   ///< sum of all entries (design.md identity 4)
  [[nodiscard]] std::int64_t min() const { return histogram.empty() ? 0 : histogram.begin()->first; }
  [[nodiscard]] std::int64_t max() const { return histogram.empty() ? 0 : histogram.rbegin()->first; }
  friend bool operator==(const GreenStatistics&, const GreenStatistics&) = default;
};

}  // namespace sqfc::linalg
