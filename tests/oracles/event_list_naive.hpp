// SPDX-License-Identifier: MIT
// Oracle for tests only: the events of a run (zeros and records of M, records of M(n)/sqrt(n),
// first face and homology dimensions) listed by a plain pass over per-n values, with exact
// integer comparisons written out here rather than taken from the library.
#pragma once

#include <cmath>
#include <cstdint>
#include <vector>

#include "sqfc/track/events.hpp"

namespace sqfc::oracles {

/// Events for n in [1, omega.size() - 1], where omega[n] is omega(n) for squarefree n and -1
/// otherwise (index 0 unused). Only events with n >= from are listed; records still count
/// every n >= 1. Events of one n come in the order of the EventKind enumeration.
/// Definitions (events.hpp): a zero is M(n) = 0; a record high (low) of M is n >= 2 with M(n)
/// above (below) every M(k), 1 <= k < n; a scaled record is n > 200 with M(n)/sqrt(n) above
/// (below) every M(k)/sqrt(k), 200 <= k < n, compared exactly as M(n)^2 k against M(k)^2 n;
/// the first face of dimension d is the first squarefree n >= 2 with omega(n) = d + 1; b_0
/// first appears at n = 2 and b_d, d >= 1, at the first odd squarefree n with omega(n) = d + 1
/// (design.md identity 2, checked against direct homology in tests/topology).
/// Pre: |M(n)|^2 n < 2^63 for every n (true for n <= 10^8).
inline std::vector<track::Event> event_list_naive(const std::vector<std::int8_t>& omega, std::uint64_t from = 1) {
  using track::Event;
  using track::EventKind;
  std::vector<Event> events;
  const std::uint64_t n_max = omega.size() - 1;
  std::int64_t m = 0, high = 0, low = 0;
  // M(n)/sqrt(n) > M(k)/sqrt(k) exactly: compare signs, then M(n)^2 k with M(k)^2 n.
  const auto above = [](std::int64_t mn, std::uint64_t n, std::int64_t mk, std::uint64_t k) {
    const int sn = (mn > 0) - (mn < 0), sk = (mk > 0) - (mk < 0);
    if (sn != sk) return sn > sk;
    if (sn == 0) return false;
    const std::int64_t a = mn * mn * static_cast<std::int64_t>(k);
    const std::int64_t b = mk * mk * static_cast<std::int64_t>(n);
    return sn > 0 ? a > b : a < b;
  };
  std::int64_t best_m = 0, worst_m = 0;
  std::uint64_t best_n = 0, worst_n = 0;
  std::vector<bool> face_seen(16, false), homology_seen(16, false);
  for (std::uint64_t n = 1; n <= n_max; ++n) {
    const int w = omega[n];
    m += w < 0 ? 0 : (w % 2 ? -1 : 1);
    const bool report = n >= from;
    if (n == 1) {
      high = low = m;
    } else {
      if (m == 0 && report) events.push_back({EventKind::mertens_zero, n, 0, 0.0});
      if (m > high) {
        high = m;
        if (report) events.push_back({EventKind::mertens_high, n, m, 0.0});
      }
      if (m < low) {
        low = m;
        if (report) events.push_back({EventKind::mertens_low, n, m, 0.0});
      }
    }
    if (n == 200) {
      best_m = worst_m = m;
      best_n = worst_n = n;
    } else if (n > 200) {
      const double scaled = static_cast<double>(m) / std::sqrt(static_cast<double>(n));
      if (above(m, n, best_m, best_n)) {
        best_m = m, best_n = n;
        if (report) events.push_back({EventKind::scaled_high, n, m, scaled});
      }
      if (above(worst_m, worst_n, m, n)) {
        worst_m = m, worst_n = n;
        if (report) events.push_back({EventKind::scaled_low, n, m, scaled});
      }
    }
    if (w >= 1 && n >= 2) {
      if (!face_seen[static_cast<std::size_t>(w - 1)]) {
        face_seen[static_cast<std::size_t>(w - 1)] = true;
        if (report) events.push_back({EventKind::first_face_dimension, n, w - 1, 0.0});
      }
      int d = -1;
      if (n == 2) d = 0;
      else if (n % 2 == 1 && w >= 2) d = w - 1;
      if (d >= 0 && !homology_seen[static_cast<std::size_t>(d)]) {
        homology_seen[static_cast<std::size_t>(d)] = true;
        if (report) events.push_back({EventKind::first_homology_dimension, n, d, 0.0});
      }
    }
  }
  return events;
}

}  // namespace sqfc::oracles
