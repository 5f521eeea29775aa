// SPDX-License-Identifier: MIT
// `sqfc complex`: the faces of K_N and the graphs G_N, H_N as files, or their counts.
#pragma once

#include <optional>
#include <string>

#include "cli_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

struct ComplexArguments {
  std::string n;
  std::optional<std::string> object;
  std::optional<std::string> format;
  std::optional<std::string> out;
  std::optional<std::string> max_bytes;
  bool count = false;
  bool force = false;
  bool quiet = false;
};

void add_complex_command(CLI::App& app, ComplexArguments& args);
int run_complex_command(const ComplexArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
