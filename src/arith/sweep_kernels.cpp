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
// The table entries at `count` indices, summed in two chains so that the loads overlap.
template <int count, class Index>
inline SignedSum table_sum(const std::int32_t* m_local, const Index* index) noexcept {
  std::int64_t part0 = 0, part1 = 0;
  for (int k = 0; k < count; k += 2) {
    part0 += m_local[index[k]];
    part1 += m_local[index[k + 1]];
  }
  return part0 + part1;
}

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
    sum += table_sum<16>(m_local, index);
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

#define SQFC_AVX2 __attribute__((target("avx2,fma")))

// x as xh + xl: xh = x rounded to double, xl = x - xh exactly (|xl| <= 2^10 for x < 2^64).
// When xh rounds up to 2^64, x - 2^64 is x read as a signed integer.
inline double low_part(Natural x, double x_double) noexcept {
  if (x_double >= 18446744073709551616.0) return static_cast<double>(static_cast<std::int64_t>(x));
  return static_cast<double>(static_cast<std::int64_t>(x - static_cast<Natural>(x_double)));
}

// Four quotients floor(x / n) as doubles, from a truncated double quotient q (one off at
// most) and the exact remainder x - q n computed in doubles: q n = p + e exactly (FMA),
// xh - p is exact (Sterbenz: p is within a factor 2 of xh), and every partial result is an
// integer of magnitude below 2^53. Pre: q < 2^48, n < 2^53.
SQFC_AVX2 inline __m256d corrected4(__m256d q, __m256d n, __m256d x_high, __m256d x_low) noexcept {
  const __m256d product = _mm256_mul_pd(q, n);
  const __m256d error = _mm256_fmsub_pd(q, n, product);
  const __m256d r = _mm256_add_pd(_mm256_sub_pd(_mm256_sub_pd(x_high, product), error), x_low);
  const __m256d one = _mm256_set1_pd(1.0);
  q = _mm256_sub_pd(q, _mm256_and_pd(one, _mm256_cmp_pd(r, _mm256_setzero_pd(), _CMP_LT_OQ)));
  q = _mm256_add_pd(q, _mm256_and_pd(one, _mm256_cmp_pd(r, n, _CMP_GE_OQ)));
  return q;
}

SQFC_AVX2 SignedSum lookup_run_sum_avx2(Natural x, double x_double, Natural n_low, Natural n_high, Natural a,
                                        const std::int32_t* m_local) noexcept {
  const __m256d x_high = _mm256_set1_pd(x_double);
  const __m256d x_low = _mm256_set1_pd(low_part(x, x_double));
  const __m256d base = _mm256_set1_pd(static_cast<double>(a));
  const __m256d step = _mm256_set1_pd(8.0);
  __m256d n0 = _mm256_add_pd(_mm256_set1_pd(static_cast<double>(n_low)), _mm256_setr_pd(0, 1, 2, 3));
  __m256d n1 = _mm256_add_pd(n0, _mm256_set1_pd(4.0));
  Natural left = n_high - n_low + 1;
  alignas(16) std::int32_t index[8];
  SignedSum sum = 0;
  // Two groups of four per round so that the divisions overlap; indices below 2^17 convert
  // to int32 exactly, then scalar table loads as in the AVX-512 loop.
  for (; left >= 8; left -= 8) {
    const __m256d q0 = corrected4(_mm256_round_pd(_mm256_div_pd(x_high, n0), _MM_FROUND_TO_ZERO | _MM_FROUND_NO_EXC), n0, x_high, x_low);
    const __m256d q1 = corrected4(_mm256_round_pd(_mm256_div_pd(x_high, n1), _MM_FROUND_TO_ZERO | _MM_FROUND_NO_EXC), n1, x_high, x_low);
    _mm_store_si128(reinterpret_cast<__m128i*>(index), _mm256_cvttpd_epi32(_mm256_sub_pd(q0, base)));
    _mm_store_si128(reinterpret_cast<__m128i*>(index + 4), _mm256_cvttpd_epi32(_mm256_sub_pd(q1, base)));
    sum += table_sum<8>(m_local, index);
    n0 = _mm256_add_pd(n0, step);
    n1 = _mm256_add_pd(n1, step);
  }
  for (Natural n = n_high - left + 1; n <= n_high; ++n) sum += m_local[quotient_small(x, x_double, n) - a];
  return sum;
}

