// The bounded read of a file a case names: the documented limit (docs/file-formats.md, "Limits"),
// the variable that raises it, and what is not a file. The limits are the program's own
// (common practice: a bound on what an untrusted name can make a program hold).
#include "core/reading/text_file.hpp"

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include <catch2/catch.hpp>

#include "core/validation/input_error.hpp"
#include "tests/core/store/store_test_support.hpp"

using Catch::Matchers::Contains;
using counterpoise::reading::kDefaultTextFileLimitBytes;
using counterpoise::reading::kTextFileLimitVariable;
using counterpoise::reading::read_text_file;
using counterpoise::reading::text_file_limit_bytes;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using counterpoise::validation::Location;

namespace {

// Sets the limit variable for one test and clears it afterwards.
struct LimitVariable {
  explicit LimitVariable(const char* value) { ::setenv(kTextFileLimitVariable, value, 1); }
  ~LimitVariable() { ::unsetenv(kTextFileLimitVariable); }
  LimitVariable(const LimitVariable&) = delete;
  LimitVariable& operator=(const LimitVariable&) = delete;
};

}  // namespace

TEST_CASE("a file over the limit is refused, naming the limit and how to raise it", "[reading][file]") {
  store_test::TempDir dir;
  const auto exact = dir / "exact.csv";
  const auto over = dir / "over.csv";
  store_test::write_bytes(exact, std::string(1024 * 1024, 'a'));
  store_test::write_bytes(over, std::string(1024 * 1024 + 1, 'a'));
  const Location where{"E1", "frequencies.file"};
  {
    const LimitVariable one_mib("1");
    CHECK(text_file_limit_bytes() == 1024 * 1024);
    CHECK(read_text_file(exact, where).size() == 1024 * 1024);
    CHECK_THROWS_WITH(read_text_file(over, where), Contains("item E1, field frequencies.file") &&
                                                       Contains("larger than 1 MiB") &&
                                                       Contains("COUNTERPOISE_FILE_LIMIT_MIB"));
  }
  CHECK(text_file_limit_bytes() == kDefaultTextFileLimitBytes);
  CHECK(kDefaultTextFileLimitBytes == 64ull * 1024 * 1024);
  CHECK(read_text_file(over, where).size() == 1024 * 1024 + 1);
}

TEST_CASE("a limit that is not a whole number of MiB is refused, naming the variable", "[reading][file]") {
  for (const char* value : {"abc", "0", "-5", "1e3", "64MiB", "9999999999"}) {
    const LimitVariable given(value);
    CHECK_THROWS_AS(text_file_limit_bytes(), InvalidValue);
    CHECK_THROWS_WITH(text_file_limit_bytes(), Contains("COUNTERPOISE_FILE_LIMIT_MIB"));
  }
}

TEST_CASE("a device, a folder or a missing file is not read", "[reading][file]") {
  store_test::TempDir dir;
  const Location where{"E1", "population.kde.file"};
  // /dev/zero would never end; it is refused before a byte is read.
  CHECK_THROWS_WITH(read_text_file("/dev/zero", where), Contains("not a regular file"));
  CHECK_THROWS_WITH(read_text_file(dir.path(), where), Contains("not a regular file"));
  CHECK_THROWS_AS(read_text_file(dir / "missing.csv", where), FileError);
}
