// The shared store survives its server being killed mid-edit: every edit the store reported as
// committed is in the audit afterwards, the chain verifies, the edit in flight is reported as
// failed (never retried silently), and the case can be edited again. The test runs its own
// throwaway cluster (scripts/pg-cluster), so killing it disturbs no other test.

#include <atomic>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <thread>

#include <catch2/catch.hpp>

#include "core/store/case_store.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"
#include "tests/core/store/store_backends.hpp"

using namespace counterpoise::store;
using Catch::Matchers::Contains;
using counterpoise::validation::FileError;
using nlohmann::json;
using store_test::kThwaite;

namespace {

const std::string kClusterScript =
    std::string(COUNTERPOISE_TEST_DATA_DIR) + "/../../scripts/pg-cluster";

// Runs a shell command and returns its standard output; fails the test when it fails.
std::string shell(const std::string& command) {
  std::string output;
  FILE* pipe = ::popen(command.c_str(), "r");
  REQUIRE(pipe != nullptr);
  char buffer[4096];
  while (std::size_t n = std::fread(buffer, 1, sizeof buffer, pipe)) output.append(buffer, n);
  REQUIRE(::pclose(pipe) == 0);
  return output;
}

// A cluster of this test's own, stopped and deleted when the object goes.
class OwnCluster {
 public:
  OwnCluster() {
    const std::string settings = shell(kClusterScript + " start");
    const std::string key = "COUNTERPOISE_PG_CLUSTER='";
    const std::size_t at = settings.find(key);
    REQUIRE(at != std::string::npos);
    folder_ =
        settings.substr(at + key.size(), settings.find('\'', at + key.size()) - at - key.size());
  }
  ~OwnCluster() { std::system((kClusterScript + " stop '" + folder_ + "' 2>/dev/null").c_str()); }
  OwnCluster(const OwnCluster&) = delete;
  OwnCluster& operator=(const OwnCluster&) = delete;

  // A connection string for `role` (libpq key=value form).
  std::string as(const std::string& role) const {
    return "host=" + folder_ + " port=5432 dbname=counterpoise_test user=" + role;
  }
  void crash_restart() const { shell(kClusterScript + " crash-restart '" + folder_ + "' 2>&1"); }

 private:
  std::string folder_;
};

}  // namespace

TEST_CASE("killing the server mid-edit loses no committed edit and retries nothing",
          "[store][postgres][restart]") {
  if (!store_test::postgres_configured()) {
    WARN(
        "SKIPPED the PostgreSQL back end: no test server configured (run scripts/test, or "
        "eval \"$(scripts/pg-cluster start)\" before ctest)");
    return;
  }
  OwnCluster cluster;
  {
    PgConnection admin(cluster.as("postgres"), "own test cluster");
    install_postgres_store(admin);
    admin.execute("CREATE ROLE cp_test_examiner LOGIN");
    admin.execute("GRANT counterpoise_users TO cp_test_examiner");
  }
  const DatabaseCase address{cluster.as("cp_test_examiner"), "HV-2026-0117"};
  CaseStore::create(address, store_test::sample_case(), kThwaite);

  // A writer edits as fast as it can; every edit that returns is committed, so its value must
  // be found afterwards. The server is killed while it runs.
  std::atomic<bool> started{false};
  std::vector<std::pair<std::int64_t, int>> acknowledged;  // audit seq, value written
  std::string failure;
  std::thread writer([&] {
    CaseStore store = CaseStore::open(address, OpenMode::edit);
    for (int value = 1;; ++value) {
      try {
        const std::int64_t seq =
            store.set_field(kThwaite, EntityRef::item("E1"), "title", json(value));
        acknowledged.emplace_back(seq, value);
        started = true;
      } catch (const FileError& e) {
        failure = e.what();
        return;
      }
    }
  });
  while (!started) std::this_thread::sleep_for(std::chrono::milliseconds(5));
  std::this_thread::sleep_for(std::chrono::milliseconds(200));
  cluster.crash_restart();
  writer.join();

  INFO(failure);
  CHECK_THAT(failure, Contains("connection to the database was lost"));
  REQUIRE_FALSE(acknowledged.empty());
  CaseStore reopened = CaseStore::open(address, OpenMode::edit);
  CHECK(reopened.verify().ok());
  const std::vector<AuditRow> rows = reopened.audit_rows();
  // Every acknowledged edit is there, with its value; at most the one in flight may have been
  // committed without being acknowledged (its COMMIT reached the server, the answer did not).
  for (const auto& [seq, value] : acknowledged) {
    REQUIRE(seq <= static_cast<std::int64_t>(rows.size()));
    CHECK(rows[static_cast<std::size_t>(seq - 1)].new_value == std::to_string(value));
  }
  CHECK(rows.size() <= acknowledged.size() + 2);  // the import, the acknowledged, one in flight
  // The store can be edited again, and nothing was repeated behind the user's back.
  CHECK(reopened.set_field(kThwaite, EntityRef::item("E1"), "title", json("after the restart")) ==
        static_cast<std::int64_t>(rows.size()) + 1);
  CHECK(reopened.verify().ok());
}
