// SPDX-License-Identifier: MIT
// JSON text output.
#include "sqfc/io/json.hpp"

#include <charconv>
#include <cmath>

namespace sqfc::io {

Json& Json::set(const std::string& key, Json value) {
  if (std::holds_alternative<std::nullptr_t>(value_)) value_ = Object{};
  auto& object = std::get<Object>(value_);
  for (auto& [k, v] : object)
    if (k == key) {
      v = std::move(value);
      return *this;
    }
  object.emplace_back(key, std::move(value));
  return *this;
}

Json& Json::push(Json value) {
  if (std::holds_alternative<std::nullptr_t>(value_)) value_ = Array{};
  std::get<Array>(value_).push_back(std::move(value));
  return *this;
}

std::string json_quote(const std::string& s) {
  std::string out = "\"";
  for (unsigned char c : s) {
    switch (c) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\n': out += "\\n"; break;
      case '\r': out += "\\r"; break;
      case '\t': out += "\\t"; break;
      default:
        if (c < 0x20) {
          static const char* hex = "0123456789abcdef";
          out += "\\u00";
          out += hex[c >> 4];
          out += hex[c & 15];
        } else {
          out += static_cast<char>(c);
        }
    }
  }
  out += '"';
  return out;
}

void Json::write(std::string& out, int indent, int depth) const {
  const auto newline = [&](int d) {
    if (indent <= 0) return;
    out += '\n';
    out.append(static_cast<std::size_t>(indent * d), ' ');
  };
  if (std::holds_alternative<std::nullptr_t>(value_)) out += "null";
  else if (const auto* b = std::get_if<bool>(&value_)) out += *b ? "true" : "false";
  else if (const auto* i = std::get_if<std::int64_t>(&value_)) out += std::to_string(*i);
  else if (const auto* u = std::get_if<std::uint64_t>(&value_)) out += std::to_string(*u);
  else if (const auto* d = std::get_if<double>(&value_)) {
    if (!std::isfinite(*d)) {
      out += "null";
    } else {
      char buffer[40];
      const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, *d);
      out.append(buffer, ec == std::errc() ? end : buffer);
    }
  } else if (const auto* s = std::get_if<std::string>(&value_)) out += json_quote(*s);
  else if (const auto* a = std::get_if<Array>(&value_)) {
    out += '[';
    for (std::size_t k = 0; k < a->size(); ++k) {
      if (k) out += ',';
      newline(depth + 1);
      (*a)[k].write(out, indent, depth + 1);
    }
    if (!a->empty()) newline(depth);
    out += ']';
  } else {
    const auto& o = std::get<Object>(value_);
    out += '{';
    for (std::size_t k = 0; k < o.size(); ++k) {
      if (k) out += ',';
      newline(depth + 1);
      out += json_quote(o[k].first);
      out += indent > 0 ? ": " : ":";
      o[k].second.write(out, indent, depth + 1);
    }
    if (!o.empty()) newline(depth);
    out += '}';
  }
}

std::string Json::dump(int indent) const {
  std::string out;
  write(out, indent, 0);
  return out;
}

}  // namespace sqfc::io
