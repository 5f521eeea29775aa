// SPDX-License-Identifier: MIT
// `sqfc runs`: what run stores hold (range done, parameters, timings, checks).
#pragma once

#include <string>
#include <vector>

#include "cli_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

struct RunsArguments {
  std::vector<std::string> list_paths;  ///< `runs list`: folders or store files
  std::string show_path;                ///< `runs show`: one store file
};

void add_runs_command(CLI::App& app, RunsArguments& args);
/// Returns the exit code: 0, or 1 when `list` found a damaged store.
int run_runs_command(const CLI::App& app, const RunsArguments& args);

}  // namespace sqfc::cli
