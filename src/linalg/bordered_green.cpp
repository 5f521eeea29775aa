// SPDX-License-Identifier: MIT
// Bordered (Schur complement) growth of an exact integer inverse.
#include "sqfc/linalg/bordered_green.hpp"

#include <algorithm>
#include <cstdio>
#include <string>
#include <thread>

#include "sqfc/core/error.hpp"

namespace sqfc::linalg {
namespace {

// Rows [row_begin, row_end) of g += s u u^T over columns [0, k); returns the largest |entry|
// written. Compiled for AVX-512, AVX2 and the baseline, chosen at load time: the update is
// almost all of the run time (k^2 multiply-adds for the k-th vertex).
__attribute__((target_clones("arch=skylake-avx512", "avx2", "default")))
std::int32_t update_rows(std::int32_t* g, std::size_t stride, const std::int32_t* u, std::size_t k,
                         std::size_t row_begin, std::size_t row_end, std::int32_t s) {
  std::int32_t largest = 0;
  for (std::size_t i = row_begin; i < row_end; ++i) {
    std::int32_t* row = g + i * stride;
    const std::int32_t w = s * u[i];
    std::int32_t row_largest = 0;
    for (std::size_t j = 0; j < k; ++j) {
      const std::int32_t value = row[j] + w * u[j];
      row[j] = value;
      const std::int32_t magnitude = value < 0 ? -value : value;
      row_largest = magnitude > row_largest ? magnitude : row_largest;
    }
    largest = std::max(largest, row_largest);
  }
  return largest;
}

__attribute__((target_clones("arch=skylake-avx512", "avx2", "default")))
void add_row(std::int64_t* u, const std::int32_t* row, std::size_t k) {
  for (std::size_t j = 0; j < k; ++j) u[j] += row[j];
}

std::string mebibytes(std::uint64_t bytes) {
  char text[32];
  std::snprintf(text, sizeof text, "%.1f", static_cast<double>(bytes) / (1024.0 * 1024.0));
  return text;
}

}  // namespace

void BorderedGreen::check_memory(std::size_t capacity, std::uint64_t memory_limit_bytes) {
  const auto bytes = bytes_for(capacity);
  if (bytes > memory_limit_bytes)
    throw InvalidArgument("bordered tracking of " + std::to_string(capacity) + " vertices needs " + std::to_string(bytes) +
                          " bytes (" + mebibytes(bytes) + " MiB), above the limit of " +
                          std::to_string(memory_limit_bytes) + " bytes (" + mebibytes(memory_limit_bytes) +
                          " MiB); use --method closed (closed-form Green values, no matrix)");
}

BorderedGreen::BorderedGreen(std::size_t capacity, std::uint64_t memory_limit_bytes, unsigned threads)
    : capacity_(capacity), threads_(std::max(1U, threads)) {
  check_memory(capacity, memory_limit_bytes);
  g_.assign(capacity * capacity, 0);
  u_.assign(capacity, 0);
  u32_.assign(capacity, 0);
}

int BorderedGreen::add_vertex(std::span<const std::uint32_t> neighbours) {
  const std::size_t k = size_;
  if (k >= capacity_) throw InvalidArgument("bordered Green function is full (" + std::to_string(capacity_) + " vertices)");
  std::int64_t* u = u_.data();
  std::fill(u, u + k, 0);
  // u = g a is the sum of the neighbours' rows (g is symmetric).
  for (const auto j : neighbours) {
    if (j >= k) throw InvalidArgument("neighbour index " + std::to_string(j) + " is not an earlier vertex");
    add_row(u, g_.data() + static_cast<std::size_t>(j) * capacity_, k);
  }
  std::int64_t a_u = 0;
  for (const auto j : neighbours) a_u += u[j];
  const std::int64_t s = 1 - a_u;
  if (s != 1 && s != -1)
    throw InternalError("Schur complement " + std::to_string(s) + " at vertex " + std::to_string(k) +
                        " is not +-1: the inverse would not stay integral");

  // Overflow proof for this step: every new entry is bounded by |g| + |u|^2 < 2^31, so the
  // 32-bit storage is exact (u itself is summed in 64 bits).
  std::int64_t max_u = 0;
  Wide sum_u = 0;
  for (std::size_t j = 0; j < k; ++j) {
    max_u = std::max(max_u, u[j] < 0 ? -u[j] : u[j]);
    sum_u += u[j];
  }
  constexpr std::int64_t limit = std::int64_t{1} << 31;
  if (max_u >= (std::int64_t{1} << 16) || max_abs_ + max_u * max_u >= limit)
    throw OverflowError("Green function entries would pass 2^31 at vertex " + std::to_string(k));
  std::int32_t* u32 = u32_.data();
  for (std::size_t j = 0; j < k; ++j) u32[j] = static_cast<std::int32_t>(u[j]);

  // g += s u u^T, rows split over the threads.
  std::int32_t largest = 0;
  const unsigned workers = k >= 512 ? threads_ : 1;
  if (workers == 1) {
    largest = update_rows(g_.data(), capacity_, u32, k, 0, k, static_cast<std::int32_t>(s));
  } else {
    std::vector<std::int32_t> partial(workers, 0);
    std::vector<std::thread> pool;
    const std::size_t chunk = (k + workers - 1) / workers;
    for (unsigned t = 1; t < workers; ++t)
      pool.emplace_back([&, t] {
        const std::size_t begin = std::min(k, t * chunk), end = std::min(k, begin + chunk);
        partial[t] = update_rows(g_.data(), capacity_, u32, k, begin, end, static_cast<std::int32_t>(s));
      });
    partial[0] = update_rows(g_.data(), capacity_, u32, k, 0, std::min(k, chunk), static_cast<std::int32_t>(s));
    for (auto& thread : pool) thread.join();
    largest = *std::max_element(partial.begin(), partial.end());
  }
  // The border: -s u in row and column k, s in the corner.
  std::int32_t* row_k = g_.data() + k * capacity_;
  const auto s32 = static_cast<std::int32_t>(s);
  for (std::size_t j = 0; j < k; ++j) {
    row_k[j] = -s32 * u32[j];
    g_[j * capacity_ + k] = -s32 * u32[j];
  }
  row_k[k] = s32;
  SQFC_ASSERT(g_[k * capacity_ + k] == s32);
  max_abs_ = std::max({static_cast<std::int64_t>(largest), max_u, std::int64_t{1}});

  energy_ += s * (sum_u - 1) * (sum_u - 1);
  determinant_ *= static_cast<int>(s);
  (s > 0 ? positive_ : negative_) += 1;
  size_ = k + 1;
  return static_cast<int>(s);
}

GreenStatistics BorderedGreen::statistics(Natural n) const {
  GreenStatistics stats;
  stats.n = n;
  stats.vertices = size_;
  // Small values (almost all of them) go to a dense array first; the map gets the rest.
  constexpr std::int64_t dense_radius = 1024;
  std::vector<Count> dense(2 * dense_radius + 1, 0);
  for (std::size_t i = 0; i < size_; ++i) {
    const std::int32_t* row = g_.data() + i * capacity_;
    for (std::size_t j = 0; j < size_; ++j) {
      const std::int64_t v = row[j];
      if (v >= -dense_radius && v <= dense_radius) ++dense[static_cast<std::size_t>(v + dense_radius)];
      else ++stats.histogram[v];
      stats.energy += v;
    }
    ++stats.diagonal_histogram[row[i]];
  }
  for (std::size_t d = 0; d < dense.size(); ++d)
    if (dense[d]) stats.histogram[static_cast<std::int64_t>(d) - dense_radius] += dense[d];
  return stats;
}

}  // namespace sqfc::linalg
