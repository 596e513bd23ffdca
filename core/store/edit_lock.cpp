#include "core/store/edit_lock.hpp"

#include <cerrno>
#include <cstring>
#include <string>

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

#include "core/validation/input_error.hpp"

namespace counterpoise::store {

EditLock::EditLock(const std::filesystem::path& path) {
  fd_ = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd_ < 0)
    throw validation::FileError({path.filename().string(), {}},
                                "cannot open '" + path.string() + "': " + std::strerror(errno));
  held_ = ::flock(fd_, LOCK_EX | LOCK_NB) == 0;
}

EditLock::~EditLock() {
  // Closing any descriptor of the file drops this process's POSIX locks on it (fcntl(2)), so the
  // store closes its SQLite connection before this lock.
  if (fd_ >= 0) ::close(fd_);
}

}  // namespace counterpoise::store
