// SPDX-License-Identifier: MIT
/// @file types.hpp  Named integer aliases used across sqfc.
#pragma once

#include <cstddef>
#include <cstdint>

namespace sqfc {

/// A positive integer n under study (1-based; the sieve range is [1, 10^16]).
using Natural = std::uint64_t;
/// A signed running sum such as M(n) or L(n); |value| <= n, so 64 bits suffice.
using SignedSum = std::int64_t;
/// A count of integers or faces up to n.
using Count = std::uint64_t;
/// A 128-bit signed integer for products and sums that may pass 2^63.
__extension__ typedef __int128 Wide;
/// A 128-bit unsigned integer.
__extension__ typedef unsigned __int128 WideUnsigned;

}  // namespace sqfc
