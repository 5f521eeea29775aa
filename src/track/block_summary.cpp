// SPDX-License-Identifier: MIT
// Block summaries: the per-block scan and the merge.
#include "sqfc/track/block_summary.hpp"

#include <algorithm>
#include <limits>
#include <string>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::track {
namespace {

constexpr std::array<int, arith::factor_code_count> make_mu_table() {
  std::array<int, arith::factor_code_count> t{};
  for (int c = 0; c < arith::factor_code_count; ++c) t[c] = arith::code_mu(static_cast<arith::FactorCode>(c));
  return t;
}
constexpr auto mu_of_code = make_mu_table();

}  // namespace

Count BlockSummary::squarefree() const noexcept {
  Count total = 0;
  for (int w = 0; w < config::omega_slots; ++w) total += odd_squarefree[w] + even_squarefree[w];
  return total;
}

Count BlockSummary::divisibility_edges() const noexcept {
  Count total = 0;
  for (int w = 1; w < config::omega_slots; ++w)
    total += (odd_squarefree[w] + even_squarefree[w]) * complex::divisibility_edges_below(w);
  return total;
}

BlockSummary merge_summaries(const BlockSummary& a, const BlockSummary& b) {
  if (a.hi != b.lo)
    throw InvalidArgument("cannot merge block summaries of [" + std::to_string(a.lo) + ", " + std::to_string(a.hi) +
                          ") and [" + std::to_string(b.lo) + ", " + std::to_string(b.hi) + "): not adjacent");
  if (a.empty()) return b;
  if (b.empty()) return a;
  BlockSummary m = a;
  m.hi = b.hi;
  m.mertens = a.mertens + b.mertens;
  m.liouville = a.liouville + b.liouville;
  for (int w = 0; w < config::omega_slots; ++w) {
    m.odd_squarefree[w] += b.odd_squarefree[w];
    m.even_squarefree[w] += b.even_squarefree[w];
  }
  m.prefix_low = std::min(a.prefix_low, a.mertens + b.prefix_low);
  m.prefix_high = std::max(a.prefix_high, a.mertens + b.prefix_high);
  m.mu_last = b.mu_last;
  return m;
}

BlockSummary summarize_codes(Natural lo, const arith::FactorCode* codes, std::size_t count) {
  BlockSummary s;
  s.lo = lo;
  s.hi = lo + count;
  if (count == 0) return s;
  // Two histograms per parity of n so that consecutive increments rarely hit the same
  // counter (store-to-load forwarding stalls otherwise dominate the scan).
  std::array<std::array<std::uint32_t, arith::factor_code_count>, 4> histogram{};
  SignedSum prefix = 0;
  SignedSum low = std::numeric_limits<SignedSum>::max();
  SignedSum high = std::numeric_limits<SignedSum>::min();
  // hist[0], hist[2] take n of the parity of lo; hist[1], hist[3] the other.
  std::size_t i = 0;
  for (; i + 4 <= count; i += 4) {
    const auto c0 = codes[i], c1 = codes[i + 1], c2 = codes[i + 2], c3 = codes[i + 3];
    ++histogram[0][c0];
    ++histogram[1][c1];
    ++histogram[2][c2];
    ++histogram[3][c3];
    prefix += mu_of_code[c0];
    low = std::min(low, prefix);
    high = std::max(high, prefix);
    prefix += mu_of_code[c1];
    low = std::min(low, prefix);
    high = std::max(high, prefix);
    prefix += mu_of_code[c2];
    low = std::min(low, prefix);
    high = std::max(high, prefix);
    prefix += mu_of_code[c3];
    low = std::min(low, prefix);
    high = std::max(high, prefix);
  }
  for (; i < count; ++i) {
    ++histogram[i & 1][codes[i]];
    prefix += mu_of_code[codes[i]];
    low = std::min(low, prefix);
    high = std::max(high, prefix);
  }
  s.prefix_low = low;
  s.prefix_high = high;
  s.mertens = prefix;
  s.mu_last = mu_of_code[codes[count - 1]];
  const bool lo_odd = (lo & 1) != 0;
  for (int c = 0; c < arith::factor_code_count; ++c) {
    const Count same = Count{histogram[0][c]} + histogram[2][c];   // parity of lo
    const Count other = Count{histogram[1][c]} + histogram[3][c];  // the other parity
    const auto code = static_cast<arith::FactorCode>(c);
    s.liouville += static_cast<SignedSum>(same + other) * arith::code_liouville(code);
    if (!arith::code_is_squarefree(code)) continue;
    const int w = arith::code_omega(code);
    s.odd_squarefree[w] += lo_odd ? same : other;
    s.even_squarefree[w] += lo_odd ? other : same;
  }
  return s;
}

}  // namespace sqfc::track
