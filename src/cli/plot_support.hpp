// SPDX-License-Identifier: MIT
// Shared pieces of `sqfc plot` and the --plot options of table, homology and fredholm.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "sqfc/io/plot.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

/// The absolute path of gnuplot: `given` when it holds a '/', else `given` (default "gnuplot")
/// searched in PATH; empty when not found (io::check_plot_request then names the package).
std::string resolve_gnuplot(const std::optional<std::string>& given);

/// Kinds and formats from a comma-separated list whose items are kind names (mertens, scaled,
/// betti, faces, fredholm, barcode, diagram, green) or format names (png, svg, pdf).
/// Throws: InvalidArgument naming the option and the item.
struct PlotChoice {
  std::vector<io::PlotKind> kinds;
  std::vector<io::PlotFormat> formats;
};
PlotChoice parse_plot_choice(const std::string& list, const std::string& option);

/// Options of the picture size and look shared by every command that draws.
struct PlotLookArguments {
  std::optional<std::string> width, height, gnuplot;
  bool log_x = false, linear_y = false;
};
/// Adds --plot-width, --plot-height, --plot-log-x, --plot-linear-y, --gnuplot (prefix "plot-"
/// is dropped for `sqfc plot` itself when `bare` is true: --width, --height, --log-x, --linear-y).
void add_plot_look_options(CLI::App& cmd, PlotLookArguments& a, bool bare);
/// Copies the look into a request. The width must lie in [min_width, 20000] (pictures need 200;
/// an envelope without pictures may have fewer columns). Throws: InvalidArgument for bad sizes.
void apply_plot_look(const PlotLookArguments& a, io::PlotRequest& request, bool bare, unsigned min_width = 200);

/// "<path without its extension>": the prefix of the pictures drawn beside an output file.
std::string plot_prefix_beside(const std::string& output_path);

}  // namespace sqfc::cli
