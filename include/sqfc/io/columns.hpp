// SPDX-License-Identifier: MIT
/// @file columns.hpp  Table columns by name, and their values in a row.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "sqfc/track/tracker_state.hpp"

namespace sqfc::io {

/// One column of a table: a scalar kind, or f_d / b_d with its dimension.
struct Column {
  enum class Kind { n, mu, mertens, euler, squarefree, liouville, fredholm, face, betti, div_edges };
  Kind kind;
  int dimension = 0;  ///< for face and betti
  friend bool operator==(const Column&, const Column&) = default;
};

/// The column's name as in design.md: n, mu, mertens, ..., f3, b2, div_edges.
std::string column_name(const Column& column);

/// Every column for a table up to N: n, mu, mertens, euler, squarefree, liouville, fredholm,
/// f0..fD, b0..bD, div_edges with D = max(0, largest face dimension of K_N).
std::vector<Column> default_columns(Natural to);

/// Parses a comma-separated column list. `n` is put first when missing. Accepted names are
/// those of column_name() with d in [0, 14], plus `f` and `b` for all of f0..fD / b0..bD.
/// Throws: InvalidArgument naming the unknown column; on an empty list.
std::vector<Column> parse_columns(std::string_view list, Natural to);

/// The value of a column in a row, as exact decimal text.
std::string column_value(const Column& column, const track::TableRow& row);

}  // namespace sqfc::io
