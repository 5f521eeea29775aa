// SPDX-License-Identifier: MIT
// Baseline for the table benchmark: a plain, single-threaded, non-segmented linear sieve of mu
// to N, printing M(N), Q(N) and the time it took.
//
// This is deliberately the textbook method, written for the benchmark and sharing no code with
// the library's sieve: one int8 array mu[0..N] and a list of the primes found so far. Each
// composite m is written exactly once, from m = i * p where p is the least prime factor of m
// (the loop over the primes stops at the first p dividing i, so p <= lpf(i) always holds).
// Then mu(i * p) = 0 when p | i and -mu(i) otherwise. Memory: N + 1 bytes plus 4 bytes per
// prime <= N (about 1.2 GB at N = 10^9).
//
// Usage: baseline_linear_mu [N]   (N in the CLI number syntax, default 10^9, 1 <= N < 2^32)
// Output, one line each, meant for tests/bench/bench_table.sh:
//   baseline_linear_mu N=<N> M=<M(N)> Q=<Q(N)> sieve_seconds=<s> total_seconds=<s>
//   check: <published|none> <pass|FAIL>
// Exit code 0, or 1 when N is a power of ten in the table below and the answers differ from it,
// or 2 on a bad argument.
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <exception>
#include <iostream>
#include <memory>
#include <vector>

#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"

namespace {

// Published values at N = 10^k, k = 0..9: M(10^k) from OEIS A084237 and Q(10^k) from
// OEIS A071172.
struct Published {
  std::uint64_t n;
  std::int64_t mertens;
  std::uint64_t squarefree;
};
constexpr Published published[] = {
    {1, 1, 1},
    {10, -1, 7},
    {100, 1, 61},
    {1'000, 2, 608},
    {10'000, -23, 6'083},
    {100'000, -48, 60'794},
    {1'000'000, 212, 607'926},
    {10'000'000, 1'037, 6'079'291},
    {100'000'000, 1'928, 60'792'694},
    {1'000'000'000, -222, 607'927'124},
};

// Sentinel for "not reached yet": every i >= 2 that is still unmarked when the outer loop
// arrives at it is prime, because every composite was marked from a smaller i.
constexpr std::int8_t unmarked = 2;

}  // namespace

int main(int argc, char** argv) {
  std::uint64_t n = 1'000'000'000;
  try {
    if (argc > 2) throw sqfc::InvalidArgument("usage: baseline_linear_mu [N]");
    if (argc == 2) n = sqfc::parse_natural(argv[1], "N");
    // i and p stay below 2^32, so 32-bit division is used in the inner loop; the product
    // i * p is formed in 64 bits.
    if (n < 1 || n >= (std::uint64_t{1} << 32)) throw sqfc::InvalidArgument("N must lie in [1, 2^32)");
  } catch (const sqfc::Error& e) {
    std::cerr << "baseline_linear_mu: error: " << e.what() << '\n';
    return 2;
  }

  const auto t0 = std::chrono::steady_clock::now();
  // unique_ptr<T[]> with a fill instead of std::vector so the fill is the only pass before
  // the sieve (a vector would value-initialise and then be filled again).
  std::unique_ptr<std::int8_t[]> mu(new std::int8_t[n + 1]);
  std::fill(mu.get(), mu.get() + n + 1, unmarked);
  mu[0] = 0;
  mu[1] = 1;
  std::vector<std::uint32_t> primes;
  // pi(x) < 1.25506 x / ln x for x > 1, a classical explicit bound. Reserving that bound
  // avoids regrowth copies, which would briefly double the memory of the prime list; pages
  // reserved but never written do not count in the resident set.
  primes.reserve(static_cast<std::size_t>(1.26 * static_cast<double>(n) / std::log(static_cast<double>(n) + 2.0)) + 16);

  const auto n32 = static_cast<std::uint32_t>(n);
  for (std::uint32_t i = 2; i <= n32 && i != 0; ++i) {
    if (mu[i] == unmarked) {
      mu[i] = -1;
      primes.push_back(i);
    }
    const std::int8_t mi = mu[i];
    const std::uint64_t limit = n / i;  // p * i <= n  <=>  p <= floor(n / i)
    for (const std::uint32_t p : primes) {
      if (p > limit) break;
      const std::uint64_t m = std::uint64_t{p} * i;
      if (i % p == 0) {
        mu[m] = 0;
        break;
      }
      mu[m] = static_cast<std::int8_t>(-mi);
    }
  }
  const auto t1 = std::chrono::steady_clock::now();

  std::int64_t mertens = 0;
  std::uint64_t squarefree = 0;
  for (std::uint64_t k = 1; k <= n; ++k) {
    mertens += mu[k];
    squarefree += static_cast<std::uint64_t>(mu[k] != 0);
  }
  const auto t2 = std::chrono::steady_clock::now();

  const double sieve_seconds = std::chrono::duration<double>(t1 - t0).count();
  const double total_seconds = std::chrono::duration<double>(t2 - t0).count();
  std::printf("baseline_linear_mu N=%llu M=%lld Q=%llu primes=%zu sieve_seconds=%.3f total_seconds=%.3f\n",
              static_cast<unsigned long long>(n), static_cast<long long>(mertens),
              static_cast<unsigned long long>(squarefree), primes.size(), sieve_seconds, total_seconds);

  for (const auto& row : published) {
    if (row.n != n) continue;
    const bool ok = row.mertens == mertens && row.squarefree == squarefree;
    std::printf("check: published %s (expected M=%lld Q=%llu)\n", ok ? "pass" : "FAIL",
                static_cast<long long>(row.mertens), static_cast<unsigned long long>(row.squarefree));
    return ok ? 0 : 1;
  }
  std::printf("check: none (N is not a power of ten up to 10^9)\n");
  return 0;
}