// Four corrected quotients floor(x / v[i]) as int64 lanes (quotients below 2^48).
SQFC_AVX2 inline __m256i quotients4_by_inverse(const Natural* v, const double* inverse, __m256d x_high, __m256d x_low) noexcept {
  // 2^52 + k has the bit pattern of 2^52 plus k for 0 <= k < 2^52: integer <-> double both ways.
  const __m256d magic = _mm256_set1_pd(4503599627370496.0);
  const __m256i magic_bits = _mm256_castpd_si256(magic);
  const __m256i vi = _mm256_loadu_si256(reinterpret_cast<const __m256i*>(v));
  const __m256d vd = _mm256_sub_pd(_mm256_castsi256_pd(_mm256_or_si256(vi, magic_bits)), magic);
  const __m256d q0 = _mm256_round_pd(_mm256_mul_pd(x_high, _mm256_loadu_pd(inverse)), _MM_FROUND_TO_ZERO | _MM_FROUND_NO_EXC);
  const __m256d q = corrected4(q0, vd, x_high, x_low);
  return _mm256_sub_epi64(_mm256_castpd_si256(_mm256_add_pd(q, magic)), magic_bits);
}

SQFC_AVX2 WideUnsigned quotient_sum_avx2(Natural x, double x_double, const Natural* v, const double* inverse,
                                         std::size_t count) noexcept {
  const __m256d x_high = _mm256_set1_pd(x_double);
  const __m256d x_low = _mm256_set1_pd(low_part(x, x_double));
  __m256i acc0 = _mm256_setzero_si256(), acc1 = _mm256_setzero_si256();

  std::size_t i = 0;
  for (; i + 8 <= count; i += 8) {
    acc0 = _mm256_add_epi64(acc0, quotients4_by_inverse(v + i, inverse + i, x_high, x_low));
    acc1 = _mm256_add_epi64(acc1, quotients4_by_inverse(v + i + 4, inverse + i + 4, x_high, x_low));
  }
  if (i + 4 <= count) {
    acc0 = _mm256_add_epi64(acc0, quotients4_by_inverse(v + i, inverse + i, x_high, x_low));
    i += 4;
  }
  // Each lane holds at most count / 8 + 1 quotients below 2^48 (below 2^63); the lanes are
  // added in 128 bits.
  alignas(32) Natural lanes[4];
  WideUnsigned sum = 0;
  _mm256_store_si256(reinterpret_cast<__m256i*>(lanes), acc0);
  for (const Natural lane : lanes) sum += lane;
  _mm256_store_si256(reinterpret_cast<__m256i*>(lanes), acc1);
  for (const Natural lane : lanes) sum += lane;
  if (i < count) sum += quotient_sum_portable(x, x_double, v + i, inverse + i, count - i);
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
  return avx2_sweep_kernels_available() ? SweepKernels::avx2 : SweepKernels::portable;
}

bool avx2_sweep_kernels_available() noexcept {
#if SQFC_HAVE_AVX512_KERNELS
  static const bool has_avx2 = __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma");
  return has_avx2;
#else
  return false;
#endif
}

SignedSum lookup_run_sum(SweepKernels kernels, Natural x, double x_double, Natural n_low, Natural n_high, Natural a,
                         const std::int32_t* m_local) noexcept {
#if SQFC_HAVE_AVX512_KERNELS
  if (kernels == SweepKernels::avx512) return lookup_run_sum_avx512(x, x_double, n_low, n_high, a, m_local);
  if (kernels == SweepKernels::avx2) return lookup_run_sum_avx2(x, x_double, n_low, n_high, a, m_local);
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
  if (kernels == SweepKernels::avx2) return quotient_sum_avx2(x, x_double, v, inverse, count);
#endif
  (void)kernels;
  return quotient_sum_portable(x, x_double, v, inverse, count);
}

}  // namespace sqfc::arith::detail
