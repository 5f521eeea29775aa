// SPDX-License-Identifier: MIT
// gnuplot look-up, --plot lists and the picture look options.
#include "plot_support.hpp"

#include <unistd.h>

#include <CLI/CLI.hpp>
#include <cstdlib>
#include <filesystem>
#include <sstream>

#include "cli_support.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::cli {

std::string resolve_gnuplot(const std::optional<std::string>& given) {
  const std::string name = given.value_or("gnuplot");
  if (name.find('/') != std::string::npos) return name;
  const char* path = std::getenv("PATH");
  std::stringstream folders(path ? path : "/usr/bin:/bin");
  for (std::string folder; std::getline(folders, folder, ':');) {
    if (folder.empty()) continue;
    const std::string candidate = folder + "/" + name;
    if (::access(candidate.c_str(), X_OK) == 0 && !std::filesystem::is_directory(candidate)) return candidate;
  }
  return "";
}

PlotChoice parse_plot_choice(const std::string& list, const std::string& option) {
  PlotChoice choice;
  std::stringstream items(list);
  for (std::string item; std::getline(items, item, ',');) {
    if (item.empty()) throw InvalidArgument(option + ": empty item in '" + list + "'");
    if (const auto k = io::find_plot_kind(item)) {
      if (std::find(choice.kinds.begin(), choice.kinds.end(), *k) == choice.kinds.end()) choice.kinds.push_back(*k);
    } else if (const auto f = io::find_plot_format(item)) {
      if (std::find(choice.formats.begin(), choice.formats.end(), *f) == choice.formats.end()) choice.formats.push_back(*f);
    } else {
      throw InvalidArgument(option + ": unknown picture kind or format '" + item +
                            "' (kinds: mertens, scaled, betti, faces, fredholm, barcode, diagram, green; formats: png, svg, pdf)");
    }
  }
  if (!list.empty() && list.back() == ',') throw InvalidArgument(option + ": empty item in '" + list + "'");
  return choice;
}

void add_plot_look_options(CLI::App& cmd, PlotLookArguments& a, bool bare) {
  const std::string p = bare ? "--" : "--plot-";
  cmd.add_option_function<std::string>(p + "width", [&a](const std::string& v) { a.width = v; },
                                       "picture width in pixels, also the envelope's pixel columns (default 1200)");
  cmd.add_option_function<std::string>(p + "height", [&a](const std::string& v) { a.height = v; }, "picture height in pixels (default 720)");
  cmd.add_flag(p + "log-x", a.log_x, std::string("logarithmic n axis (and log-spaced envelope columns)"));
  cmd.add_flag(p + "linear-y", a.linear_y, std::string("linear y axis for betti, faces and green (default logarithmic)"));
  cmd.add_option_function<std::string>("--gnuplot", [&a](const std::string& v) { a.gnuplot = v; },
                                       "the gnuplot program (default: gnuplot from PATH)");
}

void apply_plot_look(const PlotLookArguments& a, io::PlotRequest& r, bool bare, unsigned min_width) {
  const std::string p = bare ? "--" : "--plot-";
  if (a.width) r.width = static_cast<unsigned>(parse_number_option(*a.width, p + "width", min_width, 20000));
  if (a.height) r.height = static_cast<unsigned>(parse_number_option(*a.height, p + "height", 150, 20000));
  r.log_x = a.log_x;
  r.log_y = !a.linear_y;
  if (a.gnuplot && a.gnuplot->empty()) throw InvalidArgument("--gnuplot: empty program name");
  r.gnuplot = resolve_gnuplot(a.gnuplot);
}

std::string plot_prefix_beside(const std::string& output_path) {
  const std::filesystem::path p(output_path);
  return (p.parent_path() / p.stem()).string();
}

}  // namespace sqfc::cli
