// counterpoise-cli as a user runs it on the demo cases and on broken files.
#include <catch2/catch.hpp>
#include <sys/wait.h>

#include <array>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "tests/app/cli_run.hpp"

namespace {

using cli_run::Run;
using cli_run::run_cli;

std::string demo(const char* name) { return std::string("'") + COUNTERPOISE_DEMO_DIR + "/" + name + "'"; }

std::filesystem::path write_temp(const std::string& name, const std::string& text) {
  const auto path = std::filesystem::temp_directory_path() / name;
  std::ofstream(path) << text;
  return path;
}

}  // namespace

TEST_CASE("evaluate --json carries the fields of the interchange contract") {
  const auto run = run_cli("evaluate --json " + demo("harwick-vale-breakin.json"));
  REQUIRE(run.exit_code == 0);
  const auto j = nlohmann::json::parse(run.out);
  for (const auto& item : j["items"]) {
    CHECK(item.contains("id"));
    CHECK(item.contains("log10_lr"));
    CHECK(item.contains("lr"));
    CHECK(item.contains("verbal"));
    CHECK(item.contains("model_detail"));
  }
  CHECK(j["items"][0].contains("interval_log10"));
  CHECK(j["combined"].contains("interval_log10"));
  CHECK(j["combined"]["included"].size() == 3);  // E4 is left out with a reason
  CHECK(j["items"][3]["included"] == false);
  REQUIRE(j["sensitivity"].is_array());
  for (const auto& row : j["sensitivity"]) {
    CHECK(row.contains("prior_odds"));
    CHECK(row.contains("posterior_log10_odds"));
    const double p = row["posterior_probability"], q = row["posterior_complement"];
    CHECK(p + q == Approx(1.0).epsilon(1e-12));
  }
  CHECK(j.contains("warnings"));
}

TEST_CASE("evaluate prints a readable table with the combined result and the illustration label") {
  const auto run = run_cli("evaluate " + demo("harwick-vale-breakin.json"));
  REQUIRE(run.exit_code == 0);
  CHECK_THAT(run.out, Catch::Contains("Combined (3 items"));
  CHECK_THAT(run.out, Catch::Contains("Illustration only"));
  CHECK_THAT(run.out, Catch::Contains("left out"));
}

TEST_CASE("the issue's extreme case: LR 1e18 with prior odds 1e-3 gives a complement near 1e-15") {
  const auto path = write_temp("cp-extreme.json", R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "X-1" }, "mode": "training",
    "propositions": { "level": "sub-source", "hp": "The DNA came from Mr A", "hd": "The DNA came from an unknown person" },
    "items": [ { "id": "D", "model": "reported-lr", "lr": 1e18 } ], "priors": { "odds": [1e-3] } })");
  const auto run = run_cli("evaluate --json '" + path.string() + "'");
  REQUIRE(run.exit_code == 0);
  const auto row = nlohmann::json::parse(run.out)["sensitivity"][0];
  CHECK(row["posterior_complement"].get<double>() == Approx(1e-15).epsilon(1e-12));
  CHECK(row["posterior_probability"].get<double>() < 1.0);
}

TEST_CASE("validate lists every problem on stderr and exits 1") {
  const auto path = write_temp("cp-broken.json", R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "X-2" },
    "items": [ { "id": "E1", "model": "assigned", "p_given_hp": 1.4, "p_given_hd": 0.1 },
               { "id": "E1", "model": "reported-lr", "lr": 10 } ] })");
  const auto run = run_cli("validate '" + path.string() + "'");
  CHECK(run.exit_code == 1);
  CHECK_THAT(run.err, Catch::Contains("item E1, field p_given_hp: probability 1.4 is outside [0, 1]"));
  CHECK_THAT(run.err, Catch::Contains("duplicate item id"));
  CHECK_THAT(run.err, Catch::Contains("propositions"));
  CHECK(run.out.empty());
}

TEST_CASE("validate accepts every demo case") {
  for (const auto& entry : std::filesystem::directory_iterator(COUNTERPOISE_DEMO_DIR)) {
    if (entry.path().extension() != ".json") continue;
    CAPTURE(entry.path().string());
    const auto run = run_cli("validate '" + entry.path().string() + "'");
    CHECK(run.exit_code == 0);
  }
}

