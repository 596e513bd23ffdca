#pragma once
// A size limit the user can raise (or lower) for one run through an environment variable, in
// whole MiB: the one form every configurable limit takes (COUNTERPOISE_FILE_LIMIT_MIB,
// COUNTERPOISE_NETWORK_FACTOR_LIMIT_MIB; docs/file-formats.md, "Limits").

#include <cstdint>

namespace counterpoise::platform {

inline constexpr std::uintmax_t kMiB = 1024 * 1024;

// `variable` read as a whole number of MiB (digits only, at least 1), in bytes; `default_bytes`
// when it is unset or empty. Throws validation::InvalidValue naming the variable when it is set
// to anything else ("64MiB", "1e3", "0", a sign).
std::uintmax_t mib_limit_from_environment(const char* variable, std::uintmax_t default_bytes);

}  // namespace counterpoise::platform
