#include "core/reading/json_text.hpp"

#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"

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

  const auto big = std::filesystem::temp_directory_path() / ("cp-json-big-" + std::to_string(::getpid()) + ".json");
  std::ofstream(big) << "[" + std::string(200, ' ') + "]";
  limits = JsonLimits{};
  limits.max_bytes = 100;
  CHECK_THROWS_AS(read_json_file(big, limits), FileError);
  std::filesystem::remove(big);
  CHECK_THROWS_AS(read_json_file(big), FileError);
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
