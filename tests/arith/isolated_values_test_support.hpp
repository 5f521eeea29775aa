// SPDX-License-Identifier: MIT
// Shared pieces of the isolated-value tests: prefix sums by the segmented sieve (the
// independent method; the sieve itself is checked against trial division, FLINT and PARI in
// test_sieve*.cpp) and the sieve limits that split the computation differently.
// Expected values: the segmented sieve oracle, and the reader of the OEIS A084236 b-file
// (M(2^k), from memory) that the M tests share.
#pragma once

#include <cstdint>
#include <fstream>
#include <string>
#include <utility>
#include <vector>

#include "sqfc/arith/isolated_values.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/checked.hpp"

namespace sqfc::testing {

/// M(n), L(n), Q(n) for every n in [0, n_max] (index n) by one pass of the segmented sieve.
struct SievePrefix {
  std::vector<std::int64_t> mertens, liouville;
  std::vector<std::uint64_t> squarefree;
  explicit SievePrefix(std::uint64_t n_max) : mertens(n_max + 1), liouville(n_max + 1), squarefree(n_max + 1) {
    sqfc::arith::sieve_range(1, n_max + 1, [&](const sqfc::arith::SieveBlock& b) {
      for (std::size_t i = 0; i < b.size(); ++i) {
        const auto n = static_cast<std::size_t>(b.lo() + i);
        mertens[n] = mertens[n - 1] + b.mu(i);
        liouville[n] = liouville[n - 1] + b.liouville(i);
        squarefree[n] = squarefree[n - 1] + (b.is_squarefree(i) ? 1 : 0);
      }
    });
  }
};

/// Sieve limits Y that are valid for x and split it in different places: the default (0), the
/// smallest valid ones, a middle one and x + 1 (no split at all).
inline std::vector<std::uint64_t> split_limits(std::uint64_t x) {
  const std::uint64_t r = sqfc::integer_sqrt(x);
  std::vector<std::uint64_t> limits = {0, x + 1};
  for (const std::uint64_t y : {r + 1, r + 2, 2 * r + 3, 3 * r + 7}) {
    if (y > x) continue;
    const std::uint64_t u = x / y + (x % y != 0 ? 1 : 0);
    if (u < y) limits.push_back(y);
  }
  return limits;
}

/// The (k, M(2^k)) rows of tests/data/bfile/a084236_mertens_pow2.txt (OEIS A084236, k = 0..30,
/// from memory); empty when the file is missing.
inline std::vector<std::pair<int, std::int64_t>> mertens_powers_of_two(const std::string& path) {
  std::vector<std::pair<int, std::int64_t>> rows;
  std::ifstream in(path);
  for (std::string line; std::getline(in, line);) {
    if (line.empty() || line[0] == '#') continue;
    const auto space = line.find(' ');
    rows.emplace_back(std::stoi(line.substr(0, space)), std::stoll(line.substr(space + 1)));
  }
  return rows;
}

}  // namespace sqfc::testing
