#pragma once
// Shared helpers of the case store tests: a fresh folder per test, an invented case, raw SQL
// for edits made behind the store's back, and file digests to prove a file was left untouched.

#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>
#include <sqlite3.h>
#include <unistd.h>

#include "core/platform/sha256.hpp"
#include "core/store/examiner.hpp"
#include "core/validation/input_error.hpp"

namespace store_test {

// A new empty folder under the system temp folder, removed when the object goes.
class TempDir {
 public:
  TempDir() {
    static int counter = 0;
    path_ = std::filesystem::temp_directory_path() /
            ("cp-store-" + std::to_string(::getpid()) + "-" + std::to_string(counter++) + "-" +
             std::to_string(std::random_device{}()));
    std::filesystem::create_directories(path_);
  }
  ~TempDir() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  std::filesystem::path operator/(const std::string& name) const { return path_ / name; }
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

// The examiner named in sample_case(), and a colleague (invented names).
inline const counterpoise::store::ExaminerName kThwaite{"Dr Imogen Thwaite"};
inline const counterpoise::store::ExaminerName kPryce{"Dr Owen Pryce"};

// An invented case from the Harwick Vale scenario (all names fictional).
inline nlohmann::json sample_case() {
  return nlohmann::json::parse(R"({
    "format": "counterpoise.case", "version": 1,
    "case": {"reference": "HV-2026-0117", "title": "Break-in at the Millbrook Road bakery",
             "laboratory": "Vale Forensic Laboratory", "examiner": "Dr Imogen Thwaite"},
    "propositions": {"level": "source",
                     "hp": "The glass on the jacket came from the broken bakery window.",
                     "hd": "The glass on the jacket came from another source."},
    "items": [
      {"id": "E1", "title": "Glass fragments on the jacket", "model": "assigned",
       "p_given_hp": 0.95, "p_given_hd": {"counts": {"k": 3, "n": 412}}},
      {"id": "E2", "model": "reported-lr", "lr": 2.0e4, "interval": [5.0e3, 6.0e4]},
      {"id": "E3", "title": "Fibres on the window frame", "model": "assigned",
       "p_given_hp": {"beta": [8.5, 2.5]}, "p_given_hd": 0.013}
    ],
    "priors": {"odds": [1e-6, 1e-3, 1]}
  })");
}

// A stand-in for the case reader's check (StoreOptions::validate): refuses a case whose item
// states a p_given_hp above 1.
inline void refuse_probability_above_one(const nlohmann::json& document) {
  for (const auto& item : document["items"])
    if (item.contains("p_given_hp") && item["p_given_hp"].is_number() &&
        item["p_given_hp"].get<double>() > 1)
      throw counterpoise::validation::InvalidValue({item["id"].get<std::string>(), "p_given_hp"},
                                                   "a probability is at most 1");
}

inline std::string file_bytes(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
}

inline std::string file_digest(const std::filesystem::path& path) {
  return counterpoise::platform::sha256_hex(file_bytes(path));
}

inline void write_bytes(const std::filesystem::path& path, const std::string& bytes) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out.write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

// Runs SQL on the file with a plain SQLite connection, as someone with the sqlite3 shell would.
inline void raw_sql(const std::filesystem::path& path, const std::string& sql) {
  sqlite3* db = nullptr;
  if (sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE, nullptr) != SQLITE_OK) {
    sqlite3_close(db);
    throw std::runtime_error("raw_sql: cannot open");
  }
  char* message = nullptr;
  const int rc = sqlite3_exec(db, sql.c_str(), nullptr, nullptr, &message);
  std::string text = message ? message : "";
  sqlite3_free(message);
  sqlite3_close(db);
  if (rc != SQLITE_OK) throw std::runtime_error("raw_sql: " + text);
}

// Runs `sql` as someone with the sqlite3 shell would to get past the file's protective
// triggers: drops every trigger, runs `sql`, and creates the triggers again from their exact
// stored text, so the file's schema is again the program's own and only verify can tell.
inline void raw_sql_behind_triggers(const std::filesystem::path& path, const std::string& sql) {
  sqlite3* db = nullptr;
  std::vector<std::pair<std::string, std::string>> triggers;  // name, CREATE text
  sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
  sqlite3_stmt* statement = nullptr;
  if (sqlite3_prepare_v2(db, "SELECT name, sql FROM sqlite_schema WHERE type = 'trigger'", -1,
                         &statement, nullptr) == SQLITE_OK)
    while (sqlite3_step(statement) == SQLITE_ROW)
      triggers.emplace_back(reinterpret_cast<const char*>(sqlite3_column_text(statement, 0)),
                            reinterpret_cast<const char*>(sqlite3_column_text(statement, 1)));
  sqlite3_finalize(statement);
  sqlite3_close(db);
  if (triggers.empty()) throw std::runtime_error("raw_sql_behind_triggers: no triggers");
  std::string script;
  for (const auto& [name, text] : triggers) script += "DROP TRIGGER \"" + name + "\"; ";
  script += sql + "; ";
  for (const auto& [name, text] : triggers) script += text + "; ";
  raw_sql(path, script);
}

inline long long raw_int(const std::filesystem::path& path, const std::string& sql) {
  sqlite3* db = nullptr;
  sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr);
  sqlite3_stmt* statement = nullptr;
  long long value = -1;
  if (sqlite3_prepare_v2(db, sql.c_str(), -1, &statement, nullptr) == SQLITE_OK &&
      sqlite3_step(statement) == SQLITE_ROW)
    value = sqlite3_column_int64(statement, 0);
  sqlite3_finalize(statement);
  sqlite3_close(db);
  return value;
}

}  // namespace store_test
