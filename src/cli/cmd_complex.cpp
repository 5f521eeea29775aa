// SPDX-License-Identifier: MIT
// `sqfc complex`: parse, count (identity 8), bound the output size, then stream the export
// into an atomic file with a manifest beside it.
#include "cmd_complex.hpp"

#include <CLI/CLI.hpp>
#include <cstdio>
#include <iostream>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/complex/graph_enumeration.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/graph_export.hpp"
#include "sqfc/io/manifest.hpp"

namespace sqfc::cli {
namespace {

// Default --max-bytes: 2 GiB, larger than any export a test or a quick look needs and small
// enough that a mistyped N (H_N grows like N^2) is caught before it fills a disk.
constexpr Count default_max_bytes = Count{1} << 31;

// Largest N of each mode (complex/graph_enumeration.hpp gives the reasons).
Natural n_limit(io::ComplexObject object, bool count) {
  if (count) {
    switch (object) {
      case io::ComplexObject::faces: return 100'000'000'000'000ULL;  // Q(N) only: 10^14
      case io::ComplexObject::divisibility: return complex::max_divisibility_count_n;
      case io::ComplexObject::shared_factor: return complex::max_shared_factor_count_n;
    }
  }
  return object == io::ComplexObject::shared_factor ? complex::max_shared_factor_enumeration_n
                                                   : complex::max_enumeration_n;
}

io::ComplexCounts counts_of(io::ComplexObject object, Natural n) {
  io::ComplexCounts c;
  c.n = n;
  c.vertices = complex::count_vertices(n);
  if (object == io::ComplexObject::divisibility) c.edges = complex::count_divisibility_edges(n);
  if (object == io::ComplexObject::shared_factor) c.edges = complex::count_shared_factor_edges_formula(n);
  return c;
}

std::string size_text(Count bytes) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%llu bytes (%.2f GiB)", static_cast<unsigned long long>(bytes),
                static_cast<double>(bytes) / static_cast<double>(Count{1} << 30));
  return buffer;
}

std::string extension(io::GraphFormat format) {
  return format == io::GraphFormat::edges ? "edges" : std::string(io::graph_format_name(format));
}

}  // namespace

void add_complex_command(CLI::App& app, ComplexArguments& a) {
  auto* cmd = app.add_subcommand("complex", "The faces of K_N or the graphs G_N, H_N as files, or their counts");
  cmd->add_option("N", a.n, "the complex K_N: digits, 1e6, 10^6 or 2^20")->required();
  cmd->add_option_function<std::string>(
      "--object", [&a](const std::string& v) { a.object = v; }, "faces, divisibility or shared-factor (required)");
  cmd->add_option_function<std::string>(
      "--format", [&a](const std::string& v) { a.format = v; },
      "edges, graphml, dot, mtx (graphs; default edges) or jsonl (faces, the default)");
  cmd->add_option_function<std::string>(
      "--out", [&a](const std::string& v) { a.out = v; }, "output file, - for standard output (default: under data_out/complex/)");
  cmd->add_flag("--count", a.count, std::string("print vertices and edges as a CSV row, without enumerating"));
  cmd->add_flag("--force", a.force, std::string("write even when the estimated size is above --max-bytes"));
  cmd->add_option_function<std::string>(
      "--max-bytes", [&a](const std::string& v) { a.max_bytes = v; }, "size limit of an export (default 2^31 = 2 GiB)");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
}

int run_complex_command(const ComplexArguments& a, const Invocation& invocation) {
  // Every argument is validated before any counting or file work.
  if (!a.object) throw InvalidArgument("--object is required: faces, divisibility or shared-factor");
  const io::ComplexObject object = io::parse_complex_object(*a.object);
  const io::GraphFormat format = a.format ? io::parse_graph_format(*a.format) : io::default_graph_format(object);
  io::check_format_fits(object, format);
  const Natural limit = n_limit(object, a.count);
  const Natural n = parse_number_option(a.n, "N", 1, limit);
  const Count max_bytes = a.max_bytes ? parse_number_option(*a.max_bytes, "--max-bytes", 0, ~Count{0}) : default_max_bytes;
  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty path (use - for standard output)");
  if (a.count && (a.out || a.format || a.force || a.max_bytes))
    throw InvalidArgument("--count prints counts only; it takes none of --out, --format, --force, --max-bytes");

  const io::ComplexCounts counts = counts_of(object, n);
  if (a.count) {
    if (object == io::ComplexObject::faces)
      std::cout << "n,object,faces,top_dimension\n"
                << n << ",faces," << counts.vertices << ',' << complex::max_face_dimension(n) << '\n';
    else
      std::cout << "n,object,vertices,edges\n"
                << n << ',' << io::complex_object_name(object) << ',' << counts.vertices << ',' << counts.edges << '\n';
    return exit_code::ok;
  }

  const Count estimate = io::estimate_export_bytes(object, format, counts);
  if (estimate > max_bytes && !a.force)
    throw InvalidArgument("the export would take up to " + size_text(estimate) + ", above the limit of " +
                          size_text(max_bytes) + "; pass --force to write it anyway or raise --max-bytes");

  std::string out;
  if (a.out) {
    out = *a.out;
  } else {
    const std::string dir = "data_out/complex/" + io::utc_compact_timestamp(invocation.started) + "-" +
                            std::string(io::complex_object_name(object)) + "-" + std::to_string(n);
    io::ensure_directory(dir);
    out = dir + "/" + std::string(io::complex_object_name(object)) + "." + extension(format);
  }
  const auto started = std::chrono::system_clock::now();
  const auto clock_start = std::chrono::steady_clock::now();
  io::AtomicOutputFile file(out);
  std::unique_ptr<io::AtomicOutputFile> manifest;
  if (!file.is_stream()) manifest = std::make_unique<io::AtomicOutputFile>(out + ".manifest.json");
  ProgressBar bar("complex", a.quiet);
  const io::ExportReport report = io::write_complex(file.stream(), object, format, counts, [&](Count bytes) {
    throw_if_interrupted();
    bar.update(std::min(bytes, estimate), estimate);
  });
  bar.finish();
  file.commit();
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count();
  if (manifest) {
    io::Json m = io::manifest_head(invocation.argv);
    m.set("command", "complex");
    io::Json parameters;
    parameters.set("n", n);
    parameters.set("object", std::string(io::complex_object_name(object)));
    parameters.set("format", std::string(io::graph_format_name(format)));
    parameters.set("max_bytes", max_bytes);
    parameters.set("force", a.force);
    m.set("parameters", std::move(parameters));
    io::set_run_times(m, started, seconds);
    io::Json outputs;
    outputs.set("export", out);
    m.set("outputs", std::move(outputs));
    io::Json c;
    c.set("vertices", counts.vertices);
    c.set("edges", counts.edges);
    c.set("estimated_bytes", estimate);
    c.set("bytes", report.bytes);
    m.set("counts", std::move(c));
    manifest->stream() << m.dump(2) << '\n';
    manifest->commit();
  }
  if (bar.active() && manifest)
    std::cerr << "sqfc complex: wrote " << out << " (" << report.vertices << " vertices, " << report.edges << " edges, "
              << report.bytes << " bytes) in " << seconds << " s\n";
  return exit_code::ok;
}

}  // namespace sqfc::cli
