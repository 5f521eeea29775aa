// SPDX-License-Identifier: MIT
/// @file envelope_file.hpp  The envelope data file: one CSV row per pixel column (docs/output-formats.md).
#pragma once

#include <ostream>
#include <string>
#include <vector>

#include "sqfc/track/envelope.hpp"

namespace sqfc::io {

/// First line of every envelope file; readers recognise the file by it.
inline constexpr const char* envelope_signature = "# sqfc envelope";

/// Names of the series written for faces and Betti numbers of dimensions 0..top_dimension:
/// mertens, scaled, squarefree, fredholm, f0..fD, then b0..bD when the envelope has Betti extremes.
std::vector<std::string> envelope_series(const track::Envelope& envelope, int top_dimension);

/// Writes the envelope: two `#` lines (signature and `key=value` facts), a header
/// `column,lo,hi,<s>_first,<s>_last,<s>_min,<s>_min_n,<s>_max,<s>_max_n` for each series s,
/// then one row per column. All values are exact integers except the scaled series, whose
/// values are M(n)/sqrt(n) with 12 significant digits (its positions are exact).
/// Pre: 0 <= top_dimension < 15 (assumed). Complexity: O(columns * series).
void write_envelope(std::ostream& out, const track::Envelope& envelope, int top_dimension);

/// What the second line of an envelope file says, and its header.
struct EnvelopeFileInfo {
  Natural first = 0, last = 0;
  std::size_t columns = 0;
  bool log_x = false;
  std::vector<std::string> header;  ///< the column names of the CSV header
};

/// Reads the two comment lines and the header of an envelope file.
/// Throws: IoError (unreadable), InvalidArgument (not an envelope file, naming what is wrong).
EnvelopeFileInfo read_envelope_info(const std::string& path);

}  // namespace sqfc::io