TEST_CASE("usage errors exit 2, --help and --version exit 0") {
  CHECK(run_cli("").exit_code == 2);
  CHECK(run_cli("frobnicate").exit_code == 2);
  CHECK(run_cli("evaluate").exit_code == 2);
  CHECK(run_cli("evaluate --colour " + demo("harwick-vale-breakin.json")).exit_code == 2);
  const auto help = run_cli("--help");
  CHECK(help.exit_code == 0);
  CHECK_THAT(help.out, Catch::Contains("evaluate"));
  CHECK_THAT(help.out, Catch::Contains("fact-finder"));
  const auto version = run_cli("--version");
  CHECK(version.exit_code == 0);
  CHECK_THAT(version.out, Catch::Contains(COUNTERPOISE_VERSION));
}

TEST_CASE("a missing or non-JSON file is a clear error, exit 1") {
  const auto missing = run_cli("evaluate /nonexistent/case.json");
  CHECK(missing.exit_code == 1);
  CHECK_THAT(missing.err, Catch::Contains("/nonexistent/case.json: cannot read"));
  const auto path = write_temp("cp-notjson.json", "this is not json");
  const auto bad = run_cli("evaluate '" + path.string() + "'");
  CHECK(bad.exit_code == 1);
  CHECK_THAT(bad.err, Catch::Contains("JSON syntax error at line 1"));
}

TEST_CASE("evaluate and validate accept a case store as well as JSON, with the same result") {
  const auto store = std::filesystem::temp_directory_path() / ("cp-cli-" + std::to_string(::getpid()) + ".cpcase");
  std::filesystem::remove(store);
  REQUIRE(run_cli("import " + demo("harwick-vale-breakin.json") + " -o '" + store.string() +
                  "' --examiner 'Dr Imogen Tarrant'").exit_code == 0);
  const auto from_json = run_cli("evaluate --json " + demo("harwick-vale-breakin.json"));
  const auto from_store = run_cli("evaluate --json '" + store.string() + "'");
  REQUIRE(from_store.exit_code == 0);
  CHECK(nlohmann::json::parse(from_store.out)["combined"] == nlohmann::json::parse(from_json.out)["combined"]);
  CHECK(run_cli("validate '" + store.string() + "'").exit_code == 0);
  std::filesystem::remove(store);
}

// --- method-validation ---

TEST_CASE("method-validation judges the demo method and prints every measure with its interval") {
  const Run run = run_cli("method-validation " + demo("method-validation/vale-glass-lrs.csv"));
  CHECK(run.exit_code == 0);
  CHECK(run.err.empty());
  for (const char* row : {"Cllr (bits)", "Cllr_min, after PAV", "calibration loss", "equal error rate",
                          "strongly misleading, Hd true: LR >= 100", "large fragments", "small fragments",
                          "no criterion set by the laboratory", "A validation holds for the conditions tested"})
    CHECK_THAT(run.out, Catch::Contains(row));
}

