// Real second processes (fork): a case held for editing by one process, and a process killed
// with SIGKILL in the middle of its edits, hundreds of times.
#include <chrono>
#include <csignal>
#include <random>
#include <set>
#include <thread>

#include <catch2/catch.hpp>
#include <sys/wait.h>
#include <unistd.h>

#include "core/store/case_store.hpp"
#include "tests/core/store/store_test_support.hpp"

using store_test::kThwaite;
using namespace counterpoise::store;
using Catch::Matchers::Contains;
using nlohmann::json;
using store_test::TempDir;

namespace {

// Reads one line from `fd` (blocking); "" at end of file.
std::string read_line(int fd) {
  std::string line;
  char c = 0;
  while (::read(fd, &c, 1) == 1) {
    if (c == '\n') return line;
    line += c;
  }
  return line;
}

void write_line(int fd, const std::string& line) {
  const std::string text = line + "\n";
  [[maybe_unused]] auto n = ::write(fd, text.data(), text.size());
}

}  // namespace

TEST_CASE("a second process gets 'in use by' while a case is edited, and may view it",
          "[store][processes]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  CaseStore::create(path, store_test::sample_case(), kThwaite);
  int to_parent[2], to_child[2];
  REQUIRE(::pipe(to_parent) == 0);
  REQUIRE(::pipe(to_child) == 0);
  const pid_t child = ::fork();
  REQUIRE(child >= 0);
  if (child == 0) {
    int code = 0;
    try {
      CaseStore store = CaseStore::open(path, OpenMode::edit);
      store.set_field(kThwaite, EntityRef::item("E1"), "note", json("held by the child"));
      write_line(to_parent[1], "ready");
      read_line(to_child[0]);  // hold the case until the parent has looked
    } catch (...) {
      code = 1;
    }
    ::_exit(code);
  }
  REQUIRE(read_line(to_parent[0]) == "ready");
  // The holder is named by the account it runs under (the examiner's name belongs to each row).
  const std::string expected_holder = "in use by account " + operating_system_account() +
                                      " (process " + std::to_string(child);
  CHECK_THROWS_AS(CaseStore::open(path, OpenMode::edit), CaseInUse);
  CHECK_THROWS_WITH(CaseStore::open(path, OpenMode::edit), Contains(expected_holder));
  {
    CaseStore view = CaseStore::open(path, OpenMode::read_only);
    CHECK(view.state().items()[0].second["note"] == "held by the child");
    CHECK(view.verify().ok());
  }
  write_line(to_child[1], "done");
  int status = 0;
  ::waitpid(child, &status, 0);
  CHECK(WIFEXITED(status));
  CHECK(WEXITSTATUS(status) == 0);
  // Released when the holder is gone.
  CHECK_NOTHROW(CaseStore::open(path, OpenMode::edit));
  for (int fd : {to_parent[0], to_parent[1], to_child[0], to_child[1]}) ::close(fd);
}

TEST_CASE("a process killed at random moments never loses a committed edit",
          "[store][processes][crash]") {
  TempDir dir;
  const auto path = dir / "case.cpcase";
  CaseStore::create(path, store_test::sample_case(), kThwaite);
  std::mt19937_64 random(4207);  // fixed seed: the same kill moments on every run
  std::set<std::string> acknowledged;
  int kills = 0, hot_journals = 0;
  constexpr int kRounds = 200;
  for (int round = 0; round < kRounds; ++round) {
    int pipe_fds[2];
    REQUIRE(::pipe(pipe_fds) == 0);
    const pid_t child = ::fork();
    REQUIRE(child >= 0);
    if (child == 0) {
      ::close(pipe_fds[0]);
      try {
        CaseStore store = CaseStore::open(path, OpenMode::edit);
        write_line(pipe_fds[1], "opened");
        for (int i = 0;; ++i) {
          const std::string tag = std::to_string(round) + "-" + std::to_string(i);
          switch (i % 5) {
            case 0:
              store.set_field(kThwaite, EntityRef::item("E1"), "note", json(tag));
              break;
            case 1:
              store.add_item(kThwaite, json{{"id", "X" + tag}, {"model", "assigned"}}, 1);
              break;
            case 2:
              store.move_item(kThwaite, "X" + std::to_string(round) + "-" + std::to_string(i - 1), 0);
              break;
            case 3:
              store.remove_item(kThwaite, "X" + std::to_string(round) + "-" + std::to_string(i - 2));
              break;
            case 4:
              store.seal_revision(kThwaite, "report " + tag, "report-" + tag + ".pdf");
              break;
          }
          write_line(pipe_fds[1], tag);  // only after the commit returned
        }
      } catch (...) {
        ::_exit(1);
      }
    }
    ::close(pipe_fds[1]);
    // Let the child open the case and make a few edits, then kill it at a random moment.
    REQUIRE(read_line(pipe_fds[0]) == "opened");
    std::this_thread::sleep_for(
        std::chrono::microseconds(std::uniform_int_distribution<int>(0, 100'000)(random)));
    ::kill(child, SIGKILL);
    int status = 0;
    ::waitpid(child, &status, 0);
    if (WIFSIGNALED(status)) ++kills;
    for (std::string tag = read_line(pipe_fds[0]); !tag.empty(); tag = read_line(pipe_fds[0]))
      acknowledged.insert(tag);
    ::close(pipe_fds[0]);

    // Afterwards the file always opens — first read-only (SQLite rolls back a hot journal the
    // child left), then for editing (no stale lock) — passes the integrity check (part of open)
    // and verifies; every acknowledged edit is in the audit.
    const bool journal_left = std::filesystem::exists(path.string() + "-journal");
    hot_journals += journal_left;
    CaseStore store = CaseStore::open(path, OpenMode::read_only);
    CHECK_NOTHROW(CaseStore::open(path, OpenMode::edit));
    const VerifyReport report = store.verify();
    INFO("round " << round << ": " << (report.ok() ? "" : report.problem->reason));
    REQUIRE(report.ok());
    // Each acknowledged edit names the one audit row it must have written.
    std::set<std::string> recorded;
    for (const AuditRow& row : store.audit_rows()) {
      if (row.action == "set" && row.new_value) recorded.insert("set " + *row.new_value);
      if (row.action == "add" || row.action == "move" || row.action == "remove")
        recorded.insert(row.action + " " + row.key);
      if (row.action == "seal")
        recorded.insert("seal " +
                        json::parse(*row.new_value)["report_file_name"].get<std::string>());
    }
    for (const std::string& tag : acknowledged) {
      const auto dash = tag.find('-');
      const std::string r = tag.substr(0, dash);
      const int i = std::stoi(tag.substr(dash + 1));
      const std::string expected = i % 5 == 0   ? "set \"" + tag + "\""
                                   : i % 5 == 1 ? "add X" + tag
                                   : i % 5 == 2 ? "move X" + r + "-" + std::to_string(i - 1)
                                   : i % 5 == 3 ? "remove X" + r + "-" + std::to_string(i - 2)
                                                : "seal report-" + tag + ".pdf";
      if (!recorded.count(expected))
        FAIL("acknowledged edit " << tag << " has no audit row \"" << expected << "\"");
    }
  }
  CHECK(kills > kRounds / 2);
  WARN("SIGKILLs: " << kills << ", journals left behind: " << hot_journals
                    << ", edits acknowledged: " << acknowledged.size());
  CHECK(acknowledged.size() > kRounds);
}
