// SPDX-License-Identifier: MIT
// Isolated M(x), L(x), Q(x) and the Fredholm sign, assembled as sums over one mu sweep.
#include "sqfc/arith/isolated_values.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "detail_mobius_sweep.hpp"
#include "detail_sweep_kernels.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::arith {
namespace {

// Y = alpha * x^(2/3): alpha trades the sieve (cost ~ Y) against the lookups (~ x / sqrt(Y)).
// Measured with the AVX-512 kernels on the 2-core EPYC KVM at x = 10^14 and 10^15 (December
// 2026); see docs/algorithms/mertens-isolated.md for the sweep.
constexpr double sieve_limit_factor = 0.5;
// Below this, sieving [1, x] directly is cheaper than any split.
constexpr Natural direct_sieve_limit = Natural{1} << 20;

void check_x(Natural x, Natural max, const char* what) {
  if (x < 1 || x > max)
    throw InvalidArgument(std::string(what) + " argument " + std::to_string(x) + " is outside the supported range [1, " +
                          std::to_string(max) + "]");
}

Natural checked_sieve_limit(Natural x, const IsolatedOptions& options) {
  const Natural y = options.sieve_limit != 0 ? options.sieve_limit : default_mertens_sieve_limit(x);
  const Natural root = integer_sqrt(x);
  // 2^44 is the sweep's own bound (its lookup quotients stay below 2^44).
  if (y <= root || y > (Natural{1} << 44) || y - 1 > config::max_sieve_n)
    throw InvalidArgument("sieve limit " + std::to_string(y) + " for x = " + std::to_string(x) + " is outside (isqrt(x), 2^44]");
  if (x >= y && x / y + (x % y != 0 ? 1 : 0) >= y)
    throw InvalidArgument("sieve limit " + std::to_string(y) + " is too small for x = " + std::to_string(x));
  return y;
}

detail::SweepKernels sweep_kernels(IsolatedKernels kernels) {
  switch (kernels) {
    case IsolatedKernels::portable: return detail::SweepKernels::portable;
    case IsolatedKernels::avx2:
      if (!detail::avx2_sweep_kernels_available()) throw InvalidArgument("the AVX2 inner loops need a CPU with AVX2 and FMA");
      return detail::SweepKernels::avx2;
    case IsolatedKernels::fastest: break;
  }
  return detail::fastest_sweep_kernels();
}

SignedSum narrow(Wide value, const char* what) {
  if (value > static_cast<Wide>(INT64_MAX) || value < static_cast<Wide>(INT64_MIN))
    throw InternalError(std::string(what) + " does not fit 64 bits: " + to_string_wide(value));
  return static_cast<SignedSum>(value);
}

}  // namespace

bool isolated_kernels_available(IsolatedKernels kernels) noexcept {
  return kernels != IsolatedKernels::avx2 || detail::avx2_sweep_kernels_available();
}

Natural default_mertens_sieve_limit(Natural x) {
  const double two_thirds = std::pow(static_cast<double>(x), 2.0 / 3.0) * sieve_limit_factor;
  Natural y = static_cast<Natural>(two_thirds);
  y = std::max(y, std::min(x + 1, direct_sieve_limit));
  y = std::max(y, integer_sqrt(x) + 1);
  return y;
}

SignedSum mertens_isolated(Natural x, const IsolatedOptions& options) {
  check_x(x, max_isolated_mertens_x, "Mertens");
  const Natural y = checked_sieve_limit(x, options);
  detail::MobiusSweep sweep(y);
  sweep.use_kernels(sweep_kernels(options.kernels));
  if (options.lookup_share != 0) sweep.set_lookup_share(options.lookup_share);
  const auto slot = sweep.add_slot();
  const auto mu = detail::mu_table(x >= y ? sweep.split_for(x) : 0);
  sweep.add_mertens_target(x, slot, mu);
  return narrow(sweep.run(options.threads, options.progress)[slot], "M(x)");
}

