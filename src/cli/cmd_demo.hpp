// SPDX-License-Identifier: MIT
// `sqfc demo`: the worked scenario.
#pragma once

#include <optional>
#include <string>

#include "cli_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

struct DemoArguments {
  std::string to = "1e8";
  std::string out_dir = "data_out/demo";
  std::optional<std::string> threads;
  bool quiet = false;
};

void add_demo_command(CLI::App& app, DemoArguments& args);
int run_demo_command(const DemoArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
