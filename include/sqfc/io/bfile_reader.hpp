// SPDX-License-Identifier: MIT
/// @file bfile_reader.hpp  A streaming reader of OEIS b-files (`n a(n)` lines) with line-numbered findings.
#pragma once

#include <cstdint>
#include <istream>
#include <optional>
#include <string>
#include <unordered_map>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::io {

/// One term of a b-file: the line `n a(n)` it came from.
struct BfileTerm {
  Count line = 0;         ///< 1-based line number in the file
  std::int64_t n = 0;     ///< the index n (may be negative; OEIS offsets vary)
  std::string value;      ///< a(n) as normalised decimal text: optional '-', no leading zeros, "0" for zero
  std::optional<std::int64_t> value_int;  ///< a(n) when it fits in int64, otherwise empty
};

/// Why a line is not a term.
enum class BfileProblem {
  field_count,    ///< only one field (a term needs `n a(n)`)
  extra_text,     ///< more than two fields
  bad_index,      ///< n is not an integer
  bad_value,      ///< a(n) is not an integer
  index_too_big,  ///< n is an integer outside [-2^63, 2^63)
};

/// Short English text of a problem, e.g. "n is not an integer".
std::string bfile_problem_text(BfileProblem problem);

/// A line that is neither a term, a comment nor blank.
struct BfileMalformed {
  Count line = 0;  ///< 1-based
  BfileProblem problem;
  std::string text;  ///< the line with its line ending removed (at most 80 characters kept)
};

/// A term whose n already appeared on an earlier line.
struct BfileDuplicate {
  Count line = 0;        ///< 1-based line of the repeat
  Count first_line = 0;  ///< 1-based line where n first appeared
  std::int64_t n = 0;
};

/// A term whose n is smaller than the n of the term just before it.
struct BfileOutOfOrder {
  Count line = 0;           ///< 1-based
  std::int64_t n = 0;
  Count previous_line = 0;  ///< 1-based line of the preceding term
  std::int64_t previous_n = 0;
};

/// What a line of a b-file is.
struct BfileLine {
  enum class Kind { term, comment, blank, malformed };
  Kind kind = Kind::blank;
  BfileTerm term;             ///< for Kind::term
  BfileMalformed malformed;   ///< for Kind::malformed
};

/// Classifies one line (without its '\n'; a trailing '\r' is removed here). Leading and trailing
/// spaces and tabs are ignored; fields are separated by runs of spaces or tabs; a line whose first
/// visible character is '#' is a comment. Integers are an optional '-' followed by decimal digits
/// (leading zeros allowed and removed; "-0" is 0); a '+' sign, decimal points and exponents are
/// not integers.
/// @param text         the line
/// @param line_number  its 1-based number, copied into the result
/// Pre: none. Complexity: O(|text|) time and memory.
BfileLine parse_bfile_line(std::string text, Count line_number);

/// Reads a b-file line by line from a stream, classifying each line with parse_bfile_line and
/// noting duplicated and out-of-order n as it goes.
/// Invariant: after each call of next(), duplicates() and out_of_order() describe every term read.
/// The stream is borrowed and must outlive the reader.
class BfileReader {
 public:
  explicit BfileReader(std::istream& in) : in_(in) {}
  /// The next line, or nullopt at the end of the stream. A last line without '\n' counts.
  /// Complexity: O(line length) time, plus O(1) expected for the duplicate test; memory O(distinct n).
  /// Throws: IoError when the stream fails other than by reaching its end.
  std::optional<BfileLine> next();
  /// Lines read so far.
  [[nodiscard]] Count lines() const noexcept { return line_; }
  [[nodiscard]] const std::vector<BfileDuplicate>& duplicates() const noexcept { return duplicates_; }
  [[nodiscard]] const std::vector<BfileOutOfOrder>& out_of_order() const noexcept { return out_of_order_; }

 private:
  std::istream& in_;
  Count line_ = 0;
  std::unordered_map<std::int64_t, Count> first_line_;  // n -> line of its first term
  std::optional<BfileTerm> previous_;                   // the last term read (value text dropped)
  std::vector<BfileDuplicate> duplicates_;
  std::vector<BfileOutOfOrder> out_of_order_;
};

/// A whole b-file: its terms in file order and every finding.
struct BfileContents {
  std::vector<BfileTerm> terms;
  std::vector<BfileMalformed> malformed;
  std::vector<BfileDuplicate> duplicates;
  std::vector<BfileOutOfOrder> out_of_order;
  Count lines = 0;     ///< every line, comments and blanks included
  Count comments = 0;
  Count blanks = 0;
};

/// Reads a whole b-file through BfileReader.
/// Pre: none. Complexity: O(file size) time; memory O(terms + total digits of the values).
/// Throws: IoError when the stream fails.
BfileContents read_bfile(std::istream& in);

/// Opens and reads the b-file at @p path. Throws: IoError naming the path when it cannot be
/// opened (missing, a directory, unreadable) or read.
BfileContents read_bfile_file(const std::string& path);

}  // namespace sqfc::io
