#pragma once
// Calendar dates as ISO 8601 writes them (ISO 8601-1:2019, 5.2.2.1, the complete extended
// representation "YYYY-MM-DD"): the only date form a case file holds, so a report never prints
// "03/04/2026" that one reader takes for March and another for April.

#include <string_view>

#include "core/validation/input_error.hpp"

namespace counterpoise::validation {

// True for "YYYY-MM-DD" naming a real day of the Gregorian calendar (leap years included).
bool is_iso_calendar_date(std::string_view text);

// Throws InvalidValue at `where` unless is_iso_calendar_date(text).
void check_iso_calendar_date(std::string_view text, const Location& where);

}  // namespace counterpoise::validation
