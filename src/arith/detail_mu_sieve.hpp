// SPDX-License-Identifier: MIT
// The mu sieve of the isolated-value sweep: one 16-bit word per value, a bucket ring for the
// primes above the segment length and a heap for the squares above it.
#pragma once

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <vector>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::arith::detail {

/// Values per segment: 16-bit sieve words (256 KiB) and the int32 table of M (512 KiB),
/// so both stay in the 2 MiB L2 of the development machine while the lookups hit them.
inline constexpr std::size_t sweep_segment_length = std::size_t{1} << 17;

/// The primes and squares a MuSieve sieves with, for values up to max_n; shared by threads.
/// Pre: max_n < 2^44 (the word fields below; the sweep checks its limit).
// A mu-only segmented sieve, faster than SegmentedSieve because it keeps one 16-bit word per
// value: bits 0-11 the sum of round(64 log2 p) over the primes p found, bits 12-14 the number
// of squares p^2 found, bit 15 the parity of the number of primes (each prime adds 0x8000).
// Bounds: for n < 2^44 the log sum is at most 64 * 44 + 6 < 4096 and at most 7 squares divide
// n (the squares of the first 8 primes multiply to 9.4e13 > 2^44), so no field carries.
// After the primes p <= P = isqrt(hi - 1), a squarefree n is s * r with r = 1 or one prime
// r > P >= 1. With 12 primes at most the rounding error is at most 6 units of 1/64 bit, and
// r >= 2 lowers log2 s by a whole bit, so "log sum < 64 log2 n - 32" detects r exactly.
class MuSieveTables {
 public:
  explicit MuSieveTables(Natural max_n) {
    const auto root = integer_sqrt(max_n);
    for (const auto p : primes_up_to(root)) {
      if (p <= 13) continue;
      primes_.push_back(p);
      if (p < (1U << 14)) ++small_prime_count_;
      increments_.push_back(static_cast<std::uint16_t>(log_units(p) + 0x8000U));
    }
    for (const auto p : primes_up_to(root)) {
      if (p < 5) continue;
      squares_.push_back(static_cast<Natural>(p) * p);
    }
  }
  // The pattern does not depend on max_n: built once per process (thread-safe static init),
  // so that many small evaluations do not pay 360 KiB of set-up each.
  static const std::vector<std::uint16_t>& pattern() {
    static const std::vector<std::uint16_t> words = [] {
      std::vector<std::uint16_t> w(pattern_period, 0);
      for (const Natural p : {2ULL, 3ULL, 5ULL, 7ULL, 11ULL, 13ULL}) {
        const auto inc = static_cast<std::uint16_t>(log_units(p) + 0x8000U);
        for (Natural i = 0; i < pattern_period; i += p) w[i] = static_cast<std::uint16_t>(w[i] + inc);
      }
      for (const Natural q : {4ULL, 9ULL})
        for (Natural i = 0; i < pattern_period; i += q) w[i] = static_cast<std::uint16_t>(w[i] + 0x1000U);
      return w;
    }();
    return words;
  }
  // 4 * 9 * 5 * 7 * 11 * 13: the primes up to 13 and the squares 4 and 9 repeat with this period.
  static constexpr Natural pattern_period = 180180;
  static std::uint16_t log_units(Natural p) { return static_cast<std::uint16_t>(std::lround(64.0 * std::log2(static_cast<double>(p)))); }
  std::vector<std::uint32_t> primes_;
  std::size_t small_prime_count_ = 0;  // primes_ below 2^14, the L1 sub-block length
  std::vector<std::uint16_t> increments_;
  std::vector<Natural> squares_;
};

/// mu over consecutive segments of one chunk [lo, ...), segment by segment.
/// Primes up to 2^14 sieve 32 KiB sub-blocks, primes up to the segment length the whole
/// segment, larger primes wait in a ring of buckets (one per coming segment; each hits a
/// segment at most once) and squares above the segment length in a heap of next multiples.
/// Complexity: per segment O(len log log hi) word updates plus O(pi(sqrt(2^17))) loop heads;
/// reset O(pi(sqrt(max_n))) divisions. Memory: 2 len bytes plus 8 bytes per prime and 16 per square.
class MuSieve {
  static constexpr std::size_t sub_block = std::size_t{1} << 14;

  static std::int8_t mu_of_word(unsigned x, int threshold) {
    const unsigned large = static_cast<int>(x & 0xFFFU) < threshold ? 1U : 0U;
    const unsigned odd = (x >> 15) ^ large;
    return static_cast<std::int8_t>(((x >> 12) & 7U) != 0 ? 0 : (odd != 0 ? -1 : 1));
  }

 public:
  /// Pre: block <= sweep_segment_length; after each reset, next() is called for consecutive
  /// ranges of exactly sweep_segment_length values, except possibly the last one (the bucket
  /// ring counts in segments of that length). Not checked (inner loop).
  MuSieve(const MuSieveTables& tables, std::size_t block)
      : t_(tables),
        medium_end_(static_cast<std::size_t>(std::upper_bound(tables.primes_.begin(), tables.primes_.end(), sweep_segment_length) -
                                             tables.primes_.begin())),
        small_square_end_(static_cast<std::size_t>(
            std::upper_bound(tables.squares_.begin(), tables.squares_.end(), Natural{sweep_segment_length}) - tables.squares_.begin())),
        ring_(tables.primes_.empty() ? 1 : static_cast<std::size_t>(tables.primes_.back() / sweep_segment_length) + 2),
        prime_offset_(medium_end_),
        square_offset_(small_square_end_),
        buckets_(ring_),
        words_(block) {}

  /// Starts a chunk at lo (>= 1).
  void reset(Natural lo) {
    lo_ = lo;
    for (std::size_t i = 0; i < medium_end_; ++i) {
      const Natural p = t_.primes_[i];
      prime_offset_[i] = static_cast<std::uint32_t>((p - lo % p) % p);
    }
    for (std::size_t i = 0; i < small_square_end_; ++i) {
      const Natural q = t_.squares_[i];
      square_offset_[i] = (q - lo % q) % q;
    }
    // A large prime p > sweep_segment_length hits a segment at most once: it waits in the bucket of
    // the segment of its next multiple (at most ring_ - 1 segments ahead), with its offset there.
    for (auto& bucket : buckets_) bucket.clear();
    current_bucket_ = 0;
    for (std::size_t i = medium_end_; i < t_.primes_.size(); ++i) {
      const std::uint32_t p = t_.primes_[i];
      const Natural first = (p - lo % p) % p;
      buckets_[static_cast<std::size_t>(first / sweep_segment_length)].push_back(
          {static_cast<std::uint32_t>(first % sweep_segment_length) | (log_bits(i) << segment_shift), p});
    }
    // A large square hits a few segments in all: a heap of next multiples, earliest on top.
    pending_squares_.clear();
    for (std::size_t i = small_square_end_; i < t_.squares_.size(); ++i) {
      const Natural q = t_.squares_[i];
      pending_squares_.push_back({lo + (q - lo % q) % q, q});
    }
    std::make_heap(pending_squares_.begin(), pending_squares_.end(), later);
  }

  /// mu(n) for n in [lo, lo + len) into out, then advances lo. Pre: len <= block, lo + len - 1 <= max_n.
  void next(std::size_t len, std::int8_t* out) {
    std::uint16_t* w = words_.data();
    std::size_t phase = static_cast<std::size_t>(lo_ % MuSieveTables::pattern_period);
    for (std::size_t done = 0; done < len;) {
      const std::size_t run = std::min<std::size_t>(len - done, MuSieveTables::pattern_period - phase);
      std::memcpy(w + done, MuSieveTables::pattern().data() + phase, run * sizeof(std::uint16_t));
      done += run;
      phase = 0;
    }
    const Natural hi = lo_ + len;
    // Primes below the L1 sub-block length sieve one 32 KiB sub-block at a time (their hits
    // then stay in L1), the larger ones the whole segment in one go.
    const std::size_t small_count = t_.small_prime_count_;
    for (std::size_t sub = 0; sub < len; sub += sub_block) {
      const std::size_t sub_end = std::min(len, sub + sub_block);
      for (std::size_t i = 0; i < small_count; ++i) {
        const std::uint32_t p = t_.primes_[i];
        const std::uint16_t inc = t_.increments_[i];
        std::size_t j = sub + prime_offset_[i];
        for (; j < sub_end; j += p) w[j] = static_cast<std::uint16_t>(w[j] + inc);
        prime_offset_[i] = static_cast<std::uint32_t>(j - sub_end);
      }
    }
    for (std::size_t i = small_count; i < medium_end_; ++i) {
      const std::uint32_t p = t_.primes_[i];
      const std::uint16_t inc = t_.increments_[i];
      std::size_t j = prime_offset_[i];
      for (; j < len; j += p) w[j] = static_cast<std::uint16_t>(w[j] + inc);
      prime_offset_[i] = static_cast<std::uint32_t>(j - len);
    }
    for (std::size_t i = 0; i < small_square_end_; ++i) {
      const Natural q = t_.squares_[i];
      Natural j = square_offset_[i];
      for (; j < len; j += q) w[j] = static_cast<std::uint16_t>(w[j] + 0x1000U);
      square_offset_[i] = j - len;
    }
    sieve_large_primes(len);
    while (!pending_squares_.empty() && pending_squares_.front().next < hi) {
      std::pop_heap(pending_squares_.begin(), pending_squares_.end(), later);
      PendingSquare& top = pending_squares_.back();
      w[top.next - lo_] = static_cast<std::uint16_t>(w[top.next - lo_] + 0x1000U);
      top.next += top.square;
      std::push_heap(pending_squares_.begin(), pending_squares_.end(), later);
    }
    // Thresholds 64 log2 n - 32: per n below 2^20, else per run of 2^12 values, over which
    // 64 log2 n grows by less than 0.4 units (the margin is 26 units either way).
    constexpr Natural exact_below = Natural{1} << 20;
    constexpr std::size_t run_length = std::size_t{1} << 12;
    std::size_t i = 0;
    for (; i < len && lo_ + i < exact_below; ++i) {
      const int threshold = static_cast<int>(std::floor(64.0 * std::log2(static_cast<double>(lo_ + i)) - 32.0));
      out[i] = mu_of_word(w[i], threshold);
    }
    while (i < len) {
      const std::size_t stop = std::min(len, i + run_length);
      const auto threshold = static_cast<std::uint16_t>(std::floor(64.0 * std::log2(static_cast<double>(lo_ + i)) - 32.0));
      // Branch-free so that the compiler vectorizes it.
      for (; i < stop; ++i) {
        const std::uint16_t x = w[i];
        const std::uint16_t odd = static_cast<std::uint16_t>((x >> 15) ^ ((x & 0xFFFU) < threshold ? 1U : 0U));
        const std::int8_t sign = static_cast<std::int8_t>(1 - 2 * odd);
        out[i] = (x & 0x7000U) != 0 ? std::int8_t{0} : sign;
      }
    }
    lo_ = hi;
  }

 private:
  static constexpr unsigned segment_shift = 17;
  static_assert(sweep_segment_length == std::size_t{1} << segment_shift);
  static constexpr std::uint32_t offset_mask = (std::uint32_t{1} << segment_shift) - 1;
  // A large prime waiting in a bucket: its offset in that segment (low 17 bits) and its log
  // units (the 11 bits above; below 2^11 for p < 2^22), and the prime.
  struct BucketedPrime {
    std::uint32_t packed;
    std::uint32_t prime;
  };
  struct PendingSquare {
    Natural next;
    Natural square;
  };
  static bool later(const PendingSquare& a, const PendingSquare& b) { return a.next > b.next; }
  [[nodiscard]] std::uint32_t log_bits(std::size_t prime_index) const { return t_.increments_[prime_index] & 0x7FFFU; }

  // Adds the current segment's large-prime hits and files each prime under its next segment.
  void sieve_large_primes(std::size_t len) {
    std::uint16_t* w = words_.data();
    auto& here = buckets_[current_bucket_];
    for (const BucketedPrime entry : here) {
      const std::uint32_t offset = entry.packed & offset_mask;
      // Offsets past a short last segment lie beyond the chunk: never read.
      if (offset < len) w[offset] = static_cast<std::uint16_t>(w[offset] + ((entry.packed >> segment_shift) | 0x8000U));
      const Natural next = Natural{offset} + entry.prime;
      std::size_t bucket = current_bucket_ + static_cast<std::size_t>(next >> segment_shift);
      if (bucket >= ring_) bucket -= ring_;
      buckets_[bucket].push_back({static_cast<std::uint32_t>(next & offset_mask) | (entry.packed & ~offset_mask), entry.prime});
    }
    here.clear();
    current_bucket_ = current_bucket_ + 1 == ring_ ? 0 : current_bucket_ + 1;
  }

  const MuSieveTables& t_;
  std::size_t medium_end_;        // primes_[0, medium_end_) are <= sweep_segment_length
  std::size_t small_square_end_;  // squares_[0, small_square_end_) are <= sweep_segment_length
  std::size_t ring_;              // buckets: enough that no prime skips past the ring
  std::vector<std::uint32_t> prime_offset_;
  std::vector<Natural> square_offset_;
  std::vector<std::vector<BucketedPrime>> buckets_;
  std::size_t current_bucket_ = 0;
  std::vector<PendingSquare> pending_squares_;
  std::vector<std::uint16_t> words_;
  Natural lo_ = 1;
};

}  // namespace sqfc::arith::detail
