// SPDX-License-Identifier: MIT
/// @file isolated_values.hpp  M(x), Q(x), L(x) and the Fredholm sign at one huge x, without sieving to x.
#pragma once

#include <cstdint>
#include <functional>

#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// Largest x that mertens_isolated() accepts (and the Fredholm sign, which needs M and Q).
/// The 128-bit bounds of docs/algorithms/mertens-isolated.md hold for every x < 2^64; this is
/// the largest x the result was compared at: M(10^19) = 899990187 (OEIS A084237) in a 125-minute
/// run on two cores, reproducible by tests/bench/bench_value.sh --max 19; M(10^18) the same way,
/// M(10^17) against A084237 in a slow test; M(10^16) - M(10^16 - 1) = mu(10^16) by factoring.
/// Nothing beyond is claimed.
inline constexpr Natural max_isolated_mertens_x = 10'000'000'000'000'000'000ULL;  // 10^19

/// Largest x that liouville_isolated() and mertens_liouville_isolated() accept: 10^16, the
/// largest x where L was compared (L(x) - L(x-1) = lambda(x) next to 10^15 and 10^16).
inline constexpr Natural max_isolated_liouville_x = 10'000'000'000'000'000ULL;  // 10^16

/// Largest x that squarefree_isolated() accepts: 10^19 (Q(10^18) and Q near 10^19 compared in tests).
inline constexpr Natural max_isolated_squarefree_x = 10'000'000'000'000'000'000ULL;

/// Which inner loops the sweep runs: the fastest this CPU has (AVX-512, else AVX2 with FMA,
/// else portable), or one forced. All give the same result; tests and benchmarks compare them.
enum class IsolatedKernels { fastest, avx2, portable };

/// Whether this CPU can run `kernels` (fastest and portable always; avx2 needs AVX2 and FMA).
bool isolated_kernels_available(IsolatedKernels kernels) noexcept;

/// How an isolated evaluation runs.
struct IsolatedOptions {
  /// Worker threads (>= 1).
  unsigned threads = 1;
  /// The sieve limit Y of the method: mu is sieved on [1, Y). 0 chooses the tuned default
  /// (default_mertens_sieve_limit). Any Y with sqrt(x) < Y is valid; tests vary it to check
  /// that the result does not depend on the split.
  Natural sieve_limit = 0;
  /// Where each Deléglise–Rivat term switches from lookups of M to grouped mu sums: at
  /// n = c sqrt(x/m). 0 chooses the measured default; any c in (0, 4] gives the same result
  /// (tests vary it), only the time moves.
  double lookup_share = 0;
  /// Called now and then with the fraction done in [0, 1], one call at a time (under a lock,
  /// from any worker thread). It may throw to abort the run (the exception is rethrown).
  std::function<void(double)> progress;
  /// The inner loops (checked: avx2 on a CPU without it is InvalidArgument).
  IsolatedKernels kernels = IsolatedKernels::fastest;
};

/// The sieve limit Y that mertens_isolated(x) uses by default: about 0.5 x^(2/3), at least
/// min(x + 1, 2^20), measured to balance the sieve against the lookups on a 2-core EPYC.
Natural default_mertens_sieve_limit(Natural x);

/// M(x) = sum_{k <= x} mu(k) by the Deléglise–Rivat identity
/// M(x) = M(u) - sum_{m <= u} mu(m) sum_{u/m < n <= x/m} M(floor(x/(mn))), u = ceil(x/Y),
/// with every M value below Y read from a segmented, threaded sweep of mu over [1, Y).
/// Pre: 1 <= x <= max_isolated_mertens_x (checked; InvalidArgument); a custom sieve_limit
/// must satisfy isqrt(x) < Y <= 2^44 and ceil(x/Y) < Y (checked; InvalidArgument).
/// Complexity: time O(Y log log Y + sqrt(x * x / Y)), i.e. about x^(2/3) for the default Y;
/// memory O(sqrt(Y) + x / Y) plus 3 MiB per thread.
/// Throws: InvalidArgument; whatever options.progress throws.
/// See: docs/algorithms/mertens-isolated.md.
SignedSum mertens_isolated(Natural x, const IsolatedOptions& options = {});

/// M(x) and L(x) from one sweep.
struct MertensLiouville {
  SignedSum mertens = 0;
  SignedSum liouville = 0;
};

/// L(x) = sum_{k <= x} lambda(k) = sum_{d <= sqrt x} M(floor(x/d^2)) (design.md identity 7),
/// together with M(x) (the term d = 1). The M(floor(x/d^2)) >= Y are Deléglise–Rivat targets
/// sharing one sweep; the smaller ones are read from the sweep, grouped by value for d > x^(1/3).
/// Pre: 1 <= x <= max_isolated_liouville_x (checked; InvalidArgument); sieve_limit as for
/// mertens_isolated. Throws: as mertens_isolated.
/// Complexity: about 1.6 times the lookups of mertens_isolated(x) and the same sieve.
MertensLiouville mertens_liouville_isolated(Natural x, const IsolatedOptions& options = {});

/// L(x) alone; see mertens_liouville_isolated.
SignedSum liouville_isolated(Natural x, const IsolatedOptions& options = {});

/// Q(x), the number of squarefree k <= x, from Q(x) = sum_{d <= sqrt x} mu(d) floor(x/d^2)
/// (design.md identity 7): terms d <= D = x^(1/3) directly, and the d > D grouped by
/// k = floor(x/d^2) as sum_{k <= K} (M(isqrt(x/k)) - M(D)); the M values below Y = 2 x^(2/5) are
/// read from a sweep of mu over [1, Y), the larger ones (k <= x/Y^2) are Deléglise–Rivat
/// targets of the same sweep. options.sieve_limit is ignored.
/// Pre: 1 <= x <= max_isolated_squarefree_x (checked; InvalidArgument).
/// Complexity: time O(x^(2/5)) for the sweep and its targets plus O(x^(1/3)) for the direct
/// terms and points; memory O(x^(1/3)) (24 bytes per point) plus 3 MiB per thread.
Count squarefree_isolated(Natural x, const IsolatedOptions& options = {});

/// det(1 + A(H_x)) = (-1)^((Q(x) + M(x))/2 - 1) (design.md identity 3).
/// Pre: Q(x) + M(x) is even (always true for the true values; checked, InternalError), x >= 1.
int fredholm_from_counts(Count squarefree, SignedSum mertens);

}  // namespace sqfc::arith
