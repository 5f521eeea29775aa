// SPDX-License-Identifier: MIT
/// @file graph_enumeration.hpp  Streamed enumeration of the faces of K_n and of the edges of the
/// divisibility graph G_n and the shared-factor graph H_n, and their counts without enumeration.
#pragma once

#include <cstdint>
#include <functional>
#include <span>
#include <vector>

#include "sqfc/complex/face_neighbourhood.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::complex {

/// Largest n for which faces and G_n are enumerated (10^9): the enumeration keeps a rank
/// bitmap of about 0.19 bytes per integer, and its output is then already tens of GiB.
inline constexpr Natural max_enumeration_n = 1'000'000'000ULL;

/// Largest n for which H_n is enumerated (10^7): the per-prime vertex lists take about
/// 4 * sum of omega bytes (about 80 MiB at 10^7), and H_{10^7} has about 4 * 10^12 edges.
inline constexpr Natural max_shared_factor_enumeration_n = 10'000'000ULL;

/// Largest n accepted by count_divisibility_edges (10^11): one sieve pass over [2, n], single
/// threaded, a few minutes at the top.
inline constexpr Natural max_divisibility_count_n = 100'000'000'000ULL;

/// Largest n accepted by count_shared_factor_edges_formula (10^10): one SquarefreeCounter
/// evaluation per squarefree d <= n / 2.
inline constexpr Natural max_shared_factor_count_n = 10'000'000'000ULL;

/// One face of K_n as the enumeration hands it out.
/// Invariant: primes are increasing, their product is k, dimension = primes.size() - 1.
struct FaceView {
  Natural k;                           ///< the squarefree integer, 2 <= k <= n
  std::span<const Natural> primes;     ///< its prime set; valid only during the callback
  int dimension;                       ///< omega(k) - 1
};

/// One edge {a, b} of G_n or H_n with a < b (both squarefree in [2, n]).
struct GraphEdge {
  Natural a;
  Natural b;
};

/// Called once per face, in increasing k.
using FaceVisitor = std::function<void(const FaceView&)>;
/// Called with consecutive batches of edges (at most edge_batch_size each) from one buffer that
/// is reused, so no memory is allocated per edge; the span is valid only during the call.
using EdgeBatchVisitor = std::function<void(std::span<const GraphEdge>)>;

/// Edges per batch handed to an EdgeBatchVisitor: larger batches amortise the call, smaller
/// ones keep the buffer in L1/L2 cache. Any value >= 1 is correct.
inline constexpr std::size_t edge_batch_size = 4096;

/// Calls visit for every face of K_n (squarefree k in [2, n]) in increasing k.
/// Pre: n <= max_enumeration_n (checked; InvalidArgument). n < 2 gives no call.
/// Complexity: O(n log log n) time, O(sqrt n + block) memory (a segmented factoring sieve).
/// Throws: InvalidArgument; whatever visit throws (enumeration stops).
void for_each_face(Natural n, const FaceVisitor& visit);

/// Calls visit with every edge of G_n: a properly divides b, a >= 2, both squarefree <= n.
/// Order: increasing b, and for one b increasing a.
/// Pre: n <= max_enumeration_n (checked; InvalidArgument).
/// Complexity: O(n log log n + E log E_b) time for E edges (E_b <= 2^omega(b) sorted per b);
/// O(sqrt n + block + edge_batch_size) memory.
/// Throws: InvalidArgument; whatever visit throws.
void for_each_divisibility_edge(Natural n, const EdgeBatchVisitor& visit);

/// Calls visit with every edge of H_n: gcd(a, b) > 1, a < b, both squarefree in [2, n].
/// Order: increasing b, and for one b increasing a.
/// Method: a merge of the sorted lists of squarefree multiples of each prime of b, so the work
/// is proportional to the output (about 22% of all vertex pairs near n = 10^4).
/// Pre: n <= max_shared_factor_enumeration_n (checked; InvalidArgument).
/// Complexity: O(n log log n + E omega) time; O(sum of omega) 4-byte entries of memory.
/// Throws: InvalidArgument; whatever visit throws.
void for_each_shared_factor_edge(Natural n, const EdgeBatchVisitor& visit);

/// Vertices of G_n and H_n (faces of K_n): Q(n) - 1 for n >= 1, 0 for n = 0.
/// Pre: n <= 10^14 (checked; InvalidArgument). Complexity: O(sqrt n) (SquarefreeCounter).
Count count_vertices(Natural n);

/// Edges of G_n by design.md identity 8: sum over squarefree k in [2, n] of 2^omega(k) - 2,
/// summed over one sieve pass (no enumeration of edges); below 2^16 over the factoring pass of
/// the enumerations, whose set-up is cheaper than the sieve's tables.
/// Pre: n <= max_divisibility_count_n (checked; InvalidArgument).
/// Complexity: O(n log log n) time, O(sqrt n + block) memory.
Count count_divisibility_edges(Natural n);

/// Edges of H_n by design.md identity 8: sum over squarefree d >= 2 of -mu(d) C(S_d(n), 2),
/// S_d(n) = #{squarefree j <= n with d | j} = #{squarefree t <= n/d coprime to d}, from
/// SquarefreeCounter::count_coprime_squarefree. Terms with d > n/2 have S_d = 1 and vanish.
/// Pre: n <= max_shared_factor_count_n (checked; InvalidArgument).
/// Complexity: O(n log log n) for factoring d <= n/2, plus one coprime count per squarefree d
/// (O(1) table look-ups each for n / d below 2^20); O(sqrt n + 2^20) memory.
/// Throws: InvalidArgument; OverflowError if a sum passes 2^64 (not below n = 10^10).
Count count_shared_factor_edges_formula(Natural n);

/// The same with a caller-built counter (one counter up to the largest n serves every smaller
/// n, so a sweep over many n pays for one mu sieve). Pre: n <= counter.max_y() and
/// n <= max_shared_factor_count_n (checked; InvalidArgument). Complexity: as above, less the
/// counter.
Count count_shared_factor_edges_formula(const SquarefreeCounter& counter, Natural n);

/// Position of every squarefree integer in [2, n] among them: rank(2) = 1, rank(3) = 2,
/// rank(5) = 3, ... (1-based, the Matrix Market vertex index).
/// Invariant: bits_ has bit k set exactly for squarefree k in [2, n] (1 is squarefree but no
/// vertex, so its bit stays clear); before_[w] counts the set bits of words [0, w).
class SquarefreeRank {
 public:
  /// Pre: n <= max_enumeration_n (checked; InvalidArgument).
  /// Complexity: O(n log log n) time, n/8 + n/16 bytes.
  explicit SquarefreeRank(Natural n);
  /// The 1-based vertex index of k. Pre: k squarefree in [2, n] (assumed). Complexity: O(1).
  [[nodiscard]] std::uint64_t rank(Natural k) const noexcept;
  /// True when k in [2, n] is squarefree. Pre: k <= n (assumed).
  [[nodiscard]] bool is_squarefree(Natural k) const noexcept { return (bits_[k >> 6] >> (k & 63)) & 1U; }

 private:
  std::vector<std::uint64_t> bits_;
  std::vector<std::uint32_t> before_;
};

}  // namespace sqfc::complex
