// SPDX-License-Identifier: MIT
// Oracle for tests only: per-column extremes of every table series by a plain walk over n,
// from omega values of a depth-first enumeration (squarefree_enumeration.hpp). It shares no code
// with the library's tracker or envelope builder; only the column boundaries are given to it.
#pragma once

#include <array>
#include <cmath>
#include <cstdint>
#include <vector>

namespace sqfc::oracles {

/// Extremes of one series over one column; positions are the first n attaining the extreme,
/// except for the non-decreasing series Q and f_d whose maximum is placed at the column's last n.
struct NaiveExtremes {
  std::int64_t first = 0, last = 0, min = 0, max = 0;
  std::uint64_t min_n = 0, max_n = 0;
};

struct NaiveColumn {
  std::uint64_t lo = 0, hi = 0;
  NaiveExtremes mertens, scaled, squarefree, fredholm;  // scaled: M values at the extreme n
  std::array<NaiveExtremes, 16> faces{}, betti{};
};

/// Columns [boundaries[c], boundaries[c + 1]) for n up to boundaries.back() - 1, where omega[n]
/// is omega(n) for squarefree n and -1 otherwise (index 0 unused). b_d(n) is counted from its
/// definition through Björner's formula (design.md identity 2): b~_d(n) = #{odd squarefree m in
/// (n/2, n] with omega(m) = d + 1}, b_0 = b~_0 + 1 for n >= 2. D(n) = prod over squarefree k in
/// [2, n] of -mu(k). M(n)/sqrt(n) is compared exactly as M(n)^2 k against M(k)^2 n with signs.
/// Pre: |M(n)|^2 n < 2^63.
inline std::vector<NaiveColumn> envelope_naive(const std::vector<std::int8_t>& omega,
                                               const std::vector<std::uint64_t>& boundaries) {
  const std::uint64_t n_max = boundaries.back() - 1;
  std::vector<NaiveColumn> columns(boundaries.size() - 1);
  std::int64_t m = 0, q = 0;
  int d_sign = 1;
  std::array<std::int64_t, 16> faces{};
  std::array<std::int64_t, 16> window{};  // odd squarefree m in (n/2, n] by omega(m)
  const auto scaled_less = [](std::int64_t ma, std::uint64_t a, std::int64_t mb, std::uint64_t b) {
    const int sa = (ma > 0) - (ma < 0), sb = (mb > 0) - (mb < 0);
    if (sa != sb) return sa < sb;
    if (sa == 0) return false;
    const std::int64_t x = ma * ma * static_cast<std::int64_t>(b), y = mb * mb * static_cast<std::int64_t>(a);
    return sa > 0 ? x < y : x > y;
  };
  std::size_t c = 0;
  for (std::uint64_t n = 1; n <= n_max; ++n) {
    const int w = omega[n];
    if (w >= 0) {
      m += (w % 2) ? -1 : 1;
      ++q;
      if (n >= 2) {
        ++faces[w - 1];
        if (w % 2 == 0) d_sign = -d_sign;
      }
      if (n % 2 == 1) ++window[w];
    }
    // m' = n/2 leaves (n/2, n] when n is even and n/2 is odd squarefree
    if (n % 2 == 0 && (n / 2) % 2 == 1 && omega[n / 2] >= 0) --window[omega[n / 2]];
    if (n < boundaries.front()) continue;
    while (n >= boundaries[c + 1]) ++c;
    NaiveColumn& col = columns[c];
    const bool fresh = n == boundaries[c];
    if (fresh) col.lo = boundaries[c], col.hi = boundaries[c + 1];
    auto take = [&](NaiveExtremes& e, std::int64_t v) {
      if (fresh) {
        e = NaiveExtremes{v, v, v, v, n, n};
        return;
      }
      e.last = v;
      if (v > e.max) e.max = v, e.max_n = n;
      if (v < e.min) e.min = v, e.min_n = n;
    };
    take(col.mertens, m);
    take(col.squarefree, q);
    take(col.fredholm, d_sign);
    for (int d = 0; d < 16; ++d) take(col.faces[d], faces[d]);
    for (int d = 0; d < 15; ++d) take(col.betti[d], d == 0 ? window[1] + (n >= 2 ? 1 : 0) : window[d + 1]);
    if (fresh) {
      col.scaled = NaiveExtremes{m, m, m, m, n, n};
    } else {
      col.scaled.last = m;
      if (scaled_less(col.scaled.max, col.scaled.max_n, m, n)) col.scaled.max = m, col.scaled.max_n = n;
      if (scaled_less(m, n, col.scaled.min, col.scaled.min_n)) col.scaled.min = m, col.scaled.min_n = n;
    }
    if (n + 1 == col.hi) {
      col.squarefree.max_n = n;
      for (auto& f : col.faces) f.max_n = n;
    }
  }
  return columns;
}

}  // namespace sqfc::oracles
