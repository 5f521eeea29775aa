// SPDX-License-Identifier: MIT
/// @file bfile_check.hpp  Comparison of a b-file's terms with sqfc's values, and the report of `sqfc check --bfile`.
#pragma once

#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include "sqfc/io/bfile_reader.hpp"
#include "sqfc/track/sequence_terms.hpp"

namespace sqfc::io {

/// The first term whose value differs from sqfc's.
struct BfileMismatch {
  Count line = 0;         ///< 1-based line of the term
  std::int64_t n = 0;     ///< the term's index as written in the file
  std::string expected;   ///< the file's a(n), normalised decimal
  std::string got;        ///< sqfc's value, decimal
};

/// Tally of one comparison.
struct BfileComparison {
  Count compared = 0;        ///< terms whose value sqfc computed and compared
  Count mismatched = 0;      ///< compared terms that differ
  Count beyond_limit = 0;    ///< skipped: the term needs n above the limit
  Count outside_domain = 0;  ///< skipped: the index is not one of the sequence
  std::optional<BfileMismatch> first_mismatch;
  [[nodiscard]] Count skipped() const noexcept { return beyond_limit + outside_domain; }
};

/// The indices of the terms, in file order: the input of track::evaluate_sequence_terms.
std::vector<std::int64_t> bfile_indices(const BfileContents& contents);

/// Compares every term with the value at the same position of @p values (exact, as decimal text,
/// so a(n) beyond 64 bits is a mismatch rather than an overflow).
/// Pre: values.size() == contents.terms.size() (checked; InvalidArgument).
/// Complexity: O(terms) time, O(1) extra memory.
BfileComparison compare_bfile_terms(const BfileContents& contents, const std::vector<track::TermValue>& values);

/// True when nothing compared differs and no line is malformed (duplicates and out-of-order
/// lines are reported but do not fail a check).
[[nodiscard]] bool bfile_check_passed(const BfileContents& contents, const BfileComparison& comparison) noexcept;

/// What the report names besides the tallies.
struct BfileCheckHeading {
  std::string file;        ///< the path as given
  std::string sequence;    ///< its name, e.g. "mertens"
  std::string description; ///< e.g. "M(n), the Mertens function"
  Natural limit = 0;       ///< largest n sieved
};

/// Writes the report of `sqfc check --bfile` (docs/output-formats.md): one `key: value` line per
/// item, then the listed findings, at most @p max_listed per kind followed by a count of the rest.
/// Complexity: O(lines written).
void write_bfile_check_report(std::ostream& out, const BfileCheckHeading& heading, const BfileContents& contents,
                              const BfileComparison& comparison, std::size_t max_listed = 20);

}  // namespace sqfc::io
