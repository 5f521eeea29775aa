// SPDX-License-Identifier: MIT
// Inner loops of the mu sweep (docs/algorithms/mertens-isolated.md, section 2).
#include "detail_sweep_kernels.hpp"

#if defined(__x86_64__)
#include <immintrin.h>
#define SQFC_HAVE_AVX512_KERNELS 1
// GCC 12's AVX-512 headers start some intrinsics from _mm512_undefined_*(), which its own
// uninitialised-value warnings then flag at every use; the values are never read.
#pragma GCC diagnostic ignored "-Wuninitialized"
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#endif

namespace sqfc::arith::detail {
namespace {

SignedSum lookup_run_sum_portable(Natural x, double x_double, Natural n_low, Natural n_high, Natural a,
                                  const std::int32_t* m_local) noexcept {
  SignedSum sum = 0;
  for (Natural n = n_low; n <= n_high; ++n) sum += m_local[quotient_small(x, x_double, n) - a];
  return sum;
}

// The same correction with x * (1 / v): for a quotient below 2^48 the product is within
// 3 * 2^-53 relative, so again off by at most one.
WideUnsigned quotient_sum_portable(Natural x, double x_double, const Natural* v, const double* inverse,
                                   std::size_t count) noexcept {
  WideUnsigned sum = 0;
  for (std::size_t i = 0; i < count; ++i) {
    auto q = static_cast<Natural>(x_double * inverse[i]);
    const auto r = static_cast<std::int64_t>(x - q * v[i]);
    if (r < 0) --q;
    else if (static_cast<Natural>(r) >= v[i]) ++q;
    sum += q;
  }
  return sum;
}

std::int32_t prefix_sums_portable(const std::int8_t* mu, std::size_t len, std::int32_t* out) noexcept {
  std::int32_t running = 0;
  for (std::size_t i = 0; i < len; ++i) {
    running += mu[i];
    out[i] = running;
  }
  return running;
}

#if SQFC_HAVE_AVX512_KERNELS
#define SQFC_AVX512 __attribute__((target("avx512f,avx512dq")))

// Eight quotients floor(x / n) with the scalar version's correction, lane by lane.
SQFC_AVX512 inline __m512i quotients8(__m512d x_d, __m512i x_i, __m512i n) noexcept {
  __m512i q = _mm512_cvttpd_epi64(_mm512_div_pd(x_d, _mm512_cvtepi64_pd(n)));
  const __m512i r = _mm512_sub_epi64(x_i, _mm512_mullo_epi64(q, n));
  const __m512i one = _mm512_set1_epi64(1);
  q = _mm512_mask_sub_epi64(q, _mm512_cmplt_epi64_mask(r, _mm512_setzero_si512()), q, one);
  q = _mm512_mask_add_epi64(q, _mm512_cmpge_epi64_mask(r, n), q, one);
  return q;
}

SQFC_AVX512 SignedSum lookup_run_sum_avx512(Natural x, double x_double, Natural n_low, Natural n_high, Natural a,
                                            const std::int32_t* m_local) noexcept {
  const __m512d x_d = _mm512_set1_pd(x_double);
  const __m512i x_i = _mm512_set1_epi64(static_cast<long long>(x));
  const __m512i base = _mm512_set1_epi64(static_cast<long long>(a));
  const __m512i step = _mm512_set1_epi64(16);
  __m512i n0 = _mm512_add_epi64(_mm512_set1_epi64(static_cast<long long>(n_low)), _mm512_setr_epi64(0, 1, 2, 3, 4, 5, 6, 7));
  __m512i n1 = _mm512_add_epi64(n0, _mm512_set1_epi64(8));
  __m512i acc0 = _mm512_setzero_si512();
  Natural left = n_high - n_low + 1;
  // Two independent groups of eight per round, so the divisions overlap. The sixteen table
  // reads are scalar loads: they beat the gather instruction on the development machine.
  alignas(64) std::int64_t index[16];
  SignedSum sum = 0;
  for (; left >= 16; left -= 16) {
    _mm512_store_si512(index, _mm512_sub_epi64(quotients8(x_d, x_i, n0), base));
    _mm512_store_si512(index + 8, _mm512_sub_epi64(quotients8(x_d, x_i, n1), base));
    std::int64_t part0 = 0, part1 = 0;
    for (int k = 0; k < 16; k += 2) {
      part0 += m_local[index[k]];
      part1 += m_local[index[k + 1]];
    }
    sum += part0 + part1;
    n0 = _mm512_add_epi64(n0, step);
    n1 = _mm512_add_epi64(n1, step);
  }
  for (; left > 0;) {
    const unsigned lanes = left >= 8 ? 8U : static_cast<unsigned>(left);
    const auto mask = static_cast<__mmask8>((1U << lanes) - 1U);
    // Masked-off lanes divide by n too (harmless) and gather nothing.
    const __m512i i0 = _mm512_sub_epi64(quotients8(x_d, x_i, n0), base);
    const __m256i got = _mm512_mask_i64gather_epi32(_mm256_setzero_si256(), mask, i0, m_local, 4);
    acc0 = _mm512_add_epi64(acc0, _mm512_cvtepi32_epi64(got));
    n0 = _mm512_add_epi64(n0, _mm512_set1_epi64(8));
    left -= lanes;
  }
  return sum + static_cast<SignedSum>(_mm512_reduce_add_epi64(acc0));
}

SQFC_AVX512 inline __m512i quotients8_by_inverse(__m512d x_d, __m512i x_i, __m512i v, __m512d inverse) noexcept {
  __m512i q = _mm512_cvttpd_epi64(_mm512_mul_pd(x_d, inverse));
  const __m512i r = _mm512_sub_epi64(x_i, _mm512_mullo_epi64(q, v));
  const __m512i one = _mm512_set1_epi64(1);
  q = _mm512_mask_sub_epi64(q, _mm512_cmplt_epi64_mask(r, _mm512_setzero_si512()), q, one);
  q = _mm512_mask_add_epi64(q, _mm512_cmpge_epi64_mask(r, v), q, one);
  return q;
}

SQFC_AVX512 WideUnsigned quotient_sum_avx512(Natural x, double x_double, const Natural* v, const double* inverse,
                                             std::size_t count) noexcept {
  const __m512d x_d = _mm512_set1_pd(x_double);
  const __m512i x_i = _mm512_set1_epi64(static_cast<long long>(x));
  __m512i acc0 = _mm512_setzero_si512(), acc1 = _mm512_setzero_si512();
  std::size_t i = 0;
  for (; i + 16 <= count; i += 16) {
    acc0 = _mm512_add_epi64(acc0, quotients8_by_inverse(x_d, x_i, _mm512_loadu_si512(v + i), _mm512_loadu_pd(inverse + i)));
    acc1 = _mm512_add_epi64(
        acc1, quotients8_by_inverse(x_d, x_i, _mm512_loadu_si512(v + i + 8), _mm512_loadu_pd(inverse + i + 8)));
  }
  for (; i < count; i += 8) {
    const unsigned lanes = count - i >= 8 ? 8U : static_cast<unsigned>(count - i);
    const auto mask = static_cast<__mmask8>((1U << lanes) - 1U);
    // Masked-off lanes read v = 1, inverse = 1 and are then dropped from the sum.
    const __m512i vv = _mm512_mask_loadu_epi64(_mm512_set1_epi64(1), mask, v + i);
    const __m512d inv = _mm512_mask_loadu_pd(_mm512_set1_pd(1.0), mask, inverse + i);
    acc0 = _mm512_mask_add_epi64(acc0, mask, acc0, quotients8_by_inverse(x_d, x_i, vv, inv));
  }
  // Each lane holds at most count / 16 + 1 quotients below 2^48: below 2^62, but eight lanes
  // together may pass 2^64, so they are added in 128 bits.
  alignas(64) Natural lanes[8];
  _mm512_store_si512(lanes, acc0);
  WideUnsigned sum = 0;
  for (const Natural lane : lanes) sum += lane;
  _mm512_store_si512(lanes, acc1);
  for (const Natural lane : lanes) sum += lane;
  return sum;
}

// Sixteen values at a time: the in-register prefix sum takes four shifted adds, then the
// running total of the earlier values is added to every lane.
SQFC_AVX512 std::int32_t prefix_sums_avx512(const std::int8_t* mu, std::size_t len, std::int32_t* out) noexcept {
  const __m512i zero = _mm512_setzero_si512();
  const __m512i last_lane = _mm512_set1_epi32(15);
  __m512i carry = zero;
  std::size_t i = 0;
  for (; i + 16 <= len; i += 16) {
    __m512i x = _mm512_cvtepi8_epi32(_mm_loadu_si128(reinterpret_cast<const __m128i*>(mu + i)));
    x = _mm512_add_epi32(x, _mm512_alignr_epi32(x, zero, 15));
    x = _mm512_add_epi32(x, _mm512_alignr_epi32(x, zero, 14));
    x = _mm512_add_epi32(x, _mm512_alignr_epi32(x, zero, 12));
    x = _mm512_add_epi32(x, _mm512_alignr_epi32(x, zero, 8));
    x = _mm512_add_epi32(x, carry);
    _mm512_storeu_si512(out + i, x);
    carry = _mm512_permutexvar_epi32(last_lane, x);
  }
  std::int32_t running = _mm_cvtsi128_si32(_mm512_castsi512_si128(carry));
  for (; i < len; ++i) {
    running += mu[i];
    out[i] = running;
  }
  return running;
}
#endif

}  // namespace

SweepKernels fastest_sweep_kernels() noexcept {
#if SQFC_HAVE_AVX512_KERNELS
  static const bool has_avx512 = __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512dq");
  if (has_avx512) return SweepKernels::avx512;
#endif
  return SweepKernels::portable;
}

SignedSum lookup_run_sum(SweepKernels kernels, Natural x, double x_double, Natural n_low, Natural n_high, Natural a,
                         const std::int32_t* m_local) noexcept {
#if SQFC_HAVE_AVX512_KERNELS
  if (kernels == SweepKernels::avx512) return lookup_run_sum_avx512(x, x_double, n_low, n_high, a, m_local);
#endif
  (void)kernels;
  return lookup_run_sum_portable(x, x_double, n_low, n_high, a, m_local);
}

std::int32_t prefix_sums(SweepKernels kernels, const std::int8_t* mu, std::size_t len, std::int32_t* out) noexcept {
#if SQFC_HAVE_AVX512_KERNELS
  if (kernels == SweepKernels::avx512) return prefix_sums_avx512(mu, len, out);
#endif
  (void)kernels;
  return prefix_sums_portable(mu, len, out);
}

WideUnsigned quotient_sum(SweepKernels kernels, Natural x, double x_double, const Natural* v, const double* inverse,
                          std::size_t count) noexcept {
#if SQFC_HAVE_AVX512_KERNELS
  if (kernels == SweepKernels::avx512) return quotient_sum_avx512(x, x_double, v, inverse, count);
#endif
  (void)kernels;
  return quotient_sum_portable(x, x_double, v, inverse, count);
}

}  // namespace sqfc::arith::detail
