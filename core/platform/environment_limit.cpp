#include "core/platform/environment_limit.hpp"

#include <cstdlib>
#include <string>

#include "core/validation/input_error.hpp"

namespace counterpoise::platform {

std::uintmax_t mib_limit_from_environment(const char* variable, std::uintmax_t default_bytes) {
  const char* text = std::getenv(variable);
  if (!text || !*text) return default_bytes;
  const validation::Location where{variable, {}};
  const std::string given(text);
  // A whole number of MiB, written in digits only: no sign, no unit, no exponent.
  if (given.find_first_not_of("0123456789") != std::string::npos || given.size() > 9)
    throw validation::InvalidValue(where, "\"" + given + "\" is not a whole number of MiB such as 256");
  const std::uintmax_t mib = std::stoull(given);
  if (mib < 1) throw validation::InvalidValue(where, "the limit must be at least 1 MiB");
  return mib * kMiB;
}

}  // namespace counterpoise::platform
