// SPDX-License-Identifier: MIT
// Slow tests of linalg/spectrum: eigenvalue signs of 1 + A(H_n) = even/odd face counts
// (design.md identity 5; published 2017) with a verified margin, at n = 1500, 2000, ..., 5000.
// Expected values: the even/odd-dimensional face counts from the independent squarefree
// enumeration oracle (tests/oracles/squarefree_enumeration.hpp); the eigenvalues come from LAPACK.
#include "sqfc/linalg/spectrum.hpp"

#include <gtest/gtest.h>

#include <chrono>
#include <cstdint>
#include <sstream>
#include <string>

#include "linalg/spectrum_test_support.hpp"

namespace {

TEST(SpectrumSlow, SignCountsAreFaceCountsUpTo5000) {
  std::uint64_t checked = 0;
  for (sqfc::Natural n = 1500; n <= sqfc::linalg::max_spectrum_n; n += 500) {
    const auto start = std::chrono::steady_clock::now();
    const auto signs = sqfc::testing::expect_spectrum_matches_faces(n);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    std::ostringstream note;
    note << "V=" << signs.dimension << " smallest=" << signs.smallest_magnitude << " bound=" << signs.error_bound
         << " seconds=" << seconds;
    ::testing::Test::RecordProperty("n" + std::to_string(n), note.str());
    ++checked;
  }
  EXPECT_EQ(checked, 8U);
}

}  // namespace
