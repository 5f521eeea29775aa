// SPDX-License-Identifier: MIT
/// @file version.hpp  The sqfc version string, written into every manifest.
#pragma once

// SQFC_VERSION comes from project(VERSION ...) in CMakeLists.txt, the single source of truth.
#ifndef SQFC_VERSION
#error "SQFC_VERSION must be defined by the build (target sqfc::core)"
#endif

namespace sqfc {
/// Semantic version of this build.
inline constexpr const char* version_string = SQFC_VERSION;
}  // namespace sqfc
