// SPDX-License-Identifier: MIT
// Driver of tests/bench/bench_omega_counting.sh: one evaluation of the squarefree counts by omega
// at x, either by counting over primes (arith::count_by_omega) or, as the baseline, by the
// segmented sieve over [1, x] on the same threads (arith::SegmentedSieve through
// for_each_segment_ordered, one histogram of factor code and parity per segment).
//
// Usage: bench_omega_counting --method counting|sieve --x X [--threads T]
// Prints one line:
//   method=M x=X threads=T seconds=S squarefree=Q faces=f_0,f_1,... odd=o_0,o_1,... betti=b_0,b_1,...
// where seconds is the wall time of the computation alone (the script also times the process),
// faces[d] = squarefree k <= x with omega(k) = d + 1, odd[m] = odd squarefree k <= x with
// omega(k) = m (m from 0), betti[d] the unreduced Betti numbers of K_x (Björner 2011).
// Exit codes: 0 done, 2 bad usage or an argument the library refuses.
#include <array>
#include <chrono>
#include <cstdint>
#include <iostream>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "sqfc/arith/omega_counting.hpp"
#include "sqfc/arith/parallel_segments.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"

namespace {

using sqfc::Natural;

// Squarefree counts by omega over [1, x] by the segmented sieve: per segment a histogram of
// (factor code, parity of n), summed in segment order.
sqfc::arith::OmegaCounts sieve_counts(Natural x, unsigned threads) {
  const sqfc::arith::SieveTables tables(x);
  const Natural segment = sqfc::config::default_segment_size;
  using Histogram = std::array<std::uint64_t, 2 * sqfc::arith::factor_code_count>;
  std::vector<sqfc::arith::SegmentedSieve> sieves;
  std::vector<std::vector<sqfc::arith::FactorCode>> buffers;
  std::vector<Histogram> partial(threads);
  for (unsigned t = 0; t < threads; ++t) {
    sieves.emplace_back(tables);
    buffers.emplace_back(sieves.back().block_size());
  }
  Histogram total{};
  sqfc::arith::for_each_segment_ordered(
      1, x + 1, segment, threads,
      [&](unsigned w, Natural, Natural lo, Natural hi) {
        Histogram& h = partial[w];
        h.fill(0);
        auto& sieve = sieves[w];
        sieve.reset(lo, hi);
        while (sieve.next_block_codes(buffers[w].data())) {
          const Natural first = sieve.last_lo();
          for (std::size_t i = 0; i < sieve.last_size(); ++i)
            ++h[2 * buffers[w][i] + ((first + i) & 1)];
        }
      },
      [&](unsigned w, Natural) {
        for (std::size_t i = 0; i < total.size(); ++i) total[i] += partial[w][i];
      });
  sqfc::arith::OmegaCounts counts;
  counts.squarefree_by_omega.assign(sqfc::config::omega_slots, 0);
  counts.odd_squarefree_by_omega.assign(sqfc::config::omega_slots, 0);
  for (int code = 0; code < sqfc::arith::factor_code_count; ++code) {
    const auto c = static_cast<sqfc::arith::FactorCode>(code);
    if (!sqfc::arith::code_is_squarefree(c)) continue;
    const auto m = static_cast<std::size_t>(sqfc::arith::code_omega(c));
    counts.squarefree_by_omega[m] += total[2 * code] + total[2 * code + 1];
    counts.odd_squarefree_by_omega[m] += total[2 * code + 1];
  }
  // The same shape as count_by_omega: trailing zero totals dropped from both vectors.
  while (counts.squarefree_by_omega.size() > 1 && counts.squarefree_by_omega.back() == 0) {
    counts.squarefree_by_omega.pop_back();
    counts.odd_squarefree_by_omega.pop_back();
  }
  return counts;
}

std::string join(const std::vector<std::uint64_t>& v, std::size_t from = 0) {
  std::ostringstream out;
  for (std::size_t i = from; i < v.size(); ++i) out << (i > from ? "," : "") << v[i];
  return out.str();
}

int usage(const std::string& problem) {
  std::cerr << "bench_omega_counting: " << problem
            << " (usage: bench_omega_counting --method counting|sieve --x X [--threads T])\n";
  return 2;
}

}  // namespace

int main(int argc, char** argv) {
  std::string method;
  Natural x = 0;
  unsigned threads = std::max(1U, std::thread::hardware_concurrency());
  try {
    for (int i = 1; i < argc; ++i) {
      const std::string a = argv[i];
      if (i + 1 >= argc) return usage("option " + a + " needs a value");
      const std::string v = argv[++i];
      if (a == "--method") method = v;
      else if (a == "--x") x = sqfc::parse_natural(v, "--x");
      else if (a == "--threads") threads = static_cast<unsigned>(sqfc::parse_natural(v, "--threads"));
      else return usage("unknown option " + a);
    }
    if (method != "counting" && method != "sieve") return usage("--method must be counting or sieve");
    if (x < 1) return usage("--x must be at least 1");
    if (threads < 1 || threads > 256) return usage("--threads must be in 1..256");
    const auto start = std::chrono::steady_clock::now();
    const auto counts = method == "counting" ? sqfc::arith::count_by_omega(x, threads) : sieve_counts(x, threads);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    std::uint64_t q = 0;
    for (const auto v : counts.squarefree_by_omega) q += v;
    const auto upper = sqfc::arith::odd_upper_half_by_omega(counts);
    std::vector<std::uint64_t> betti;
    for (std::size_t d = 0; d + 1 < upper.size(); ++d) betti.push_back(upper[d + 1] + (d == 0 ? 1 - upper[0] : 0));
    std::cout << "method=" << method << " x=" << x << " threads=" << threads << " seconds=" << seconds
              << " squarefree=" << q << " faces=" << join(counts.squarefree_by_omega, 1)
              << " odd=" << join(counts.odd_squarefree_by_omega) << " betti=" << join(betti) << "\n";
    return 0;
  } catch (const sqfc::Error& e) {
    return usage(e.what());
  }
}
