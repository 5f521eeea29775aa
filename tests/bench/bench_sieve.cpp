// SPDX-License-Identifier: MIT
// Google Benchmark of arith::SegmentedSieve over [lo, lo + len) for a grid of starting points
// and block sizes, reporting values per second; every configuration checks its own answers.
//
// Grid: lo in {1, 10^9, 10^12} x block size in {2^15, 2^16, 2^17, 2^18}; len = 10^7 values
// (10^4 with --smoke). Each benchmark builds its SieveTables outside the timed loop; the timed
// loop is reset() plus next_block() over the whole range, i.e. the sieve alone.
//
// Checks (all outside the timed loop; a failure marks the benchmark as errored and makes the
// program exit with status 1):
//   1. before timing, with a fresh sieve, and after timing, with the sieve reused by every
//      timed iteration: the blocks tile [lo, lo + len) in order, none is longer than the
//      block size, and the digest (sum of mu, number of squarefree n, sum of omega, sum of
//      Omega, sum of lambda) equals that of an independent reference sieve written below
//      (remainder division by every prime <= sqrt(hi - 1); shares no code with the library);
//   2. at lo = 1 the range is [1, len], so sum mu = M(len) and the squarefree count = Q(len)
//      must equal the published values (OEIS A084237 and A071172);
//   3. mu, omega and Omega of a few n of the range (the first and last eight and eight spread
//      between) are compared with trial division.
//
// Usage: bench_sieve [--smoke] [--len=N] [Google Benchmark flags, e.g. --benchmark_filter=...]
#include <benchmark/benchmark.h>

#include <algorithm>
#include <bit>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <map>
#include <string>
#include <utility>
#include <vector>

#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/core/types.hpp"

