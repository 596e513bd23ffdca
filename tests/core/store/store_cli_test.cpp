// The store commands of counterpoise-cli run as a user would run them, on the demo cases.
#include <catch2/catch.hpp>
#include <sys/stat.h>
#include <unistd.h>

#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_store.hpp"
#include "tests/core/store/cli_runner.hpp"
#include "tests/core/store/store_test_support.hpp"

using Catch::Matchers::Contains;
using nlohmann::json;

using store_test::cli;
using store_test::Run;

TEST_CASE("import then export of every demo case reproduces its canonical JSON", "[store][cli]") {
  store_test::TempDir dir;
  int cases = 0;
  for (const auto& entry : std::filesystem::directory_iterator(COUNTERPOISE_DEMO_DIR)) {
    if (entry.path().extension() != ".json") continue;
    ++cases;
    const std::string name = entry.path().stem().string();
    const auto store_path = (dir / (name + ".cpcase")).string();
    const auto exported = (dir / (name + ".json")).string();
    INFO(name);
    const Run imported =
        cli({"import", entry.path().string(), "-o", store_path, "--examiner", "Dr Imogen Thwaite"});
    CHECK(imported.code == 0);
    CHECK_THAT(imported.output, Contains("created"));
    CHECK(cli({"verify", store_path}).code == 0);
    CHECK(cli({"export", store_path, "-o", exported}).code == 0);
    const json original = counterpoise::reading::read_json_file(entry.path());
    CHECK(store_test::file_bytes(exported) == counterpoise::store::canonical_text(original));
    CHECK(cli({"export", store_path, "-o", exported}).code == 1);  // never replaced silently
    CHECK(cli({"export", store_path, "-o", exported, "--force"}).code == 0);
  }
  CHECK(cases >= 2);
}

TEST_CASE("edit, history and verify work together from the command line", "[store][cli]") {
  store_test::TempDir dir;
  const auto json_path = (dir / "case.json").string();
  const auto store_path = (dir / "case.cpcase").string();
  store_test::write_bytes(json_path, store_test::sample_case().dump());
  REQUIRE(cli({"import", json_path, "-o", store_path, "--examiner", "Dr Imogen Thwaite"}).code ==
          0);

  const Run edited = cli({"edit", store_path, "--item", "E1", "--field", "title", "--value",
                          "\"Glass (re-examined)\"", "--examiner", "Dr Owen Pryce"});
  CHECK(edited.code == 0);
  CHECK_THAT(edited.output, Contains("audit row 2"));
  // The examiner can also come from the environment or the settings file.
  const std::vector<std::string> thwaite = {"COUNTERPOISE_EXAMINER=Dr Imogen Thwaite"};
  CHECK(cli({"edit", store_path, "--section", "propositions", "--field", "level", "--value",
             "\"activity\""},
            thwaite)
            .code == 0);
  store_test::write_bytes(dir / "examiner", "Dr Imogen Thwaite\n");
  const std::vector<std::string> settings = {"COUNTERPOISE_CONFIG_DIR=" + dir.path().string()};
  CHECK(cli({"edit", store_path, "--add-item", R"({"id":"E4","model":"reported-lr","lr":3.5})",
             "--position", "0"},
            settings)
            .code == 0);
  CHECK(cli({"edit", store_path, "--move-item", "E4", "--position", "2"}, thwaite).code == 0);
  CHECK(cli({"edit", store_path, "--remove-item", "E4"}, thwaite).code == 0);
  CHECK(cli({"edit", store_path, "--item", "E1", "--field", "note", "--unset"}, thwaite).code == 0);

  // Refused edits: bad JSON, unknown item, a value the case reader rejects; usage errors exit 2.
  const Run bad_json =
      cli({"edit", store_path, "--item", "E1", "--field", "title", "--value", "{oops"}, thwaite);
  CHECK(bad_json.code == 1);
  CHECK_THAT(bad_json.output, Contains("line 1, column"));
  CHECK(cli({"edit", store_path, "--item", "E9", "--field", "title", "--value", "\"x\""}, thwaite)
            .code == 1);
  const Run refused =
      cli({"edit", store_path, "--item", "E1", "--field", "p_given_hp", "--value", "7"}, thwaite);
  CHECK(refused.code == 1);
  CHECK_THAT(refused.output, Contains("p_given_hp"));
  CHECK(cli({"edit", store_path, "--field", "title", "--value", "1"}, thwaite).code == 2);
  CHECK(cli({"edit", store_path, "--item", "E1", "--field", "title"}, thwaite).code == 2);
  CHECK(cli({"import", json_path}).code == 2);

  const Run history = cli({"history", store_path, "--json"});
  REQUIRE(history.code == 0);
  const json listed = json::parse(history.output);
  REQUIRE(listed["audit"].size() == 7);
  CHECK(listed["audit"][1]["examiner"] == "Dr Owen Pryce");
  CHECK(listed["audit"][1]["account"].is_string());
  CHECK(listed["audit"][1]["new_value"] == "Glass (re-examined)");
  CHECK(listed["audit"][6]["action"] == "set");
  CHECK_FALSE(listed["audit"][6].contains("new_value"));
  CHECK(listed["revisions"].size() == 1);
  const Run text = cli({"history", store_path});
  CHECK_THAT(text.output, Contains("item E1.title") && Contains("Dr Owen Pryce"));

  CHECK(cli({"verify", store_path}).code == 0);
  store_test::raw_sql(store_path, "UPDATE sections SET body = '\"x\"' WHERE name = 'version'");
  const Run failed = cli({"verify", store_path});
  CHECK(failed.code == 1);
  CHECK_THAT(failed.output, Contains("audit row 7") && Contains("section \"version\""));
}

