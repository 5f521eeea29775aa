// SPDX-License-Identifier: MIT
/// @file sample_schedule.hpp  The n at which `sqfc table` emits rows.
#pragma once

#include <optional>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::track {

/// A set of sample points inside [from, to]: the union of every multiple of `every`, an
/// explicit list, `per_decade` log-spaced points per decade (round(10^(j/K)), powers of ten
/// exact) and, optionally, the end point `to`.
/// Invariant: the points are fixed at construction; next_at_or_after is monotone.
class SampleSchedule {
 public:
  SampleSchedule() = default;
  /// Pre: 1 <= from <= to (checked; InvalidArgument); every >= 1 when given; 1 <= per_decade
  /// <= 1000 when given (checked). Log points are exact: rounding is confirmed with integer
  /// powers (FLINT) near half-integers and above 2^53. Points of `at` outside [from, to] are dropped.
  /// Complexity: O(|at| log |at| + per_decade * 20) time and memory.
  SampleSchedule(Natural from, Natural to, std::optional<Natural> every, std::vector<Natural> at,
                 std::optional<unsigned> per_decade, bool include_end);

  /// The smallest sample point >= n, or nullopt when none is left. Complexity: O(log points).
  [[nodiscard]] std::optional<Natural> next_at_or_after(Natural n) const;
  /// True when the schedule holds no point at all.
  [[nodiscard]] bool empty() const { return !next_at_or_after(from_).has_value(); }
  /// Number of sample points. Complexity: O(points) for the listed ones, O(1) for `every`.
  [[nodiscard]] Count size() const;

 private:
  Natural from_ = 1;
  Natural to_ = 0;
  std::optional<Natural> every_;
  std::vector<Natural> listed_;  // sorted, unique, inside [from, to]
};

}  // namespace sqfc::track
