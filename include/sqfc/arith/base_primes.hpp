// SPDX-License-Identifier: MIT
/// @file base_primes.hpp  The primes up to a bound, for sieving.
#pragma once

#include <cstdint>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// All primes p <= limit, in increasing order (Eratosthenes over odd numbers).
/// @param limit  inclusive bound.
/// Pre: limit <= 2^32 - 1 (checked; InvalidArgument), so each prime fits 32 bits.
/// Complexity: O(limit log log limit) time, limit/16 bytes of scratch memory plus 4 bytes per prime.
std::vector<std::uint32_t> primes_up_to(std::uint64_t limit);

}  // namespace sqfc::arith
