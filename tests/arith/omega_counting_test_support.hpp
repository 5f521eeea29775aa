// SPDX-License-Identifier: MIT
// Helpers of the omega-counting tests: histograms of squarefree n by omega from the segmented
// sieve (the independent method), and their comparison with count_by_omega.
#pragma once

#include <gtest/gtest.h>

#include <array>
#include <cstdint>
#include <string>

#include "oracles/published_csv.hpp"
#include "sqfc/arith/omega_counting.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/config.hpp"

namespace sqfc::testing {

inline std::string omega_data_path(const char* name) { return std::string(SQFC_TEST_DATA_DIR) + "/" + name; }

/// Squarefree and odd squarefree n by omega(n), over some set of n.
struct OmegaHistogram {
  std::array<std::uint64_t, config::omega_slots> all{};
  std::array<std::uint64_t, config::omega_slots> odd{};

  void add(Natural n, int omega) {
    ++all[static_cast<std::size_t>(omega)];
    if (n & 1) ++odd[static_cast<std::size_t>(omega)];
  }
  OmegaHistogram& operator+=(const OmegaHistogram& o) {
    for (std::size_t m = 0; m < all.size(); ++m) all[m] += o.all[m], odd[m] += o.odd[m];
    return *this;
  }
};

/// The histogram of the squarefree n in [lo, hi), by the segmented sieve.
inline OmegaHistogram sieved_histogram(Natural lo, Natural hi) {
  OmegaHistogram h;
  arith::sieve_range(lo, hi, [&](const arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i)
      if (b.is_squarefree(i)) h.add(b.lo() + i, b.omega(i));
  });
  return h;
}

/// Entry m of a count vector, 0 past its end.
inline std::uint64_t entry(const std::vector<std::uint64_t>& v, std::size_t m) { return m < v.size() ? v[m] : 0; }

/// True when count_by_omega's answer equals the histogram in every slot, and the vectors have
/// the documented shape: equal lengths, no nonzero count left out, a nonzero last total.
inline ::testing::AssertionResult same_counts(const arith::OmegaCounts& c, const OmegaHistogram& h) {
  if (c.squarefree_by_omega.size() != c.odd_squarefree_by_omega.size() || c.squarefree_by_omega.empty())
    return ::testing::AssertionFailure() << "vector lengths " << c.squarefree_by_omega.size() << " and "
                                         << c.odd_squarefree_by_omega.size();
  if (c.squarefree_by_omega.back() == 0) return ::testing::AssertionFailure() << "last total is 0";
  for (std::size_t m = 0; m < h.all.size(); ++m) {
    if (entry(c.squarefree_by_omega, m) != h.all[m] || entry(c.odd_squarefree_by_omega, m) != h.odd[m])
      return ::testing::AssertionFailure() << "omega " << m << ": counted " << entry(c.squarefree_by_omega, m) << " / "
                                           << entry(c.odd_squarefree_by_omega, m) << " (odd), sieve " << h.all[m]
                                           << " / " << h.odd[m];
  }
  return ::testing::AssertionSuccess();
}

/// Sum over m of squarefree_by_omega: Q(x).
inline std::uint64_t total_squarefree(const arith::OmegaCounts& c) {
  std::uint64_t q = 0;
  for (const auto v : c.squarefree_by_omega) q += v;
  return q;
}

/// Checks count_by_omega at the points b of `points` (sorted, > a) against count_by_omega(a)
/// plus the sieve's histogram of (a, b]. Returns the number of points checked.
inline int check_window(Natural a, const std::vector<Natural>& points, unsigned threads) {
  const auto base = arith::count_by_omega(a, threads);
  OmegaHistogram running;
  for (std::size_t m = 0; m < running.all.size(); ++m) {
    running.all[m] = entry(base.squarefree_by_omega, m);
    running.odd[m] = entry(base.odd_squarefree_by_omega, m);
  }
  Natural done = a;
  int checked = 0;
  for (const Natural b : points) {
    running += sieved_histogram(done + 1, b + 1);
    done = b;
    EXPECT_TRUE(same_counts(arith::count_by_omega(b, threads), running)) << "x = " << b << " (window from " << a << ")";
    ++checked;
  }
  return checked;
}

}  // namespace sqfc::testing
