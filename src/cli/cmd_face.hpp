// SPDX-License-Identifier: MIT
// `sqfc face`: one positive integer of any size as a face of the squarefree complex.
#pragma once

#include <optional>
#include <string>

#include "cli_support.hpp"

namespace CLI {
class App;
}

namespace sqfc::cli {

struct FaceArguments {
  std::string k;
  std::optional<std::string> n;
  std::string format = "text";
};

void add_face_command(CLI::App& app, FaceArguments& args);
int run_face_command(const FaceArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
