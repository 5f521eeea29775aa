// SPDX-License-Identifier: MIT
// Apparent pairs of the filtration by k, and the reduction of the remaining columns by them.
#include "apparent_pairs.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <bit>
#include <memory>
#include <numeric>
#include <thread>

#include <sys/mman.h>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/arith/parallel_segments.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/checked.hpp"

namespace sqfc::topology::detail {
namespace {

constexpr Natural segment_size = Natural{1} << 16;
// 2*3*5*...*23 > 2*10^8, so every k <= 2*10^8 has at most 8 distinct primes.
constexpr int max_primes = 8;
// A candidate's boundary lives on the divisors of k*q0: at most 9 primes, so masks < 2^9.
constexpr std::size_t mask_space = std::size_t{1} << (max_primes + 1);
// A birth is stored as 4 bytes until the bars are written once: essential_flag is set for a
// class that never dies, otherwise it dies at birth * q0. Births are <= 2*10^8 < 2^31.
constexpr std::uint32_t essential_flag = 0x80000000u;
using SegmentBirths = std::array<std::vector<std::uint32_t>, config::omega_slots>;

// The smallest prime a face of the family may contain, or 0 when no prime <= n is allowed.
Natural smallest_allowed_prime(Natural n, const FaceFamily& family) {
  // coprime_to < 2^64 has at most 15 distinct primes, so one of the first 16 primes is free of it.
  constexpr std::array<Natural, 16> small{2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53};
  for (const Natural q : small) {
    if (q > n || (family.smooth_bound && q > *family.smooth_bound)) return 0;
    if (!family.coprime_to || *family.coprime_to % q != 0) return q;
  }
  return 0;
}

struct Worker {
  std::unique_ptr<arith::SegmentedSieve> sieve;
  // Segment buffers, left uninitialised: each is written before it is read, and a fresh page
  // that is never touched (small_primes below n/q0 for K_n) costs nothing.
  std::unique_ptr<arith::FactorCode[]> codes;
  std::unique_ptr<std::uint8_t[]> prime_count;    // distinct sieved primes found per k of the segment
  std::unique_ptr<std::uint16_t[]> small_primes;  // max_primes slots per k (base primes < 2^16)
  std::array<std::size_t, config::omega_slots> last_births{};  // births per dimension in the last segment
  // This segment's births per dimension in increasing order (storage owned by the segment).
  std::vector<std::uint32_t>* births_by_dimension = nullptr;
  std::array<Count, config::omega_slots> faces_by_dimension{};
  Count column_additions = 0, apparent_pairs = 0, cleared_columns = 0;
  // Column of the candidate being reduced: coefficient and value per divisor mask of k*q0.
  std::array<std::uint8_t, mask_space> coefficient{};
  std::array<bool, mask_space> touched_flag{};
  std::array<Natural, mask_space> value{};
  std::vector<std::uint16_t> touched;
  bool failed = false;
};

class ApparentPairReduction {
 public:
  ApparentPairReduction(Natural n, const FaceFamily& family, unsigned field, Natural q0)
      : n_(n), family_(family), p_(static_cast<std::uint8_t>(field)), q0_(q0), full_(family.is_full()),
        birth_limit_(n / q0), base_primes_(arith::primes_up_to(integer_sqrt(n))) {}

