#pragma once
// Reading an open file descriptor with a bound on how much is read. Every reader of a file whose
// size cannot be trusted in advance (a file a case names, a private key) reads through this, so
// a device, a /proc file or a file that grows while it is read is refused, not read without end.

#include <cstdint>
#include <optional>
#include <string>

namespace counterpoise::reading {

// The bytes read from `fd` up to its end, or nullopt when it holds more than `limit` bytes (the
// read stops after limit + 1 bytes). Reads interrupted by a signal are retried. Throws
// std::system_error carrying the read's errno when a read fails. Does not close `fd`.
std::optional<std::string> read_descriptor(int fd, std::uintmax_t limit);

}  // namespace counterpoise::reading
