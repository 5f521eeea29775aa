// SPDX-License-Identifier: MIT
// Eigenvalue signs of symmetric integer matrices with LAPACK's dsyev.
#include "sqfc/linalg/spectrum.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "sqfc/core/error.hpp"

// LAPACK's Fortran interface (Debian's liblapack, 32-bit integers). gfortran passes the length of
// each CHARACTER argument as a trailing hidden size_t argument, declared here so that the call
// matches the callee's ABI exactly.
extern "C" void dsyev_(const char* jobz, const char* uplo, const int* n, double* a, const int* lda, double* w,
                       double* work, const int* lwork, int* info, std::size_t jobz_length, std::size_t uplo_length);

namespace sqfc::linalg {

std::vector<double> symmetric_eigenvalues(const SquareMatrix& m) {
  const std::size_t d = m.dimension;
  if (d > max_spectrum_dimension)
    throw InvalidArgument("eigenvalues are limited to dimension " + std::to_string(max_spectrum_dimension) + ", got " +
                          std::to_string(d));
  constexpr std::int64_t exact_double = std::int64_t{1} << 53;
  std::vector<double> a(d * d);
  for (std::size_t i = 0; i < d; ++i)
    for (std::size_t j = 0; j < d; ++j) {
      const std::int64_t v = m.at(i, j);
      if (v != m.at(j, i))
        throw InvalidArgument("eigenvalue signs need a symmetric matrix; entries (" + std::to_string(i) + ", " +
                              std::to_string(j) + ") and its transpose differ");
      if (v > exact_double || v < -exact_double)
        throw InvalidArgument("matrix entry " + std::to_string(v) + " is not exactly representable as a double");
      a[i * d + j] = static_cast<double>(v);  // symmetric, so row- and column-major agree
    }
  std::vector<double> w(d);
  if (d == 0) return w;
  const int n = static_cast<int>(d);
  int info = 0, lwork = -1;
  double optimal = 0;
  dsyev_("N", "L", &n, a.data(), &n, w.data(), &optimal, &lwork, &info, 1, 1);  // workspace query
  if (info != 0) throw InternalError("LAPACK dsyev workspace query failed, info = " + std::to_string(info));
  lwork = std::max(static_cast<int>(optimal), 3 * n);
  std::vector<double> work(static_cast<std::size_t>(lwork));
  dsyev_("N", "L", &n, a.data(), &n, w.data(), work.data(), &lwork, &info, 1, 1);
  if (info != 0) throw InternalError("LAPACK dsyev failed to converge, info = " + std::to_string(info));
  return w;
}

SpectrumSigns symmetric_spectrum_signs(const SquareMatrix& m) {
  const std::vector<double> eigenvalues = symmetric_eigenvalues(m);
  SpectrumSigns signs;
  signs.dimension = m.dimension;
  if (eigenvalues.empty()) return signs;
  // ||M||_F from the sum of squares in long double (64-bit mantissa: exact for the 0/1 matrices
  // here, whose sum of squares is at most V^2 < 2^24).
  long double squares = 0;
  for (const auto v : m.entries) squares += static_cast<long double>(v) * static_cast<long double>(v);
  signs.frobenius_norm = static_cast<double>(std::sqrt(squares));
  signs.error_bound = spectrum_error_factor * static_cast<double>(m.dimension) *
                      std::numeric_limits<double>::epsilon() * signs.frobenius_norm;
  signs.minimum = eigenvalues.front();
  signs.maximum = eigenvalues.back();
  for (const double lambda : eigenvalues) {
    if (lambda > 0) ++signs.positive;
    else if (lambda < 0) ++signs.negative;
    signs.smallest_magnitude = std::min(signs.smallest_magnitude, std::fabs(lambda));
  }
  signs.verified = signs.smallest_magnitude > signs.error_bound;
  return signs;
}

SpectrumSigns fredholm_spectrum_signs(const std::vector<Natural>& vertices, std::size_t count) {
  if (count > vertices.size())
    throw InvalidArgument("the spectrum needs " + std::to_string(count) + " vertices but only " +
                          std::to_string(vertices.size()) + " are given");
  if (count > 0 && vertices[count - 1] > max_spectrum_n)
    throw InvalidArgument("the spectrum is limited to n <= " + std::to_string(max_spectrum_n) + ", got vertex " +
                          std::to_string(vertices[count - 1]));
  return symmetric_spectrum_signs(shared_factor_fredholm_matrix(vertices, count));
}

}  // namespace sqfc::linalg
