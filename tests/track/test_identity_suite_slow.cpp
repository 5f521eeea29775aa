// SPDX-License-Identifier: MIT
// The identity suite with its default sub-ranges (bordered inverse to 3000, FLINT to 1000, LAPACK
// at 1000, every Green entry at 3000, H_n to 5000): every check passes and covers those ranges.
// Oracle: the suite's own second routes (FLINT, LAPACK, brute force); the expected counts and
// ranges are the suite's documented defaults (common practice: a test pins its own configuration).
#include <gtest/gtest.h>

#include "sqfc/track/identity_suite.hpp"

namespace sqfc::track {
namespace {

TEST(IdentitySuiteSlow, DefaultBoundsAtOneHundredThousand) {
  IdentitySuiteOptions o;
  o.to = 100'000;
  o.threads = 2;
  const auto r = run_identity_suite(o);
  EXPECT_TRUE(r.passed());
  ASSERT_EQ(r.checks.size(), 20u);
  int checked = 0;
  for (const auto& c : r.checks) {
    EXPECT_EQ(c.failed, 0u) << c.name;
    EXPECT_GT(c.points, 0u) << c.name;
    const Natural expected_to = c.name == "fredholm_flint" || c.name == "inertia_lapack" ? 1000
                                : c.name == "fredholm_bordered" || c.name == "energy_bordered" || c.name == "inertia_pivots" ||
                                        c.name == "green_closed_form" || c.name == "green_inverse_certificate"
                                    ? 3000
                                : c.name == "shared_factor_edges" ? 5000
                                                                  : 100'000;
    EXPECT_EQ(c.to, expected_to) << c.name;
    ++checked;
  }
  EXPECT_EQ(checked, 20);
}

}  // namespace
}  // namespace sqfc::track
