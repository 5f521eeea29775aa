// SPDX-License-Identifier: MIT
/// @file sieve.hpp  Segmented sieve of mu(n), omega(n) and Omega(n) over cache-sized blocks.
#pragma once

#include <cstddef>
#include <cstdint>
#include <vector>

#include "sqfc/arith/factor_code.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// Read-only tables shared by every sieve of a run: base primes, the prime powers to sieve
/// and the pre-sieved pattern of the powers of 2, 3, 5, 7 dividing 151200.
/// Invariant: covers every n <= max_n (all primes p <= floor(sqrt(max_n)) and all their
/// powers <= max_n are present). Immutable after construction, so any number of threads may
/// share one instance.
class SieveTables {
 public:
  /// Builds the tables for sieving any [lo, hi) with hi - 1 <= max_n.
  /// Pre: 1 <= max_n <= config::max_sieve_n (checked; InvalidArgument).
  /// Complexity: O(sqrt(max_n) log log max_n) time; 4 bytes per prime up to sqrt(max_n)
  /// plus 16 bytes per sieving entry plus 600 KiB for the pattern.
  explicit SieveTables(Natural max_n);

  /// One arithmetic progression of the sieve: every multiple of `modulus` gets `increment`
  /// added to its packed word.
  struct Entry {
    std::uint64_t modulus;
    std::uint32_t increment;
  };

  [[nodiscard]] Natural max_n() const noexcept { return max_n_; }
  [[nodiscard]] const std::vector<Entry>& entries() const noexcept { return entries_; }
  [[nodiscard]] const std::vector<std::uint32_t>& pattern() const noexcept { return pattern_; }
  /// Number of base primes (all primes <= floor(sqrt(max_n))).
  [[nodiscard]] std::size_t prime_count() const noexcept { return prime_count_; }

 private:
  Natural max_n_;
  std::size_t prime_count_ = 0;
  std::vector<Entry> entries_;
  std::vector<std::uint32_t> pattern_;
};

/// The sieve's answer for one block [lo, hi): per n, omega(n), Omega(n), mu(n), lambda(n).
/// Index i stands for n = lo + i (0-based). The view is valid until the sieve advances.
class SieveBlock {
 public:
  SieveBlock() = default;
  SieveBlock(Natural lo, std::size_t size, const std::uint32_t* words) : lo_(lo), size_(size), words_(words) {}

  [[nodiscard]] Natural lo() const noexcept { return lo_; }
  /// One past the last n of the block (half-open range).
  [[nodiscard]] Natural hi() const noexcept { return lo_ + size_; }
  [[nodiscard]] std::size_t size() const noexcept { return size_; }
  /// Packed factor code of n = lo + i. Pre: i < size() (assumed).
  [[nodiscard]] FactorCode code(std::size_t i) const noexcept { return static_cast<FactorCode>(words_[i] & 0x3F); }
  [[nodiscard]] int omega(std::size_t i) const noexcept { return code_omega(code(i)); }
  [[nodiscard]] int big_omega(std::size_t i) const noexcept { return static_cast<int>((words_[i] >> 8) & 0xFF); }
  [[nodiscard]] bool is_squarefree(std::size_t i) const noexcept { return code_is_squarefree(code(i)); }
  [[nodiscard]] int mu(std::size_t i) const noexcept { return code_mu(code(i)); }
  [[nodiscard]] int liouville(std::size_t i) const noexcept { return code_liouville(code(i)); }
  /// Raw finalized words: bits 0-5 the FactorCode, bits 8-15 Omega(n).
  [[nodiscard]] const std::uint32_t* words() const noexcept { return words_; }

 private:
  Natural lo_ = 0;
  std::size_t size_ = 0;
  const std::uint32_t* words_ = nullptr;
};

/// Sieves consecutive blocks of a range [lo, hi) in increasing order.
/// Invariant: after next_block() returned true, block() holds exact values for its range.
/// Method: every prime power q <= hi - 1 with q = p^k adds round(4 log2 p) quarter-bits, one
/// to Omega, and (k = 1) one to omega or (k >= 2) one to a square counter to its multiples'
/// packed words; what is left of n afterwards is 1 or a single prime > sqrt(hi - 1), and the
/// log sum tells which with a proven margin (docs/algorithms/sieve.md).
/// One instance per thread; reuse it with reset() so that no memory is allocated per block.
class SegmentedSieve {
 public:
  /// Pre: tables outlive the sieve; 2^10 <= block_size <= 2^24 (checked; InvalidArgument).
  /// Complexity: memory 4 * block_size bytes plus 8 bytes per sieving entry.
  SegmentedSieve(const SieveTables& tables, std::size_t block_size = config::default_block_size);

  /// Starts sieving [lo, hi).
  /// Pre: 1 <= lo <= hi and hi - 1 <= tables.max_n() (checked; InvalidArgument).
  /// Complexity: O(number of sieving entries) (one division each).
  void reset(Natural lo, Natural hi);

  /// Sieves the next block (at most block_size values). Returns false when [lo, hi) is done.
  /// Complexity: O(B log log hi + E) for a block of B values and E sieving entries.
  bool next_block();

  /// Sieves the next block like next_block() but writes only the factor codes, out[i] for
  /// n = last_lo() + i, skipping the word array's final pass (the table engine's fast path).
  /// block() is not valid afterwards. Pre: out has room for block_size() codes (assumed).
  bool next_block_codes(FactorCode* out);
  /// First n and size of the block sieved last (by either call).
  [[nodiscard]] Natural last_lo() const noexcept { return last_lo_; }
  [[nodiscard]] std::size_t last_size() const noexcept { return last_size_; }

  /// The block sieved last. Pre: next_block() returned true (assumed).
  [[nodiscard]] const SieveBlock& block() const noexcept { return block_; }
  [[nodiscard]] std::size_t block_size() const noexcept { return block_size_; }

 private:
  const SieveTables* tables_;
  std::size_t block_size_;
  Natural next_lo_ = 1;
  Natural hi_ = 1;
  std::vector<std::uint64_t> offsets_;  // per entry: index of its next multiple from next_lo_
  std::vector<std::uint32_t> words_;
  SieveBlock block_;
  Natural last_lo_ = 0;
  std::size_t last_size_ = 0;

  // Adds the pattern and every sieving entry for [next_lo_, next_lo_ + len) into words_.
  void sieve_words(std::size_t len);
};

/// Sieves [lo, hi) block by block on the calling thread and calls visit(const SieveBlock&).
/// Pre: as SegmentedSieve::reset. Complexity: O((hi - lo) log log hi + sqrt(hi)).
template <class Visit>
void sieve_range(Natural lo, Natural hi, Visit&& visit, std::size_t block_size = config::default_block_size) {
  if (hi <= lo) return;
  const SieveTables tables(hi - 1);
  SegmentedSieve sieve(tables, block_size);
  sieve.reset(lo, hi);
  while (sieve.next_block()) visit(sieve.block());
}

}  // namespace sqfc::arith
