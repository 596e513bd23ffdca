#include "core/reading/json_text.hpp"

#include <string>

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"
#include "tests/core/store/store_test_support.hpp"

using Catch::Matchers::Contains;
using counterpoise::reading::JsonLimits;
using counterpoise::reading::parse_json_text;
using counterpoise::reading::read_json_file;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;

TEST_CASE("a syntax error names the line and column", "[reading][json]") {
  const std::string text = "{\n  \"a\": 1,\n  \"b\": tru\n}";
  CHECK_THROWS_WITH(parse_json_text(text, "broken.json"),
                    Contains("broken.json") && Contains("line 3"));
  CHECK_THROWS_AS(parse_json_text("{\"a\": 1,}", "x.json"), InvalidValue);
  CHECK_THROWS_AS(parse_json_text("{} trailing", "x.json"), InvalidValue);
  CHECK_THROWS_AS(parse_json_text("", "x.json"), InvalidValue);
}

TEST_CASE("deep nesting is refused before a document is built", "[reading][json]") {
  // nlohmann::json's recursive destructor and writer would overflow the stack on a million levels.
  const std::string deep = std::string(1'000'000, '[') + std::string(1'000'000, ']');
  JsonLimits limits;
  limits.max_bytes = 4u << 20;
  CHECK_THROWS_WITH(parse_json_text(deep, "deep.json", limits), Contains("nested more than 64"));
  const std::string ok = std::string(64, '[') + std::string(64, ']');
  CHECK_NOTHROW(parse_json_text(ok, "ok.json"));
  CHECK_THROWS_WITH(parse_json_text("[" + std::string(64, '[') + std::string(65, ']'), "x.json"),
                    Contains("nested more than 64") && Contains("line 1, column 65"));
}

TEST_CASE("size and value-count limits are enforced", "[reading][json]") {
  JsonLimits limits;
  limits.max_bytes = 100;
  CHECK_THROWS_WITH(parse_json_text(std::string(101, ' '), "big.json", limits),
                    Contains("more than the limit of 100"));
  limits = JsonLimits{};
  limits.max_values = 10;
  CHECK_NOTHROW(parse_json_text("[1,2,3,4,5,6,7,8,9]", "x.json", limits));  // 9 numbers + 1 array
  CHECK_THROWS_WITH(parse_json_text("[1,2,3,4,5,6,7,8,9,10]", "x.json", limits),
                    Contains("more than 10 values"));

  store_test::TempDir dir;
  store_test::write_bytes(dir / "big.json", "[" + std::string(200, ' ') + "]");
  limits = JsonLimits{};
  limits.max_bytes = 100;
  CHECK_THROWS_AS(read_json_file(dir / "big.json", limits), FileError);
  CHECK_THROWS_AS(read_json_file(dir / "missing.json"), FileError);
}

TEST_CASE("huge numbers, invalid UTF-8 and duplicate members are refused", "[reading][json]") {
  CHECK_THROWS_WITH(parse_json_text("{\"lr\": 1e999}", "x.json"),
                    Contains("too large") && Contains("line 1"));
  CHECK_THROWS_WITH(parse_json_text("[-1e400]", "x.json"), Contains("too large"));
  // Integers beyond 64 bits are read as the nearest double (finite): accepted, not clamped
  // silently.
  CHECK(parse_json_text("[123456789012345678901234567890]", "x.json")[0].is_number_float());
  CHECK_THROWS_AS(parse_json_text("{\"title\": \"caf\xe9\"}", "x.json"),
                  InvalidValue);  // Latin-1 byte
  CHECK_THROWS_AS(parse_json_text("{\"title\": \"\xed\xa0\x80\"}", "x.json"),
                  InvalidValue);  // UTF-16 surrogate
  CHECK_THROWS_AS(parse_json_text("{\"title\": \"\xc0\xaf\"}", "x.json"),
                  InvalidValue);  // overlong form
  CHECK_THROWS_WITH(parse_json_text("{\"id\": \"E1\", \"id\": \"E2\"}", "x.json"),
                    Contains("appears twice") && Contains("line 1"));
  CHECK(parse_json_text("{\"title\": \"Harwick Vale \xe2\x80\x94 bakery\"}", "x.json")["title"] ==
        "Harwick Vale \xe2\x80\x94 bakery");
}

