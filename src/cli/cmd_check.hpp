// SPDX-License-Identifier: MIT
// `sqfc check`: the identity suite, or the comparison of an OEIS b-file with sqfc's values.
#pragma once

#include <optional>
#include <string>

#include "cli_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

struct CheckArguments {
  std::optional<std::string> bfile, sequence, to, threads;
  std::optional<std::string> only, out, inject_fault;  // identity suite only
  bool quiet = false;
};

void add_check_command(CLI::App& app, CheckArguments& args);
int run_check_command(const CheckArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
