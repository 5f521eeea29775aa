// SPDX-License-Identifier: MIT
// The sweep behind the isolated values: mu sieved over [1, Y) in segments, with weighted
// lookups of M(v) (points and Deléglise–Rivat lookup ranges) and mu-weighted quotient sums.
#pragma once

#include <cstdint>
#include <functional>
#include <vector>

#include "detail_sweep_kernels.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::arith::detail {

/// A sum of M values, mu sums and constants, collected in slots during one pass of mu over
/// [1, limit). Every M(v) it reads has v < limit. Slots add up independently; several
/// targets may share one slot (their values add).
class MobiusSweep {
 public:
  /// Pre: 2 <= limit <= 2^44 (checked; InvalidArgument).
  explicit MobiusSweep(Natural limit);

  [[nodiscard]] Natural limit() const noexcept { return limit_; }
  /// A new slot, initially 0; returns its index.
  std::uint32_t add_slot();
  /// Adds weight * M(v). Pre: 1 <= v < limit (checked; InvalidArgument).
  void add_point(Natural v, SignedSum weight, std::uint32_t slot);
  /// Adds a constant.
  void add_constant(std::uint32_t slot, Wide value);
  /// Adds M(x) by the Deléglise–Rivat identity with u = ceil(x / limit); x < limit is a point.
  /// @param mu  mu(m) for every m <= u (index m; index 0 unused).
  /// Pre: isqrt(x) < limit, u < limit, mu.size() > u (checked; InvalidArgument).
  void add_mertens_target(Natural x, std::uint32_t slot, const std::vector<std::int8_t>& mu);
  /// The u that add_mertens_target(x) uses: ceil(x / limit).
  [[nodiscard]] Natural split_for(Natural x) const noexcept { return x / limit_ + (x % limit_ != 0 ? 1 : 0); }

  /// Where each target term switches from lookups to grouped sums: at n = c isqrt(x/m)
  /// (at least floor(u/m)). Any c in (0, 4] gives the same result; only the cost moves.
  /// Pre: called before add_mertens_target; 0 < c <= 4 (checked; InvalidArgument).
  void set_lookup_share(double c);
  /// The c that add_mertens_target uses; default_lookup_share unless set.
  [[nodiscard]] double lookup_share() const noexcept { return lookup_share_; }
  /// The default c, measured on the development machine (docs/algorithms/mertens-isolated.md).
  static constexpr double default_lookup_share = 0.4;

  /// The inner loops to run (default: the fastest this CPU has). Pre: the CPU can run them.
  void use_kernels(SweepKernels kernels) noexcept { kernels_ = kernels; }

  /// Runs the pass; returns the value of every slot. The result does not depend on threads.
  /// Pre: threads >= 1 (checked). Throws: what progress throws; InvalidArgument.
  std::vector<Wide> run(unsigned threads, const std::function<void(double)>& progress);

  /// One squarefree m of a target: the lookups M(floor(xm / n)) for n in [n_first, n_last]
  /// and the sum of mu(v) floor(xm / v) over v in [1, v_max], both times sign = -mu(m).
  struct Term {
    Natural xm = 0;
    Natural n_first = 0;
    Natural n_last = 0;
    Natural v_max = 0;
    double xm_double = 0;
    std::uint32_t slot = 0;
    int sign = 0;
  };
  struct Point {
    Natural v;
    SignedSum weight;
    std::uint32_t slot;
  };

 private:
  Natural limit_;
  SweepKernels kernels_ = fastest_sweep_kernels();
  double lookup_share_ = default_lookup_share;
  std::vector<Wide> constants_;
  std::vector<Point> points_;
  std::vector<Term> lookup_terms_;  // terms with n_first <= n_last
  std::vector<Term> mu_terms_;      // terms with v_max >= 1
};

/// mu(m) for m in [0, n] (index 0 is 0), by a plain sieve (not the sweep's). Pre: n <= 10^16 (checked); memory 2n bytes.
std::vector<std::int8_t> mu_table(Natural n);

/// floor(x^(1/3)) exactly.
Natural integer_cbrt(Natural x) noexcept;

}  // namespace sqfc::arith::detail
