// SPDX-License-Identifier: MIT
/// @file identity_suite.hpp  The identity suite of design.md section 2: every identity checked over a
/// range of n by two independent routes, with pass/fail, the range and the first failure per check.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::track {

/// Largest --to of the suite: 10^8. Memory is about 17 bytes per n (a reference sieve byte, M of
/// the reference, M, Q and L of the engine) plus the direct homology to 10^7 at most; measured
/// peak 1.95 GB and 56 s at 10^8 on two cores (docs/algorithms/identity-suite.md).
inline constexpr Natural max_identity_suite_n = 100'000'000ULL;

/// The sub-ranges of the expensive checks (each is also cut to --to). Defaults keep
/// `sqfc check --to 1e6` well inside a minute on two cores (tests/bench/bench_check.sh).
struct IdentitySuiteBounds {
  Natural persistence_to = 10'000'000;    ///< direct persistent homology (compute_persistence; 0.2 s at 10^7)
  Natural flint_determinant_to = 1000;    ///< FLINT leading principal minors of 1 + A(H_n) (608 vertices)
  Natural bordered_to = 3000;             ///< bordered exact inverse of 1 + A(H_n) (1824 vertices)
  Natural green_every_n_to = 300;         ///< all Green entries compared at every n up to this, and at bordered_to
  Natural lapack_every_n_to = 200;        ///< LAPACK inertia at every n up to this, and at lapack_last_n
  Natural lapack_last_n = 1000;
  Natural closed_energy_every_n_to = 2000;  ///< closed-form energy at every n up to this, and at closed_energy_samples points above
  Count closed_energy_samples = 100;
  Natural closed_energy_to = 10'000'000;
  Natural arithmetic_every_n_to = 1'000'000;  ///< literal divisor-sum formulas at every n up to this ...
  Count arithmetic_samples = 2000;            ///< ... and at this many evenly spaced n above it (plus --to)
  Natural divisibility_enumeration_to = 1'000'000;  ///< G_n edge enumeration
  Natural shared_factor_to = 5000;                  ///< H_n edge enumeration and formula at every n
};

/// Test hook (mutation tests): the value that check `check` obtains from its first route at n
/// is changed before the comparison, by adding 1, or by negating it for a +-1 value (a
/// determinant sign). A suite that does not then fail that check at exactly n is broken.
struct IdentityCorruption {
  std::string check;  ///< a check name, e.g. "euler_characteristic"
  Natural n = 0;      ///< where to corrupt; a point the check does not visit corrupts nothing
};

/// Parameters of one suite run.
struct IdentitySuiteOptions {
  Natural to = 1'000'000;                 ///< largest n, inclusive
  unsigned threads = 1;
  std::vector<int> identities;            ///< design.md identity numbers 1..8 to run; empty = all
  IdentitySuiteBounds bounds;
  std::optional<IdentityCorruption> corruption;
};

/// The first n where a check's two routes disagreed.
struct IdentityFailure {
  Natural n = 0;
  std::string expected;  ///< the reference route's value (decimal; a vector as "[a, b, ...]")
  std::string got;       ///< the value under test
};

/// Outcome of one check.
struct IdentityCheckResult {
  int identity = 0;        ///< design.md section 2 number, 1..8
  std::string name;        ///< stable identifier, e.g. "betti_persistence"
  std::string statement;   ///< what is compared
  std::string source;      ///< paper or classical source
  std::string routes;      ///< "got" route vs "expected" route
  Natural from = 1;        ///< smallest n checked
  Natural to = 0;          ///< largest n checked (0 when nothing was)
  std::string coverage;    ///< which n in [from, to]: "every n", or the sample
  bool reduced_range = false;  ///< true when `to` is below the suite's --to because the check is expensive
  Count points = 0;        ///< number of n visited
  Count compared = 0;      ///< scalar values compared
  Count failed = 0;        ///< n at which the routes disagreed
  std::optional<IdentityFailure> first_failure;
  [[nodiscard]] bool passed() const noexcept { return failed == 0 && compared > 0; }
};

/// What a suite run reports.
struct IdentitySuiteReport {
  Natural to = 0;
  std::vector<int> identities;               ///< the identities run, increasing
  std::vector<IdentityCheckResult> checks;   ///< in identity order
  std::vector<std::string> engine_checks_failed;  ///< names of the table engine's own self-checks that failed
  std::optional<IdentityCorruption> corruption;   ///< the test corruption of the run, if any (reports must say so)
  [[nodiscard]] bool passed() const noexcept;
};

/// Short name of identity i (1..8): "euler", "betti", "unimodularity", "energy", "spectrum",
/// "green", "arithmetic", "counts". Pre: 1 <= i <= 8 (checked; InvalidArgument).
std::string_view identity_short_name(int i);
/// Title of identity i as in design.md, e.g. "Euler characteristic".
std::string_view identity_title(int i);

/// Parses a comma-separated list of identity numbers (1..8) and short names into a sorted,
/// de-duplicated list. Throws: InvalidArgument naming the first unknown entry.
std::vector<int> parse_identity_list(std::string_view text);

/// Names of every check of identity i, in report order (for --inject-fault validation).
std::vector<std::string> identity_check_names(int i);

/// Runs the suite over n = 1..options.to. The routes of each check are independent: the table
/// engine (segmented sieve, incremental tracker) against a plain unsegmented Eratosthenes sieve
/// written here, direct persistent homology, FLINT elimination, the bordered inverse, LAPACK, the
/// closed-form Green function and explicit edge enumeration (docs/algorithms/identity-suite.md).
/// Pre: 1 <= to <= max_identity_suite_n (checked; InvalidArgument); threads >= 1 (checked);
/// identities in 1..8 (checked); a corruption names a check of a selected identity (checked).
/// Complexity: O(to log log to) for the sieves and the engine; O(A^1.5) for the literal arithmetic
/// sums with A = min(to, arithmetic_every_n_to); the matrix checks are bounded by the bounds above.
/// Memory about 17 bytes per n.
/// Throws: InvalidArgument; InternalError from a matrix routine that finds a non-unimodular step;
/// whatever @p progress throws (the run stops).
IdentitySuiteReport run_identity_suite(const IdentitySuiteOptions& options, const ProgressFn& progress = {});

}  // namespace sqfc::track
