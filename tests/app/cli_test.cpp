// counterpoise-cli as a user runs it on the demo cases and on broken files.
#include <catch2/catch.hpp>
#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <nlohmann/json.hpp>

namespace {

struct Run {
  int exit_code;
  std::string out;
  std::string err;
};

// Runs the CLI with `args` (already shell-quoted), capturing stdout and stderr separately.
Run run_cli(const std::string& args) {
  const auto err_path = std::filesystem::temp_directory_path() / ("cp-cli-err-" + std::to_string(::getpid()));
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' " + args + " 2>'" + err_path.string() + "'";
  Run run{};
  FILE* pipe = ::popen(command.c_str(), "r");
  REQUIRE(pipe);
  std::array<char, 4096> buffer{};
  std::size_t n;
  while ((n = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0) run.out.append(buffer.data(), n);
  const int status = ::pclose(pipe);
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  std::ifstream err(err_path);
  run.err.assign(std::istreambuf_iterator<char>(err), {});
  std::filesystem::remove(err_path);
  return run;
}

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

TEST_CASE("usage errors exit 2; --help and --version exit 0") {
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