TEST_CASE("method-validation --json carries the measures, a failed criterion exits 1") {
  const Run run = run_cli("method-validation " + demo("method-validation/vale-glass-lrs.csv") + " --json --bootstrap 100");
  REQUIRE(run.exit_code == 0);
  const auto j = nlohmann::json::parse(run.out);
  for (const char* key : {"cllr", "cllr_min", "cllr_cal", "eer", "misleading", "intervals"}) CHECK(j.contains(key));
  for (const char* key : {"hp", "hd", "strong_hp", "strong_hd"}) CHECK(j.at("misleading").contains(key));
  // The demo LRs are exact for the model that simulated them: well calibrated by construction, so
  // the calibration loss is small (0.05 bits is a loose bound for 600 comparisons).
  CHECK(j.at("cllr_cal").get<double>() < 0.05);
  CHECK(j.at("intervals").at("resamples") == 100);

  const auto dir = std::filesystem::temp_directory_path() / ("cp-mv-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  std::ofstream(dir / "strict.json") << R"({"criteria": [{"characteristic": "accuracy", "metric": "cllr", "at_most": 0.01}]})";
  const Run strict = run_cli("method-validation " + demo("method-validation/vale-glass-lrs.csv") + " --criteria '" +
                             (dir / "strict.json").string() + "'");
  CHECK(strict.exit_code == 1);
  CHECK_THAT(strict.out, Catch::Contains("FAIL"));
  std::filesystem::remove_all(dir);
}

TEST_CASE("method-validation calibrates raw scores on a training set") {
  const Run run = run_cli("method-validation " + demo("method-validation/vale-glass-scores-test.csv") +
                          " --calibrate linear --train " + demo("method-validation/vale-glass-scores-train.csv") +
                          " --criteria " + demo("method-validation/vale-criteria.json"));
  CHECK(run.exit_code == 0);
  CHECK_THAT(run.out, Catch::Contains("linear (logistic-regression) calibration"));
  CHECK_THAT(run.out, !Catch::Contains("fitted on the same results"));
  const Run uncalibrated = run_cli("method-validation " + demo("method-validation/vale-glass-scores-test.csv"));
  CHECK(uncalibrated.exit_code == 1);
  CHECK_THAT(uncalibrated.err, Catch::Contains("raw scores"));
}

TEST_CASE("method-validation names the row and column of bad input, and bad options") {
  const auto dir = std::filesystem::temp_directory_path() / ("cp-mv-bad-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  std::ofstream(dir / "bad.csv") << "truth,lr\nhp,3\nhd,-2\n";
  const Run bad = run_cli("method-validation '" + (dir / "bad.csv").string() + "'");
  CHECK(bad.exit_code == 1);
  CHECK_THAT(bad.err, Catch::Contains("line 3") && Catch::Contains("lr") && Catch::Contains("positive"));
  std::ofstream(dir / "one.csv") << "truth,lr\nhp,3\nhp,2\n";
  const Run one = run_cli("method-validation '" + (dir / "one.csv").string() + "'");
  CHECK(one.exit_code == 1);
  CHECK_THAT(one.err, Catch::Contains("needs both"));
  CHECK(run_cli("method-validation " + demo("method-validation/vale-glass-lrs.csv") + " --calibrate magic").exit_code == 2);
  CHECK(run_cli("method-validation " + demo("method-validation/vale-glass-lrs.csv") + " --bootstrap 0").exit_code == 2);
  std::filesystem::remove_all(dir);
}

// validate and report agree (docs/reasoning-guard.md, "Validate and report agree"): a statement
// that will make report refuse a casework report makes validate exit 1, naming the statement, its
// item and field; a case report accepts passes validate. The demo break-in case is copied with a
// transposed conditional (the probability of an activity stated as the scientist's finding; ENFSI
// 2015, Guideline for Evaluative Reporting in Forensic Science) written into an item's notes.
namespace {

const char* kFlaggedNote = "There is a 99.9% probability that Mr Ashby broke the window of the bakery.";

// Whether this counterpoise-cli was built with the reports library (report listed in --help).
bool report_available() { return run_cli("--help").out.find("report CASE -o") != std::string::npos; }

std::filesystem::path agreement_dir() {
  const auto dir = std::filesystem::temp_directory_path() / ("cp-cli-agree-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  return dir;
}

nlohmann::json breakin() {
  std::ifstream in(std::string(COUNTERPOISE_DEMO_DIR) + "/harwick-vale-breakin.json");
  return nlohmann::json::parse(in);
}

std::string write_case(const std::string& name, const nlohmann::json& document) {
  const auto path = agreement_dir() / name;
  std::ofstream(path) << document.dump(2);
  return "'" + path.string() + "'";
}

Run report(const std::string& quoted_case, const std::string& name) {
  return run_cli("report " + quoted_case + " -o '" + (agreement_dir() / (name + ".pdf")).string() + "'");
}

// The lines that name a refusing statement ("  item E1, field notes: rule ...").
std::vector<std::string> statement_lines(const std::string& err) {
  std::vector<std::string> lines;
  std::istringstream in(err);
  for (std::string line; std::getline(in, line);)
    if (line.rfind("  item ", 0) == 0) lines.push_back(line);
  return lines;
}

}  // namespace

TEST_CASE("validate and report agree: a flagged statement makes validate exit 1 naming it, and report exit 3") {
  // In an item's notes, and in an item's title (the user's text too, though printed as a heading).
  for (const auto& [pointer, place] : std::vector<std::pair<std::string, std::string>>{
           {"/items/0/notes", "item E1, field notes"}, {"/items/1/title", "item E2, field title"}}) {
    INFO(pointer);
    auto document = breakin();
    document[nlohmann::json::json_pointer(pointer)] = kFlaggedNote;
    const std::string name = "flagged-" + pointer.substr(pointer.rfind('/') + 1);
    const auto flagged = write_case(name + ".json", document);
    const auto validated = run_cli("validate " + flagged);
    CHECK(validated.exit_code == 1);
    CHECK_THAT(validated.out, Catch::Contains("valid (4 items)"));
    CHECK_THAT(validated.err, Catch::Contains("report will refuse the casework report: 1 statement is flagged"));
    const auto lines = statement_lines(validated.err);
    REQUIRE(lines.size() == 1);
    CHECK_THAT(lines[0], Catch::StartsWith("  " + place + ": rule "));
    CHECK_THAT(lines[0], Catch::Contains(kFlaggedNote));
    if (!report_available()) {
      WARN("counterpoise-cli was built without the reports library; report not run");
      continue;
    }
    const auto reported = report(flagged, name);
    CHECK(reported.exit_code == 3);
    CHECK(statement_lines(reported.err) == lines);
    CHECK_FALSE(std::filesystem::exists(agreement_dir() / (name + ".pdf")));
  }
}

TEST_CASE("validate and report agree: a clean case, an overridden statement and a training case pass both") {
  auto flagged = breakin();
  flagged["items"][0]["notes"] = kFlaggedNote;
  const std::string line = statement_lines(run_cli("validate " + write_case("flagged.json", flagged)).err).at(0);
  const auto rule_at = line.find(": rule ") + 7;
  const std::string rule = line.substr(rule_at, line.find(' ', rule_at) - rule_at);

  auto overridden = flagged;
  overridden["report"] = {{"wording_overrides", {{{"rule", rule}, {"item", "E1"}, {"reason", "Quoted from the request."}}}}};
  auto training = flagged;
  training["mode"] = "training";
  for (const auto& [name, document] : std::vector<std::pair<std::string, nlohmann::json>>{
           {"clean", breakin()}, {"overridden", overridden}, {"training", training}}) {
    INFO(name);
    const auto path = write_case(name + ".json", document);
    const auto validated = run_cli("validate " + path);
    CHECK(validated.exit_code == 0);
    CHECK(statement_lines(validated.err).empty());
    if (report_available()) CHECK(report(path, name).exit_code == 0);
  }
}

TEST_CASE("validate and report agree: an invalid override is an error for both, naming the field") {
  auto document = breakin();
  document["report"] = {{"wording_overrides", {{{"rule", "X"}, {"item", "E9"}, {"reason", "x"}}}}};
  const auto path = write_case("bad-override.json", document);
  const auto validated = run_cli("validate " + path);
  CHECK(validated.exit_code == 1);
  CHECK_THAT(validated.err, Catch::Contains("item report, field wording_overrides[0].item"));
  if (report_available()) CHECK(report(path, "bad-override").exit_code == 1);
}

TEST_CASE("--help documents the exit codes of validate and report") {
  const auto help = run_cli("--help");
  CHECK_THAT(help.out, Catch::Contains("1 invalid input (validate: also a statement the report's wording check"));
  if (report_available()) CHECK_THAT(help.out, Catch::Contains("3 wording flagged (check-wording) or report refused"));
}

// Terminal injection: every text that came from a file or an argument is shown escaped. The
// sequences are ECMA-48's (5th ed. 1991): OSC "ESC ] 0;…BEL" sets the window title (8.3.89),
// CSI "ESC [ 2J" erases the display (8.3.39); 0x9B is the one-byte CSI (section 5.3).
namespace {

const std::string kRetitle = "\x1b]0;owned\x07";
const std::string kClear = "\x1b[2J";

bool has_raw_control(const std::string& text) {
  for (unsigned char c : text)
    if ((c < 0x20 && c != '\n') || c == 0x7F) return true;
  return text.find("\xc2\x9b") != std::string::npos;
}

std::string hostile_case_text() {
  const nlohmann::json hostile = kRetitle + kClear + "\xc2\x9b";
  const std::string h = hostile.dump().substr(1, hostile.dump().size() - 2);  // JSON-escaped, unquoted
  return R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "R)" + h + R"(", "title": "T)" + h + R"(", "examiner": "X)" + h + R"(" },
    "propositions": { "level": "source", "hp": "Hp)" + h + R"(", "hd": "Hd)" + h + R"(" },
    "items": [ { "id": "E)" + h + R"(", "title": "I)" + h + R"(", "model": "reported-lr", "lr": 100 },
               { "id": "F)" + h + R"(", "model": "reported-lr", "lr": 2,
                 "combination": { "included": false, "exclusion_reason": "W)" + h + R"(" } } ] })";
}

}  // namespace

