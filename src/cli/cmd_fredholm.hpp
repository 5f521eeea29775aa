// SPDX-License-Identifier: MIT
// `sqfc fredholm`: Fredholm determinant and Green function of H_n as n grows.
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

struct FredholmArguments {
  std::string to;
  std::optional<std::string> every, at, log, method, out, histogram, dump_n, dump_file, threads, memory_limit;
  bool green_stats = false, cross_check = false, spectrum = false, divisibility = false, quiet = false;
  std::string plot_list;  // --plot [LIST]: kinds fredholm, green and formats
  CLI::Option* plot_option = nullptr;
  PlotLookArguments plot_look;
};

void add_fredholm_command(CLI::App& app, FredholmArguments& args);
int run_fredholm_command(const FredholmArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