  // Classifies every face of [lo, hi), reduces the candidates, and fills the worker's bars.
  void run_segment(Worker& w, Natural lo, Natural hi) {
    w.faces_by_dimension.fill(0);
    w.column_additions = w.apparent_pairs = w.cleared_columns = 0;
    w.sieve->reset(lo, hi);
    w.sieve->next_block_codes(w.codes.get());
    // Births per dimension change slowly from segment to segment: reserve what the last one had.
    for (std::size_t d = 0; d < w.last_births.size(); ++d)
      w.births_by_dimension[d].reserve(w.last_births[d] + w.last_births[d] / 8 + 16);
    // Only candidates need their primes in the full complex: k not divisible by q0 = 2 with 2k > n.
    const Natural factor_lo = full_ ? std::max(lo, birth_limit_ + 1) : lo;
    const Natural birth_limit = birth_limit_;
    const Natural q0 = q0_;
    if (factor_lo < hi) factor_segment(w, lo, hi, factor_lo);

    Natural primes[max_primes];
    for (Natural k = std::max<Natural>(lo, 2); k < hi; ++k) {
      const auto code = w.codes[k - lo];
      if (!arith::code_is_squarefree(code)) continue;
      const int omega = arith::code_omega(code);
      int known = 0;  // primes of k read so far (0: not needed yet)
      if (!full_) {
        known = primes_of(w, k, lo, primes);
        if (!family_accepts(family_, k, primes[known - 1], known)) continue;
      }
      const int dim = omega - 1;
      ++w.faces_by_dimension[static_cast<std::size_t>(dim)];
      const bool q0_divides = full_ ? (k % 2 == 0) : (k % q0 == 0);
      if (q0_divides && omega >= 2) {
        // Its youngest facet is k/q0, whose oldest coface is k: the death of an apparent pair,
        // recorded from the birth side (below) so that bars come out in birth order.
        ++w.apparent_pairs;
        continue;
      }
      if (!q0_divides && k <= birth_limit && dim + 1 <= max_dimension()) {
        // Birth of the apparent pair (k, k*q0): its column is cleared by the column of k*q0.
        w.births_by_dimension[static_cast<std::size_t>(dim)].push_back(static_cast<std::uint32_t>(k));
        ++w.cleared_columns;
        continue;
      }
      if (omega >= 2) {
        if (known == 0) known = primes_of(w, k, lo, primes);
        const bool zero = p_ == 2 ? reduces_to_zero<2>(w, primes, known) : reduces_to_zero<3>(w, primes, known);
        if (!zero) {
          w.failed = true;
          return;
        }
      }
      // A zero column that no apparent column clears: an essential class.
      w.births_by_dimension[static_cast<std::size_t>(dim)].push_back(static_cast<std::uint32_t>(k) | essential_flag);
    }
    for (std::size_t d = 0; d < w.last_births.size(); ++d) w.last_births[d] = w.births_by_dimension[d].size();
  }

 private:
  Natural n_;
  FaceFamily family_;
  std::uint8_t p_;
  Natural q0_;
  bool full_;
  Natural birth_limit_;  // k is an apparent birth only if k * q0 <= n
  std::vector<std::uint32_t> base_primes_;

  [[nodiscard]] int max_dimension() const noexcept {
    return family_.max_dimension ? *family_.max_dimension : config::omega_slots;
  }

  // Records the base primes dividing each k in [factor_lo, hi); in the full complex only odd k
  // are ever read, so 2 and the even multiples are skipped.
  void factor_segment(Worker& w, Natural lo, Natural hi, Natural factor_lo) const {
    std::fill(w.prime_count.get() + (factor_lo - lo), w.prime_count.get() + (hi - lo), std::uint8_t{0});
    const bool odd_only = full_;
    for (const auto p32 : base_primes_) {
      const Natural p = p32;
      if (p * p > hi - 1) break;
      if (odd_only && p == 2) continue;
      Natural m = (factor_lo + p - 1) / p * p;
      Natural step = p;
      if (odd_only) {
        if (m % 2 == 0) m += p;
        step = 2 * p;
      }
      for (; m < hi; m += step) {
        const auto i = static_cast<std::size_t>(m - lo);
        w.small_primes[i * max_primes + w.prime_count[i]++] = static_cast<std::uint16_t>(p);
      }
    }
  }

  // The primes of squarefree k in increasing order: the sieved ones, then the one prime above
  // sqrt(hi - 1) that can be left over.
  static int primes_of(const Worker& w, Natural k, Natural lo, Natural* out) {
    const auto i = static_cast<std::size_t>(k - lo);
    const int count = w.prime_count[i];
    Natural product = 1;
    for (int j = 0; j < count; ++j) product *= out[j] = w.small_primes[i * max_primes + static_cast<std::size_t>(j)];
    if (product == k) return count;
    out[count] = static_cast<std::uint32_t>(k) / static_cast<std::uint32_t>(product);  // k < 2^32
    return count + 1;
  }

