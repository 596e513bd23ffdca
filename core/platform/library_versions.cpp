#include "core/platform/library_versions.hpp"

#include <boost/version.hpp>
#include <nlohmann/json.hpp>
#include <openssl/crypto.h>
#include <sqlite3.h>

namespace counterpoise::platform {

std::vector<LibraryVersion> core_library_versions() {
  const std::string boost = std::to_string(BOOST_VERSION / 100000) + "." + std::to_string(BOOST_VERSION / 100 % 1000) + "." +
                            std::to_string(BOOST_VERSION % 100);
  const std::string json = std::to_string(NLOHMANN_JSON_VERSION_MAJOR) + "." + std::to_string(NLOHMANN_JSON_VERSION_MINOR) +
                           "." + std::to_string(NLOHMANN_JSON_VERSION_PATCH);
  // The licences are those the projects publish for these versions (common practice: each
  // project's own licence file).
  return {
      {"Boost (Math)", boost, "Boost Software License 1.0"},
      {"nlohmann-json", json, "MIT License"},
      {"SQLite", sqlite3_libversion(), "public domain"},
      {"OpenSSL (libcrypto)", OpenSSL_version(OPENSSL_VERSION), OPENSSL_VERSION_MAJOR >= 3 ? "Apache License 2.0" : "OpenSSL and SSLeay licences"},
  };
}

}  // namespace counterpoise::platform
