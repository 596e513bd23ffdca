// Shared case store benchmark (not a timed test): one audited edit committed on a local
// PostgreSQL server beside the same edit in a .cpcase file (median, p99), verify of a
// 100,000-row audit chain in the database, and concurrent writers on different cases. Needs the
// PG environment of a server (scripts/pg-cluster start); run as the cluster's superuser, which
// installs the store and a role for the benchmark. Figures: docs/performance.md ("Shared case
// store").
#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <thread>
#include <vector>

#include <unistd.h>

#include "bench_machine.hpp"
#include "core/store/audit_log.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "store_bench_case.hpp"
#include "core/store/postgres_connection.hpp"
#include "core/store/postgres_schema.hpp"

using namespace counterpoise::store;
using nlohmann::json;
using Clock = std::chrono::steady_clock;

namespace {

const ExaminerName kThwaite{"Dr Imogen Thwaite"};
constexpr const char* kRole = "cp_bench_examiner";

double ms_since(Clock::time_point start) {
  return std::chrono::duration<double, std::milli>(Clock::now() - start).count();
}

double quantile(std::vector<double> v, double q) {
  std::sort(v.begin(), v.end());
  return v[static_cast<std::size_t>(q * static_cast<double>(v.size() - 1) + 0.5)];
}


std::string unique(const std::string& stem) {
  return stem + "-" + std::to_string(::getpid()) + "-" +
         std::to_string(Clock::now().time_since_epoch().count());
}

void prepare() {
  PgConnection admin("", "benchmark database (administrator)");
  install_postgres_store(admin);
  if (admin.run("SELECT 1 FROM pg_roles WHERE rolname = $1", {PgParam::text(kRole)}).rows() == 0)
    admin.execute("CREATE ROLE cp_bench_examiner LOGIN");
  admin.execute("GRANT counterpoise_users TO cp_bench_examiner");
}

DatabaseCase address(const std::string& reference) {
  return {std::string("user=") + kRole, reference};
}

// Median and p99 of `edits` single-field edits, each one committed transaction.
std::pair<double, double> edit_times(CaseStore& store, int edits) {
  std::vector<double> ms;
  for (int i = 0; i < edits; ++i) {
    const auto start = Clock::now();
    store.set_field(kThwaite, EntityRef::item("E" + std::to_string(1 + i % 40)), "title",
                    json("Edit " + std::to_string(i)));
    ms.push_back(ms_since(start));
  }
  return {quantile(ms, 0.5), quantile(ms, 0.99)};
}

// A case of `rows` audit rows written straight into the database as the store would write them
// (each row made and checked by the store's own replay), in one transaction.
std::string build_long_chain(int rows) {
  const std::string reference = unique("HV-CHAIN");
  CaseStore::create(address(reference), counterpoise::bench::store_bench_case(reference), kThwaite);
  CaseStore store = CaseStore::open(address(reference), OpenMode::edit);
  AuditReplay replay(store.state(), 1, false, 1, true, {});
  std::string prev = store.audit_rows().back().hash;
  PgConnection db(std::string("user=") + kRole, "benchmark database");
  db.execute("BEGIN");
  db.run("SELECT 1 FROM counterpoise.cases WHERE case_ref = $1 FOR UPDATE",
         {PgParam::text(reference)});
  std::string title = canonical_text(json("Finding 1 from the Harwick Vale bakery"));
  for (int seq = 2; seq <= rows; ++seq) {
    AuditRow row;
    row.seq = seq;
    row.revision = 1;
    row.at = "2026-12-03T12:00:00.000Z";
    row.examiner = kThwaite.text();
    row.account = kRole;
    row.action = action::set_field;
    row.entity = "item";
    row.key = "E1";
    row.field = "title";
    row.old_value = title;
    row.new_value = canonical_text(json("Edit " + std::to_string(seq)));
    row.prev_hash = prev;
    row.hash = audit_row_hash(row);
    replay.apply(row);
    db.run(
        "INSERT INTO counterpoise.audit(case_ref, seq, revision, at, examiner, account, action, "
        "entity, entity_key, field, old_value, new_value, prev_hash, hash) "
        "VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14)",
        {PgParam::text(reference), PgParam::integer(row.seq), PgParam::integer(row.revision),
         PgParam::text(row.at), PgParam::text(row.examiner), PgParam::optional(row.account),
         PgParam::text(row.action), PgParam::text(row.entity), PgParam::text(row.key),
         PgParam::text(row.field), PgParam::optional(row.old_value),
         PgParam::optional(row.new_value), PgParam::text(row.prev_hash), PgParam::text(row.hash)});
    prev = row.hash;
    title = *row.new_value;
  }
  db.run(
      "UPDATE counterpoise.items SET body = $2 WHERE case_ref = $1 AND item_id = 'E1'",
      {PgParam::text(reference), PgParam::text(canonical_text(replay.state().items()[0].second))});
  db.run("UPDATE counterpoise.cases SET chain_head = $2 WHERE case_ref = $1",
         {PgParam::text(reference), PgParam::text(std::to_string(rows) + " " + prev)});
  db.execute("COMMIT");
  return reference;
}

}  // namespace