  // Reduces the boundary column of a candidate k (primes p_1 < ... < p_w, none equal to q0) by
  // apparent columns only. Faces are divisors of k*q0, written as masks over (q0, p_1, .., p_w),
  // an order that is the primes' order because q0 is the smallest allowed prime. Returns false
  // when a pivot is not the birth of an apparent pair (no apparent column owns it).
  // P is the field size, a constant so that the arithmetic mod P compiles to a few instructions.
  template <std::uint8_t P>
  bool reduces_to_zero(Worker& w, const Natural* primes, int count) {
    Natural universe[max_primes + 1];
    universe[0] = q0_;
    for (int j = 0; j < count; ++j) universe[j + 1] = primes[j];
    const auto value_of = [&](unsigned mask) {
      Natural v = 1;
      for (unsigned bits = mask; bits != 0; bits &= bits - 1) v *= universe[std::countr_zero(bits)];
      return v;
    };
    const auto add = [&](unsigned mask, std::uint8_t c) {
      if (!w.touched_flag[mask]) {
        w.touched_flag[mask] = true;
        w.coefficient[mask] = 0;
        w.value[mask] = value_of(mask);
        w.touched.push_back(static_cast<std::uint16_t>(mask));
      }
      w.coefficient[mask] = static_cast<std::uint8_t>((w.coefficient[mask] + c) % P);
    };
    const auto boundary = [&](unsigned face, std::uint8_t factor) {
      // sum_i (-1)^i (face without its i-th prime), primes in increasing order.
      unsigned rank = 0;
      for (unsigned bits = face; bits != 0; bits &= bits - 1, ++rank) {
        const std::uint8_t sign = (rank % 2 == 0) ? 1 : static_cast<std::uint8_t>(P - 1);
        const unsigned lowest = bits & (0u - bits);
        add(face & ~lowest, static_cast<std::uint8_t>(sign * factor % P));
      }
    };
    const auto finish = [&](bool zero) {
      for (const auto mask : w.touched) w.touched_flag[mask] = false;
      w.touched.clear();
      return zero;
    };

    boundary(((1u << count) - 1) << 1, 1);  // the column of k itself
    for (;;) {
      unsigned pivot = 0;
      Natural pivot_value = 0;
      for (const auto mask : w.touched)
        if (w.coefficient[mask] != 0 && w.value[mask] > pivot_value) pivot = mask, pivot_value = w.value[mask];
      if (pivot_value == 0) return finish(true);
      // The pivot's owner is an apparent column exactly when the pivot is an apparent birth.
      const int pivot_dim = std::popcount(pivot) - 1;
      if ((pivot & 1u) != 0 || pivot_value > birth_limit_ || pivot_dim + 1 > max_dimension()) return finish(false);
      // Column of pivot*q0 has coefficient +1 at the pivot (q0 is its first vertex).
      const auto factor = static_cast<std::uint8_t>(P - w.coefficient[pivot]);
      boundary(pivot | 1u, factor);
      ++w.column_additions;
    }
  }
};

// Writes the bars, dimension by dimension and segment by segment (so in (dimension, birth)
// order), into `bars`; the threads fill disjoint ranges. The buffer asks for huge pages: at
// 10^8 it holds about 1 GB, and 4 KiB first-touch faults would cost more than the filling.
void write_bars(std::vector<SegmentBirths>& births, std::size_t dimensions, Natural q0, unsigned threads,
                std::vector<Bar>& bars) {
  struct Chunk {
    int dimension;
    const std::vector<std::uint32_t>* births;
    std::size_t offset;
  };
  std::vector<Chunk> chunks;
  std::size_t total = 0;
  for (std::size_t d = 0; d < dimensions; ++d)
    for (auto& segment : births)
      if (!segment[d].empty()) {
        chunks.push_back({static_cast<int>(d), &segment[d], total});
        total += segment[d].size();
      }
  bars.reserve(total);
#ifdef MADV_HUGEPAGE
  if (total * sizeof(Bar) >= (std::size_t{4} << 20)) {
    constexpr std::uintptr_t huge = std::uintptr_t{2} << 20;
    const auto begin = (reinterpret_cast<std::uintptr_t>(bars.data()) + huge - 1) & ~(huge - 1);
    const auto end = (reinterpret_cast<std::uintptr_t>(bars.data() + total)) & ~(huge - 1);
    if (end > begin) madvise(reinterpret_cast<void*>(begin), end - begin, MADV_HUGEPAGE);  // a hint only
  }
#endif
  bars.resize(total);
  const auto fill = [&](std::size_t first_chunk, std::size_t last_chunk) {
    for (std::size_t c = first_chunk; c < last_chunk; ++c) {
      Bar* out = bars.data() + chunks[c].offset;
      for (const auto entry : *chunks[c].births) {
        const Natural birth = entry & ~essential_flag;
        *out++ = {chunks[c].dimension, birth, (entry & essential_flag) ? 0 : birth * q0};
      }
    }
  };
  const std::size_t parts = std::min<std::size_t>(threads, chunks.size());
  if (parts <= 1) {
    fill(0, chunks.size());
  } else {
    std::vector<std::thread> pool;
    std::size_t first = 0;
    for (std::size_t t = 1; t <= parts; ++t) {
      std::size_t last = first;  // chunks whose start lies below the t-th share of the bars
      while (last < chunks.size() && (t == parts || chunks[last].offset < total / parts * t)) ++last;
      pool.emplace_back(fill, first, last);
      first = last;
    }
    for (auto& thread : pool) thread.join();
  }
  for (auto& segment : births)
    for (auto& list : segment) std::vector<std::uint32_t>().swap(list);
}

}  // namespace

std::optional<PersistenceResult> persistence_by_apparent_pairs(Natural n, const FaceFamily& family, unsigned field,
                                                               unsigned threads) {
  PersistenceResult result;
  result.method = ReductionOrder::apparent_pairs;
  const Natural q0 = smallest_allowed_prime(n, family);
  if (q0 == 0) return result;  // no vertex: the empty complex

  ApparentPairReduction reduction(n, family, field, q0);
  const arith::SieveTables tables(n);
  threads = std::max(1u, threads);
  std::vector<Worker> workers(threads);
  for (auto& w : workers) {
    w.sieve = std::make_unique<arith::SegmentedSieve>(tables, segment_size);
    w.codes.reset(new arith::FactorCode[segment_size]);
    w.prime_count.reset(new std::uint8_t[segment_size]);
    w.small_primes.reset(new std::uint16_t[segment_size * max_primes]);
    w.touched.reserve(mask_space);
  }
  const std::size_t segments = static_cast<std::size_t>((n - 1) / segment_size + 1);
  std::vector<SegmentBirths> births(segments);
  std::array<Count, config::omega_slots> faces{};
  std::atomic<bool> failed{false};

  arith::for_each_segment_ordered(
      1, n + 1, segment_size, threads,
      [&](unsigned worker, Natural segment, Natural lo, Natural hi) {
        if (failed.load(std::memory_order_relaxed)) return;
        workers[worker].births_by_dimension = births[static_cast<std::size_t>(segment)].data();
        reduction.run_segment(workers[worker], lo, hi);
        if (workers[worker].failed) failed.store(true);
      },
      [&](unsigned worker, Natural) {
        const Worker& w = workers[worker];
        if (failed.load()) return;
        for (std::size_t d = 0; d < faces.size(); ++d) faces[d] += w.faces_by_dimension[d];
        result.column_additions += w.column_additions;
        result.apparent_pairs += w.apparent_pairs;
        result.cleared_columns += w.cleared_columns;
      });
  if (failed.load()) return std::nullopt;

  for (std::size_t d = 0; d < faces.size() && faces[d] != 0; ++d)  // divisor-closed: no gaps
    result.faces_by_dimension.push_back(faces[d]);
  result.top_dimension = static_cast<int>(result.faces_by_dimension.size()) - 1;
  write_bars(births, result.faces_by_dimension.size(), q0, threads, result.bars);
  return result;
}

}  // namespace sqfc::topology::detail
