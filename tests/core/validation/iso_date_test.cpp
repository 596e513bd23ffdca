// ISO 8601 calendar dates (ISO 8601-1:2019, 5.2.2.1, extended format YYYY-MM-DD) and the Gregorian
// leap-year rule (a year divisible by 4, except centuries not divisible by 400; e.g. Dershowitz &
// Reingold 2018, Calendrical Calculations, 4th ed., eq. 2.16 — from memory for the equation).
#include <catch2/catch.hpp>

#include "core/interchange/case_json.hpp"
#include "core/validation/iso_date.hpp"

using namespace counterpoise;

TEST_CASE("real days in YYYY-MM-DD are dates, leap days only in leap years") {
  const auto [text, valid] = GENERATE(table<const char*, bool>({{"2026-12-03", true},
                                                               {"2024-02-29", true},  // divisible by 4
                                                               {"2000-02-29", true},  // century divisible by 400
                                                               {"1900-02-29", false}, // century not divisible by 400
                                                               {"2026-02-29", false},
                                                               {"2026-04-31", false},
                                                               {"2026-13-01", false},
                                                               {"2026-00-10", false},
                                                               {"2026-12-00", false},
                                                               {"03/12/2026", false},
                                                               {"2026-1-3", false},
                                                               {"2026-12-03T10:00", false},
                                                               {"", false},
                                                               {"20261203", false}}));
  CAPTURE(text);
  CHECK(validation::is_iso_calendar_date(text) == valid);
}

TEST_CASE("the case reader refuses a date that is not ISO 8601, naming the field") {
  const auto read = interchange::read_case(nlohmann::json::parse(R"({"format": "counterpoise.case", "version": 1,
      "case": {"reference": "HV-1", "date": "03/04/2026"},
      "propositions": {"level": "source", "hp": "The glass came from the window", "hd": "The glass came from another source"},
      "items": [{"id": "E1", "model": "assigned", "p_given_hp": 0.5, "p_given_hd": 0.1}]})"), ".");
  REQUIRE_FALSE(read.value);
  const std::string text = read.diagnostics.problems().front().text();
  CHECK(text.find("case") != std::string::npos);
  CHECK(text.find("date") != std::string::npos);
  CHECK(text.find("YYYY-MM-DD") != std::string::npos);
}
