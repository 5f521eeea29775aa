// SPDX-License-Identifier: MIT
// Tests of io/json: string escaping, exact text of nested values at both indentations, member
// replacement, and parsing of the output by nlohmann-json (used here only as a reader).
#include "sqfc/io/json.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdint>
#include <limits>
#include <string>
#include <vector>

namespace {

using sqfc::io::Json;
using sqfc::io::json_quote;

TEST(Json, QuoteEscapesWhatJsonRequires) {
  // RFC 8259 section 7 (common practice): quote, backslash and control characters below 0x20
  // must be escaped; everything else may stand as is.
  const std::vector<std::pair<std::string, std::string>> cases = {
      {"", "\"\""},
      {"plain", "\"plain\""},
      {"a\"b", "\"a\\\"b\""},
      {"back\\slash", "\"back\\\\slash\""},
      {"line\nbreak", "\"line\\nbreak\""},
      {"cr\r", "\"cr\\r\""},
      {"\ttab", "\"\\ttab\""},
      {std::string("\x01", 1), "\"\\u0001\""},
      {std::string("\x1f", 1), "\"\\u001f\""},
      {std::string("nul\0byte", 8), "\"nul\\u0000byte\""},
      {"\x7f", "\"\x7f\""},
      {"/", "\"/\""},
      {"caf\xc3\xa9 \xe2\x88\x9a", "\"caf\xc3\xa9 \xe2\x88\x9a\""}};  // UTF-8 passes through
  int checked = 0;
  for (const auto& [text, quoted] : cases) {
    EXPECT_EQ(json_quote(text), quoted);
    ++checked;
  }
  EXPECT_EQ(checked, 13);
}

TEST(Json, QuotedStringsParseBackToTheSameBytes) {
  // Every ASCII byte (0x00..0x7f) and some UTF-8 sequences, through nlohmann-json.
  std::string all;
  for (int c = 0; c < 128; ++c) all += static_cast<char>(c);
  int checked = 0;
  for (const std::string& text : {all, std::string("\xc3\xa9\xe2\x88\x9a\xf0\x9f\x98\x80"), std::string("\"\\\"\\")}) {
    const auto parsed = nlohmann::json::parse(json_quote(text));
    ASSERT_TRUE(parsed.is_string());
    EXPECT_EQ(parsed.get<std::string>(), text);
    ++checked;
  }
  EXPECT_EQ(checked, 3);
}

TEST(Json, ScalarsText) {
  const std::vector<std::pair<Json, std::string>> cases = {
      {Json(), "null"},
      {Json(nullptr), "null"},
      {Json(true), "true"},
      {Json(false), "false"},
      {Json(0), "0"},
      {Json(-42), "-42"},
      {Json(std::numeric_limits<long long>::min()), "-9223372036854775808"},
      {Json(std::numeric_limits<unsigned long long>::max()), "18446744073709551615"},
      {Json(10'000'000'000'000'000ULL), "10000000000000000"},
      {Json(0.1), "0.1"},
      {Json(-2.5), "-2.5"},
      {Json(1e300), "1e+300"},
      {Json(std::nan("")), "null"},
      {Json(std::numeric_limits<double>::infinity()), "null"},
      {Json("text"), "\"text\""},
      {Json(std::string("a\nb")), "\"a\\nb\""}};
  int checked = 0;
  for (const auto& [value, text] : cases) {
    EXPECT_EQ(value.dump(), text) << "case " << checked;
    EXPECT_EQ(value.dump(0), text) << "case " << checked;
    ++checked;
  }
  EXPECT_EQ(checked, 16);
}

Json nested() {
  Json inner;
  inner.set("x", 1).set("y", Json::Array{});
  Json list;
  list.push(1).push("two").push(std::move(inner)).push(Json::Object{});
  Json root;
  root.set("name", "sqfc").set("list", std::move(list)).set("empty", Json());
  return root;
}

TEST(Json, NestedTextIndented) {
  EXPECT_EQ(nested().dump(),
            "{\n"
            "  \"name\": \"sqfc\",\n"
            "  \"list\": [\n"
            "    1,\n"
            "    \"two\",\n"
            "    {\n"
            "      \"x\": 1,\n"
            "      \"y\": []\n"
            "    },\n"
            "    {}\n"
            "  ],\n"
            "  \"empty\": null\n"
            "}");
  EXPECT_EQ(nested().dump(4).substr(0, 13), "{\n    \"name\":");
}

TEST(Json, NestedTextCompact) {
  EXPECT_EQ(nested().dump(0), "{\"name\":\"sqfc\",\"list\":[1,\"two\",{\"x\":1,\"y\":[]},{}],\"empty\":null}");
  EXPECT_EQ(Json(Json::Array{}).dump(), "[]");
  EXPECT_EQ(Json(Json::Object{}).dump(), "{}");
}

TEST(Json, SetKeepsOrderAndReplacesInPlace) {
  Json o;
  o.set("b", 1).set("a", 2).set("c", 3);
  o.set("a", "replaced");
  EXPECT_EQ(o.dump(0), "{\"b\":1,\"a\":\"replaced\",\"c\":3}");
  // push turns a null into an array.
  Json a;
  a.push(Json());
  EXPECT_EQ(a.dump(0), "[null]");
}

TEST(Json, OutputParsesWithAnIndependentReader) {
  // Deep nesting and every scalar kind; nlohmann-json reads both indentations to the same
  // value, with the members in insertion order.
  Json deep = 7;
  for (int level = 0; level < 40; ++level) {
    Json wrapper;
    if (level % 2) wrapper.set("k" + std::to_string(level), std::move(deep));
    else wrapper.push(std::move(deep)).push(level);
    deep = std::move(wrapper);
  }
  Json root = nested();
  root.set("deep", std::move(deep));
  root.set("max", std::numeric_limits<unsigned long long>::max());
  root.set("min", std::numeric_limits<long long>::min());
  root.set("pi", 3.141592653589793);
  root.set("tiny", 5e-324);
  int checked = 0;
  for (const int indent : {0, 2, 3}) {
    const auto parsed = nlohmann::ordered_json::parse(root.dump(indent));
    EXPECT_EQ(parsed["name"], "sqfc");
    EXPECT_EQ(parsed["list"][1], "two");
    EXPECT_EQ(parsed["list"][2]["x"], 1);
    EXPECT_TRUE(parsed["empty"].is_null());
    EXPECT_EQ(parsed["max"].get<std::uint64_t>(), std::numeric_limits<std::uint64_t>::max());
    EXPECT_EQ(parsed["min"].get<std::int64_t>(), std::numeric_limits<std::int64_t>::min());
    EXPECT_EQ(parsed["pi"].get<double>(), 3.141592653589793);  // shortest round trip is exact
    EXPECT_EQ(parsed["tiny"].get<double>(), 5e-324);
    std::vector<std::string> keys;
    for (const auto& [key, value] : parsed.items()) keys.push_back(key);
    EXPECT_EQ(keys, (std::vector<std::string>{"name", "list", "empty", "deep", "max", "min", "pi", "tiny"}));
    // Walk down the 40 levels.
    const nlohmann::ordered_json* node = &parsed["deep"];
    int depth = 0;
    for (int level = 39; level >= 0; --level, ++depth) {
      if (level % 2) node = &(*node)["k" + std::to_string(level)];
      else {
        EXPECT_EQ((*node)[1], level);
        node = &(*node)[0];
      }
    }
    EXPECT_EQ(*node, 7);
    EXPECT_EQ(depth, 40);
    ++checked;
  }
  EXPECT_EQ(checked, 3);
}

}  // namespace
