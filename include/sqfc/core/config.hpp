// SPDX-License-Identifier: MIT
/// @file config.hpp  Compile-time limits and tuning constants.
#pragma once

#include <cstddef>

#include "sqfc/core/types.hpp"

namespace sqfc::config {

/// Largest n the sieve accepts: 10^16. Verified against PARI by tests/arith/test_sieve_reference.cpp
/// (random blocks up to 10^13) and tests/arith/test_sieve_reference_slow.cpp (blocks near 10^16). The packed sieve word keeps
/// a log sum of at most 4.5 * log2(n) < 256 quarter-bits for n < 2^56, so the bound could
/// be raised to 2^56 only after the same comparison is run there.
inline constexpr Natural max_sieve_n = 10'000'000'000'000'000ULL;

/// Values per cache block of the sieve (4 bytes each). 2^17 values = 512 KiB fits the
/// 2 MiB L2 of the development machine (Xeon, measured 2026-12); allowed 2^10 .. 2^24.
inline constexpr std::size_t default_block_size = std::size_t{1} << 17;

/// Values per segment, the unit a worker thread takes: 32 blocks. Larger segments mean
/// fewer hand-offs but more memory (1 byte per value per worker); allowed >= block size.
inline constexpr Natural default_segment_size = Natural{1} << 22;

/// Largest omega(n) for n <= max_sieve_n: 2*3*...*41 (13 primes) = 3.0e14 <= 10^16 < the
/// product of the first 14 primes (1.3e16 > 10^16), so 13; arrays are sized 16.
inline constexpr int omega_slots = 16;

}  // namespace sqfc::config
