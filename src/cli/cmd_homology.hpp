// SPDX-License-Identifier: MIT
// `sqfc homology`: persistent homology of the filtration, computed from the boundary matrix.
#pragma once

#include <optional>
#include <string>

#include "cli_support.hpp"
#include "plot_support.hpp"

namespace CLI {
class App;
class Option;
}

namespace sqfc::cli {

struct HomologyArguments {
  std::string to;
  std::optional<std::string> every, at, log, out, barcode, field, smooth, coprime_to, max_dim;
  bool quiet = false;
  std::string plot_list;  // --plot [LIST]: kinds barcode, diagram, betti and formats
  CLI::Option* plot_option = nullptr;
  PlotLookArguments plot_look;
};

void add_homology_command(CLI::App& app, HomologyArguments& args);
int run_homology_command(const HomologyArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