TEST_CASE("escape sequences in every printed field reach the terminal escaped") {
  const auto folder = std::filesystem::temp_directory_path() / ("cp-hostile-" + std::to_string(::getpid()));
  std::filesystem::create_directories(folder);
  const auto json_path = folder / ("case" + kClear + ".json");
  std::ofstream(json_path) << hostile_case_text();
  const auto store = folder / ("store" + kRetitle + ".cpcase");
  const auto exported = folder / ("out" + kClear + ".json");
  const std::string q = "'";

  const auto table = run_cli("evaluate " + q + json_path.string() + q);
  REQUIRE(table.exit_code == 0);
  CHECK_FALSE(has_raw_control(table.out + table.err));
  CHECK_THAT(table.out, Catch::Contains("Case R\\x1b]0;owned\\x07\\x1b[2J\\u{9b}"));
  CHECK_THAT(table.out, Catch::Contains("E\\x1b]0;owned\\x07\\x1b[2J\\u{9b}"));
  CHECK_THAT(table.out, Catch::Contains("left out: W\\x1b]0;owned"));

  const auto as_json = run_cli("evaluate --json " + q + json_path.string() + q);
  REQUIRE(as_json.exit_code == 0);
  CHECK_FALSE(has_raw_control(as_json.out));
  // Still valid JSON (RFC 8259), and the strings parse back to exactly what the case holds.
  const auto parsed = nlohmann::json::parse(as_json.out);
  CHECK(parsed["items"][0]["id"] == "E" + kRetitle + kClear + "\xc2\x9b");

  const auto valid = run_cli("validate " + q + json_path.string() + q);
  CHECK(valid.exit_code == 0);
  CHECK_FALSE(has_raw_control(valid.out + valid.err));
  CHECK_THAT(valid.out, Catch::Contains("case\\x1b[2J.json: valid"));

  // An examiner's declared name may not hold a control character at all: refused, and the
  // refusal shows the name escaped.
  const auto refused = run_cli("import " + q + json_path.string() + q + " -o " + q + store.string() + q +
                               " --examiner " + q + "Ann" + kRetitle + q);
  CHECK(refused.exit_code == 1);
  CHECK_FALSE(has_raw_control(refused.out + refused.err));
  CHECK_THAT(refused.err, Catch::Contains("control character"));
  CHECK_FALSE(std::filesystem::exists(store));

  const auto imported = run_cli("import " + q + json_path.string() + q + " -o " + q + store.string() + q +
                                " --examiner Ann");
  REQUIRE(imported.exit_code == 0);
  CHECK_FALSE(has_raw_control(imported.out + imported.err));
  CHECK_THAT(imported.out, Catch::Contains("store\\x1b]0;owned\\x07.cpcase: created from"));
  for (const char* command : {"history ", "history --json ", "verify "}) {
    const auto run = run_cli(command + q + store.string() + q);
    CAPTURE(command);
    CHECK(run.exit_code == 0);
    CHECK_FALSE(has_raw_control(run.out + run.err));
  }
  // The stored case text comes back exactly, through JSON escapes (RFC 8259 section 7).
  CHECK(nlohmann::json::parse(run_cli("history --json " + q + store.string() + q).out)["audit"][0]["new_value"]["case"]
                             ["title"] == "T" + kRetitle + kClear + "\xc2\x9b");
  const auto export_run = run_cli("export " + q + store.string() + q + " -o " + q + exported.string() + q);
  CHECK(export_run.exit_code == 0);
  CHECK_FALSE(has_raw_control(export_run.out + export_run.err));

  if (report_available()) {
    const auto written = run_cli("report " + q + json_path.string() + q + " -o " + q +
                                 (folder / ("r" + kClear + ".pdf")).string() + q + " --examiner Ann");
    CHECK(written.exit_code == 0);
    CHECK_FALSE(has_raw_control(written.out + written.err));
    CHECK_THAT(written.out, Catch::Contains("r\\x1b[2J.pdf"));
    // The case's examiner (a hostile name) is quoted escaped in the refusal to seal.
    const auto not_sealed = run_cli("report " + q + store.string() + q + " -o " + q +
                                    (folder / "r2.pdf").string() + q + " --examiner Ann");
    CHECK(not_sealed.exit_code == 1);
    CHECK_FALSE(has_raw_control(not_sealed.out + not_sealed.err));
    CHECK_THAT(not_sealed.err, Catch::Contains("(X\\x1b]0;owned\\x07\\x1b[2J\\u{9b})"));
  }

  const auto unknown = run_cli(q + "frob" + kClear + q);
  CHECK(unknown.exit_code == 2);
  CHECK_FALSE(has_raw_control(unknown.err));
  std::filesystem::remove_all(folder);
}

