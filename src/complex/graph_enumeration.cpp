// SPDX-License-Identifier: MIT
// Streamed faces and graph edges of K_n, G_n and H_n, and their counts by identity 8.
#include "sqfc/complex/graph_enumeration.hpp"

#include <algorithm>
#include <array>
#include <bit>
#include <string>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/complex/face_neighbourhood.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::complex {
namespace {

// Distinct primes of an integer <= 10^10: the product of the first 10 primes is 6.5 * 10^9 and
// that of the first 11 is 2 * 10^11, so 10 slots suffice for every n this file accepts.
constexpr std::size_t prime_slots = 10;
// Values per factoring block: 2^14 entries of 10 primes take 1.3 MiB, about L2 size.
constexpr std::size_t factor_block = std::size_t{1} << 14;
// Below this n, count_divisibility_edges sums over the factoring pass: building the sieve's
// tables (a 600 KiB pre-sieved pattern) costs about 0.2 ms, more than factoring 2^16 values.
// Any value is correct; both paths are tested on each side of it.
constexpr Natural small_count_n = Natural{1} << 16;

// Factors every integer of [lo, hi) block by block with the primes <= sqrt(hi - 1): a hit of p^2
// clears the squarefree flag, a hit of p appends p and multiplies the product found so far;
// what the product misses is one prime > sqrt(hi - 1). Multiplying instead of dividing keeps
// the inner loop free of divisions (one division per squarefree entry at the end).
class BlockFactorer {
 public:
  explicit BlockFactorer(Natural max_value) : base_(arith::primes_up_to(isqrt(max_value))) {
    product_.resize(factor_block);
    count_.resize(factor_block);
    squarefree_.resize(factor_block);
    primes_.resize(factor_block * prime_slots);
  }

  // Factors [lo, hi), hi - lo <= factor_block, hi - 1 <= max_value.
  void factor(Natural lo, Natural hi) {
    lo_ = lo;
    size_ = static_cast<std::size_t>(hi - lo);
    std::fill_n(product_.begin(), size_, Natural{1});
    std::fill_n(count_.begin(), size_, std::uint8_t{0});
    std::fill_n(squarefree_.begin(), size_, std::uint8_t{1});
    for (const Natural p : base_) {
      const Natural square = p * p;
      if (square >= hi) break;
      for (Natural m = (lo + square - 1) / square * square; m < hi; m += square) squarefree_[m - lo] = 0;
    }
    for (const Natural p : base_) {
      if (p >= hi) break;
      for (Natural m = (lo + p - 1) / p * p; m < hi; m += p) {
        const std::size_t i = static_cast<std::size_t>(m - lo);
        if (!squarefree_[i]) continue;
        primes_[i * prime_slots + count_[i]++] = p;
        product_[i] *= p;
      }
    }
    for (std::size_t i = 0; i < size_; ++i) {
      if (!squarefree_[i]) continue;
      const Natural k = lo + i;
      if (product_[i] != k) primes_[i * prime_slots + count_[i]++] = k / product_[i];
    }
  }

  [[nodiscard]] std::size_t size() const noexcept { return size_; }
  // Squarefree and >= 2 (1 is squarefree but the empty face).
  [[nodiscard]] bool is_face(std::size_t i) const noexcept { return squarefree_[i] && lo_ + i >= 2; }
  [[nodiscard]] std::span<const Natural> primes(std::size_t i) const noexcept {
    return {primes_.data() + i * prime_slots, count_[i]};
  }

 private:
  static Natural isqrt(Natural x) {
    Natural r = 0;
    while ((r + 1) * (r + 1) <= x) ++r;  // x <= 10^11 here, so at most 3.2 * 10^5 steps
    return r;
  }
  std::vector<std::uint32_t> base_;
  Natural lo_ = 0;
  std::size_t size_ = 0;
  std::vector<Natural> product_;
  std::vector<std::uint8_t> count_;
  std::vector<std::uint8_t> squarefree_;
  std::vector<Natural> primes_;
};

// Calls visit(k, primes) for every squarefree k in [2, n], increasing.
template <class Visit>
void factor_faces(Natural n, Visit&& visit) {
  if (n < 2) return;
  BlockFactorer factorer(n);
  for (Natural lo = 2; lo <= n; lo += factor_block) {
    const Natural hi = std::min<Natural>(n + 1, lo + factor_block);
    factorer.factor(lo, hi);
    for (std::size_t i = 0; i < factorer.size(); ++i)
      if (factorer.is_face(i)) visit(lo + i, factorer.primes(i));
  }
}

// A fixed buffer of edges handed to the visitor when full and at the end.
class EdgeBuffer {
 public:
  explicit EdgeBuffer(const EdgeBatchVisitor& visit) : visit_(visit) {}
  void push(Natural a, Natural b) {
    edges_[used_++] = GraphEdge{a, b};
    if (used_ == edges_.size()) flush();
  }
  void flush() {
    if (used_) visit_(std::span<const GraphEdge>(edges_.data(), used_));
    used_ = 0;
  }

