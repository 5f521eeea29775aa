// SPDX-License-Identifier: MIT
// `sqfc plot`: pictures of a table, envelope, events, barcode or Green histogram file.
#pragma once

#include <optional>
#include <string>

#include "cli_support.hpp"
#include "plot_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

struct PlotArguments {
  std::string input;
  std::optional<std::string> kind, format, events, out, at_n;
  PlotLookArguments look;
  bool quiet = false;
};

void add_plot_command(CLI::App& app, PlotArguments& args);
int run_plot_command(const PlotArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