TEST_CASE("a damaged file's bytes are escaped in the message: invalid UTF-8 and control characters") {
  const auto path = write_temp("cp-damaged.json", "{ \"format\": \"counterpoise.case\", \"version\": 1, \x1b[2J\xff\xfe }");
  const auto run = run_cli("validate '" + path.string() + "'");
  CHECK(run.exit_code == 1);
  CHECK_FALSE(has_raw_control(run.err));
  CHECK(run.err.find('\xff') == std::string::npos);
  CHECK_THAT(run.err, Catch::Contains("JSON syntax error"));
}

TEST_CASE("check-wording shows the flagged wording and the file name escaped") {
  const auto path = write_temp("cp-wording\x1b[2J.txt",
                               "The probability that the defendant is not the source is one in a million." + kRetitle +
                                   "\n");
  for (const char* flags : {"", "--json "}) {
    const auto run = run_cli(std::string("check-wording ") + flags + "'" + path.string() + "'");
    CAPTURE(flags);
    CHECK(run.exit_code == 3);
    CHECK_FALSE(has_raw_control(run.out + run.err));
  }
}

TEST_CASE("evaluate shows Hp against each alternative, the weighted set and the illustration over the set") {
  const auto text = run_cli("evaluate " + demo("harwick-vale-glass-alternatives.json"));
  REQUIRE(text.exit_code == 0);
  for (const char* part : {"Hd2: The glass fragments came from the glazing workshop", "(weight 3)",
                           "(unspecified alternative)", "against Hd3", "against the set",
                           "Combined against each alternative", "rather than Hd2",
                           "With the weights stated as the fact-finder's", "Against the specified alternatives alone",
                           "P(Hd3)", "(against Hd1 alone)"})
    CHECK_THAT(text.out, Catch::Contains(part));
  const auto run = run_cli("evaluate --json " + demo("harwick-vale-glass-alternatives.json"));
  REQUIRE(run.exit_code == 0);
  const auto j = nlohmann::json::parse(run.out);
  REQUIRE(j["combined"]["by_alternative"].size() == 3);
  for (const auto& entry : j["combined"]["by_alternative"])
    for (const char* key : {"id", "log10_lr", "interval_log10", "verbal"}) CHECK(entry.contains(key));
  CHECK(j["items"][0]["by_alternative"][1]["id"] == "Hd2");
  CHECK(j["combined"]["compound"].contains("log10_lr"));
  CHECK(j["combined"]["compound"].contains("interval_log10"));
  CHECK(j["sensitivity_over_set"].size() == 10);  // the default illustration, 1e-6 to 1e3 by decades
}

