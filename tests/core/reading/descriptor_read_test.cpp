// The bounded read of a descriptor shared by the text-file reader and the private-key reader:
// a file at the limit is read whole, one byte over is refused, and a source without an end
// (/dev/zero, a pipe that keeps writing) stops after limit + 1 bytes. read(2) semantics: POSIX.1-2017,
// read() (a return of 0 at end of file, EINTR retried, short reads from pipes).
#include "core/reading/descriptor_read.hpp"

#include <catch2/catch.hpp>

#include <cstdio>
#include <string>
#include <system_error>

#include <fcntl.h>
#include <unistd.h>

using counterpoise::reading::read_descriptor;

namespace {

// A descriptor on a temporary file holding `bytes`, at its start.
int file_holding(const std::string& bytes) {
  FILE* file = std::tmpfile();
  REQUIRE(file);
  const int fd = ::dup(::fileno(file));
  std::fclose(file);
  REQUIRE(::write(fd, bytes.data(), bytes.size()) == static_cast<ssize_t>(bytes.size()));
  REQUIRE(::lseek(fd, 0, SEEK_SET) == 0);
  return fd;
}

}  // namespace

TEST_CASE("a file at the limit is read whole, one byte over is refused", "[reading]") {
  const std::string text(70 * 1024 + 3, 'x');  // more than one chunk of the reader's
  int fd = file_holding(text);
  CHECK(read_descriptor(fd, text.size()) == text);
  ::close(fd);
  fd = file_holding(text);
  CHECK_FALSE(read_descriptor(fd, text.size() - 1).has_value());
  ::close(fd);
  fd = file_holding("");
  CHECK(read_descriptor(fd, 0) == std::string());
  ::close(fd);
}

TEST_CASE("a source without an end stops one byte past the limit", "[reading]") {
  const int fd = ::open("/dev/zero", O_RDONLY | O_CLOEXEC);
  REQUIRE(fd >= 0);
  CHECK_FALSE(read_descriptor(fd, 1000).has_value());
  // It read only limit + 1 bytes: the next read still finds the device (nothing to check on
  // /dev/zero's position); a pipe shows the count exactly.
  ::close(fd);
  int ends[2];
  REQUIRE(::pipe(ends) == 0);
  REQUIRE(::write(ends[1], "abcdef", 6) == 6);
  CHECK_FALSE(read_descriptor(ends[0], 3).has_value());
  char rest[8] = {};
  CHECK(::read(ends[0], rest, sizeof rest) == 2);  // "ef": exactly limit + 1 = 4 bytes were taken
  ::close(ends[0]);
  ::close(ends[1]);
}

TEST_CASE("a failed read throws with its errno", "[reading]") {
  const int fd = ::open("/", O_RDONLY | O_DIRECTORY | O_CLOEXEC);  // read(2) on a folder: EISDIR
  REQUIRE(fd >= 0);
  try {
    read_descriptor(fd, 10);
    FAIL("no error");
  } catch (const std::system_error& error) {
    CHECK(error.code().value() == EISDIR);
  }
  ::close(fd);
}
