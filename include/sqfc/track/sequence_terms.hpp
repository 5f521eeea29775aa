// SPDX-License-Identifier: MIT
/// @file sequence_terms.hpp  Named integer sequences that sqfc computes, evaluated at given indices by the table engine.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::track {

/// A sequence a(k) that sqfc can produce, as named on the command line.
struct Sequence {
  enum class Kind {
    mertens,           ///< a(n) = M(n)
    mertens_pow10,     ///< a(k) = M(10^k), k >= 0
    mertens_pow2,      ///< a(k) = M(2^k), k >= 0
    mertens_zeros,     ///< a(k) = the k-th n >= 1 with M(n) = 0, k >= 1
    squarefree,        ///< a(n) = Q(n)
    squarefree_pow10,  ///< a(k) = Q(10^k), k >= 0
    liouville,         ///< a(n) = L(n)
    faces,             ///< a(n) = f_d(n), faces of dimension d of K_n
    betti,             ///< a(n) = b_d(n), unreduced Betti numbers of K_n
  };
  Kind kind = Kind::mertens;
  int dimension = 0;  ///< d for faces and betti, in [0, config::omega_slots)
  friend bool operator==(const Sequence&, const Sequence&) = default;
};

/// Parses a sequence name: mertens, mertens_pow10, mertens_pow2, mertens_zeros, squarefree,
/// squarefree_pow10, liouville, f<d>, b<d> with d a decimal number in [0, 15].
/// Throws: InvalidArgument naming the text and listing the accepted names.
Sequence parse_sequence(std::string_view name);

/// The name parse_sequence accepts for @p sequence (e.g. "b2").
std::string sequence_name(const Sequence& sequence);

/// A one-line description, e.g. "M(10^k), the Mertens function at powers of ten".
std::string sequence_description(const Sequence& sequence);

/// The accepted names, comma-separated, for messages and help text.
std::string_view sequence_names_help() noexcept;

/// What became of one requested index.
enum class TermStatus {
  computed,        ///< value holds a(k)
  beyond_limit,    ///< a(k) needs n above the limit (or, for zeros, the k-th zero lies above it)
  outside_domain,  ///< k is not an index of the sequence (negative n, k < 0 for powers, k < 1 for zeros)
};

/// The value of a sequence at one index.
struct TermValue {
  TermStatus status = TermStatus::outside_domain;
  Natural n = 0;        ///< the n the value belongs to (10^k for mertens_pow10, the zero itself for zeros); 0 when unknown
  SignedSum value = 0;  ///< a(k) when computed
  friend bool operator==(const TermValue&, const TermValue&) = default;
};

/// Evaluates @p sequence at every index in @p indices (any order, repeats allowed) with one run of
/// the table engine over [1, max needed n]: an explicit sample schedule of the needed n, or, for
/// mertens_zeros, the event detector, stopped as soon as the largest requested zero is found.
/// Index n = 0 of an n-indexed sequence is the empty sum, 0, computed without a run.
/// @param indices  the k (or n) of each term
/// @param limit    largest n that may be sieved; terms needing more are beyond_limit
/// @param threads  worker threads of the engine
/// @return one TermValue per index, in the order of @p indices.
/// Pre: 1 <= limit <= config::max_sieve_n (checked; InvalidArgument); threads >= 1 (checked;
/// InvalidArgument); sequence.dimension in [0, omega_slots) (checked; InvalidArgument).
/// Complexity: time of run_table up to the largest needed n <= limit, plus O(I log I) for I indices;
/// memory O(I) beyond the engine's.
/// Throws: InvalidArgument; InternalError when an engine self-check fails; whatever @p progress throws.
std::vector<TermValue> evaluate_sequence_terms(const Sequence& sequence, const std::vector<std::int64_t>& indices,
                                               Natural limit, unsigned threads, const ProgressFn& progress = {});

}  // namespace sqfc::track