// The demo case with per-alternative inputs in two models: a mixture whose contributors differ by
// alternative (under Hd2 the person of interest handled the strap: the same contributors as under
// Hp, so LR 1 exactly, common practice) and a transfer item with its own transfer under Hd2,
// checked against Evett's formula with the Beta and counts means written out (DOMAIN, transfer
// evidence; counts k of n by Laplace's rule of succession, mean (k+1)/(n+2)).
TEST_CASE("evaluate reads the demo case with per-alternative mixture and transfer inputs") {
  const auto run = run_cli("evaluate --json " + demo("harwick-vale-handbag-alternatives.json"));
  REQUIRE(run.exit_code == 0);
  const auto j = nlohmann::json::parse(run.out);
  REQUIRE(j["items"].size() == 2);
  const auto& mixture = j["items"][0]["by_alternative"];
  REQUIRE(mixture.size() == 2);
  CHECK(mixture[1]["id"] == "Hd2");
  CHECK(mixture[1]["log10_lr"].get<double>() == Approx(0.0).margin(1e-12));  // identical terms, rounding only
  CHECK(mixture[0]["log10_lr"].get<double>() > 10);
  // Transfer, one group of n found: under Hp t0 P1 Sn γ + tn P0; under Hd1 P1 Sn γ (nothing
  // transferred); under Hd2 the same form as Hp with t0 and tn under Hd2.
  const double t0 = 3.0 / 30, tn = 8.0 / 40, t0_hd2 = 18.0 / 30, tn_hd2 = 3.0 / 30;  // Beta(a, b) means a/(a+b)
  const double p0 = 143.0 / 202, p1 = 47.0 / 202, sn = 8.0 / 48, gamma = 3.0 / 352;   // counts (k+1)/(n+2)
  const double hp = t0 * p1 * sn * gamma + tn * p0;
  const auto& transfer = j["items"][1]["by_alternative"];
  // 1e-9 in log10: the model's terms are computed in log space, the test in plain doubles.
  CHECK(transfer[0]["log10_lr"].get<double>() == Approx(std::log10(hp / (p1 * sn * gamma))).margin(1e-9));
  CHECK(transfer[1]["log10_lr"].get<double>() ==
        Approx(std::log10(hp / (t0_hd2 * p1 * sn * gamma + tn_hd2 * p0))).margin(1e-9));
}

