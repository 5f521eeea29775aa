// SPDX-License-Identifier: MIT
// Slow tests of linalg/fredholm_checks over the full range of issue 4: FLINT's determinant of
// 1 + A(H_n) = prod -mu(k) (design.md identity 3; unimodularity of connection graphs, published
// 2016) for every n <= 2000 by one fraction-free elimination, by fmpz_mat_det for every n <= 300
// and at n = 1000 and 2000, and by the certified route at n = 2000; PARI's matdet at n = 1000;
// the characteristic polynomial and the Bowen–Lanford zeta identity for every n <= 300. Each
// long step records its time as a test property.
#include "sqfc/linalg/fredholm_checks.hpp"

#include <gtest/gtest.h>

#include <chrono>
#include <cstdint>
#include <string>

#include "linalg/linalg_test_support.hpp"
#include "oracles/pari_oracle.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/linalg/bordered_green.hpp"

namespace {

using sqfc::Natural;
using sqfc::linalg::ExactInteger;
namespace linalg = sqfc::linalg;
namespace testing_support = sqfc::testing;

// Runs f, records its wall time in seconds under `name`, returns f's result.
template <class F>
auto timed(const std::string& name, F&& f) {
  const auto start = std::chrono::steady_clock::now();
  auto result = f();
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ::testing::Test::RecordProperty(name + "_seconds", std::to_string(seconds));
  return result;
}

TEST(FredholmChecksSlow, PrefixDeterminantsForEveryNUpTo2000) {
  const testing_support::SquarefreeOracle oracle(2000);
  const auto dets = timed("prefix_n2000", [&] {
    return linalg::fredholm_determinants_of_prefixes_flint(oracle.vertices, oracle.vertices.size());
  });
  ASSERT_EQ(dets.size(), oracle.vertices.size());
  int product = 1;
  std::uint64_t checked = 0;
  for (std::size_t k = 0; k < dets.size(); ++k) {
    product *= -oracle.mu[oracle.vertices[k]];
    ASSERT_EQ(dets[k], ExactInteger::of(product)) << "n = " << oracle.vertices[k];
    ++checked;
  }
  EXPECT_EQ(checked, 1214U);  // Q(2000) = 1215 (PARI/GP 2.15)
}

TEST(FredholmChecksSlow, FmpzDeterminantForEveryNUpTo300) {
  const testing_support::SquarefreeOracle oracle(300);
  std::uint64_t checked = 0;
  for (std::size_t count = 1; count <= oracle.vertices.size(); ++count) {
    ASSERT_EQ(linalg::fredholm_determinant_flint(oracle.vertices, count),
              ExactInteger::of(oracle.product_of_minus_mu(oracle.vertices[count - 1])))
        << "n = " << oracle.vertices[count - 1];
    ++checked;
  }
  EXPECT_EQ(checked, 182U);  // Q(300) = 183 (PARI/GP 2.15)
}

TEST(FredholmChecksSlow, FmpzDeterminantAtN1000AndPariAgrees) {
  const testing_support::SquarefreeOracle oracle(1000);
  const std::size_t v = oracle.vertices.size();
  const auto det = timed("fmpz_mat_det_n1000", [&] { return linalg::fredholm_determinant_flint(oracle.vertices, v); });
  EXPECT_EQ(det, ExactInteger::of(oracle.product_of_minus_mu(1000)));
  const auto h = linalg::shared_factor_fredholm_matrix(oracle.vertices, v);
  EXPECT_EQ(timed("pari_matdet_n1000", [&] { return sqfc::oracles::pari_determinant(h.entries, v); }), det.decimal);
  // The exploratory divisibility determinant at n = 1000, FLINT against PARI.
  const auto g = linalg::divisibility_fredholm_matrix(oracle.vertices, v);
  const auto div = timed("divisibility_n1000", [&] { return linalg::divisibility_fredholm_determinant(oracle.vertices, v); });
  EXPECT_EQ(sqfc::oracles::pari_determinant(g.entries, v), div.decimal);
}

TEST(FredholmChecksSlow, FmpzDeterminantAtN2000) {
  const testing_support::SquarefreeOracle oracle(2000);
  const auto det = timed("fmpz_mat_det_n2000",
                         [&] { return linalg::fredholm_determinant_flint(oracle.vertices, oracle.vertices.size()); });
  EXPECT_EQ(det, ExactInteger::of(oracle.product_of_minus_mu(2000)));
  EXPECT_EQ(det, ExactInteger::of(-1));  // prod -mu(k) for k <= 2000 (the oracle, asserted above)
}

TEST(FredholmChecksSlow, CertifiedRouteAtN2000) {
  const testing_support::SquarefreeOracle oracle(2000);
  const auto& vertices = oracle.vertices;
  linalg::BorderedGreen g(vertices.size(), 1ULL << 30, 2);
  for (std::size_t i = 0; i < vertices.size(); ++i)
    g.add_vertex(sqfc::complex::shared_factor_neighbours_below(vertices, i));
  EXPECT_TRUE(timed("certify_inverse_n2000", [&] { return linalg::certify_inverse(vertices, g, 2); }));
  EXPECT_EQ(timed("sign_mod_prime_n2000", [&] { return linalg::determinant_sign_mod_prime(vertices, vertices.size()); }),
            oracle.product_of_minus_mu(2000));
  EXPECT_EQ(linalg::certified_fredholm_determinant(vertices, g, 2), oracle.product_of_minus_mu(2000));
  // One changed entry (the last diagonal one, and one off the diagonal) breaks the certificate.
  auto changed = testing_support::green_matrix(g);
  const std::size_t last = vertices.size() - 1;
  changed.at(last, last) += 1;
  EXPECT_FALSE(linalg::certify_inverse(vertices, changed, 2));
  changed.at(last, last) -= 1;
  ASSERT_TRUE(linalg::certify_inverse(vertices, changed, 2));
  changed.at(17, 600) -= 1;
  EXPECT_FALSE(linalg::certify_inverse(vertices, changed, 2));
}

TEST(FredholmChecksSlow, CharacteristicPolynomialAndZetaIdentityForEveryNUpTo300) {
  const testing_support::SquarefreeOracle oracle(300);
  std::uint64_t checked = 0;
  for (std::size_t count = 1; count <= oracle.vertices.size(); ++count) {
    const Natural n = oracle.vertices[count - 1];
    const auto zeta = linalg::check_zeta_identity(oracle.vertices, count);
    ASSERT_TRUE(zeta.holds()) << n << ": " << zeta.from_zeta.decimal << " vs " << zeta.from_determinant.decimal;
    ASSERT_EQ(zeta.from_zeta, ExactInteger::of(oracle.product_of_minus_mu(n))) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 182U);
}

}  // namespace
