#pragma once
// The edit lock of a case file: an advisory flock(2) on the file itself, held while a program
// has the case open for editing. The kernel drops it when the process ends, even by SIGKILL, so
// a crash never leaves a stale lock. (flock locks do not interact with the POSIX record locks
// SQLite uses on Linux.) Who holds it is written in the file's `session` table.

#include <filesystem>

namespace counterpoise::store {

class EditLock {
 public:
  // Tries to take the lock without waiting. Throws validation::FileError when the file cannot be
  // opened.
  explicit EditLock(const std::filesystem::path& path);
  ~EditLock();
  EditLock(const EditLock&) = delete;
  EditLock& operator=(const EditLock&) = delete;

  // True when this process now holds the lock.
  bool held() const noexcept { return held_; }

 private:
  int fd_ = -1;
  bool held_ = false;
};

}  // namespace counterpoise::store
