// Files of case content are written privately and atomically: the owner's mode whatever the
// umask, through an exclusive temporary file beside the target that a planted link cannot
// redirect, and leftovers of killed writers are cleaned by the next write (common practice for
// safe file replacement on POSIX: open(2) O_EXCL|O_NOFOLLOW, fsync(2), rename(2)).
#include "core/platform/private_file.hpp"

#include <cstdlib>

#include <catch2/catch.hpp>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include "core/validation/input_error.hpp"
#include "tests/core/store/store_test_support.hpp"

using namespace counterpoise::platform;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using counterpoise::validation::InvalidValue;
using store_test::TempDir;

namespace {

mode_t mode_of(const std::filesystem::path& path) {
  struct stat info {};
  REQUIRE(::lstat(path.c_str(), &info) == 0);
  return info.st_mode & 07777;
}

std::size_t entries_in(const std::filesystem::path& folder) {
  return static_cast<std::size_t>(std::distance(std::filesystem::directory_iterator(folder),
                                                std::filesystem::directory_iterator()));
}

// A pid that certainly ran and is certainly gone: a child that exited and was reaped.
pid_t finished_pid() {
  const pid_t child = ::fork();
  if (child == 0) ::_exit(0);
  ::waitpid(child, nullptr, 0);
  return child;
}

class ScopedUmask {
 public:
  explicit ScopedUmask(mode_t mask) : previous_(::umask(mask)) {}
  ~ScopedUmask() { ::umask(previous_); }

 private:
  mode_t previous_;
};

}  // namespace

TEST_CASE("a file of case content is 0600 under umask 000, new or replacing a 0644 file",
          "[platform][private-file]") {
  TempDir dir;
  ::unsetenv("COUNTERPOISE_FILE_MODE");
  ScopedUmask open_umask(0);
  const auto target = dir / "case.json";
  write_private_file(target, "{\"items\":[]}");
  CHECK(mode_of(target) == 0600);
  CHECK(store_test::file_bytes(target) == "{\"items\":[]}");
  store_test::write_bytes(dir / "old.json", "old");
  ::chmod((dir / "old.json").c_str(), 0644);
  write_private_file(dir / "old.json", "new");
  CHECK(mode_of(dir / "old.json") == 0600);
  CHECK(store_test::file_bytes(dir / "old.json") == "new");
  CHECK(entries_in(dir.path()) == 2);  // no temporary file left
}

TEST_CASE("COUNTERPOISE_FILE_MODE configures the mode within safe bounds",
          "[platform][private-file]") {
  TempDir dir;
  ScopedUmask open_umask(0);
  ::setenv("COUNTERPOISE_FILE_MODE", "0640", 1);
  CHECK(case_content_file_mode() == 0640);
  write_private_file(dir / "report.pdf", "%PDF-");
  CHECK(mode_of(dir / "report.pdf") == 0640);
  for (const char* refused : {"0644x", "9", "0400", "0700", "0666", "1777"}) {
    INFO(refused);
    ::setenv("COUNTERPOISE_FILE_MODE", refused, 1);
    CHECK_THROWS_AS(case_content_file_mode(), InvalidValue);
  }
  ::unsetenv("COUNTERPOISE_FILE_MODE");
  CHECK(case_content_file_mode() == 0600);
}

TEST_CASE("a link planted at the next temporary name is never written through",
          "[platform][private-file]") {
  TempDir dir;
  const auto target = dir / "out.json";
  const auto victim = dir / "victim.txt";
  store_test::write_bytes(victim, "precious");
  // The next names this process will use: "<target>.cp-tmp-<pid>-<n>" for the next few n.
  const std::string probe = temporary_name_for(target).string();
  const std::string stem = probe.substr(0, probe.rfind('-') + 1);
  const int next = std::stoi(probe.substr(probe.rfind('-') + 1)) + 1;
  for (int n = next; n < next + 5; ++n)
    REQUIRE(::symlink(victim.c_str(), (stem + std::to_string(n)).c_str()) == 0);
  // An older fixed name too, as the old writers used.
  REQUIRE(::symlink(victim.c_str(), (target.string() + ".tmp").c_str()) == 0);
  write_private_file(target, "case content");
  CHECK(store_test::file_bytes(victim) == "precious");
  CHECK(store_test::file_bytes(target) == "case content");
  CHECK(std::filesystem::is_symlink(stem + std::to_string(next)));  // left alone, not followed
}

TEST_CASE("the target being a link replaces the link, not the file it points to",
          "[platform][private-file]") {
  TempDir dir;
  store_test::write_bytes(dir / "victim.txt", "precious");
  REQUIRE(::symlink((dir / "victim.txt").c_str(), (dir / "out.json").c_str()) == 0);
  write_private_file(dir / "out.json", "case content");
  CHECK(store_test::file_bytes(dir / "victim.txt") == "precious");
  CHECK_FALSE(std::filesystem::is_symlink(dir / "out.json"));
}

TEST_CASE("leftovers of a killed writer are removed by the next write, a live one's are kept",
          "[platform][private-file]") {
  TempDir dir;
  const auto target = dir / "case.json";
  const std::string dead = std::to_string(finished_pid());
  const std::string alive = std::to_string(::getppid());
  store_test::write_bytes(target.string() + ".cp-tmp-" + dead + "-0", "partial");
  store_test::write_bytes(target.string() + ".cp-tmp-" + dead + "-3-journal", "journal");
  store_test::write_bytes(target.string() + ".cp-tmp-" + alive + "-1", "in progress");
  store_test::write_bytes(dir / ("other.json.cp-tmp-" + dead + "-0"), "another target's");
  store_test::write_bytes(target.string() + ".cp-tmp-x-0", "not our name form");
  write_private_file(target, "done");
  CHECK_FALSE(std::filesystem::exists(target.string() + ".cp-tmp-" + dead + "-0"));
  CHECK_FALSE(std::filesystem::exists(target.string() + ".cp-tmp-" + dead + "-3-journal"));
  CHECK(std::filesystem::exists(target.string() + ".cp-tmp-" + alive + "-1"));
  CHECK(std::filesystem::exists(dir / ("other.json.cp-tmp-" + dead + "-0")));
  CHECK(std::filesystem::exists(target.string() + ".cp-tmp-x-0"));
}

TEST_CASE("a folder that does not exist is a FileError naming the target, nothing left behind",
          "[platform][private-file]") {
  TempDir dir;
  CHECK_THROWS_AS(write_private_file(dir / "missing" / "x.json", "x"), FileError);
  CHECK_THROWS_WITH(write_private_file(dir / "missing" / "x.json", "x"),
                    Contains((dir / "missing" / "x.json").string()));
  CHECK(entries_in(dir.path()) == 0);
}
