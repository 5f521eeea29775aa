// SPDX-License-Identifier: MIT
/// @file json.hpp  A small JSON value and writer for manifests.
#pragma once

#include <cstdint>
#include <map>
#include <memory>
#include <string>
#include <utility>
#include <variant>
#include <vector>

namespace sqfc::io {

/// A JSON value. Objects keep insertion order, so manifests read top to bottom.
class Json {
 public:
  using Array = std::vector<Json>;
  using Object = std::vector<std::pair<std::string, Json>>;

  Json() : value_(nullptr) {}
  Json(std::nullptr_t) : value_(nullptr) {}
  Json(bool b) : value_(b) {}
  Json(int v) : value_(static_cast<std::int64_t>(v)) {}
  Json(long v) : value_(static_cast<std::int64_t>(v)) {}
  Json(long long v) : value_(static_cast<std::int64_t>(v)) {}
  Json(unsigned v) : value_(static_cast<std::uint64_t>(v)) {}
  Json(unsigned long v) : value_(static_cast<std::uint64_t>(v)) {}
  Json(unsigned long long v) : value_(static_cast<std::uint64_t>(v)) {}
  Json(double v) : value_(v) {}
  Json(const char* s) : value_(std::string(s)) {}
  Json(std::string s) : value_(std::move(s)) {}
  Json(Array a) : value_(std::move(a)) {}
  Json(Object o) : value_(std::move(o)) {}

  /// Appends (or replaces) a member. Pre: this is an object or null (a null becomes an object).
  Json& set(const std::string& key, Json value);
  /// Appends an element. Pre: this is an array or null.
  Json& push(Json value);

  /// Text with two-space indentation; numbers exact, doubles shortest round-trip.
  [[nodiscard]] std::string dump(int indent = 2) const;

 private:
  void write(std::string& out, int indent, int depth) const;
  std::variant<std::nullptr_t, bool, std::int64_t, std::uint64_t, double, std::string, Array, Object> value_;
};

/// The text of a JSON string literal for @p s, with quotes and escapes.
std::string json_quote(const std::string& s);

}  // namespace sqfc::io