 private:
  const EdgeBatchVisitor& visit_;
  std::array<GraphEdge, edge_batch_size> edges_{};
  std::size_t used_ = 0;
};

void check_enumeration(Natural n, Natural limit, const char* what) {
  if (n > limit)
    throw InvalidArgument(std::string(what) + " are enumerated for n <= " + std::to_string(limit) + ", got " +
                          std::to_string(n));
}

}  // namespace

void for_each_face(Natural n, const FaceVisitor& visit) {
  check_enumeration(n, max_enumeration_n, "faces");
  factor_faces(n, [&](Natural k, std::span<const Natural> primes) {
    visit(FaceView{k, primes, static_cast<int>(primes.size()) - 1});
  });
}

void for_each_divisibility_edge(Natural n, const EdgeBatchVisitor& visit) {
  check_enumeration(n, max_enumeration_n, "divisibility graph edges");
  EdgeBuffer buffer(visit);
  std::array<Natural, std::size_t{1} << prime_slots> divisors{};
  factor_faces(n, [&](Natural b, std::span<const Natural> primes) {
    // All subset products of the primes: divisors[0] = 1, each prime doubles the list.
    std::size_t count = 1;
    divisors[0] = 1;
    for (const Natural p : primes) {
      for (std::size_t j = 0; j < count; ++j) divisors[count + j] = divisors[j] * p;
      count *= 2;
    }
    // Entries 0 (the empty product 1) and count - 1 (b itself) are no proper divisors >= 2.
    if (count <= 2) return;
    std::sort(divisors.begin() + 1, divisors.begin() + static_cast<std::ptrdiff_t>(count - 1));
    for (std::size_t j = 1; j + 1 < count; ++j) buffer.push(divisors[j], b);
  });
  buffer.flush();
}

void for_each_shared_factor_edge(Natural n, const EdgeBatchVisitor& visit) {
  check_enumeration(n, max_shared_factor_enumeration_n, "shared-factor graph edges");
  if (n < 4) return;  // H_2 and H_3 have no edges
  // Lists of the squarefree multiples of each prime p <= n / 2 (a larger prime has only
  // itself as multiple, so no edge). Built once; n <= 10^7 keeps the values in 32 bits.
  const std::vector<std::uint32_t> small_primes = arith::primes_up_to(n / 2);
  std::vector<std::vector<std::uint32_t>> multiples(small_primes.size());
  auto slot = [&](Natural p) {
    return static_cast<std::size_t>(std::lower_bound(small_primes.begin(), small_primes.end(), p) - small_primes.begin());
  };
  std::vector<std::uint32_t> face_primes;   // primes of every face, in face order
  std::vector<std::uint32_t> face_offsets{0};
  std::vector<std::uint32_t> faces;
  factor_faces(n, [&](Natural k, std::span<const Natural> primes) {
    faces.push_back(static_cast<std::uint32_t>(k));
    for (const Natural p : primes) {
      face_primes.push_back(static_cast<std::uint32_t>(p));
      if (p <= n / 2) multiples[slot(p)].push_back(static_cast<std::uint32_t>(k));
    }
    face_offsets.push_back(static_cast<std::uint32_t>(face_primes.size()));
  });
  EdgeBuffer buffer(visit);
  struct Cursor {
    const std::uint32_t* at;
    const std::uint32_t* end;
  };
  std::array<Cursor, prime_slots> cursors{};
  for (std::size_t f = 0; f < faces.size(); ++f) {
    const std::uint32_t b = faces[f];
    std::size_t m = 0;
    for (std::uint32_t j = face_offsets[f]; j < face_offsets[f + 1]; ++j) {
      const Natural p = face_primes[j];
      if (p > n / 2) continue;
      const auto& list = multiples[slot(p)];
      cursors[m++] = Cursor{list.data(), list.data() + list.size()};
    }
    // Merge the lists below b; a value on several lists (a shares several primes) once.
    while (true) {
      std::uint32_t least = b;
      for (std::size_t c = 0; c < m; ++c)
        if (cursors[c].at != cursors[c].end && *cursors[c].at < least) least = *cursors[c].at;
      if (least == b) break;  // every list has reached b (each list of a prime of b holds b)
      buffer.push(least, b);
      for (std::size_t c = 0; c < m; ++c)
        if (cursors[c].at != cursors[c].end && *cursors[c].at == least) ++cursors[c].at;
    }
  }
  buffer.flush();
}

