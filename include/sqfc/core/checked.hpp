// SPDX-License-Identifier: MIT
/// @file checked.hpp  Overflow-checked 64-bit arithmetic and exact integer helpers.
#pragma once

#include <cstdint>
#include <string>

#include "sqfc/core/error.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc {

/// a + b for unsigned 64-bit values.
/// Throws: OverflowError naming @p what when the sum passes 2^64 - 1.
inline std::uint64_t checked_add(std::uint64_t a, std::uint64_t b, const char* what = "sum") {
  std::uint64_t r = 0;
  if (__builtin_add_overflow(a, b, &r)) throw OverflowError(std::string(what) + " overflows 64 bits");
  return r;
}

/// a * b for unsigned 64-bit values.
/// Throws: OverflowError naming @p what when the product passes 2^64 - 1.
inline std::uint64_t checked_mul(std::uint64_t a, std::uint64_t b, const char* what = "product") {
  std::uint64_t r = 0;
  if (__builtin_mul_overflow(a, b, &r)) throw OverflowError(std::string(what) + " overflows 64 bits");
  return r;
}

/// a + b for signed 64-bit values. Throws: OverflowError on overflow.
inline std::int64_t checked_add(std::int64_t a, std::int64_t b, const char* what = "sum") {
  std::int64_t r = 0;
  if (__builtin_add_overflow(a, b, &r)) throw OverflowError(std::string(what) + " overflows 64 bits");
  return r;
}

/// floor(sqrt(n)) exactly, for every 64-bit n.
/// Complexity: O(1) (one floating-point root and at most two corrections each way).
std::uint64_t integer_sqrt(std::uint64_t n) noexcept;

/// floor(log2(n)) for n >= 1. Pre: n >= 1 (assumed).
inline int floor_log2(std::uint64_t n) noexcept { return 63 - __builtin_clzll(n); }

/// Decimal text of a 128-bit integer (std::to_string has no overload for it).
std::string to_string_wide(Wide value);

}  // namespace sqfc
