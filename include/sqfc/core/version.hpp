// SPDX-License-Identifier: MIT
/// @file version.hpp  The sqfc version string, written into every manifest.
#pragma once

namespace sqfc {
/// Semantic version of this build.
inline constexpr const char* version_string = "0.1.0";
}  // namespace sqfc