TEST_CASE("the bounded reader builds the document nlohmann::json's own parser builds", "[reading][json]") {
  // RFC 8259 (Bray 2017), section 4: member names must be unique within one object, not across
  // sibling objects. The bounded reader must give exactly the document of nlohmann::json::parse
  // for any text within the limits: nested arrays and objects, every scalar kind, names repeated
  // across objects, and a list of 2 000 items as a large case holds.
  const std::string text = R"({"items": [{"id": "E1", "p": 0.5, "n": null}, {"id": "E2", "p": [1, -2, 18446744073709551615,
    {"id": 3, "ok": true, "no": false}], "t": "caf\u00e9 \u2014"}], "id": "case", "empty": {}, "none": []})";
  CHECK(parse_json_text(text, "x.json") == nlohmann::json::parse(text));
  nlohmann::json list = nlohmann::json::array();
  for (int i = 0; i < 2000; ++i) list.push_back({{"id", "E" + std::to_string(i)}, {"p_given_hp", 0.5 + i * 1e-4}, {"tags", {i, "x"}}});
  const std::string large = nlohmann::json{{"items", list}}.dump();
  CHECK(parse_json_text(large, "large.json") == nlohmann::json::parse(large));
  CHECK(parse_json_text("42", "x.json") == 42);  // a scalar document
}

TEST_CASE("a number below the smallest double is refused, naming the item and field", "[reading][json]") {
  // IEEE 754-2008 binary64: the smallest positive subnormal is 2^-1074, about 4.94e-324
  // (section 3.6); strtod (ISO C 7.22.1.3) returns 0 for 1e-400.
  const std::string text = R"({"items": [{"id": "E1", "p_given_hp": 0.5}, {"id": "E2", "p_given_hp": 1e-400}]})";
  try {
    parse_json_text(text, "case.json");
    FAIL("no error");
  } catch (const InvalidValue& error) {
    CHECK(error.where().item == "E2");
    CHECK(error.where().field == "p_given_hp");
    CHECK_THAT(error.what(), Contains("number 1e-400 is smaller than the smallest") && Contains("line 1"));
  }
  // Before the id is read, the item is named by its place, as the case reader names it.
  CHECK_THROWS_WITH(parse_json_text(R"({"items": [{"p_given_hd": {"counts": [-1.5e-999]}}]})", "x.json"),
                    Contains("item #1, field p_given_hd.counts[0]"));
  CHECK_THROWS_WITH(parse_json_text(R"({"priors": {"odds": [1, 2e-500]}})", "x.json"),
                    Contains("field priors.odds[1]"));
  // Zero written as zero, and the smallest subnormal, are kept.
  CHECK(parse_json_text("[0.0, 0e-400, -0, 4.9406564584124654e-324]", "x.json")[3].get<double>() > 0.0);
}

TEST_CASE("a text longer than the limit for one string is refused", "[reading][json]") {
  JsonLimits limits;
  limits.max_string_bytes = 10;
  CHECK_NOTHROW(parse_json_text(R"({"title": "0123456789"})", "x.json", limits));
  CHECK_THROWS_WITH(parse_json_text(R"({"title": "0123456789A"})", "x.json", limits),
                    Contains("a text of 11 bytes, more than the limit of 10") && Contains("field title"));
  CHECK_THROWS_WITH(parse_json_text(R"({"0123456789A": 1})", "x.json", limits), Contains("a text of 11 bytes"));
}

TEST_CASE("many objects are read, each member name once per object", "[reading][json]") {
  // The shape that made the DOM parser's callback quadratic: a long array of small objects.
  std::string text = "[";
  for (int i = 0; i < 20000; ++i) text += (i ? ",{}" : "{}");
  text += "]";
  CHECK(parse_json_text(text, "x.json").size() == 20000);
  CHECK(parse_json_text(R"({"a": {"a": 1}, "b": [{"a": 1}, {"a": 2}]})", "x.json")["b"][1]["a"] == 2);
  CHECK_THROWS_WITH(parse_json_text(R"([{"a": 1}, {"b": 1, "b": 2}])", "x.json"), Contains("appears twice"));
}

TEST_CASE("a syntax error quotes only the start of the token it stopped in", "[reading][json]") {
  // RFC 8259, section 7: control characters must be escaped inside a string, so the raw U+0001
  // ends the parse after 5 000 characters of the string were read.
  const std::string text = "{\"title\": \"" + std::string(5000, 'x') + "\x01\"}";
  try {
    parse_json_text(text, "x.json");
    FAIL("no error");
  } catch (const InvalidValue& error) {
    const std::string message = error.what();
    CHECK_THAT(message, Contains("JSON syntax error at line 1") && Contains("last read: '\"xxxx"));
    CHECK(message.size() < 400);
    CHECK(message.find(std::string(100, 'x')) == std::string::npos);
  }
}
