// SPDX-License-Identifier: MIT
/// @file error.hpp  The sqfc exception hierarchy; each error carries its CLI exit code.
#pragma once

#include <stdexcept>
#include <string>

namespace sqfc {

/// Exit codes of the sqfc executable.
namespace exit_code {
inline constexpr int ok = 0;
inline constexpr int check_failed = 1;  ///< a computation ran but an identity or comparison failed
inline constexpr int bad_input = 2;     ///< bad argument, unsupported range, unwritable path
inline constexpr int internal = 3;      ///< a bug: an internal invariant did not hold
}  // namespace exit_code

/// Base of every error sqfc throws. The message is one line, meant for stderr as is.
class Error : public std::runtime_error {
 public:
  Error(const std::string& message, int exit_code) : std::runtime_error(message), exit_code_(exit_code) {}
  /// Exit code the CLI returns for this error.
  [[nodiscard]] int exit_code() const noexcept { return exit_code_; }

 private:
  int exit_code_;
};

/// A caller passed a value outside the documented domain (exit code 2).
class InvalidArgument : public Error {
 public:
  explicit InvalidArgument(const std::string& message) : Error(message, exit_code::bad_input) {}
};

/// A result or intermediate value would not fit its type (exit code 2: the input is too large).
class OverflowError : public Error {
 public:
  explicit OverflowError(const std::string& message) : Error(message, exit_code::bad_input) {}
};

/// A file could not be opened, written or renamed (exit code 2).
class IoError : public Error {
 public:
  explicit IoError(const std::string& message) : Error(message, exit_code::bad_input) {}
};

/// An internal invariant failed (exit code 3); raised by SQFC_ASSERT and by self-checks.
class InternalError : public Error {
 public:
  explicit InternalError(const std::string& message) : Error(message, exit_code::internal) {}
};

}  // namespace sqfc

#if defined(SQFC_ENABLE_ASSERT)
#define SQFC_ASSERT(condition)                                                                  \
  do {                                                                                          \
    if (!(condition))                                                                           \
      throw ::sqfc::InternalError(std::string("assertion failed: " #condition " at ") + __FILE__ + \
                                  ":" + std::to_string(__LINE__));                             \
  } while (false)
#else
#define SQFC_ASSERT(condition) static_cast<void>(0)
#endif
