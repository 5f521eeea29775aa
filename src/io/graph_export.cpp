// SPDX-License-Identifier: MIT
// Edge list, GraphML, DOT, Matrix Market and JSON-lines writers over the streamed enumerations.
#include "sqfc/io/graph_export.hpp"

#include <charconv>
#include <memory>
#include <vector>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/complex/graph_enumeration.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::io {
namespace {

// Text is collected in a buffer and written in large pieces: one ostream call per 1 MiB keeps
// the stream's per-call cost out of the per-edge work. A line is at most ~300 bytes, so the
// 512-byte reserve is never overrun.
class TextBuffer {
 public:
  TextBuffer(std::ostream& out, const std::function<void(Count)>& progress) : out_(out), progress_(progress) {
    data_ = std::make_unique<char[]>(capacity);
  }
  TextBuffer& operator<<(std::string_view s) {
    if (used_ + s.size() > capacity) flush();
    if (s.size() > capacity) {
      write(s.data(), s.size());
      return *this;
    }
    std::copy(s.begin(), s.end(), data_.get() + used_);
    used_ += s.size();
    if (used_ + reserve > capacity) flush();
    return *this;
  }
  TextBuffer& operator<<(char c) {
    data_[used_++] = c;
    if (used_ + reserve > capacity) flush();
    return *this;
  }
  TextBuffer& operator<<(std::uint64_t v) {
    used_ = static_cast<std::size_t>(std::to_chars(data_.get() + used_, data_.get() + capacity, v).ptr - data_.get());
    if (used_ + reserve > capacity) flush();
    return *this;
  }
  TextBuffer& operator<<(int v) {
    used_ = static_cast<std::size_t>(std::to_chars(data_.get() + used_, data_.get() + capacity, v).ptr - data_.get());
    if (used_ + reserve > capacity) flush();
    return *this;
  }
  void flush() {
    if (!used_) return;
    write(data_.get(), used_);
    used_ = 0;
    if (progress_) progress_(bytes_);
  }
  [[nodiscard]] Count bytes() const noexcept { return bytes_ + used_; }

 private:
  static constexpr std::size_t capacity = std::size_t{1} << 20;
  static constexpr std::size_t reserve = 512;
  void write(const char* p, std::size_t size) {
    out_.write(p, static_cast<std::streamsize>(size));
    if (!out_) throw IoError("writing the export failed (disk full or stream closed?)");
    bytes_ += size;
  }
  std::ostream& out_;
  const std::function<void(Count)>& progress_;
  std::unique_ptr<char[]> data_;
  std::size_t used_ = 0;
  Count bytes_ = 0;
};

std::string graph_title(ComplexObject object) {
  return object == ComplexObject::divisibility ? "divisibility graph G_N (a - b when a properly divides b)"
                                               : "shared-factor graph H_N (a - b when gcd(a, b) > 1)";
}

// Runs the object's edge enumeration, calling edge(a, b) per edge.
template <class Edge>
void each_edge(ComplexObject object, Natural n, Edge&& edge) {
  const complex::EdgeBatchVisitor visit = [&](std::span<const complex::GraphEdge> batch) {
    for (const auto& e : batch) edge(e.a, e.b);
  };
  if (object == ComplexObject::divisibility)
    complex::for_each_divisibility_edge(n, visit);
  else
    complex::for_each_shared_factor_edge(n, visit);
}

template <class Vertex>
void each_vertex(Natural n, Vertex&& vertex) {
  complex::for_each_face(n, [&](const complex::FaceView& f) { vertex(f.k, f.dimension); });
}

Count digits(Natural n) {
  Count d = 1;
  while (n >= 10) {
    n /= 10;
    ++d;
  }
  return d;
}

// Saturating a * x + b for the size bound.
Count affine(Count a, Count x, Count b) {
  const WideUnsigned v = static_cast<WideUnsigned>(a) * x + b;
  return v > static_cast<WideUnsigned>(~Count{0}) ? ~Count{0} : static_cast<Count>(v);
}
Count add(Count a, Count b) { return a > ~Count{0} - b ? ~Count{0} : a + b; }

}  // namespace

ComplexObject parse_complex_object(std::string_view word) {
  if (word == "faces") return ComplexObject::faces;
  if (word == "divisibility") return ComplexObject::divisibility;
  if (word == "shared-factor") return ComplexObject::shared_factor;
  throw InvalidArgument("--object: '" + std::string(word) + "' is not one of faces, divisibility, shared-factor");
}

GraphFormat parse_graph_format(std::string_view word) {
  if (word == "edges") return GraphFormat::edges;
  if (word == "graphml") return GraphFormat::graphml;
  if (word == "dot") return GraphFormat::dot;
  if (word == "mtx") return GraphFormat::mtx;
  if (word == "jsonl") return GraphFormat::jsonl;
  throw InvalidArgument("--format: '" + std::string(word) + "' is not one of edges, graphml, dot, mtx, jsonl");
}

std::string_view complex_object_name(ComplexObject object) noexcept {
  switch (object) {
    case ComplexObject::faces: return "faces";
    case ComplexObject::divisibility: return "divisibility";
    case ComplexObject::shared_factor: return "shared-factor";
  }
  return "";
}

std::string_view graph_format_name(GraphFormat format) noexcept {
  switch (format) {
    case GraphFormat::edges: return "edges";
    case GraphFormat::graphml: return "graphml";
    case GraphFormat::dot: return "dot";
    case GraphFormat::mtx: return "mtx";
    case GraphFormat::jsonl: return "jsonl";
  }
  return "";
}

GraphFormat default_graph_format(ComplexObject object) noexcept {
  return object == ComplexObject::faces ? GraphFormat::jsonl : GraphFormat::edges;
}

