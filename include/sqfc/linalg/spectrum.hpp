// SPDX-License-Identifier: MIT
/// @file spectrum.hpp  Numbers of positive and negative eigenvalues of 1 + A(H_n), from LAPACK, with
/// a margin that shows no eigenvalue's sign can be a rounding artefact.
#pragma once

#include <cstddef>
#include <limits>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/linalg/fredholm_checks.hpp"

namespace sqfc::linalg {

/// Largest n (the last vertex used) that fredholm_spectrum_signs accepts: 5000 (3041 vertices,
/// 6-8 s with Debian's reference LAPACK and BLAS on the development machine, 2026-12; the cost
/// grows as V^3).
inline constexpr Natural max_spectrum_n = 5000;
/// Largest dimension symmetric_eigenvalues accepts: 4096 (128 MiB of doubles, about 20 s).
inline constexpr std::size_t max_spectrum_dimension = 4096;
/// The constant c in the error bound c * V * eps * ||M||_F. LAPACK's symmetric eigen-solvers are
/// backward stable: the computed eigenvalues are exact for some M + E with ||E||_2 <= p(V) eps ||M||_2,
/// p a modest function of V (LAPACK Users' Guide, 3rd ed., section 4.7), so by Weyl's inequality
/// each computed eigenvalue is within ||E||_2 of a true one. Taking p(V) = c V with c = 100 and
/// ||M||_2 <= ||M||_F leaves room over the usual estimates; it is a standard a priori bound, not an
/// interval proof. (The exact proof of the inertia is the bordering's pivot signs, Sylvester's law.)
inline constexpr double spectrum_error_factor = 100.0;

/// Eigenvalue sign counts of a symmetric matrix, with the evidence that they are right.
/// Invariant: positive + negative <= dimension, with equality unless a computed eigenvalue is
/// exactly 0 (counted as neither; it also makes verified false).
struct SpectrumSigns {
  std::size_t dimension = 0;
  Count positive = 0;  ///< eigenvalues > 0
  Count negative = 0;  ///< eigenvalues < 0
  double minimum = 0, maximum = 0;  ///< smallest and largest eigenvalue (0 when dimension == 0)
  double smallest_magnitude = std::numeric_limits<double>::infinity();  ///< min |eigenvalue|
  double frobenius_norm = 0;  ///< ||M||_F, exact up to one rounding
  double error_bound = 0;     ///< spectrum_error_factor * V * eps * ||M||_F
  /// True when smallest_magnitude > error_bound: then every computed sign is the true sign.
  bool verified = true;
  /// smallest_magnitude - error_bound: how far the closest eigenvalue is from losing its sign.
  [[nodiscard]] double margin() const noexcept { return smallest_magnitude - error_bound; }
};

/// All eigenvalues of the symmetric matrix m, increasing, by LAPACK's dsyev (eigenvalues only:
/// Householder tridiagonalisation, then the root-free QL/QR iteration).
/// Pre: m symmetric (checked; InvalidArgument); entries of magnitude <= 2^53, so that they are
/// exact doubles (checked; InvalidArgument); dimension <= max_spectrum_dimension (checked;
/// InvalidArgument). Complexity: about (4/3) V^3 flops, 8 V^2 bytes.
/// Throws: InternalError when LAPACK reports a failure (info != 0).
/// Thread-safety: safe to call concurrently (reference LAPACK keeps no state).
std::vector<double> symmetric_eigenvalues(const SquareMatrix& m);

/// Sign counts and margin of the symmetric matrix m, from symmetric_eigenvalues.
/// Pre and complexity as symmetric_eigenvalues.
SpectrumSigns symmetric_spectrum_signs(const SquareMatrix& m);

/// Sign counts and margin of 1 + A(H) on vertices [0, count). By the published 2017 result the
/// counts are the numbers of even- and odd-dimensional faces (design.md identity 5); this routine
/// computes them numerically and does not assume so.
/// Pre: count <= vertices.size() and the last vertex used is <= max_spectrum_n (checked;
/// InvalidArgument). Complexity: as symmetric_eigenvalues (6-8 s for n = 5000).
SpectrumSigns fredholm_spectrum_signs(const std::vector<Natural>& vertices, std::size_t count);

}  // namespace sqfc::linalg
