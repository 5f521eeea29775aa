// SPDX-License-Identifier: MIT
// `sqfc value`: M, Q, L, the Fredholm sign, face counts and Betti numbers at isolated x.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "cli_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

/// Raw option text of `sqfc value`, as typed.
struct ValueArguments {
  std::vector<std::string> xs;
  std::optional<std::string> what, out, threads;
  std::string format = "csv";
  bool quiet = false;
};

void add_value_command(CLI::App& app, ValueArguments& args);
/// Parses, evaluates every x, writes the rows and the manifest. Returns the exit code.
/// Throws: InvalidArgument (bad x, unknown --what, x beyond a bound), IoError.
int run_value_command(const ValueArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