MertensLiouville mertens_liouville_isolated(Natural x, const IsolatedOptions& options) {
  check_x(x, max_isolated_liouville_x, "Liouville");
  const Natural y = checked_sieve_limit(x, options);
  detail::MobiusSweep sweep(y);
  sweep.use_kernels(sweep_kernels(options.kernels));
  if (options.lookup_share != 0) sweep.set_lookup_share(options.lookup_share);
  const auto slot_m = sweep.add_slot();
  const auto slot_rest = sweep.add_slot();
  const auto mu = detail::mu_table(x >= y ? sweep.split_for(x) : 0);
  // L(x) = sum_{d <= isqrt x} M(floor(x/d^2)). Terms d <= D = cbrt(x) one by one (those with
  // floor(x/d^2) >= Y as Deléglise–Rivat targets, the others as points); for d > D the value
  // k = floor(x/d^2) <= K = floor(x/(D+1)^2) is shared by isqrt(x/k) - max(D, isqrt(x/(k+1))) of them.
  const Natural root = integer_sqrt(x);
  const Natural d_top = std::min(detail::integer_cbrt(x), root);
  sweep.add_mertens_target(x, slot_m, mu);
  for (Natural d = 2; d <= d_top; ++d) sweep.add_mertens_target(x / (d * d), slot_rest, mu);
  if (d_top < root) {
    const Natural k_top = x / ((d_top + 1) * (d_top + 1));
    for (Natural k = 1; k <= k_top; ++k) {
      const Natural upper = integer_sqrt(x / k);
      const Natural lower = std::max(d_top, integer_sqrt(x / (k + 1)));
      if (upper > lower) sweep.add_point(k, static_cast<SignedSum>(upper - lower), slot_rest);
    }
  }
  const auto values = sweep.run(options.threads, options.progress);
  MertensLiouville result;
  result.mertens = narrow(values[slot_m], "M(x)");
  result.liouville = narrow(values[slot_m] + values[slot_rest], "L(x)");
  return result;
}

SignedSum liouville_isolated(Natural x, const IsolatedOptions& options) {
  return mertens_liouville_isolated(x, options).liouville;
}

Count squarefree_isolated(Natural x, const IsolatedOptions& options) {
  check_x(x, max_isolated_squarefree_x, "squarefree count");
  const Natural root = integer_sqrt(x);
  // Q(x) = sum_{d <= D} mu(d) floor(x/d^2) + sum_{k <= K} (M(isqrt(x/k)) - M(D)),
  // D = cbrt(x), K = floor(x/(D+1)^2): for k <= K, isqrt(x/k) >= D + 1. The M values below the
  // sweep limit Y are read from the sweep, the larger ones (k <= x/Y^2) are Deléglise–Rivat
  // targets of the same sweep; Y ~ 2 x^(2/5) balances the two (the idea of Pawlewicz,
  // arXiv:1107.4890, with our M machinery).
  const Natural d_top = std::min(detail::integer_cbrt(x), root);
  const auto mu_direct = detail::mu_table(d_top);
  Wide direct = 0;
  for (Natural d = 1; d <= d_top; ++d)
    if (mu_direct[static_cast<std::size_t>(d)] != 0)
      direct += mu_direct[static_cast<std::size_t>(d)] * static_cast<Wide>(x / (d * d));
  if (d_top == root) return static_cast<Count>(direct);
  const auto two_fifths = static_cast<Natural>(2.0 * std::pow(static_cast<double>(x), 0.4));
  const Natural y = std::min(root + 1, std::max({two_fifths, d_top + 2, direct_sieve_limit}));
  detail::MobiusSweep sweep(y);
  sweep.use_kernels(sweep_kernels(options.kernels));
  if (options.lookup_share != 0) sweep.set_lookup_share(options.lookup_share);
  const auto slot = sweep.add_slot();
  sweep.add_constant(slot, direct);
  const auto mu = detail::mu_table(sweep.split_for(root));  // covers every target's u
  const Natural k_top = x / ((d_top + 1) * (d_top + 1));
  for (Natural k = 1; k <= k_top; ++k) sweep.add_mertens_target(integer_sqrt(x / k), slot, mu);
  sweep.add_point(d_top, -static_cast<SignedSum>(k_top), slot);
  const Wide q = sweep.run(options.threads, options.progress)[slot];
  if (q < 0 || q > static_cast<Wide>(x)) throw InternalError("Q(x) out of [0, x]: " + to_string_wide(q));
  return static_cast<Count>(q);
}

int fredholm_from_counts(Count squarefree, SignedSum mertens) {
  const Wide sum = static_cast<Wide>(squarefree) + mertens;
  if (sum < 2 || sum % 2 != 0) throw InternalError("Q(x) + M(x) = " + to_string_wide(sum) + " is not an even number >= 2");
  const Wide exponent = sum / 2 - 1;
  return exponent % 2 == 0 ? 1 : -1;
}

}  // namespace sqfc::arith
