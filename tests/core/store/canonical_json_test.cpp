#include "core/store/canonical_json.hpp"

#include <cmath>
#include <limits>

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"

using counterpoise::store::canonical_text;
using nlohmann::json;

TEST_CASE("canonical text sorts members and writes no white space", "[store][canonical]") {
  const json a = json::parse(R"({ "b": [1, 2.5, {"z": null, "a": true}], "a": "x" })");
  CHECK(canonical_text(a) == R"({"a":"x","b":[1,2.5,{"a":true,"z":null}]})");
  // Same content written differently gives the same bytes.
  CHECK(canonical_text(json::parse(R"({"a":"x",   "b":[1,2.50,{"a":true,"z":null}]})")) ==
        canonical_text(a));
}

TEST_CASE("canonical numbers read back exactly", "[store][canonical]") {
  // Shortest round-trip digits (common practice: Steele & White 1990 / Grisu, as nlohmann::json
  // writes them).
  const double values[] = {0.1, 1e-300, 2.0e4, 0.95, 1.0 / 3.0, 5e-324, 1.7976931348623157e308};
  for (double x : values) {
    const std::string text = canonical_text(json(x));
    CHECK(json::parse(text).get<double>() == x);
  }
  CHECK(canonical_text(json(0.1)) == "0.1");
  CHECK(canonical_text(json::parse("3")) == "3");
  // One spelling per value (docs/case-format.md): an integral float is written as an integer, so
  // a case read and written again (where counts and odds become doubles) has the same digest.
  CHECK(canonical_text(json::parse("3.0")) == "3");
  CHECK(canonical_text(json::parse("2.5")) == "2.5");
}

TEST_CASE("canonical text refuses values without a JSON form", "[store][canonical]") {
  CHECK_THROWS_AS(canonical_text(json(std::numeric_limits<double>::infinity())),
                  counterpoise::validation::InvalidValue);
  CHECK_THROWS_AS(canonical_text(json{{"x", std::nan("")}}),
                  counterpoise::validation::InvalidValue);
  CHECK_THROWS_AS(canonical_text(json(std::string("\xff\xfe"))),
                  counterpoise::validation::InvalidValue);
  // Non-ASCII text is kept as UTF-8, not escaped.
  CHECK(canonical_text(json("Thwaite \xc3\xa9")) == "\"Thwaite \xc3\xa9\"");
}
