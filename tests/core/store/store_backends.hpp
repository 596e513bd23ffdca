#pragma once
// The two back ends of the case store for tests written once for both: a case file in a fresh
// folder, and a case in the PostgreSQL database named by the PG environment variables, which
// scripts/pg-cluster sets (with COUNTERPOISE_TEST_POSTGRES=1) for a throwaway cluster. Without
// that variable the database cases say that they were skipped; with it they must reach the
// server or fail.

#include <atomic>
#include <cstdlib>
#include <optional>
#include <random>
#include <string>

#include <catch2/catch.hpp>
#include <unistd.h>

#include "core/store/case_store.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"
#include "tests/core/store/postgres_test_setup.hpp"
#include "tests/core/store/store_test_support.hpp"

namespace store_test {

enum class Backend { file, database };

inline const char* backend_name(Backend backend) {
  return backend == Backend::file ? "SQLite file" : "PostgreSQL database";
}

// A case reference no other test (or test program) uses.
inline std::string fresh_reference() {
  static std::atomic<int> counter{0};
  return "HV-2026-0117/" + std::to_string(::getpid()) + "-" + std::to_string(counter++) + "-" +
         std::to_string(std::random_device{}());
}

// The address of case `reference` for a connection as `role`.
inline counterpoise::store::DatabaseCase case_as(const std::string& role,
                                                 const std::string& reference) {
  return {"user=" + role, reference};
}

// One case in one back end: create it, open it again.
class StoreUnderTest {
 public:
  explicit StoreUnderTest(Backend backend)
      : backend_(backend), file_(folder_ / "case.cpcase"), reference_(fresh_reference()) {}

  Backend backend() const { return backend_; }
  const std::string& reference() const { return reference_; }
  counterpoise::store::DatabaseCase address(const std::string& role = kExaminerRole) const {
    return case_as(role, reference_);
  }

  counterpoise::store::CaseStore create(const nlohmann::json& document,
                                        const counterpoise::store::ExaminerName& examiner,
                                        const counterpoise::store::StoreOptions& options = {}) {
    if (backend_ == Backend::file)
      return counterpoise::store::CaseStore::create(file_, document, examiner, options);
    return counterpoise::store::CaseStore::create(address(), document, examiner, options);
  }
  counterpoise::store::CaseStore open(counterpoise::store::OpenMode mode,
                                      const counterpoise::store::StoreOptions& options = {}) {
    if (backend_ == Backend::file)
      return counterpoise::store::CaseStore::open(file_, mode, options);
    return counterpoise::store::CaseStore::open(address(), mode, options);
  }

 private:
  Backend backend_;
  TempDir folder_;
  std::filesystem::path file_;
  std::string reference_;
};

// The store under test for `backend`, or nullopt (saying so) when it is the database and no
// server is configured.
inline std::optional<StoreUnderTest> store_for(Backend backend) {
  if (backend == Backend::database) {
    if (!postgres_configured()) {
      WARN(
          "SKIPPED the PostgreSQL back end: no test server configured (run scripts/test, or "
          "eval \"$(scripts/pg-cluster start)\" before ctest)");
      return std::nullopt;
    }
    prepare_postgres();
  }
  return std::optional<StoreUnderTest>(std::in_place, backend);
}

}  // namespace store_test