Count count_vertices(Natural n) {
  if (n > 100'000'000'000'000ULL) throw InvalidArgument("vertex counts need n <= 10^14, got " + std::to_string(n));
  if (n == 0) return 0;
  return SquarefreeCounter(n).squarefree_count(n) - 1;
}

Count count_divisibility_edges(Natural n) {
  if (n > max_divisibility_count_n)
    throw InvalidArgument("divisibility edge counts need n <= 10^11, got " + std::to_string(n));
  Count edges = 0;
  if (n < 2) return 0;
  if (n < small_count_n) {
    factor_faces(n, [&](Natural, std::span<const Natural> primes) { edges += (Count{1} << primes.size()) - 2; });
    return edges;
  }
  arith::sieve_range(2, n + 1, [&](const arith::SieveBlock& block) {
    for (std::size_t i = 0; i < block.size(); ++i)
      if (block.is_squarefree(i)) edges += (Count{1} << block.omega(i)) - 2;
  });
  return edges;
}

Count count_shared_factor_edges_formula(Natural n) {
  if (n > max_shared_factor_count_n)
    throw InvalidArgument("shared-factor edge counts need n <= 10^10, got " + std::to_string(n));
  return count_shared_factor_edges_formula(SquarefreeCounter(std::max<Natural>(n, 1)), n);
}

Count count_shared_factor_edges_formula(const SquarefreeCounter& counter, Natural n) {
  if (n > max_shared_factor_count_n)
    throw InvalidArgument("shared-factor edge counts need n <= 10^10, got " + std::to_string(n));
  if (n > counter.max_y())
    throw InvalidArgument("shared-factor edge count at n = " + std::to_string(n) + " needs a counter up to it (it has " +
                          std::to_string(counter.max_y()) + ")");
  if (n < 4) return 0;
  Wide total = 0;
  std::vector<Natural> primes;
  primes.reserve(prime_slots);
  factor_faces(n / 2, [&](Natural d, std::span<const Natural> p) {
    primes.assign(p.begin(), p.end());
    const Wide s = static_cast<Wide>(counter.count_coprime_squarefree(primes, n / d));
    const Wide pairs = s * (s - 1) / 2;
    // -mu(d) = +1 for odd omega(d), -1 for even.
    total += (p.size() % 2 == 1) ? pairs : -pairs;
  });
  if (total < 0 || total > static_cast<Wide>(~Count{0}))
    throw OverflowError("shared-factor edge count out of 64-bit range at n = " + std::to_string(n));
  return static_cast<Count>(total);
}

SquarefreeRank::SquarefreeRank(Natural n) {
  check_enumeration(n, max_enumeration_n, "vertex ranks");
  bits_.assign(static_cast<std::size_t>(n / 64 + 1), 0);
  if (n >= 2)
    arith::sieve_range(2, n + 1, [&](const arith::SieveBlock& block) {
      for (std::size_t i = 0; i < block.size(); ++i)
        if (block.is_squarefree(i)) {
          const Natural k = block.lo() + i;
          bits_[k >> 6] |= std::uint64_t{1} << (k & 63);
        }
    });
  before_.resize(bits_.size());
  std::uint32_t running = 0;
  for (std::size_t w = 0; w < bits_.size(); ++w) {
    before_[w] = running;
    running += static_cast<std::uint32_t>(std::popcount(bits_[w]));
  }
}

std::uint64_t SquarefreeRank::rank(Natural k) const noexcept {
  const std::uint64_t word = bits_[k >> 6];
  const unsigned shift = 63U - static_cast<unsigned>(k & 63);
  // Bits 0..(k mod 64) of the word: shifting left drops the higher ones.
  return before_[k >> 6] + static_cast<std::uint64_t>(std::popcount(word << shift));
}

}  // namespace sqfc::complex
