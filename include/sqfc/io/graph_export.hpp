// SPDX-License-Identifier: MIT
/// @file graph_export.hpp  Streamed writers for the faces of K_n (JSON lines) and the graphs G_n
/// and H_n (edge list, GraphML, DOT, Matrix Market), with a size bound computed before writing.
#pragma once

#include <functional>
#include <ostream>
#include <string>
#include <string_view>

#include "sqfc/core/types.hpp"

namespace sqfc::io {

/// What `sqfc complex` exports: the faces of K_n, or one of its two graphs.
enum class ComplexObject { faces, divisibility, shared_factor };

/// The file layouts (docs/output-formats.md): faces take jsonl only, the graphs the other four.
enum class GraphFormat { edges, graphml, dot, mtx, jsonl };

/// "faces", "divisibility", "shared-factor" -> the object. Throws: InvalidArgument naming the
/// accepted words.
ComplexObject parse_complex_object(std::string_view word);
/// "edges", "graphml", "dot", "mtx", "jsonl" -> the format. Throws: InvalidArgument.
GraphFormat parse_graph_format(std::string_view word);
/// The command-line word of an object or format (inverse of the parsers).
std::string_view complex_object_name(ComplexObject object) noexcept;
std::string_view graph_format_name(GraphFormat format) noexcept;
/// The format used when none is given: jsonl for faces, edges for the graphs.
GraphFormat default_graph_format(ComplexObject object) noexcept;
/// Throws InvalidArgument when the format does not apply to the object (faces: jsonl only;
/// graphs: anything but jsonl).
void check_format_fits(ComplexObject object, GraphFormat format);

/// Sizes of the exported object, known before writing (from the counts of design.md
/// identity 8). For faces, edges is 0.
struct ComplexCounts {
  Natural n = 0;
  Count vertices = 0;  ///< Q(n) - 1
  Count edges = 0;     ///< edges of G_n or H_n
};

/// An upper bound, in bytes, of what write_complex writes for these counts: every integer is
/// charged the digits of n, every face the largest omega possible below n.
/// Pre: the format fits the object (assumed). Complexity: O(1).
/// Returns a value saturated at 2^64 - 1.
Count estimate_export_bytes(ComplexObject object, GraphFormat format, const ComplexCounts& counts);

/// What one export wrote.
struct ExportReport {
  Count vertices = 0;  ///< vertices (or faces) written
  Count edges = 0;     ///< edges written
  Count bytes = 0;     ///< bytes written
};

/// Writes the object in the format to @p out, streaming: vertices and edges come from the
/// complex-layer enumerations and pass through one 1 MiB text buffer, so memory stays that of
/// the enumeration (plus a rank bitmap of n/8 + n/16 bytes for Matrix Market).
/// @param counts  the true counts (they go into the headers: GraphML needs none, the edge list
///                and Matrix Market headers state them)
/// @param progress  called after each flushed buffer with the bytes written so far (may be empty)
/// Pre: the format fits the object (checked; InvalidArgument); counts are the true counts
/// (checked after writing: InternalError when the enumeration disagrees); n within the
/// enumeration limits of complex/graph_enumeration.hpp (checked; InvalidArgument).
/// Complexity: that of the enumeration plus O(bytes).
/// Throws: InvalidArgument, InternalError, IoError when the stream fails, whatever progress throws.
ExportReport write_complex(std::ostream& out, ComplexObject object, GraphFormat format, const ComplexCounts& counts,
                           const std::function<void(Count)>& progress = {});

}  // namespace sqfc::io
