#pragma once
// The libraries the core is built on, with the versions in use and their licences, for an
// About box or `--version` text. Versions are read from the libraries themselves (header
// macros, or the running library where it reports one), never typed in here.

#include <string>
#include <vector>

namespace counterpoise::platform {

struct LibraryVersion {
  std::string name;     // "SQLite"
  std::string version;  // "3.40.1"
  std::string licence;  // "public domain"
};

// Boost, nlohmann-json, SQLite and OpenSSL, in that order.
std::vector<LibraryVersion> core_library_versions();

}  // namespace counterpoise::platform
