// SPDX-License-Identifier: MIT
// The two inner loops of the mu sweep (lookup runs and mu-weighted quotient sums), in a
// portable version and an AVX-512 version chosen at run time.
#pragma once

#include <cstddef>
#include <cstdint>

#include "sqfc/core/types.hpp"

namespace sqfc::arith::detail {

/// Which implementation of the inner loops runs. All give the same sums; tests compare them.
/// avx2 (with FMA) runs the lookup runs and quotient sums four lanes wide and the prefix sums
/// in the portable loop.
enum class SweepKernels { portable, avx2, avx512 };

/// floor(x / n) for a quotient below 2^44 from one double division and one correction: the
/// double quotient is within 3 * 2^-53 relative of x / n, so its truncation is floor(x / n) or
/// one off; r = x - q n (exact modulo 2^64, truly in (-n, 2n)) tells which.
/// Pre: n >= 1, x / n < 2^44, x_double is x rounded to double. Not checked (inner loop).
inline Natural quotient_small(Natural x, double x_double, Natural n) noexcept {
  auto q = static_cast<Natural>(x_double / static_cast<double>(n));
  const auto r = static_cast<std::int64_t>(x - q * n);
  // Both corrections are rare (the double quotient is off only next to an integer), so the
  // branches predict well.
  if (r < 0) --q;
  else if (static_cast<Natural>(r) >= n) ++q;
  return q;
}

/// avx512 when this CPU has AVX-512 F and DQ, else avx2 when it has AVX2 and FMA, else
/// portable (checked once).
SweepKernels fastest_sweep_kernels() noexcept;
/// Whether this CPU can run the avx2 kernels.
bool avx2_sweep_kernels_available() noexcept;

/// The sum of m_local[floor(x / n) - a] over n in [n_low, n_high].
/// Pre: 1 <= n_low <= n_high < 2^53; x_double is x rounded to double; every quotient
/// floor(x / n) lies in [a, a + size of m_local) and is below 2^44. Not checked (inner loop).
/// Complexity: n_high - n_low + 1 divisions (eight per instruction in the AVX-512 version).
SignedSum lookup_run_sum(SweepKernels kernels, Natural x, double x_double, Natural n_low, Natural n_high, Natural a,
                         const std::int32_t* m_local) noexcept;

/// out[i] = mu[0] + ... + mu[i] for i < len; returns the total (0 for len = 0).
/// Pre: len <= 2^24, so no partial sum leaves int32. Complexity: len additions.
std::int32_t prefix_sums(SweepKernels kernels, const std::int8_t* mu, std::size_t len, std::int32_t* out) noexcept;

/// The sum of floor(x / v[i]) over i < count, where inverse[i] is 1 / v[i] rounded to double.
/// Pre: x / v[i] < 2^48 for every i and count <= 2^17, so that eight 64-bit lane sums cannot
/// carry; 1 <= v[i] < 2^52. Not checked (inner loop).
/// Complexity: count multiplications, no division.
WideUnsigned quotient_sum(SweepKernels kernels, Natural x, double x_double, const Natural* v, const double* inverse,
                          std::size_t count) noexcept;

}  // namespace sqfc::arith::detail
