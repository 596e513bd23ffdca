// libFuzzer harness for the case store opener: the input is written as a .cpcase file and opened
// read-only, then verified and listed, as `verify`, `history` and `evaluate` do with a file
// received from elsewhere. Any input must give a clean refusal (validation::Error) or a store
// that answers; a crash, a hang (libFuzzer's -timeout) or a leak (LeakSanitizer) is a finding.
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include "core/store/case_store.hpp"
#include "core/validation/input_error.hpp"

namespace {

// One file per fuzzing process, rewritten for every input and removed at exit. The path is never
// destroyed: a static object would be destroyed before an exit handler registered while it was
// being built, and the handler would then name a destroyed path and leave the file behind.
const std::filesystem::path& input_path() {
  static const std::filesystem::path* const path = [] {
    const char* dir = std::getenv("TMPDIR");
    return new std::filesystem::path(std::filesystem::path(dir && *dir ? dir : "/tmp") /
                                     ("counterpoise-fuzz-" + std::to_string(::getpid()) + ".cpcase"));
  }();
  static const bool removed_at_exit = std::atexit([] {
    std::error_code ignored;
    std::filesystem::remove(*path, ignored);
  }) == 0;
  (void)removed_at_exit;
  return *path;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace counterpoise::store;
  const auto& path = input_path();
  {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
  }
  try {
    const CaseStore store = CaseStore::open(path, OpenMode::read_only);
    (void)store.verify();
    (void)store.export_canonical();
    (void)store.revisions();
    (void)store.review_notes();
    (void)store.reviewers();
    (void)store.latest_seal();
  } catch (const counterpoise::validation::Error&) {
    // A clean refusal.
  }
  // A read-only open never leaves anything beside the file (a journal, a WAL).
  for (const char* suffix : {"-journal", "-wal", "-shm"})
    if (std::filesystem::exists(path.string() + suffix)) std::abort();
  return 0;
}