// A weight the user entered is printed with every digit, never rounded to the figures of a
// result: 9 998 stays 9 998, not "10 000" (docs/methods.md, "How numbers are written").
TEST_CASE("evaluate prints an entered weight exactly and the normalised weights as the report does") {
  auto document = nlohmann::json::parse(std::ifstream(COUNTERPOISE_DEMO_DIR "/harwick-vale-glass-alternatives.json"));
  document["propositions"]["alternatives"][0]["weight"] = 9998;
  const auto path = write_temp("cp-weights.json", document.dump());
  const auto text = run_cli("evaluate '" + path.string() + "'");
  REQUIRE(text.exit_code == 0);
  CHECK_THAT(text.out, Catch::Contains("(weight 9\u202f998)"));
  CHECK_THAT(text.out, !Catch::Contains("(weight 10\u202f000)"));
}

TEST_CASE("a two-proposition case's evaluate --json has no per-alternative fields") {
  const auto run = run_cli("evaluate --json " + demo("harwick-vale-breakin.json"));
  REQUIRE(run.exit_code == 0);
  const auto j = nlohmann::json::parse(run.out);
  CHECK_FALSE(j["combined"].contains("by_alternative"));
  CHECK_FALSE(j["items"][0].contains("by_alternative"));
  CHECK_FALSE(j.contains("sensitivity_over_set"));
}