namespace {

using sqfc::Natural;

/// What the checks compare: totals over the range.
struct Digest {
  std::int64_t mu_sum = 0;
  std::uint64_t squarefree = 0;
  std::uint64_t omega_sum = 0;
  std::uint64_t big_omega_sum = 0;
  std::int64_t lambda_sum = 0;
  bool operator==(const Digest&) const = default;
};

std::string describe(const Digest& d) {
  return "mu_sum=" + std::to_string(d.mu_sum) + " squarefree=" + std::to_string(d.squarefree) +
         " omega_sum=" + std::to_string(d.omega_sum) + " Omega_sum=" + std::to_string(d.big_omega_sum) +
         " lambda_sum=" + std::to_string(d.lambda_sum);
}

// Set by any failed check; main() returns 1 when it is set.
bool g_failed = false;

/// Primes <= limit by the sieve of Eratosthenes (for the reference sieve only).
std::vector<std::uint64_t> primes_up_to(std::uint64_t limit) {
  std::vector<bool> composite(limit + 1, false);
  std::vector<std::uint64_t> primes;
  for (std::uint64_t i = 2; i <= limit; ++i) {
    if (composite[i]) continue;
    primes.push_back(i);
    for (std::uint64_t j = i * i; j <= limit; j += i) composite[j] = true;
  }
  return primes;
}

std::uint64_t isqrt(std::uint64_t x) {
  std::uint64_t r = 0;
  for (std::uint64_t bit = std::uint64_t{1} << 31; bit != 0; bit >>= 1)
    if ((r + bit) * (r + bit) <= x) r += bit;
  return r;
}

/// Reference digest of [lo, hi): for each chunk, divide every n by each prime p <= sqrt(hi - 1)
/// as often as it goes; what remains is 1 or one prime. Complexity: O((hi - lo) log log hi)
/// 64-bit divisions plus O(sqrt(hi)) for the primes; memory 24 bytes per chunk value.
Digest reference_digest(Natural lo, Natural hi) {
  const auto primes = primes_up_to(isqrt(hi - 1));
  constexpr Natural chunk = Natural{1} << 18;
  std::vector<std::uint64_t> rest;
  std::vector<int> omega;
  std::vector<int> big_omega;
  std::vector<bool> square;
  Digest d;
  for (Natural a = lo; a < hi; a += std::min(chunk, hi - a)) {
    const Natural b = std::min(hi, a + chunk);
    const std::size_t size = b - a;
    rest.resize(size);
    for (std::size_t i = 0; i < size; ++i) rest[i] = a + i;
    omega.assign(size, 0);
    big_omega.assign(size, 0);
    square.assign(size, false);
    for (const auto p : primes) {
      for (Natural m = (a + p - 1) / p * p; m < b; m += p) {
        const std::size_t i = m - a;
        int e = 0;
        while (rest[i] % p == 0) {
          rest[i] /= p;
          ++e;
        }
        ++omega[i];
        big_omega[i] += e;
        if (e >= 2) square[i] = true;
      }
    }
    for (std::size_t i = 0; i < size; ++i) {
      if (rest[i] > 1) {
        ++omega[i];
        ++big_omega[i];
      }
      d.omega_sum += static_cast<std::uint64_t>(omega[i]);
      d.big_omega_sum += static_cast<std::uint64_t>(big_omega[i]);
      d.lambda_sum += (big_omega[i] & 1) ? -1 : 1;
      if (!square[i]) {
        ++d.squarefree;
        d.mu_sum += (omega[i] & 1) ? -1 : 1;
      }
    }
  }
  return d;
}

/// The reference digest, computed once per range and shared by every block size.
const Digest& cached_reference(Natural lo, Natural hi) {
  static std::map<std::pair<Natural, Natural>, Digest> cache;
  const auto key = std::make_pair(lo, hi);
  auto it = cache.find(key);
  if (it == cache.end()) it = cache.emplace(key, reference_digest(lo, hi)).first;
  return it->second;
}

struct Arithmetic {
  int mu;
  int omega;
  int big_omega;
};

/// mu, omega, Omega of n >= 1 by trial division. Complexity: O(sqrt(n)).
Arithmetic trial_division(std::uint64_t n) {
  Arithmetic r{0, 0, 0};
  bool squarefree = true;
  for (std::uint64_t d = 2; d <= n / d; d += (d == 2 ? 1 : 2)) {
    if (n % d != 0) continue;
    int e = 0;
    while (n % d == 0) {
      n /= d;
      ++e;
    }
    ++r.omega;
    r.big_omega += e;
    if (e >= 2) squarefree = false;
  }
  if (n > 1) {
    ++r.omega;
    ++r.big_omega;
  }
  r.mu = squarefree ? ((r.omega & 1) ? -1 : 1) : 0;
  return r;
}

/// Published M(10^k) (OEIS A084237) and Q(10^k) (OEIS A071172) for the lo = 1 check.
struct Published {
  Natural n;
  std::int64_t mertens;
  std::uint64_t squarefree;
};
constexpr Published published[] = {
    {10'000, -23, 6'083},
    {100'000, -48, 60'794},
    {1'000'000, 212, 607'926},
    {10'000'000, 1'037, 6'079'291},
    {100'000'000, 1'928, 60'792'694},
};

/// Runs the sieve once over [lo, hi) and checks everything that does not need the reference
/// beyond its digest. Returns an empty string on success, else what went wrong.
std::string verify_pass(sqfc::arith::SegmentedSieve& sieve, Natural lo, Natural hi, const char* when) {
  Digest d;
  Natural expected_lo = lo;
  std::vector<Natural> samples;
  const Natural len = hi - lo;
  for (Natural k = 0; k < 8 && k < len; ++k) {
    samples.push_back(lo + k);
    samples.push_back(hi - 1 - k);
    samples.push_back(lo + (len - 1) * (k + 1) / 9);
  }
  std::sort(samples.begin(), samples.end());
  samples.erase(std::unique(samples.begin(), samples.end()), samples.end());
  std::size_t next_sample = 0;

  sieve.reset(lo, hi);
  while (sieve.next_block()) {
    const auto& block = sieve.block();
    if (block.lo() != expected_lo || block.size() == 0 || block.size() > sieve.block_size() || block.hi() > hi)
      return std::string(when) + ": block [" + std::to_string(block.lo()) + ", " + std::to_string(block.hi()) +
             ") does not continue the tiling at " + std::to_string(expected_lo);
    expected_lo = block.hi();
    for (std::size_t i = 0; i < block.size(); ++i) {
      const int mu = block.mu(i);
      d.mu_sum += mu;
      d.squarefree += block.is_squarefree(i) ? 1 : 0;
      d.omega_sum += static_cast<std::uint64_t>(block.omega(i));
      d.big_omega_sum += static_cast<std::uint64_t>(block.big_omega(i));
      d.lambda_sum += block.liouville(i);
    }
    while (next_sample < samples.size() && samples[next_sample] < block.hi()) {
      const Natural n = samples[next_sample++];
      const std::size_t i = n - block.lo();
      const Arithmetic want = trial_division(n);
      if (block.mu(i) != want.mu || block.omega(i) != want.omega || block.big_omega(i) != want.big_omega)
        return std::string(when) + ": n = " + std::to_string(n) + ": sieve mu/omega/Omega = " +
               std::to_string(block.mu(i)) + "/" + std::to_string(block.omega(i)) + "/" +
               std::to_string(block.big_omega(i)) + ", trial division " + std::to_string(want.mu) + "/" +
               std::to_string(want.omega) + "/" + std::to_string(want.big_omega);
    }
  }
  if (expected_lo != hi) return std::string(when) + ": blocks stop at " + std::to_string(expected_lo);
  if (next_sample != samples.size()) return std::string(when) + ": not every sample point was checked";

  const Digest& ref = cached_reference(lo, hi);
  if (!(d == ref)) return std::string(when) + ": sieve " + describe(d) + " but reference " + describe(ref);
  if (lo == 1) {
    for (const auto& row : published) {
      if (row.n != hi - 1) continue;
      if (d.mu_sum != row.mertens || d.squarefree != row.squarefree)
        return std::string(when) + ": M(" + std::to_string(row.n) + ") = " + std::to_string(d.mu_sum) +
               ", Q = " + std::to_string(d.squarefree) + ", published " + std::to_string(row.mertens) + ", " +
               std::to_string(row.squarefree);
    }
  }
  return {};
}

void bench_segmented_sieve(benchmark::State& state, Natural lo, Natural len, std::size_t block_size) {
  const Natural hi = lo + len;
  const sqfc::arith::SieveTables tables(hi - 1);
  sqfc::arith::SegmentedSieve sieve(tables, block_size);

  if (const auto error = verify_pass(sieve, lo, hi, "before timing"); !error.empty()) {
    g_failed = true;
    state.SkipWithError(error.c_str());
    return;
  }
  for (auto _ : state) {
    sieve.reset(lo, hi);
    while (sieve.next_block()) {
      const auto* words = sieve.block().words();
      benchmark::DoNotOptimize(words);
    }
    benchmark::ClobberMemory();
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations()) * static_cast<std::int64_t>(len));
  state.counters["entries"] = static_cast<double>(tables.entries().size());

  // Code after the loop is not timed.
  const auto error = verify_pass(sieve, lo, hi, "after timing");
  if (!error.empty()) {
    g_failed = true;
    state.SkipWithError(error.c_str());
  }
}

std::string power_name(Natural v) {
  if (v == 1) return "1";
  int k = 0;
  Natural x = v;
  while (x % 10 == 0) {
    x /= 10;
    ++k;
  }
  return x == 1 ? "1e" + std::to_string(k) : std::to_string(v);
}

double minimum(const std::vector<double>& v) { return v.empty() ? 0.0 : *std::min_element(v.begin(), v.end()); }

}  // namespace

int main(int argc, char** argv) {
  bool smoke = false;
  Natural len = 10'000'000;
  // Take our own flags out before Google Benchmark sees the rest.
  std::vector<char*> rest;
  for (int i = 0; i < argc; ++i) {
    if (std::strcmp(argv[i], "--smoke") == 0) {
      smoke = true;
      len = 10'000;
    } else if (std::strncmp(argv[i], "--len=", 6) == 0) {
      try {
        len = sqfc::parse_natural(argv[i] + 6, "--len");
      } catch (const std::exception& e) {
        std::fprintf(stderr, "bench_sieve: error: %s\n", e.what());
        return 2;
      }
      if (len < 1) {
        std::fprintf(stderr, "bench_sieve: error: --len must be >= 1\n");
        return 2;
      }
    } else {
      rest.push_back(argv[i]);
    }
  }

  const Natural starts[] = {1, 1'000'000'000, 1'000'000'000'000};
  const std::size_t blocks[] = {std::size_t{1} << 15, std::size_t{1} << 16, std::size_t{1} << 17,
                                std::size_t{1} << 18};
  for (const Natural lo : starts) {
    for (const std::size_t block : blocks) {
      const std::string name = "sieve/lo:" + power_name(lo) + "/len:" + power_name(len) + "/block:2^" +
                               std::to_string(std::countr_zero(block));
      auto* b = benchmark::RegisterBenchmark(name.c_str(), bench_segmented_sieve, lo, len, block);
      b->Unit(benchmark::kMillisecond)->UseRealTime();
      if (smoke) {
        b->Iterations(1);
      } else {
        // The style guide asks for the minimum over repeats; "min" is added to the usual
        // aggregates. It is the minimum of each column, so for items_per_second read the rate
        // of the min real_time (len / min time), not the min of the rates.
        b->Repetitions(3)->ComputeStatistics("min", minimum)->DisplayAggregatesOnly(true);
      }
    }
  }

  int rest_argc = static_cast<int>(rest.size());
  rest.push_back(nullptr);  // argv[argc] is null by convention
  benchmark::Initialize(&rest_argc, rest.data());
  if (benchmark::ReportUnrecognizedArguments(rest_argc, rest.data())) return 2;
  const std::size_t ran = benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  if (ran == 0) {
    std::fprintf(stderr, "bench_sieve: no benchmark matched the filter\n");
    return 1;
  }
  if (g_failed) {
    std::fprintf(stderr, "bench_sieve: FAIL: a sieve answer was wrong (see the error above)\n");
    return 1;
  }
  return 0;
}
