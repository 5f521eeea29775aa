// SPDX-License-Identifier: MIT
// Independent reference values for n <= 1000, used to verify the golden files row by row:
// trial division and enumeration (tests/oracles), dense Z/2 homology, and a determinant by
// elimination modulo a prime. Nothing here calls the library's sieve, tracker or writers.
#pragma once

#include <gtest/gtest.h>

#include <cstdint>
#include <map>
#include <numeric>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"

namespace sqfc::cli_test {

/// Reference invariants of K_n for every n in [1, limit].
/// Invariant: index n of every vector holds the value at n (index 0 unused).
struct GoldenReference {
  std::uint64_t limit = 0;
  oracles::NaivePrefix prefix;                   ///< mu, omega, M, L, Q by trial division
  std::vector<std::vector<std::int64_t>> betti;  ///< Z/2 Betti numbers of K_n, dense elimination
  std::vector<int> fredholm;                     ///< sign of det(1 + A(H_n)) by elimination mod a prime
};

namespace detail {

// Prime modulus for the determinant: the largest prime below 2^16, so that x + c*y with
// x, y, c < p stays below 2^32 and the elimination runs in 32-bit lanes.
inline constexpr std::uint32_t det_prime = 65521;

inline std::uint32_t power_mod(std::uint32_t base, std::uint32_t exponent) {
  std::uint64_t result = 1, b = base % det_prime;
  for (; exponent; exponent >>= 1, b = b * b % det_prime)
    if (exponent & 1) result = result * b % det_prime;
  return static_cast<std::uint32_t>(result);
}

// det(1 + A(H_n)) mod p for every n <= limit from ONE elimination without row exchanges: the faces
// are ordered by k, so 1 + A(H_n) is the leading principal block of 1 + A(H_limit) and its determinant
// is the product of the first pivots. A zero pivot (a leading minor divisible by p) is reported as 0.
// The determinant of a 0/1 matrix is an integer; 1 or p - 1 here means it is +1 or -1 modulo p.
inline std::vector<int> fredholm_by_elimination(const std::vector<int>& mu, std::uint64_t limit) {
  std::vector<std::uint64_t> faces;
  for (std::uint64_t k = 2; k <= limit; ++k)
    if (mu[k] != 0) faces.push_back(k);
  const std::size_t f = faces.size();
  std::vector<std::uint32_t> a(f * f);
  for (std::size_t i = 0; i < f; ++i)
    for (std::size_t j = 0; j < f; ++j) a[i * f + j] = (i == j || std::gcd(faces[i], faces[j]) > 1) ? 1U : 0U;

  std::vector<int> sign(limit + 1, 1);  // D(1) = 1: the empty complex has the empty determinant
  std::uint64_t running = 1;
  bool broken = false;
  std::size_t next_face = 0;
  for (std::uint64_t n = 2; n <= limit; ++n) {
    if (next_face < f && faces[next_face] == n) {
      const std::size_t k = next_face++;
      const std::uint32_t pivot = a[k * f + k];
      if (pivot == 0) broken = true;
      if (!broken) {
        running = running * pivot % det_prime;
        const std::uint32_t inverse = power_mod(pivot, det_prime - 2);
        for (std::size_t i = k + 1; i < f; ++i) {
          const std::uint32_t entry = a[i * f + k];
          if (entry == 0) continue;
          const std::uint32_t c = static_cast<std::uint32_t>(
              (det_prime - static_cast<std::uint64_t>(entry) * inverse % det_prime) % det_prime);
          std::uint32_t* row = &a[i * f];
          const std::uint32_t* top = &a[k * f];
          for (std::size_t j = k; j < f; ++j) row[j] = (row[j] + c * top[j]) % det_prime;
        }
      }
    }
    sign[n] = broken ? 0 : running == 1 ? 1 : running == det_prime - 1 ? -1 : 0;
  }
  return sign;
}

}  // namespace detail

/// The reference for n <= limit. Complexity: about F^3/3 word operations for the determinant and
/// one Z/2 homology per squarefree n (F = Q(limit)); a few tenths of a second for limit = 1000.
inline GoldenReference compute_golden_reference(std::uint64_t limit) {
  GoldenReference r;
  r.limit = limit;
  r.prefix = oracles::prefix_naive(limit);
  r.betti.assign(limit + 1, {});
  // Homology changes only when a face enters, i.e. at squarefree n; between them it is carried over.
  for (std::uint64_t n = 1; n <= limit; ++n)
    r.betti[n] = (n == 1 || r.prefix.mu[n] != 0) ? oracles::betti_mod2_naive(n) : r.betti[n - 1];
  r.fredholm = detail::fredholm_by_elimination(r.prefix.mu, limit);
  return r;
}

/// The reference up to 1000, computed once per process.
inline const GoldenReference& golden_reference() {
  static const GoldenReference r = compute_golden_reference(1000);
  return r;
}

/// Compares every named column value of one table row with the reference and returns how many
/// values it compared. `row` maps column names (design.md section 4) to their text.
inline int check_row_against_reference(const std::map<std::string, std::string>& row, const std::string& where) {
  const auto& ref = golden_reference();
  const auto n_it = row.find("n");
  if (n_it == row.end()) {
    ADD_FAILURE() << where << ": row without n";
    return 0;
  }
  const std::uint64_t n = std::stoull(n_it->second);
  if (n < 1 || n > ref.limit) {
    ADD_FAILURE() << where << ": n = " << n << " outside the reference range";
    return 0;
  }
  const auto faces = oracles::f_vector_naive(n);
  const auto face = [&](std::size_t d) -> std::int64_t {
    return d < faces.size() ? static_cast<std::int64_t>(faces[d]) : 0;
  };
  const auto betti = [&](std::size_t d) -> std::int64_t { return d < ref.betti[n].size() ? ref.betti[n][d] : 0; };
  int compared = 0;
  for (const auto& [name, text] : row) {
    std::int64_t expected = 0;
    if (name == "n")
      expected = static_cast<std::int64_t>(n);
    else if (name == "mu")
      expected = ref.prefix.mu[n];
    else if (name == "mertens")
      expected = ref.prefix.mertens[n];
    else if (name == "squarefree")
      expected = ref.prefix.squarefree[n];
    else if (name == "liouville")
      expected = ref.prefix.liouville[n];
    else if (name == "fredholm")
      expected = ref.fredholm[n];
    else if (name == "div_edges")
      expected = static_cast<std::int64_t>(oracles::divisibility_edges_naive(n));
    else if (name == "euler") {
      // chi(K_n) = sum_d (-1)^d f_d, straight from the definition (design.md identity 1's left side).
      for (std::size_t d = 0; d < faces.size(); ++d) expected += (d % 2 ? -1 : 1) * face(d);
    } else if (name.size() >= 2 && (name[0] == 'f' || name[0] == 'b')) {
      const auto d = static_cast<std::size_t>(std::stoul(name.substr(1)));
      expected = name[0] == 'f' ? face(d) : betti(d);
    } else {
      ADD_FAILURE() << where << ": unknown column " << name;
      continue;
    }
    EXPECT_EQ(text, std::to_string(expected)) << where << ", n = " << n << ", column " << name;
    ++compared;
  }
  return compared;
}

}  // namespace sqfc::cli_test