int main(int argc, char** argv) {
  if (!std::getenv("PGHOST") && !std::getenv("PGSERVICE")) {
    std::printf(
        "bench_store_postgres: no server configured: eval \"$(scripts/pg-cluster start)\" "
        "first\n");
    return 0;
  }
  const int edits = argc > 1 ? std::atoi(argv[1]) : 300;
  const int chain_rows = argc > 2 ? std::atoi(argv[2]) : 100000;
  const int writers = argc > 3 ? std::atoi(argv[3]) : 20;
  const int seconds = argc > 4 ? std::atoi(argv[4]) : 60;
  std::printf("CPU: %s\n", counterpoise::bench::cpu_model().c_str());
  std::printf("load average before: %s\n", counterpoise::bench::load_average().c_str());
  prepare();

  // One edit: the database beside a .cpcase file, same edits, same run.
  {
    const std::string reference = unique("HV-EDIT");
    CaseStore in_database = CaseStore::create(address(reference), counterpoise::bench::store_bench_case(reference), kThwaite);
    const auto folder = std::filesystem::temp_directory_path() / unique("cp-bench-store");
    std::filesystem::create_directories(folder);
    CaseStore in_file = CaseStore::create(folder / "case.cpcase", counterpoise::bench::store_bench_case("HV-EDIT"), kThwaite);
    const auto [db_median, db_p99] = edit_times(in_database, edits);
    const auto [file_median, file_p99] = edit_times(in_file, edits);
    std::printf(
        "one edit committed (%d edits): PostgreSQL median %.2f ms, p99 %.2f ms; "
        ".cpcase file median %.2f ms, p99 %.2f ms\n",
        edits, db_median, db_p99, file_median, file_p99);
    std::filesystem::remove_all(folder);
  }

  // verify of a long chain.
  {
    const auto start_build = Clock::now();
    const std::string reference = build_long_chain(chain_rows);
    const double build_s = ms_since(start_build) / 1000;
    CaseStore store = CaseStore::open(address(reference), OpenMode::read_only);
    const auto start = Clock::now();
    const VerifyReport report = store.verify();
    std::printf("verify of %lld audit rows in the database: %.2f s (%s; building it took %.1f s)\n",
                static_cast<long long>(report.rows_checked), ms_since(start) / 1000,
                report.ok() ? "ok" : report.problem->reason.c_str(), build_s);
  }

  // Concurrent writers, each on its own case.
  {
    std::vector<std::string> references;
    for (int w = 0; w < writers; ++w) {
      references.push_back(unique("HV-WRITER-" + std::to_string(w)));
      CaseStore::create(address(references.back()), counterpoise::bench::store_bench_case(references.back()), kThwaite);
    }
    std::atomic<long> committed{0}, failed{0};
    std::vector<std::thread> threads;
    const auto until = Clock::now() + std::chrono::seconds(seconds);
    for (int w = 0; w < writers; ++w)
      threads.emplace_back([&, w] {
        CaseStore store = CaseStore::open(address(references[w]), OpenMode::edit);
        for (int i = 0; Clock::now() < until; ++i) {
          try {
            store.set_field(kThwaite, EntityRef::item("E" + std::to_string(1 + i % 40)), "title",
                            json("Writer " + std::to_string(w) + " edit " + std::to_string(i)));
            ++committed;
          } catch (const std::exception& e) {
            ++failed;
            std::fprintf(stderr, "writer %d: %s\n", w, e.what());
          }
        }
      });
    for (auto& t : threads) t.join();
    long in_audit = 0;
    bool all_verify = true;
    for (const std::string& reference : references) {
      CaseStore store = CaseStore::open(address(reference), OpenMode::read_only);
      in_audit += static_cast<long>(store.audit_rows().size()) - 1;
      all_verify = all_verify && store.verify().ok();
    }
    std::printf(
        "%d concurrent writers for %d s: %ld edits committed (%.0f per second), %ld failed, "
        "%ld in the audits afterwards, every case verifies: %s\n",
        writers, seconds, committed.load(), static_cast<double>(committed) / seconds, failed.load(),
        in_audit, all_verify ? "yes" : "NO");
  }
  std::printf("load average after: %s\n", counterpoise::bench::load_average().c_str());
  return 0;
}
