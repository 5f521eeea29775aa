// SPDX-License-Identifier: MIT
// `sqfc plot`: parse, check, write data and scripts, run gnuplot, list the pictures.
#include "cmd_plot.hpp"

#include <CLI/CLI.hpp>
#include <filesystem>
#include <iostream>

#include "sqfc/core/error.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/manifest.hpp"

namespace sqfc::cli {

void add_plot_command(CLI::App& app, PlotArguments& a) {
  auto* cmd = app.add_subcommand("plot", "Pictures (PNG, SVG, PDF) of a table, envelope, events, barcode or histogram file");
  cmd->add_option("input", a.input, "the file to draw (kind detected from its first lines)")->required();
  cmd->add_option_function<std::string>("--kind", [&a](const std::string& v) { a.kind = v; },
                                        "pictures: mertens, scaled, betti, faces, fredholm, barcode, diagram, green (comma list; default: all the file supports)");
  cmd->add_option_function<std::string>("--format", [&a](const std::string& v) { a.format = v; }, "png, svg, pdf (comma list; default png)");
  cmd->add_option_function<std::string>("--events", [&a](const std::string& v) { a.events = v; },
                                        "events file of sqfc table: zeros and records on the mertens and scaled pictures");
  cmd->add_option_function<std::string>("--out", [&a](const std::string& v) { a.out = v; },
                                        "output prefix: files PREFIX-<kind>.{dat,gp,png,...} (default under data_out/plot/)");
  cmd->add_option_function<std::string>("--at-n", [&a](const std::string& v) { a.at_n = v; },
                                        "green: the sample n of the histogram (default the largest)");
  add_plot_look_options(*cmd, a.look, true);
  cmd->add_flag("--quiet,-q", a.quiet, std::string("do not list the pictures written"));
}

int run_plot_command(const PlotArguments& a, const Invocation& invocation) {
  io::PlotRequest r;
  r.input = a.input;
  if (a.kind) {
    if (a.kind->empty()) throw InvalidArgument("--kind: empty list");
    const auto choice = parse_plot_choice(*a.kind, "--kind");
    if (!choice.formats.empty()) throw InvalidArgument("--kind: '" + *a.kind + "' names a format; use --format");
    r.kinds = choice.kinds;
  }
  if (a.format) {
    if (a.format->empty()) throw InvalidArgument("--format: empty list");
    const auto choice = parse_plot_choice(*a.format, "--format");
    if (!choice.kinds.empty()) throw InvalidArgument("--format: '" + *a.format + "' names a picture kind; use --kind");
    r.formats = choice.formats;
  }
  if (a.events) {
    if (a.events->empty()) throw InvalidArgument("--events: empty path");
    r.events = *a.events;
  }
  if (a.at_n) r.histogram_n = parse_number_option(*a.at_n, "--at-n", 1, ~0ULL >> 1);
  apply_plot_look(a.look, r, true);
  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty prefix");
  if (a.out && *a.out == "-") throw InvalidArgument("--out: pictures cannot go to standard output; give a path prefix");
  if (!std::filesystem::exists(a.input)) throw InvalidArgument("input file '" + a.input + "' does not exist");
  if (!a.out) {
    // Check first, so that a bad request leaves no empty folder behind.
    r.prefix = "unset";
    io::check_plot_request(r);
    const std::string dir = "data_out/plot/" + io::utc_compact_timestamp(invocation.started);
    io::ensure_directory(dir);
    r.prefix = dir + "/" + std::filesystem::path(a.input).stem().string();
  } else {
    r.prefix = *a.out;
  }
  const auto outputs = io::make_plots(r);
  if (!a.quiet)
    for (const auto& o : outputs)
      for (const auto& p : o.pictures) std::cout << p << '\n';
  return exit_code::ok;
}

}  // namespace sqfc::cli
