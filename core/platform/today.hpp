#pragma once
// Today's date in UTC (the system clock's calendar day), as an ISO 8601 date ("2026-12-03"),
// for documents that print the date they were made (validation reports).

#include <string>

namespace counterpoise::platform {

std::string today_iso_date();

}  // namespace counterpoise::platform