TEST_CASE("import refuses hostile JSON with a clear message", "[store][cli]") {
  store_test::TempDir dir;
  const auto store_path = (dir / "x.cpcase").string();
  const std::pair<std::string, std::string> inputs[] = {
      {std::string(100'000, '[') + std::string(100'000, ']'), "nested more than"},
      {R"({"items": [], "priors": {"odds": [1e999]}})", "too large"},
      {"{\"items\": [], \"case\": {\"title\": \"caf\xe9\"}}", "UTF-8"},
      {R"({"items": {"id": "E1"}})", "array of items"},
      {R"({"format": "counterpoise.case", "version": 1, "items": [{"id": "E1", "model": "assigned", "p_given_hp": "high"}]})",
       "E1"},
  };
  for (const auto& [text, expected] : inputs) {
    store_test::write_bytes(dir / "in.json", text);
    const Run run = cli({"import", (dir / "in.json").string(), "-o", store_path, "--examiner",
                         "Dr Imogen Thwaite"});
    INFO(run.output);
    CHECK(run.code == 1);
    CHECK_THAT(run.output, Contains(expected));
    CHECK_FALSE(std::filesystem::exists(store_path));
  }
}

TEST_CASE("commands that write refuse to run without an examiner's name", "[store][cli][examiner]") {
  store_test::TempDir dir;
  const auto json_path = (dir / "case.json").string();
  const auto store_path = (dir / "case.cpcase").string();
  store_test::write_bytes(json_path, store_test::sample_case().dump());
  const Run anonymous_import = cli({"import", json_path, "-o", store_path});
  CHECK(anonymous_import.code == 1);
  CHECK_THAT(anonymous_import.output,
             Contains("no examiner's name") && Contains("--examiner") &&
                 Contains("COUNTERPOISE_EXAMINER") && Contains("/nonexistent/counterpoise-test/examiner"));
  CHECK_FALSE(std::filesystem::exists(store_path));

  REQUIRE(cli({"import", json_path, "-o", store_path, "--examiner", "Dr Imogen Thwaite"}).code == 0);
  const std::string before = store_test::file_digest(store_path);
  const Run anonymous_edit =
      cli({"edit", store_path, "--item", "E1", "--field", "title", "--value", "\"x\""});
  CHECK(anonymous_edit.code == 1);
  CHECK_THAT(anonymous_edit.output, Contains("no examiner's name"));
  // A name that would reach terminals raw is refused too.
  const Run escape = cli({"edit", store_path, "--item", "E1", "--field", "title", "--value",
                          "\"x\"", "--examiner", "Dr \x1b]0;title\x07"});
  CHECK(escape.code == 1);
  CHECK_THAT(escape.output, Contains("control character"));
  CHECK(cli({"declare-reviewer", store_path, "Dr Owen Pryce"}).code == 1);
  CHECK(store_test::file_digest(store_path) == before);

  // The case's examiner declares a reviewer; history lists the reviewer and the accounts.
  const Run declared = cli({"declare-reviewer", store_path, "Dr Owen Pryce", "--examiner",
                            "Dr Imogen Thwaite"});
  CHECK(declared.code == 0);
  CHECK_THAT(declared.output, Contains("Dr Owen Pryce declared a reviewer"));
  CHECK(cli({"declare-reviewer", store_path, "Dr Ifan Morgan", "--examiner", "Dr Owen Pryce"})
            .code == 1);
  const Run history = cli({"history", store_path});
  CHECK_THAT(history.output, Contains("Declared reviewers: Dr Owen Pryce"));
  CHECK(cli({"verify", store_path}).code == 0);
}

TEST_CASE("every command that writes refuses a case file changed behind the program's back",
          "[store][cli][tamper]") {
  // Each change is made through the SQLite C API, as the sqlite3 shell would make it; the
  // reason is the one verify gives for the first row that no longer fits.
  const auto [tamper, reason] = GENERATE(table<std::string, std::string>({
      {R"(UPDATE items SET body = '{"id":"E1","model":"assigned","p_given_hp":0.999,"p_given_hd":0.001}' WHERE item_id = 'E1')",
       "item \"E1\" differs"},
      {"UPDATE sections SET body = json_set(body, '$.hd', 'The glass came from another window.') "
       "WHERE name = 'propositions'",
       "section \"propositions\" differs"},
      // Past the append-only trigger, which is put back word for word after the change.
      {"UPDATE audit SET examiner = 'Dr Ifan Morgan' WHERE seq = 1", "its hash does not match its content"},
  }));
  INFO(tamper);
  store_test::TempDir dir;
  const auto json_path = (dir / "case.json").string();
  const auto store_path = (dir / "case.cpcase").string();
  store_test::write_bytes(json_path, store_test::sample_case().dump());
  REQUIRE(cli({"import", json_path, "-o", store_path, "--examiner", "Dr Imogen Thwaite"}).code == 0);
  store_test::raw_sql_behind_triggers(store_path, tamper);
  const std::string tampered = store_test::file_digest(store_path);
  const std::vector<std::string> thwaite = {"COUNTERPOISE_EXAMINER=Dr Imogen Thwaite"};
  std::vector<std::vector<std::string>> writers = {
      {"edit", store_path, "--item", "E2", "--field", "lr", "--value", "15000"},
      {"edit", store_path, "--remove-item", "E2"},
      {"edit", store_path, "--add-item", R"({"id":"E9","model":"assigned","p_given_hp":0.5,"p_given_hd":0.1})"},
      {"declare-reviewer", store_path, "Dr Owen Pryce"},
      {"review", store_path, "--revision", "1", "--agree"},
  };
  // Unsigned on purpose: the refusal must come from the tampered file, not from a missing key.
  if (cli({"--help"}).output.find("report CASE") != std::string::npos)
    writers.push_back({"report", store_path, "-o", (dir / "r.pdf").string(), "--confirm-open-points",
                       "--unsigned-seal"});
  for (const auto& args : writers) {
    INFO(args[0] << " " << args[2]);
    const Run run = cli(args, thwaite);
    CHECK(run.code == 1);
    CHECK_THAT(run.output, Contains("fails verification (audit row 1: ") && Contains(reason) &&
                               Contains("nothing is written to it"));
  }
  CHECK_FALSE(std::filesystem::exists(dir / "r.pdf"));
  CHECK(store_test::file_digest(store_path) == tampered);
  CHECK(cli({"verify", store_path}).code == 1);
  // Reading is still allowed: the file can be looked at and copied out for inspection.
  CHECK(cli({"history", store_path}).code == 0);
}

TEST_CASE("every command refuses a case file that carries a trigger or view of its own",
          "[store][cli][schema]") {
  const std::string hostile = GENERATE(
      std::string("CREATE TRIGGER spin AFTER INSERT ON session BEGIN SELECT 1; END"),
      std::string("CREATE VIEW summary AS SELECT item_id FROM items"));
  INFO(hostile);
  store_test::TempDir dir;
  const auto json_path = (dir / "case.json").string();
  const auto store_path = (dir / "case.cpcase").string();
  store_test::write_bytes(json_path, store_test::sample_case().dump());
  REQUIRE(cli({"import", json_path, "-o", store_path, "--examiner", "Dr Imogen Thwaite"}).code == 0);
  store_test::raw_sql(store_path, hostile);
  const std::string before = store_test::file_digest(store_path);
  const std::vector<std::string> thwaite = {"COUNTERPOISE_EXAMINER=Dr Imogen Thwaite"};
  std::vector<std::vector<std::string>> commands = {
      {"edit", store_path, "--item", "E2", "--field", "lr", "--value", "15000"},
      {"declare-reviewer", store_path, "Dr Owen Pryce"},
      {"verify", store_path},
      {"history", store_path},
      {"export", store_path, "-o", (dir / "out.json").string()},
      {"evaluate", store_path},
      {"validate", store_path},
  };
  if (cli({"--help"}).output.find("report CASE") != std::string::npos)
    commands.push_back({"report", store_path, "-o", (dir / "r.pdf").string(), "--confirm-open-points",
                        "--unsigned-seal"});
  for (const auto& args : commands) {
    INFO(args[0]);
    const Run run = cli(args, thwaite);
    CHECK(run.code == 1);
    CHECK_THAT(run.output, Contains("that this program did not create") &&
                               Contains("could carry code that runs when it is used"));
  }
  CHECK_FALSE(std::filesystem::exists(dir / "out.json"));
  CHECK_FALSE(std::filesystem::exists(dir / "r.pdf"));
  CHECK(store_test::file_digest(store_path) == before);
}

TEST_CASE("review records a reviewer's note on a sealed revision, history lists it",
          "[store][cli][review]") {
  store_test::TempDir dir;
  const auto json_path = (dir / "case.json").string();
  const auto store_path = (dir / "case.cpcase").string();
  store_test::write_bytes(json_path, store_test::sample_case().dump());
  REQUIRE(cli({"import", json_path, "-o", store_path, "--examiner", "Dr Imogen Thwaite"}).code == 0);
  REQUIRE(cli({"declare-reviewer", store_path, "Dr Owen Pryce", "--examiner", "Dr Imogen Thwaite"})
              .code == 0);
  {
    // Sealed through the store API (the report command needs the report module).
    auto store = counterpoise::store::CaseStore::open(store_path, counterpoise::store::OpenMode::edit);
    store.seal_revision(store_test::kThwaite, "report", "r1.pdf");
  }
  const std::vector<std::string> pryce = {"COUNTERPOISE_EXAMINER=Dr Owen Pryce"};
  const Run reviewed = cli({"review", store_path, "--revision", "1", "--disagree", "--note",
                            "The prior odds in section 4 are not the court's."},
                           pryce);
  CHECK(reviewed.code == 0);
  CHECK_THAT(reviewed.output, Contains("review note (disagree) on revision 1 by Dr Owen Pryce"));
  CHECK(cli({"review", store_path, "--revision", "1", "--agree", "--comment"}, pryce).code == 2);
  CHECK(cli({"review", store_path, "--revision", "one", "--agree"}, pryce).code == 2);
  CHECK(cli({"review", store_path, "--revision", "2", "--agree"}, pryce).code == 1);
  CHECK(cli({"review", store_path, "--revision", "1", "--agree", "--examiner", "Dr Ifan Morgan"})
            .code == 1);
  const Run history = cli({"history", store_path});
  CHECK_THAT(history.output, Contains("revision 1: disagree by Dr Owen Pryce") &&
                                 Contains("not the court's"));
  const json listed = json::parse(cli({"history", store_path, "--json"}).output);
  REQUIRE(listed["review_notes"].size() == 1);
  CHECK(listed["review_notes"][0]["verdict"] == "disagree");
  CHECK(cli({"verify", store_path}).code == 0);

  // A tampered store refuses the review too.
  store_test::raw_sql(store_path, R"(UPDATE items SET body = '{"id":"E1","model":"assigned"}' WHERE item_id = 'E1')");
  const Run refused = cli({"review", store_path, "--revision", "1", "--agree"}, pryce);
  CHECK(refused.code == 1);
  CHECK_THAT(refused.output, Contains("fails verification"));
}

TEST_CASE("export and report write case content with the store's permissions, never through a link",
          "[store][cli][private-file]") {
  store_test::TempDir dir;
  const auto json_path = (dir / "case.json").string();
  const auto store_path = (dir / "case.cpcase").string();
  store_test::write_bytes(json_path, store_test::sample_case().dump());
  const mode_t previous = ::umask(0);  // the children inherit the most open umask
  const auto mode_of = [](const std::filesystem::path& path) {
    struct stat info {};
    REQUIRE(::lstat(path.c_str(), &info) == 0);
    return info.st_mode & 07777;
  };
  REQUIRE(cli({"import", json_path, "-o", store_path, "--examiner", "Dr Imogen Thwaite"}).code == 0);
  CHECK(mode_of(store_path) == 0600);
  // A link planted where the old writer put its temporary file, pointing at a file to overwrite.
  const auto victim = dir / "victim.txt";
  store_test::write_bytes(victim, "precious");
  const auto exported = dir / "out.json";
  REQUIRE(::symlink(victim.c_str(), (exported.string() + ".tmp").c_str()) == 0);
  CHECK(cli({"export", store_path, "-o", exported.string()}).code == 0);
  CHECK(mode_of(exported) == 0600);
  CHECK(store_test::file_bytes(victim) == "precious");
  CHECK(cli({"export", store_path, "-o", exported.string(), "--force"},
            {"COUNTERPOISE_FILE_MODE=0640"}).code == 0);
  CHECK(mode_of(exported) == 0640);
  const Run refused = cli({"export", store_path, "-o", exported.string(), "--force"},
                          {"COUNTERPOISE_FILE_MODE=0666"});
  CHECK(refused.code == 1);
  CHECK_THAT(refused.output, Contains("COUNTERPOISE_FILE_MODE"));
  if (cli({"--help"}).output.find("report CASE") != std::string::npos) {
    const auto pdf = dir / "r.pdf";
    const auto text = dir / "r.txt";
    const Run report = cli({"report", store_path, "-o", pdf.string(), "--text", text.string(),
                            "--confirm-open-points", "--examiner", "Dr Imogen Thwaite", "--unsigned-seal"});
    INFO(report.output);
    CHECK(report.code == 0);
    CHECK(mode_of(pdf) == 0600);
    CHECK(mode_of(text) == 0600);
  }
  ::umask(previous);
  // Nothing but the files asked for is left in the folder (no temporary files).
  for (const auto& entry : std::filesystem::directory_iterator(dir.path()))
    CHECK(entry.path().filename().string().find(".cp-tmp-") == std::string::npos);
}

TEST_CASE("a store sealed before seals were signed verifies, and verify and history name its seal unsigned",
          "[store][cli][seal]") {
  store_test::TempDir dir;
  const auto path = dir / "old.cpcase";
  std::filesystem::copy_file(std::filesystem::path(COUNTERPOISE_TEST_DATA_DIR) / "store" / "version1.cpcase", path);
  const Run verified = cli({"verify", path.string()});
  INFO(verified.output);
  CHECK(verified.code == 0);
  CHECK_THAT(verified.output, Contains("revision 1 sealed at") && Contains("unsigned seal"));
  const Run history = cli({"history", path.string()});
  CHECK_THAT(history.output, Contains("unsigned seal"));
  const json listed = json::parse(cli({"history", path.string(), "--json"}).output);
  CHECK(listed["revisions"][0]["signed"] == false);
}
