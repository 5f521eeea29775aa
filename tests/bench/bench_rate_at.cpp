// SPDX-License-Identifier: MIT
// Single-thread rate of the table engine's parallel part (sieve a block to factor codes, then
// summarise it) at chosen heights x, for the cluster cost estimates of docs/cluster.md: a run
// to N spends most of its time near N, where every block visits every sieving prime <= sqrt(N).
// Checks its answers: mu from the sieve equals mu from FLINT factoring at 64 n per height.
//
// Usage: bench_rate_at [--smoke] [--len L] [--block B] X...   (default X: 1e10 1e12 1e14 1e16 - L;
// B: the sieve block size, default config::default_block_size)
// Prints per height: x, len, block, seconds, values_per_second, tables_seconds (base-prime set-up).
#include <chrono>
#include <cstdio>
#include <string>
#include <vector>

#include "sqfc/arith/factor.hpp"
#include "sqfc/arith/factor_code.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/track/block_summary.hpp"

namespace {
using sqfc::Natural;
double seconds_since(std::chrono::steady_clock::time_point t) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t).count();
}
}  // namespace

int main(int argc, char** argv) {
  Natural len = Natural{1} << 26;  // 16 segments of 2^22 values
  std::vector<Natural> heights;
  bool smoke = false;
  std::size_t block = sqfc::config::default_block_size;
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    if (a == "--smoke") {
      smoke = true;
    } else if (a == "--block" && i + 1 < argc) {
      block = static_cast<std::size_t>(sqfc::parse_natural(argv[++i], "--block"));
    } else if (a == "--len" && i + 1 < argc) {
      len = sqfc::parse_natural(argv[++i], "--len");
    } else {
      heights.push_back(sqfc::parse_natural(a, "height"));
    }
  }
  if (smoke) {
    len = Natural{1} << 20;
    if (heights.empty()) heights = {1'000'000'000, 1'000'000'000'000};
  }
  if (heights.empty()) heights = {10'000'000'000ULL, 1'000'000'000'000ULL, 100'000'000'000'000ULL, sqfc::config::max_sieve_n - len};
  std::printf("x,len,block,seconds,values_per_second,tables_seconds\n");
  int failures = 0;
  for (const Natural x : heights) {
    const auto t0 = std::chrono::steady_clock::now();
    const sqfc::arith::SieveTables tables(x + len);
    const double table_seconds = seconds_since(t0);
    sqfc::arith::SegmentedSieve sieve(tables, block);
    std::vector<sqfc::arith::FactorCode> codes(block);
    std::vector<std::pair<Natural, sqfc::arith::FactorCode>> sample;  // (first n of a block, its code)
    Natural mertens = 0;
    const auto t1 = std::chrono::steady_clock::now();
    sieve.reset(x, x + len);
    while (sieve.next_block_codes(codes.data())) {
      const auto s = sqfc::track::summarize_codes(sieve.last_lo(), codes.data(), sieve.last_size());
      mertens += static_cast<Natural>(s.mertens);
      if (sample.size() < 64) sample.emplace_back(sieve.last_lo(), codes[0]);
    }
    const double sieve_seconds = seconds_since(t1);
    // The first value of each of the first 64 blocks, against FLINT.
    for (const auto& [n, code] : sample)
      if (sqfc::arith::code_mu(code) != sqfc::arith::arithmetic_values(n).mu) ++failures;
    std::printf("%llu,%llu,%zu,%.3f,%.4g,%.3f\n", static_cast<unsigned long long>(x),
                static_cast<unsigned long long>(len), block, sieve_seconds, static_cast<double>(len) / sieve_seconds, table_seconds);
    (void)mertens;
  }
  std::printf("check: mu against FLINT %s\n", failures ? "FAIL" : "pass");
  return failures ? 1 : 0;
}
