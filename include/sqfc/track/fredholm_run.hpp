// SPDX-License-Identifier: MIT
/// @file fredholm_run.hpp  The Fredholm determinant and Green function of H_n as n grows.
#pragma once

#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/linalg/green_statistics.hpp"
#include "sqfc/track/sample_schedule.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::track {

/// How the Green function is obtained.
enum class FredholmMethod {
  bordered,  ///< exact inverse grown vertex by vertex (n <= about 10^4)
  closed,    ///< closed form of design.md identity 6, no matrix (n up to 2*10^8)
};

/// Parameters of `sqfc fredholm`.
struct FredholmRunOptions {
  Natural to = 1;
  SampleSchedule samples;
  FredholmMethod method = FredholmMethod::bordered;
  bool green_stats = false;        ///< histogram, extremes and distinct values at each sample
  bool cross_check = false;        ///< bordered: compare every entry with the closed form at each sample
  bool flint_checks = false;       ///< bordered: FLINT determinants, certified inverse, zeta identity (n <= 2000)
  bool spectrum = false;           ///< LAPACK eigenvalue signs at samples n <= 5000
  bool divisibility = false;       ///< exploratory det(1 + A(G_n)) at samples n <= 2000
  unsigned threads = 1;
  std::uint64_t memory_limit = std::uint64_t{4} << 30;  ///< bytes the bordered matrix may take
  /// When set, called at this sample n with the vertices and an accessor entry(i, j) of g_n
  /// (the bordered matrix, or the closed form for the closed method), e.g. to dump it.
  std::optional<Natural> matrix_at;
  std::function<void(Natural n, const std::vector<Natural>& vertices, std::size_t count,
                     const std::function<std::int64_t(std::size_t, std::size_t)>& entry)>
      on_matrix;
};

/// One sample point.
struct FredholmRow {
  Natural n = 0;
  Count vertices = 0;
  Count edges = 0;                ///< edges of H_n
  int fredholm = 1;               ///< det(1 + A(H_n))
  Wide energy = 0;                ///< sum of all Green entries
  SignedSum mertens = 0;          ///< M(n), for the energy identity
  std::optional<linalg::GreenStatistics> stats;
  Count positive_eigenvalues = 0;  ///< from the bordered pivots (Sylvester inertia); bordered only
  Count negative_eigenvalues = 0;
  bool has_inertia = false;
  Count even_faces = 0, odd_faces = 0;  ///< faces of even / odd dimension of K_n
  std::optional<std::string> flint_fredholm;  ///< det(1 + A(H_n)) by FLINT elimination (flint_checks)
  bool has_spectrum = false;                  ///< LAPACK signs below (spectrum)
  Count spectrum_positive = 0, spectrum_negative = 0;
  double spectrum_margin = 0;                 ///< smallest |eigenvalue| minus the error bound
  std::optional<std::string> div_fredholm;    ///< det(1 + A(G_n)), exploratory (divisibility)
  std::string checks;  ///< checks made at this row, "name" when passed, "name:FAIL" otherwise, ';'-separated
};

/// Receives rows in increasing n; the reference to the bordered state allows dumps and extra
/// checks at sample points (null for the closed method).
class FredholmSink {
 public:
  virtual ~FredholmSink() = default;
  virtual void on_row(const FredholmRow& row) = 0;
};

struct FredholmRunReport {
  std::vector<CheckOutcome> checks;
  Count rows = 0;
  [[nodiscard]] bool all_checks_passed() const;
};

/// Runs n = 1..to and reports each sample point. Checks at every squarefree n (bordered):
/// s = -mu(k) with mu from FLINT's factorisation (identity 3); at every sample: D = prod -mu(k)
/// = (-1)^((Q+M)/2 - 1), energy = 1 - M(n) (identity 4), inertia = even/odd face counts
/// (identity 5), and with cross_check every entry against the closed form (identity 6).
/// Pre: 1 <= to; bordered: 4 V^2 bytes <= memory_limit (checked; InvalidArgument naming the
/// estimate and --method closed); closed: to <= 2*10^8 (checked).
/// Complexity: bordered O(V^3 / threads) time, 4 V^2 bytes; closed O(to log log to) tables of
/// 12 bytes per integer plus O(to polylog to) per sample point.
FredholmRunReport run_fredholm(const FredholmRunOptions& options, FredholmSink& sink, const ProgressFn& progress = {});

/// Checks the preconditions of run_fredholm (range, memory of the bordered matrix) without
/// running, so a caller can refuse before writing anything. Throws: InvalidArgument.
/// Complexity: O(to log log to) for the bordered method (counts the vertices), O(1) otherwise.
void check_fredholm_options(const FredholmRunOptions& options);

}  // namespace sqfc::track