void check_format_fits(ComplexObject object, GraphFormat format) {
  const bool faces = object == ComplexObject::faces;
  if (faces && format != GraphFormat::jsonl)
    throw InvalidArgument("--format " + std::string(graph_format_name(format)) +
                          " does not apply to --object faces (faces are written as jsonl)");
  if (!faces && format == GraphFormat::jsonl)
    throw InvalidArgument("--format jsonl applies to --object faces only (graphs: edges, graphml, dot, mtx)");
}

Count estimate_export_bytes(ComplexObject object, GraphFormat format, const ComplexCounts& c) {
  const Count d = digits(c.n);
  const Count header = 512;  // every header and footer below is shorter
  switch (format) {
    case GraphFormat::jsonl: {
      // {"k":K,"primes":[p1,...],"dim":D}\n: the primes' digits total at most digits(K) + omega - 1.
      const Count omega = static_cast<Count>(std::max(1, complex::max_face_dimension(c.n) + 1));
      return affine(28 + 2 * d + 2 * omega, c.vertices, header);
    }
    case GraphFormat::edges: return affine(2 * d + 2, c.edges, header);
    case GraphFormat::graphml: return add(affine(55 + d, c.vertices, header), affine(32 + 2 * d, c.edges, 0));
    case GraphFormat::dot: return add(affine(19 + d, c.vertices, header), affine(8 + 2 * d, c.edges, 0));
    case GraphFormat::mtx: return add(affine(4 + 2 * d, c.vertices, header), affine(2 * d + 2, c.edges, 0));
  }
  (void)object;
  return ~Count{0};
}

ExportReport write_complex(std::ostream& out, ComplexObject object, GraphFormat format, const ComplexCounts& counts,
                           const std::function<void(Count)>& progress) {
  check_format_fits(object, format);
  TextBuffer text(out, progress);
  ExportReport report;
  const Natural n = counts.n;
  const std::string n_text = std::to_string(n);
  switch (format) {
    case GraphFormat::jsonl:
      complex::for_each_face(n, [&](const complex::FaceView& f) {
        text << "{\"k\":" << f.k << ",\"primes\":[";
        for (std::size_t i = 0; i < f.primes.size(); ++i) {
          if (i) text << ',';
          text << f.primes[i];
        }
        text << "],\"dim\":" << f.dimension << "}\n";
        ++report.vertices;
      });
      break;
    case GraphFormat::edges:
      text << "# sqfc complex: " << graph_title(object) << ", N = " << n_text << '\n';
      text << "# vertices " << counts.vertices << " edges " << counts.edges << "; one edge \"a b\" per line, a < b\n";
      each_edge(object, n, [&](Natural a, Natural b) {
        text << a << ' ' << b << '\n';
        ++report.edges;
      });
      report.vertices = counts.vertices;
      break;
    case GraphFormat::graphml:
      text << "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
           << "<graphml xmlns=\"http://graphml.graphdrawing.org/xmlns\">\n"
           << "  <key id=\"dimension\" for=\"node\" attr.name=\"dimension\" attr.type=\"int\"/>\n"
           << "  <graph id=\"" << (object == ComplexObject::divisibility ? "G_" : "H_") << n_text
           << "\" edgedefault=\"undirected\">\n";
      each_vertex(n, [&](Natural k, int dimension) {
        text << "    <node id=\"" << k << "\"><data key=\"dimension\">" << dimension << "</data></node>\n";
        ++report.vertices;
      });
      each_edge(object, n, [&](Natural a, Natural b) {
        text << "    <edge source=\"" << a << "\" target=\"" << b << "\"/>\n";
        ++report.edges;
      });
      text << "  </graph>\n</graphml>\n";
      break;
    case GraphFormat::dot:
      text << "// sqfc complex: " << graph_title(object) << ", N = " << n_text << '\n';
      text << "graph " << (object == ComplexObject::divisibility ? "G_" : "H_") << n_text << " {\n";
      each_vertex(n, [&](Natural k, int dimension) {
        text << "  " << k << " [dimension=" << dimension << "];\n";
        ++report.vertices;
      });
      each_edge(object, n, [&](Natural a, Natural b) {
        text << "  " << a << " -- " << b << ";\n";
        ++report.edges;
      });
      text << "}\n";
      break;
    case GraphFormat::mtx: {
      text << "%%MatrixMarket matrix coordinate pattern symmetric\n";
      text << "% sqfc complex: adjacency of the " << graph_title(object) << ", N = " << n_text << '\n';
      text << "% vertex index i (1-based) is the i-th squarefree integer in [2, N]; lines \"% i k\" map i to k\n";
      Count index = 0;
      each_vertex(n, [&](Natural k, int) {
        text << "% " << ++index << ' ' << k << '\n';
      });
      report.vertices = index;
      text << counts.vertices << ' ' << counts.vertices << ' ' << counts.edges << '\n';
      // Symmetric storage keeps the lower triangle: row rank(b) > column rank(a) since a < b.
      const complex::SquarefreeRank rank(n);
      each_edge(object, n, [&](Natural a, Natural b) {
        text << rank.rank(b) << ' ' << rank.rank(a) << '\n';
        ++report.edges;
      });
      break;
    }
  }
  text.flush();
  out.flush();
  if (!out) throw IoError("writing the export failed (disk full or stream closed?)");
  if (format != GraphFormat::edges && report.vertices != counts.vertices)
    throw InternalError("export wrote " + std::to_string(report.vertices) + " vertices, the count says " +
                        std::to_string(counts.vertices));
  if (report.edges != counts.edges)
    throw InternalError("export wrote " + std::to_string(report.edges) + " edges, the count says " +
                        std::to_string(counts.edges));
  report.bytes = text.bytes();
  return report;
}

}  // namespace sqfc::io
