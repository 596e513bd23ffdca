#include "core/reading/descriptor_read.hpp"

#include <algorithm>
#include <cerrno>
#include <system_error>

#include <unistd.h>

namespace counterpoise::reading {

std::optional<std::string> read_descriptor(int fd, std::uintmax_t limit) {
  constexpr std::size_t kChunk = 64 * 1024;
  std::string bytes;
  std::size_t got = 0;
  while (true) {
    // Grow by chunks, never past limit + 1: one byte over the limit is enough to refuse.
    const std::uintmax_t room = limit + 1 - got;
    const std::size_t want = static_cast<std::size_t>(std::min<std::uintmax_t>(kChunk, room));
    if (want == 0) return std::nullopt;
    bytes.resize(got + want);
    const ssize_t n = ::read(fd, bytes.data() + got, want);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) throw std::system_error(errno, std::generic_category(), "read");
    if (n == 0) break;
    got += static_cast<std::size_t>(n);
  }
  bytes.resize(got);
  return bytes;
}

}  // namespace counterpoise::reading
