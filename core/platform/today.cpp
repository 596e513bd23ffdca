#include "core/platform/today.hpp"

#include <chrono>
#include <cstdio>

namespace counterpoise::platform {

std::string today_iso_date() {
  const auto today = std::chrono::floor<std::chrono::days>(std::chrono::system_clock::now());
  const std::chrono::year_month_day ymd{today};
  char buffer[16];
  std::snprintf(buffer, sizeof buffer, "%04d-%02u-%02u", static_cast<int>(ymd.year()), static_cast<unsigned>(ymd.month()),
                static_cast<unsigned>(ymd.day()));
  return buffer;
}

}  // namespace counterpoise::platform
