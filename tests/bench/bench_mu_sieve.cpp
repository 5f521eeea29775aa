// SPDX-License-Identifier: MIT
// Google Benchmark of the isolated-value sweep's mu sieve (src/arith/detail_mu_sieve.hpp)
// against the general SegmentedSieve on the same values, reporting values per second.
//
// Grid: the sieve limit Y = 0.5 x^(2/3) that `sqfc value` uses at x = 10^16 ... 10^19
// (2.2e10 ... 2.3e12: base primes from 1.5e5, just above the 2^17 segment length, to 1.5e6,
// eleven times it); the range is 64 segments of 2^17 values from Y / 2 (one segment near
// Y = 10^6 with --smoke). Tables are built outside the timed loop; the timed loop is reset()
// plus next() over the range, i.e. the sieve alone.
//
// Check (outside the timed loop; a failure marks the benchmark errored and the program exits
// with status 1): every mu value of the range equals SegmentedSieve's.
//
// Usage: bench_mu_sieve [--smoke] [Google Benchmark flags]
#include <benchmark/benchmark.h>

#include <cmath>
#include <cstdint>
#include <cstring>
#include <vector>

#include "../../src/arith/detail_mu_sieve.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/types.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::detail::MuSieve;
using sqfc::arith::detail::MuSieveTables;
using sqfc::arith::detail::sweep_segment_length;

bool g_smoke = false;
bool g_failed = false;

struct Range {
  Natural limit;  // Y: the tables cover [1, Y)
  Natural lo;
  std::size_t segments;
};

Range range_for(int exponent) {
  if (g_smoke) return {1'000'000, 500'001, 1};
  const auto limit = static_cast<Natural>(0.5 * std::pow(10.0, 2.0 * exponent / 3.0));
  return {limit, limit / 2 + 1, 64};
}

std::vector<std::int8_t> sweep_mu(const MuSieveTables& tables, const Range& r) {
  MuSieve sieve(tables, sweep_segment_length);
  std::vector<std::int8_t> mu(r.segments * sweep_segment_length);
  sieve.reset(r.lo);
  for (std::size_t s = 0; s < r.segments; ++s) sieve.next(sweep_segment_length, mu.data() + s * sweep_segment_length);
  return mu;
}

std::vector<std::int8_t> general_mu(const sqfc::arith::SieveTables& tables, const Range& r) {
  sqfc::arith::SegmentedSieve sieve(tables, sweep_segment_length);
  std::vector<std::int8_t> mu;
  mu.reserve(r.segments * sweep_segment_length);
  sieve.reset(r.lo, r.lo + r.segments * sweep_segment_length);
  while (sieve.next_block())
    for (std::size_t i = 0; i < sieve.block().size(); ++i) mu.push_back(static_cast<std::int8_t>(sieve.block().mu(i)));
  return mu;
}

void BM_SweepMuSieve(benchmark::State& state) {
  const Range r = range_for(static_cast<int>(state.range(0)));
  const MuSieveTables tables(r.limit - 1);
  const sqfc::arith::SieveTables reference_tables(r.limit - 1);
  if (sweep_mu(tables, r) != general_mu(reference_tables, r)) {
    g_failed = true;
    state.SkipWithError("mu differs from SegmentedSieve");
    return;
  }
  MuSieve sieve(tables, sweep_segment_length);
  std::vector<std::int8_t> out(sweep_segment_length);
  for (auto _ : state) {
    sieve.reset(r.lo);
    for (std::size_t s = 0; s < r.segments; ++s) sieve.next(sweep_segment_length, out.data());
    benchmark::DoNotOptimize(out.data());
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * r.segments * sweep_segment_length));
  state.counters["Y"] = static_cast<double>(r.limit);
}

void BM_GeneralSegmentedSieve(benchmark::State& state) {
  const Range r = range_for(static_cast<int>(state.range(0)));
  const sqfc::arith::SieveTables tables(r.limit - 1);
  sqfc::arith::SegmentedSieve sieve(tables, sweep_segment_length);
  std::int64_t sum = 0;
  for (auto _ : state) {
    sieve.reset(r.lo, r.lo + r.segments * sweep_segment_length);
    while (sieve.next_block()) sum += sieve.block().mu(0);
    benchmark::DoNotOptimize(sum);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * r.segments * sweep_segment_length));
  state.counters["Y"] = static_cast<double>(r.limit);
}

BENCHMARK(BM_SweepMuSieve)->DenseRange(16, 19)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_GeneralSegmentedSieve)->DenseRange(16, 19)->Unit(benchmark::kMillisecond);

}  // namespace

int main(int argc, char** argv) {
  std::vector<char*> args;
  for (int i = 0; i < argc; ++i) {
    if (std::strcmp(argv[i], "--smoke") == 0) {
      g_smoke = true;
      continue;
    }
    args.push_back(argv[i]);
  }
  static char filter[] = "--benchmark_filter=/16$";
  static char min_time[] = "--benchmark_min_time=0.01";
  if (g_smoke) {
    args.push_back(filter);
    args.push_back(min_time);
  }
  int count = static_cast<int>(args.size());
  benchmark::Initialize(&count, args.data());
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return g_failed ? 1 : 0;
}
