// Case store benchmark (not a timed test): an audited edit commit (median, p99), opening a case
// with 10,000 audit rows, and verify over 100,000 audit rows, each against plain SQLite doing the
// same rows in the same run. Figures are recorded in docs/performance.md ("Case store").
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <functional>
#include <string>
#include <vector>

#include <sqlite3.h>
#include <unistd.h>

#include "core/store/audit_log.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "store_bench_case.hpp"

using namespace counterpoise::store;
using nlohmann::json;
using Clock = std::chrono::steady_clock;

namespace {
const ExaminerName kThwaite{"Dr Imogen Thwaite"};
}  // namespace

namespace {

double ms_since(Clock::time_point start) {
  return std::chrono::duration<double, std::milli>(Clock::now() - start).count();
}

double quantile(std::vector<double> v, double q) {
  std::sort(v.begin(), v.end());
  return v[static_cast<std::size_t>(q * static_cast<double>(v.size() - 1) + 0.5)];
}


void exec(sqlite3* db, const char* sql) {
  char* message = nullptr;
  if (sqlite3_exec(db, sql, nullptr, nullptr, &message) != SQLITE_OK) {
    std::fprintf(stderr, "sqlite: %s\n", message ? message : "?");
    std::exit(1);
  }
}

// The audit rows `count` edits would write (set_field on the items in turn), as the store makes
// them, each checked by replay.
std::vector<AuditRow> make_rows(const CaseStore& store, int count, CaseState& final_state) {
  AuditReplay replay(store.state(), 1, false, 1, true, {});
  std::string prev = store.audit_rows().back().hash;
  std::vector<AuditRow> rows;
  rows.reserve(static_cast<std::size_t>(count));
  for (int i = 0; i < count; ++i) {
    AuditRow row;
    row.seq = i + 2;
    row.revision = 1;
    row.at = utc_timestamp_now();
    row.examiner = "Dr Imogen Thwaite";
    row.account = operating_system_account();
    row.action = action::set_field;
    row.entity = "item";
    row.key = "E" + std::to_string(1 + i % 40);
    row.field = "p_given_hd";
    const auto old_value = replay.state().value_at(EntityRef::item(row.key), row.field);
    row.old_value = canonical_text(*old_value);
    row.new_value = canonical_text(json{{"counts", {{"k", 3 + i % 7}, {"n", 412 + i}}}});
    row.prev_hash = prev;
    row.hash = audit_row_hash(row);
    replay.apply(row);
    prev = row.hash;
    rows.push_back(std::move(row));
  }
  final_state = replay.state();
  return rows;
}

constexpr const char* kInsertAudit =
    "INSERT INTO audit(seq, revision, at, examiner, action, entity, entity_key, field, old_value, "
    "new_value, prev_hash, hash, account) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)";

void bind_row(sqlite3_stmt* s, const AuditRow& r) {
  sqlite3_bind_int64(s, 1, r.seq);
  sqlite3_bind_int64(s, 2, r.revision);
  const std::string* texts[] = {&r.at, &r.examiner, &r.action, &r.entity, &r.key, &r.field};
  for (int i = 0; i < 6; ++i) sqlite3_bind_text(s, 3 + i, texts[i]->c_str(), -1, SQLITE_TRANSIENT);
  sqlite3_bind_text(s, 9, r.old_value->c_str(), -1, SQLITE_TRANSIENT);
  sqlite3_bind_text(s, 10, r.new_value->c_str(), -1, SQLITE_TRANSIENT);
  sqlite3_bind_text(s, 11, r.prev_hash.c_str(), -1, SQLITE_TRANSIENT);
  sqlite3_bind_text(s, 12, r.hash.c_str(), -1, SQLITE_TRANSIENT);
  sqlite3_bind_text(s, 13, r.account.value_or("").c_str(), -1, SQLITE_TRANSIENT);
}

// Writes the rows (and the resulting item bodies and chain head) into the case file in one
// transaction, as `count` audited edits would have left it.
void append_directly(const std::filesystem::path& path, const std::vector<AuditRow>& rows,
                     const CaseState& state) {
  sqlite3* db = nullptr;
  sqlite3_open(path.c_str(), &db);
  exec(db, "BEGIN");
  sqlite3_stmt* s = nullptr;
  sqlite3_prepare_v2(db, kInsertAudit, -1, &s, nullptr);
  for (const AuditRow& r : rows) {
    bind_row(s, r);
    sqlite3_step(s);
    sqlite3_reset(s);
  }
  sqlite3_finalize(s);
  sqlite3_prepare_v2(db, "UPDATE items SET body = ? WHERE item_id = ?", -1, &s, nullptr);
  for (const auto& [id, body] : state.items()) {
    const std::string text = canonical_text(body);
    sqlite3_bind_text(s, 1, text.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_bind_text(s, 2, id.c_str(), -1, SQLITE_TRANSIENT);
    sqlite3_step(s);
    sqlite3_reset(s);
  }
  sqlite3_finalize(s);
  const std::string head = std::to_string(rows.back().seq) + " " + rows.back().hash;
  sqlite3_prepare_v2(db, "UPDATE meta SET value = ? WHERE key = 'chain_head'", -1, &s, nullptr);
  sqlite3_bind_text(s, 1, head.c_str(), -1, SQLITE_TRANSIENT);
  sqlite3_step(s);
  sqlite3_finalize(s);
  exec(db, "COMMIT");
  sqlite3_close(db);
}

// Plain SQLite: the same rows into a bare table, one transaction (or one per row).
double plain_inserts_ms(const std::filesystem::path& path, const std::vector<AuditRow>& rows,
                        bool one_transaction) {
  std::filesystem::remove(path);
  sqlite3* db = nullptr;
  sqlite3_open(path.c_str(), &db);
  exec(db, "PRAGMA journal_mode = DELETE; PRAGMA synchronous = FULL;");
  exec(db,
       "CREATE TABLE audit(seq INTEGER PRIMARY KEY, revision INTEGER, at TEXT, examiner TEXT, "
       "action TEXT, entity "
       "TEXT, entity_key TEXT, field TEXT, old_value TEXT, new_value TEXT, prev_hash TEXT, hash "
       "TEXT, account TEXT)");
  sqlite3_stmt* s = nullptr;
  sqlite3_prepare_v2(db, kInsertAudit, -1, &s, nullptr);
  const auto start = Clock::now();
  if (one_transaction) exec(db, "BEGIN");
  for (const AuditRow& r : rows) {
    bind_row(s, r);
    sqlite3_step(s);
    sqlite3_reset(s);
  }
  if (one_transaction) exec(db, "COMMIT");
  const double ms = ms_since(start);
  sqlite3_finalize(s);
  sqlite3_close(db);
  return ms;
}

double plain_scan_ms(const std::filesystem::path& path) {
  sqlite3* db = nullptr;
  sqlite3_open(path.c_str(), &db);
  sqlite3_stmt* s = nullptr;
  const auto start = Clock::now();
  sqlite3_prepare_v2(db, "SELECT * FROM audit ORDER BY seq", -1, &s, nullptr);
  std::size_t bytes = 0;
  while (sqlite3_step(s) == SQLITE_ROW)
    for (int c = 0; c < 12; ++c) bytes += static_cast<std::size_t>(sqlite3_column_bytes(s, c));
  sqlite3_finalize(s);
  const double ms = ms_since(start);
  sqlite3_close(db);
  return bytes > 0 ? ms : -1;
}

}  // namespace

int main(int argc, char** argv) {
  const int edits = argc > 1 ? std::atoi(argv[1]) : 100;
  const auto dir =
      std::filesystem::temp_directory_path() / ("cp-store-bench-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  std::printf("Case store benchmark (SQLite %s, journal DELETE, synchronous FULL, folder %s)\n",
              sqlite3_libversion(), dir.c_str());

  // 1. Audited edit commits against plain one-row transactions with the same pragmas.
  {
    CaseStore store = CaseStore::create(dir / "edits.cpcase", counterpoise::bench::store_bench_case(), kThwaite);
    std::vector<double> times;
    for (int i = 0; i < edits; ++i) {
      const auto start = Clock::now();
      store.set_field(kThwaite, EntityRef::item("E" + std::to_string(1 + i % 40)), "p_given_hp",
                      json(0.5 + 0.001 * i));
      times.push_back(ms_since(start));
    }
    CaseState unused;
    const auto rows = make_rows(store, edits, unused);
    std::vector<double> plain;
    for (int i = 0; i < 5; ++i)
      plain.push_back(plain_inserts_ms(dir / "plain.db", rows, false) / edits);
    const double plain_ms = quantile(plain, 0.5);
    std::printf(
        "edit with audit, %d commits: median %.2f ms, p99 %.2f ms; plain one-row commit %.2f ms "
        "(ratio %.2f)\n",
        edits, quantile(times, 0.5), quantile(times, 0.99), plain_ms,
        quantile(times, 0.5) / plain_ms);
  }

  // 2. and 3. Opening a case with 10,000 audit rows; verify over 100,000.
  for (int count : {10'000, 100'000}) {
    const auto path = dir / ("rows-" + std::to_string(count) + ".cpcase");
    CaseState final_state;
    std::vector<AuditRow> rows;
    {
      CaseStore store = CaseStore::create(path, counterpoise::bench::store_bench_case(), kThwaite);
      rows = make_rows(store, count - 1, final_state);
    }
    append_directly(path, rows, final_state);
    const double insert_ms = plain_inserts_ms(dir / "plain.db", rows, true);
    const double scan_ms = plain_scan_ms(dir / "plain.db");
    std::vector<double> open_times;
    for (int i = 0; i < 7; ++i) {
      const auto start = Clock::now();
      CaseStore opened = CaseStore::open(path, OpenMode::read_only);
      open_times.push_back(ms_since(start));
    }
    CaseStore store = CaseStore::open(path, OpenMode::read_only);
    const auto start = Clock::now();
    const VerifyReport report = store.verify();
    const double verify_ms = ms_since(start);
    if (!report.ok()) {
      std::fprintf(stderr, "verify failed at %lld: %s\n",
                   static_cast<long long>(report.problem->seq), report.problem->reason.c_str());
      return 1;
    }
    std::printf(
        "%d audit rows (%.1f MB): open median %.1f ms; verify %.0f ms (%lld rows); plain SQLite "
        "insert of the same "
        "rows in one transaction %.0f ms (verify/insert %.2f), plain scan %.0f ms (verify/scan "
        "%.1f)\n",
        count, static_cast<double>(std::filesystem::file_size(path)) / 1e6,
        quantile(open_times, 0.5), verify_ms, static_cast<long long>(report.rows_checked),
        insert_ms, verify_ms / insert_ms, scan_ms, verify_ms / scan_ms);
  }
  std::filesystem::remove_all(dir);
  return 0;
}
