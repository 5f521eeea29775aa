// SPDX-License-Identifier: MIT
// Segmented sieve of omega, Omega and squarefreeness with an exact large-prime test.
#include "sqfc/arith/sieve.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstring>
#include <string>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::arith {
namespace {

// Packed word while sieving: bits 0-7 log sum in quarter-bits, 8-15 omega, 16-23 Omega,
// 24-31 hits of squares. Each field stays below 256 for n < 2^56 (4.5 log2 n < 256,
// Omega <= 56), so additions never carry into a neighbour.
constexpr std::uint32_t omega_one = 1U << 8;
constexpr std::uint32_t big_omega_one = 1U << 16;
constexpr std::uint32_t square_one = 1U << 24;

// 2^5 3^3 5^2 7: the powers of 2, 3, 5, 7 dividing it are pre-sieved into a repeating pattern,
// which removes about 1.8 of the 3.5 hits per value of a run to 10^10.
constexpr std::uint64_t pattern_period = 32ULL * 27 * 25 * 7;

std::uint32_t quarter_bits(std::uint64_t p) {
  return static_cast<std::uint32_t>(std::lround(4.0 * std::log2(static_cast<double>(p))));
}

// Threshold on the log sum below which a prime > sqrt(hi - 1) remains, for floor(log2 n) = e.
// With s the sieved part of n, the sum lies in [3.5 log2 s, 4.5 log2 s] (each prime power
// adds 4 log2 p +- 0.5 and there are at most log2 s of them). No prime left: s = n, sum >=
// 3.5 e. One left: s < sqrt(n), sum < 2.25 (e + 1) <= floor(3.5 e) for e >= 2.
constexpr std::array<std::uint32_t, 64> make_thresholds() {
  std::array<std::uint32_t, 64> t{};
  t[0] = 0;  // n = 1: nothing remains
  t[1] = 1;  // n = 2, 3: sieved by the pattern (sum 4 or 6) or, unsieved, sum 0
  for (int e = 2; e < 64; ++e) t[e] = static_cast<std::uint32_t>((7 * e) / 2);
  return t;
}
constexpr auto large_prime_threshold = make_thresholds();

}  // namespace

SieveTables::SieveTables(Natural max_n) : max_n_(max_n) {
  if (max_n < 1 || max_n > config::max_sieve_n)
    throw InvalidArgument("sieve bound " + std::to_string(max_n) + " is outside [1, " +
                          std::to_string(config::max_sieve_n) + "]");
  const auto root = integer_sqrt(max_n);
  const auto primes = primes_up_to(root);
  prime_count_ = primes.size();

  pattern_.assign(pattern_period, 0);
  for (std::uint64_t p : {2ULL, 3ULL, 5ULL, 7ULL}) {
    const auto inc_first = quarter_bits(p) + omega_one + big_omega_one;
    const auto inc_power = quarter_bits(p) + square_one + big_omega_one;
    for (std::uint64_t q = p; pattern_period % q == 0; q *= p)
      for (std::uint64_t i = 0; i < pattern_period; i += q) pattern_[i] += (q == p ? inc_first : inc_power);
  }

  for (std::uint64_t p : primes) {
    const auto inc_first = quarter_bits(p) + omega_one + big_omega_one;
    const auto inc_power = quarter_bits(p) + square_one + big_omega_one;
    // q runs over p^k <= max_n; q <= max_n / p guards the multiplication.
    for (std::uint64_t q = p;; q *= p) {
      const bool in_pattern = p <= 7 && pattern_period % q == 0;
      if (!in_pattern) entries_.push_back({q, q == p ? inc_first : inc_power});
      if (q > max_n / p) break;
    }
  }
  std::sort(entries_.begin(), entries_.end(), [](const Entry& a, const Entry& b) { return a.modulus < b.modulus; });
}

SegmentedSieve::SegmentedSieve(const SieveTables& tables, std::size_t block_size)
    : tables_(&tables), block_size_(block_size) {
  if (block_size < (1U << 10) || block_size > (1U << 24))
    throw InvalidArgument("sieve block size " + std::to_string(block_size) + " is outside [2^10, 2^24]");
  offsets_.resize(tables.entries().size());
  words_.resize(block_size);
}

