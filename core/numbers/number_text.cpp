#include "core/numbers/number_text.hpp"

#include <charconv>
#include <cmath>
#include <cstdio>

namespace counterpoise::numbers {

std::string exact_text(double x) {
  if (std::isnan(x)) return "nan";
  if (std::isinf(x)) return x > 0 ? "inf" : "-inf";
  char buffer[64];
  auto result = std::to_chars(buffer, buffer + sizeof buffer, x);
  return std::string(buffer, result.ptr);
}

std::string significant_text(double x, int digits) {
  if (!std::isfinite(x)) return exact_text(x);
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, x);
  return buffer;
}

}  // namespace counterpoise::numbers
