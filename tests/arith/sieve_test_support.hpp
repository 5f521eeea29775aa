// SPDX-License-Identifier: MIT
// Helpers shared by the sieve tests: run the segmented sieve over [lo, hi) into plain values,
// checking the block bookkeeping on the way, and compare with an oracle.
#pragma once

#include <gtest/gtest.h>

#include <cstdint>
#include <sstream>
#include <string>
#include <vector>

#include "sqfc/arith/factor_code.hpp"
#include "sqfc/arith/sieve.hpp"

namespace sqfc::testing {

/// What the sieve reports for one n, with the code's bits unpacked.
struct SievedValue {
  int mu;
  int omega;
  int big_omega;
  int liouville;
  bool squarefree;
  arith::FactorCode code;
};

/// Sieves [lo, hi) with `tables` and blocks of `block_size` values; value i is n = lo + i.
/// Checks on the way (EXPECT_*): blocks are contiguous, start at lo, end at hi, every block
/// but the last holds exactly block_size values, and each n's accessors agree with its code.
/// `blocks`, when given, receives the number of blocks.
inline std::vector<SievedValue> sieve_values(const arith::SieveTables& tables, Natural lo, Natural hi,
                                             std::size_t block_size, std::uint64_t* blocks = nullptr) {
  std::vector<SievedValue> values;
  values.reserve(hi > lo ? hi - lo : 0);
  arith::SegmentedSieve sieve(tables, block_size);
  sieve.reset(lo, hi);
  Natural expected_lo = lo;
  std::uint64_t block_count = 0;
  std::uint64_t inconsistent = 0;
  while (sieve.next_block()) {
    const auto& block = sieve.block();
    EXPECT_EQ(block.lo(), expected_lo) << "block " << block_count;
    EXPECT_EQ(block.hi(), block.lo() + block.size());
    EXPECT_GE(block.size(), 1U);
    EXPECT_LE(block.size(), block_size);
    if (block.hi() < hi) {
      EXPECT_EQ(block.size(), block_size) << "short block before the end";
    }
    for (std::size_t i = 0; i < block.size(); ++i) {
      const auto code = block.code(i);
      SievedValue v{block.mu(i), block.omega(i), block.big_omega(i), block.liouville(i), block.is_squarefree(i), code};
      const bool consistent = (code & 0xC0) == 0 && v.omega == arith::code_omega(code) &&
                              v.squarefree == arith::code_is_squarefree(code) && v.mu == arith::code_mu(code) &&
                              v.liouville == (v.big_omega % 2 ? -1 : 1) && (block.words()[i] & 0x3F) == code &&
                              static_cast<int>((block.words()[i] >> 8) & 0xFF) == v.big_omega &&
                              v.mu == (v.squarefree ? (v.omega % 2 ? -1 : 1) : 0);
      if (!consistent) ++inconsistent;
      values.push_back(v);
    }
    expected_lo = block.hi();
    ++block_count;
  }
  EXPECT_EQ(expected_lo, hi > lo ? hi : lo) << "blocks do not end at hi";
  EXPECT_EQ(inconsistent, 0U) << "values whose accessors disagree with their code";
  EXPECT_FALSE(sieve.next_block()) << "a finished sieve produced another block";
  if (blocks) *blocks = block_count;
  return values;
}

/// Compares sieved values for n = lo + i with oracle(n) (anything with mu, omega,
/// big_omega). Returns the number of mismatches; the first few are described in *report.
template <class Oracle>
std::uint64_t count_mismatches(const std::vector<SievedValue>& values, Natural lo, Oracle&& oracle,
                               std::string* report) {
  std::uint64_t mismatches = 0;
  std::ostringstream out;
  for (std::size_t i = 0; i < values.size(); ++i) {
    const Natural n = lo + i;
    const auto expected = oracle(n);
    const auto& v = values[i];
    if (v.mu == expected.mu && v.omega == expected.omega && v.big_omega == expected.big_omega &&
        v.squarefree == (expected.mu != 0) && v.liouville == (expected.big_omega % 2 ? -1 : 1))
      continue;
    if (++mismatches <= 5)
      out << " n=" << n << " sieve(mu,omega,Omega)=(" << v.mu << "," << v.omega << "," << v.big_omega << ") oracle=("
          << expected.mu << "," << expected.omega << "," << expected.big_omega << ");";
  }
  if (report) *report = out.str();
  return mismatches;
}

/// True when two sieved value lists are identical.
inline bool same_values(const std::vector<SievedValue>& a, const std::vector<SievedValue>& b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i)
    if (a[i].code != b[i].code || a[i].big_omega != b[i].big_omega) return false;
  return true;
}

}  // namespace sqfc::testing
