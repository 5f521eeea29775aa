// SPDX-License-Identifier: MIT
// The PARI-backed oracle: the only translation unit of the project that includes pari.h.
#include "oracles/pari_oracle.hpp"

#include <pari/pari.h>

#include <mutex>
#include <stdexcept>
#include <string>
#include <thread>

namespace sqfc::oracles {
namespace {

// 256 MB of PARI stack: far more than factoring one 64-bit integer needs, and room for the
// determinant of a 0/1 matrix of 1214 rows (H_2000; measured to need more than 64 MB). The stack
// is reserved address space, touched only as it is used.
// The small prime table (primes below 2^16) keeps start-up quick, PARI switches to its own
// factoring methods (rho, SQUFOF, ECM, MPQS) above it.
constexpr std::size_t pari_stack_bytes = std::size_t{256} << 20;
constexpr unsigned long pari_max_prime = 1UL << 16;

std::once_flag init_flag;
std::thread::id owner_thread;

// Starts PARI on the first call and insists that later calls come from the same thread: the
// Debian library keeps the stack pointer (avma) in thread-local storage, so another thread
// would see an uninitialised stack.
void ensure_pari() {
  std::call_once(init_flag, [] {
    // INIT_DFTm only: no signal handlers and no longjmp set-up, so GoogleTest keeps its own
    // crash reporting; a PARI error then ends the process, which fails the test loudly.
    pari_init_opts(pari_stack_bytes, pari_max_prime, INIT_DFTm);
    owner_thread = std::this_thread::get_id();
  });
  if (std::this_thread::get_id() != owner_thread)
    throw std::logic_error("the PARI oracle must be called from the thread that first used it");
}

GEN to_pari(std::uint64_t n) { return utoi(static_cast<ulong>(n)); }

// Runs f with a PARI stack mark and releases everything f allocated afterwards.
template <class F>
auto with_stack(F&& f) {
  const pari_sp mark = avma;
  auto result = f();
  set_avma(mark);
  return result;
}

void require_positive(std::uint64_t n, const char* what) {
  if (n == 0) throw std::invalid_argument(std::string(what) + ": n must be at least 1");
}

}  // namespace

PariArithmetic pari_arithmetic(std::uint64_t n) {
  require_positive(n, "pari_arithmetic");
  ensure_pari();
  return with_stack([n] {
    // PARI's arithmetic functions accept a factorisation matrix in place of the integer;
    // factoring once instead of once per function makes the oracle about 2.5 times faster
    // near 10^16 (measured: 50 instead of 130 microseconds per n).
    GEN f = Z_factor(to_pari(n));
    return PariArithmetic{static_cast<int>(moebius(f)), static_cast<int>(omega(f)),
                          static_cast<int>(bigomega(f))};
  });
}

std::vector<PariArithmetic> pari_arithmetic_range(std::uint64_t lo, std::uint64_t hi) {
  if (lo < 1 || hi < lo) throw std::invalid_argument("pari_arithmetic_range: need 1 <= lo <= hi");
  std::vector<PariArithmetic> values;
  values.reserve(hi - lo);
  for (std::uint64_t n = lo; n < hi; ++n) values.push_back(pari_arithmetic(n));
  return values;
}

std::vector<std::pair<std::uint64_t, int>> pari_factor(std::uint64_t n) {
  require_positive(n, "pari_factor");
  ensure_pari();
  return with_stack([n] {
    std::vector<std::pair<std::uint64_t, int>> result;
    GEN f = Z_factor(to_pari(n));
    GEN primes = gel(f, 1);
    GEN exponents = gel(f, 2);
    const long rows = lg(primes) - 1;
    for (long i = 1; i <= rows; ++i)
      result.emplace_back(static_cast<std::uint64_t>(itou(gel(primes, i))), static_cast<int>(itos(gel(exponents, i))));
    return result;
  });
}

std::vector<std::pair<std::string, int>> pari_factor_decimal(const std::string& decimal) {
  if (decimal.empty() || decimal.find_first_not_of("0123456789") != std::string::npos)
    throw std::invalid_argument("pari_factor_decimal: '" + decimal + "' is not decimal digits");
  if (decimal.find_first_not_of('0') == std::string::npos)
    throw std::invalid_argument("pari_factor_decimal: n must be at least 1");
  ensure_pari();
  return with_stack([&] {
    GEN n = strtoi(decimal.c_str());
    std::vector<std::pair<std::string, int>> result;
    GEN f = Z_factor(n);
    GEN primes = gel(f, 1);
    GEN exponents = gel(f, 2);
    const long rows = lg(primes) - 1;
    for (long i = 1; i <= rows; ++i)
      result.emplace_back(std::string(itostr(gel(primes, i))), static_cast<int>(itos(gel(exponents, i))));
    return result;
  });
}

bool pari_is_prime(std::uint64_t n) {
  ensure_pari();
  return with_stack([n] { return isprime(to_pari(n)) != 0; });
}

std::uint64_t pari_prime_count(std::uint64_t x) {
  ensure_pari();
  return with_stack([x] { return static_cast<std::uint64_t>(itou(primepi(to_pari(x)))); });
}

std::string pari_determinant(const std::vector<std::int64_t>& entries, std::size_t dimension) {
  if (entries.size() != dimension * dimension)
    throw std::invalid_argument("pari_determinant: " + std::to_string(entries.size()) + " entries for a " +
                                std::to_string(dimension) + " x " + std::to_string(dimension) + " matrix");
  ensure_pari();
  return with_stack([&] {
    // A PARI matrix is a vector of columns: column j holds entries (i, j) for i = 1..dimension.
    const long d = static_cast<long>(dimension);
    GEN matrix = cgetg(d + 1, t_MAT);
    for (long j = 1; j <= d; ++j) {
      GEN column = cgetg(d + 1, t_COL);
      for (long i = 1; i <= d; ++i) {
        const long v = static_cast<long>(entries[static_cast<std::size_t>((i - 1) * d + (j - 1))]);
        // 0, 1 and -1 point at PARI's constant integers (not on the stack): a 0/1 matrix then
        // costs one word per entry.
        gel(column, i) = v == 0 ? gen_0 : v == 1 ? gen_1 : v == -1 ? gen_m1 : stoi(v);
      }
      gel(matrix, j) = column;
    }
    char* text = GENtostr(det(matrix));
    std::string result(text);
    pari_free(text);
    return result;
  });
}

}  // namespace sqfc::oracles
