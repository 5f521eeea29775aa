// SPDX-License-Identifier: MIT
// The Fredholm run: bordered Green function or closed form, sampled as n grows.
#include "sqfc/track/fredholm_run.hpp"

#include <algorithm>
#include <memory>
#include <string>

#include "sqfc/arith/factor.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/linalg/bordered_green.hpp"
#include "sqfc/linalg/fredholm_checks.hpp"
#include "sqfc/linalg/spectrum.hpp"
#include "sqfc/linalg/green_closed_form.hpp"

namespace sqfc::track {
bool FredholmRunReport::all_checks_passed() const { return all_passed(checks); }

void check_fredholm_options(const FredholmRunOptions& options) {
  if (options.to < 1) throw InvalidArgument("--to must be at least 1");
  if (options.to > 200'000'000ULL)
    throw InvalidArgument("fredholm runs are limited to n <= 2*10^8 (closed-form tables take 12 bytes per integer)");
  if (options.method == FredholmMethod::bordered) {
    Count vertices = 0;
    arith::sieve_range(2, options.to + 1, [&](const arith::SieveBlock& block) {
      for (std::size_t i = 0; i < block.size(); ++i) vertices += block.is_squarefree(i) ? 1 : 0;
    });
    linalg::BorderedGreen::check_memory(vertices, options.memory_limit);
  }
}

FredholmRunReport run_fredholm(const FredholmRunOptions& options, FredholmSink& sink, const ProgressFn& progress) {
  check_fredholm_options(options);
  CheckTally tally;
  const auto schur = tally.add("schur_sign", "s = 1 - a^T g a equals -mu(k) at every vertex (design.md identity 3; mu by FLINT factoring)");
  const auto determinant = tally.add("fredholm_parity", "det(1 + A(H_n)) = prod -mu(k) = (-1)^((Q+M)/2 - 1) (unimodularity, published 2016)");
  const auto energy = tally.add("energy", "sum of all Green entries = 1 - M(n) (energy theorem, published 2017/2019)");
  const auto inertia = tally.add("inertia", "positive/negative eigenvalues of 1 + A = even/odd-dimensional faces (published 2017)");
  const auto closed = tally.add("closed_form", "every Green entry equals -mu(x)mu(y)mu(l)M_l(n/l) (design.md identity 6)");
  const auto flint_det = tally.add("flint_determinant", "det(1 + A(H_n)) by FLINT fraction-free elimination equals the bordered product of s");
  const auto certified = tally.add("certified_inverse", "(1 + A) g = I exactly and det = +-1 mod a 62-bit prime: a proof of det(1 + A(H_n))");
  const auto zeta = tally.add("zeta_identity", "det(1 + A) = 1/zeta(-1), zeta(z) = 1/det(1 - zA) (Bowen-Lanford), by the FLINT characteristic polynomial");
  const auto spectrum = tally.add("spectrum_signs", "LAPACK eigenvalue signs (verified margin) = even/odd-dimensional face counts (published 2017)");

  // M(n), Q(n) and the face parities come from the closed-form tables in both methods; the
  // bordered method checks against them, it does not use them.
  const linalg::GreenClosedForm tables(options.to);
  const auto vertices = complex::squarefree_vertices(options.to);
  if (options.flint_checks && (options.method != FredholmMethod::bordered || options.to > linalg::max_exact_determinant_n))
    throw InvalidArgument("FLINT checks need the bordered method and --to <= " + std::to_string(linalg::max_exact_determinant_n));
  // One FLINT elimination gives the determinant of every prefix (every n at once).
  std::vector<linalg::ExactInteger> prefix_determinants;
  if (options.flint_checks) prefix_determinants = linalg::fredholm_determinants_of_prefixes_flint(vertices, vertices.size());

  FredholmRow row;
  SignedSum mertens = 0;
  Count squarefree = 0;
  std::unique_ptr<linalg::BorderedGreen> green;
  if (options.method == FredholmMethod::bordered)
    green = std::make_unique<linalg::BorderedGreen>(vertices.size(), options.memory_limit, options.threads);
  std::size_t next_vertex = 0;
  Count edges = 0;
  FredholmRunReport report;

  // The next sample point, looked up once per sample rather than once per n.
  auto sample = options.samples.next_at_or_after(1);
  for (Natural n = 1; n <= options.to; ++n) {
    const int mu_n = tables.mu(n);
    mertens += mu_n;
    if (mu_n != 0) ++squarefree;
    if (mu_n != 0 && n >= 2) {
      const bool odd_dimension = mu_n == 1;  // omega even <=> dimension odd
      (odd_dimension ? row.odd_faces : row.even_faces) += 1;
      if (green) {
        const auto neighbours = complex::shared_factor_neighbours_below(vertices, next_vertex);
        edges += neighbours.size();
        const int s = green->add_vertex(neighbours);
        tally.record(schur, s == -arith::arithmetic_values(n).mu, n);
      }
      ++next_vertex;
    }
    if (!sample || *sample != n) {
      if (progress && (n & 0xFFF) == 0) progress(n, options.to);
      continue;
    }
    row.n = n;
    row.vertices = next_vertex;
    row.mertens = mertens;
    const SignedSum exponent = (static_cast<SignedSum>(squarefree) + mertens) / 2 - 1;
    const int expected_sign = exponent % 2 == 0 ? 1 : -1;
    row.stats.reset();
    row.checks.clear();
    if (green) {
      row.edges = edges;
      row.fredholm = green->determinant();
      row.energy = green->energy();
      row.positive_eigenvalues = green->positive_pivots();
      row.negative_eigenvalues = green->negative_pivots();
      row.has_inertia = true;
      tally.record(inertia, row.positive_eigenvalues == row.even_faces && row.negative_eigenvalues == row.odd_faces, n,
                   &row.checks);
      if (options.green_stats) row.stats = green->statistics(n);
      if (options.cross_check) {
        bool all_equal = true;
        std::string mismatch;
        for (std::size_t i = 0; i < next_vertex && all_equal; ++i)
          for (std::size_t j = 0; j < next_vertex; ++j) {
            const auto expected_entry = tables.entry_at(n, vertices[i], vertices[j]);
            if (green->entry(i, j) != expected_entry) {
              all_equal = false;
              mismatch = "n = " + std::to_string(n) + ", x = " + std::to_string(vertices[i]) + ", y = " +
                         std::to_string(vertices[j]) + ": bordered " + std::to_string(green->entry(i, j)) +
                         ", closed form " + std::to_string(expected_entry);
              break;
            }
          }
        tally.record(closed, all_equal, n, &row.checks, mismatch);
      }
    } else {
      // No matrix: the determinant is the product formula itself, so it is not checked here.
      auto stats = tables.statistics_at(n);
      row.energy = stats.energy;
      if (options.green_stats) row.stats = std::move(stats);
      row.fredholm = expected_sign;
      row.edges = tables.shared_factor_edges_at(n);
      row.has_inertia = false;
    }
    if (green) tally.record(determinant, row.fredholm == expected_sign, n, &row.checks);
    row.flint_fredholm.reset();
    row.div_fredholm.reset();
    row.has_spectrum = false;
    if (options.flint_checks) {
      const auto flint = next_vertex == 0 ? linalg::ExactInteger::of(1) : prefix_determinants[next_vertex - 1];
      row.flint_fredholm = flint.decimal;
      tally.record(flint_det, flint.value && *flint.value == row.fredholm, n, &row.checks);
      tally.record(certified, linalg::certified_fredholm_determinant(vertices, *green, options.threads) == row.fredholm, n,
                   &row.checks);
      if (n <= linalg::max_characteristic_polynomial_n && next_vertex > 0) {
        const auto z = linalg::check_zeta_identity(vertices, next_vertex);
        tally.record(zeta, z.holds() && z.from_zeta.value && *z.from_zeta.value == row.fredholm, n, &row.checks);
      }
    }
    if (options.spectrum && n <= linalg::max_spectrum_n) {
      const auto signs = linalg::fredholm_spectrum_signs(vertices, next_vertex);
      row.has_spectrum = true;
      row.spectrum_positive = signs.positive;
      row.spectrum_negative = signs.negative;
      row.spectrum_margin = next_vertex == 0 ? 0.0 : signs.margin();
      tally.record(spectrum, signs.verified && signs.positive == row.even_faces && signs.negative == row.odd_faces, n,
                   &row.checks);
    }
    if (options.divisibility && n <= linalg::max_exact_determinant_n)
      row.div_fredholm = next_vertex == 0 ? std::string("1") : linalg::divisibility_fredholm_determinant(vertices, next_vertex).decimal;
    tally.record(energy, row.energy == 1 - mertens, n, &row.checks);
    if (options.on_matrix && options.matrix_at == n) {
      if (green)
        options.on_matrix(n, vertices, next_vertex, [&](std::size_t i, std::size_t j) { return green->entry(i, j); });
      else
        options.on_matrix(n, vertices, next_vertex,
                          [&](std::size_t i, std::size_t j) { return tables.entry_at(n, vertices[i], vertices[j]); });
    }
    ++report.rows;
    sink.on_row(row);
    sample = options.samples.next_at_or_after(n + 1);
    if (progress) progress(n, options.to);
  }
  report.checks = tally.take();
  // Drop checks that did not apply to this method, so the manifest lists what really ran.
  std::erase_if(report.checks, [](const CheckOutcome& c) { return c.passed == 0 && c.failed == 0; });
  return report;
}

}  // namespace sqfc::track