void SegmentedSieve::reset(Natural lo, Natural hi) {
  if (lo < 1 || hi < lo || hi - 1 > tables_->max_n())
    throw InvalidArgument("sieve range [" + std::to_string(lo) + ", " + std::to_string(hi) +
                          ") is outside the tables' range [1, " + std::to_string(tables_->max_n()) + "]");
  next_lo_ = lo;
  hi_ = hi;
  const auto& entries = tables_->entries();
  for (std::size_t e = 0; e < entries.size(); ++e) {
    const auto q = entries[e].modulus;
    offsets_[e] = (q - lo % q) % q;
  }
}

void SegmentedSieve::sieve_words(std::size_t len) {
  const Natural lo = next_lo_;
  std::uint32_t* w = words_.data();

  // 1. Start from the pattern of the powers of 2, 3, 5, 7.
  const auto& pattern = tables_->pattern();
  std::size_t phase = static_cast<std::size_t>(lo % pattern_period);
  for (std::size_t done = 0; done < len;) {
    const std::size_t run = std::min<std::size_t>(len - done, pattern_period - phase);
    std::memcpy(w + done, pattern.data() + phase, run * sizeof(std::uint32_t));
    done += run;
    phase = 0;
  }

  // 2. Every other prime power adds its increment to its multiples.
  const auto& entries = tables_->entries();
  const std::size_t entry_count = entries.size();
  std::uint64_t* offsets = offsets_.data();
  for (std::size_t e = 0; e < entry_count; ++e) {
    const std::uint64_t q = entries[e].modulus;
    const std::uint32_t inc = entries[e].increment;
    std::uint64_t j = offsets[e];
    for (; j < len; j += q) w[j] += inc;
    offsets[e] = j - len;
  }
}

namespace {

// Decides the remaining large prime for each n of [lo, lo + len) and calls
// store(i, omega, big_omega, squarefree). The threshold depends only on floor(log2 n), so the
// loop is split at powers of two.
template <class Store>
inline void finalize_words(Natural lo, std::size_t len, const std::uint32_t* w, Store&& store) {
  std::size_t i = 0;
  while (i < len) {
    const Natural n = lo + i;
    const int e = floor_log2(n);
    const Natural next_power = e >= 63 ? ~Natural{0} : (Natural{1} << (e + 1));
    const std::size_t stop = static_cast<std::size_t>(std::min<Natural>(len, next_power - lo));
    const std::uint32_t threshold = large_prime_threshold[e];
    for (; i < stop; ++i) {
      const std::uint32_t x = w[i];
      const std::uint32_t large = (x & 0xFFU) < threshold ? 1U : 0U;
      const std::uint32_t omega = ((x >> 8) & 0xFFU) + large;
      const std::uint32_t big_omega = ((x >> 16) & 0xFFU) + large;
      const std::uint32_t squarefree = (x >> 24) == 0 ? 1U : 0U;
      store(i, omega, big_omega, squarefree);
    }
  }
}

}  // namespace

bool SegmentedSieve::next_block() {
  if (next_lo_ >= hi_) return false;
  const Natural lo = next_lo_;
  const auto len = static_cast<std::size_t>(std::min<Natural>(block_size_, hi_ - lo));
  sieve_words(len);
  std::uint32_t* w = words_.data();
  finalize_words(lo, len, w, [w](std::size_t i, std::uint32_t omega, std::uint32_t big_omega, std::uint32_t squarefree) {
    w[i] = omega | (squarefree << 4) | ((big_omega & 1U) << 5) | (big_omega << 8);
  });
  block_ = SieveBlock(lo, len, w);
  last_lo_ = lo;
  last_size_ = len;
  next_lo_ = lo + len;
  return true;
}

bool SegmentedSieve::next_block_codes(FactorCode* out) {
  if (next_lo_ >= hi_) return false;
  const Natural lo = next_lo_;
  const auto len = static_cast<std::size_t>(std::min<Natural>(block_size_, hi_ - lo));
  sieve_words(len);
  finalize_words(lo, len, words_.data(),
                 [out](std::size_t i, std::uint32_t omega, std::uint32_t big_omega, std::uint32_t squarefree) {
                   out[i] = static_cast<FactorCode>(omega | (squarefree << 4) | ((big_omega & 1U) << 5));
                 });
  block_ = SieveBlock();
  last_lo_ = lo;
  last_size_ = len;
  next_lo_ = lo + len;
  return true;
}

}  // namespace sqfc::arith
