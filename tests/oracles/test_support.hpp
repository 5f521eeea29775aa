// SPDX-License-Identifier: MIT
// Seeds and iteration scaling for randomized tests (SQFC_TEST_SEED, SQFC_TEST_MULTIPLIER).
// No expected values live here: the default seed is an arbitrary fixed number (common practice).
#pragma once

#include <cstdint>
#include <cstdlib>
#include <random>
#include <string>

namespace sqfc::testing {

/// The seed of randomized tests: SQFC_TEST_SEED when set, else a fixed default.
inline std::uint64_t test_seed() {
  const char* text = std::getenv("SQFC_TEST_SEED");
  return text ? std::strtoull(text, nullptr, 10) : 20261201ULL;
}

/// Scales iteration counts: SQFC_TEST_MULTIPLIER when set (>= 1), else 1.
inline std::uint64_t test_multiplier() {
  const char* text = std::getenv("SQFC_TEST_MULTIPLIER");
  const auto m = text ? std::strtoull(text, nullptr, 10) : 1ULL;
  return m < 1 ? 1 : m;
}

/// A generator seeded from test_seed() mixed with a per-test salt.
inline std::mt19937_64 test_rng(std::uint64_t salt) { return std::mt19937_64(test_seed() ^ (salt * 0x9E3779B97F4A7C15ULL)); }

/// Text to attach to assertion failures so a failing random case can be replayed.
inline std::string seed_note() { return "SQFC_TEST_SEED=" + std::to_string(test_seed()); }

}  // namespace sqfc::testing
