#include "core/validation/iso_date.hpp"

#include <chrono>
#include <string>

namespace counterpoise::validation {

namespace {
bool digits(std::string_view text) {
  for (char c : text)
    if (c < '0' || c > '9') return false;
  return true;
}
int number(std::string_view text) {
  int n = 0;
  for (char c : text) n = n * 10 + (c - '0');
  return n;
}
}  // namespace

bool is_iso_calendar_date(std::string_view text) {
  if (text.size() != 10 || text[4] != '-' || text[7] != '-') return false;
  const auto year = text.substr(0, 4), month = text.substr(5, 2), day = text.substr(8, 2);
  if (!digits(year) || !digits(month) || !digits(day)) return false;
  // The calendar arithmetic of <chrono> (C++20) decides which days exist.
  const std::chrono::year_month_day date{std::chrono::year{number(year)},
                                         std::chrono::month{static_cast<unsigned>(number(month))},
                                         std::chrono::day{static_cast<unsigned>(number(day))}};
  return date.ok();
}

void check_iso_calendar_date(std::string_view text, const Location& where) {
  if (!is_iso_calendar_date(text))
    throw InvalidValue(where, "date \"" + std::string(text) +
                                  "\" is not a calendar date written as YYYY-MM-DD (ISO 8601), e.g. 2026-04-03");
}

}  // namespace counterpoise::validation
