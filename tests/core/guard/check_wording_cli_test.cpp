// counterpoise-cli check-wording: exit codes (0 clean, 3 flagged, 1 unreadable input, 2 usage;
// app/cli/cli_command.hpp) and the JSON form of the findings.
#include <catch2/catch.hpp>
#include <unistd.h>

#include <sys/wait.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

namespace {

struct Run {
  int exit_code;
  std::string out;
};

Run run_cli(const std::string& arguments, const std::string& input_text) {
  const auto dir = std::filesystem::temp_directory_path();
  // Named per process: ctest -j runs this file's test cases side by side.
  const std::string pid = std::to_string(::getpid());
  const auto input = dir / ("counterpoise-guard-cli-input-" + pid + ".txt");
  const auto output = dir / ("counterpoise-guard-cli-output-" + pid + ".txt");
  std::ofstream(input, std::ios::binary) << input_text;
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' check-wording " + arguments + " < '" +
                              input.string() + "' > '" + output.string() + "' 2>/dev/null";
  const int status = std::system(command.c_str());
  std::ifstream in(output);
  std::stringstream text;
  text << in.rdbuf();
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, text.str()};
}

}  // namespace

TEST_CASE("check-wording CLI: exit codes") {
  CHECK(run_cli("-", "The findings are 100 times more probable if Hp than if Hd.\n").exit_code == 0);
  CHECK(run_cli("-", "The chance that this match is a coincidence is 1 in 500.\n").exit_code == 3);
  CHECK(run_cli("-", "It would be wrong to say the chance that this match is a coincidence is 1 in 500.\n").exit_code == 0);
  CHECK(run_cli("-", std::string("bad \xFF byte")).exit_code == 1);
  CHECK(run_cli("/nonexistent/file.txt", "").exit_code == 1);
  CHECK(run_cli("", "").exit_code == 2);
  CHECK(run_cli("- --mode court", "").exit_code == 2);
  CHECK(run_cli("- --unknown", "").exit_code == 2);
  CHECK(run_cli("- --rules /nonexistent/rules.json", "text").exit_code == 1);
  const std::string posterior = "The posterior probability that he is the source is 0.99.\n";
  CHECK(run_cli("- --mode casework", posterior).exit_code == 3);
  CHECK(run_cli("- --mode training", posterior).exit_code == 0);
}

TEST_CASE("check-wording CLI: JSON findings carry rule, family, spans and the filled rewrite") {
  const Run run = run_cli("- --json --hp 'he left the stain' --hd 'someone else left it'",
                          "Fine.\nThere is a 1 in 1,000 chance that someone else left the stain.\n");
  CHECK(run.exit_code == 3);
  const auto doc = nlohmann::json::parse(run.out);
  CHECK(doc.at("flagged") == true);
  REQUIRE(doc.at("findings").size() == 1);
  const auto& f = doc["findings"][0];
  CHECK(f.at("family") == "source-probability");
  CHECK(f.at("severity") == "error");
  CHECK(f.at("line") == 2);
  CHECK(f.at("span").at("byte_begin").get<int>() > 6);
  CHECK(f.at("suggestion") == "The findings are about 1,000 times more probable if he left the stain than if someone else left it.");
}

// A sentence no rule matches and the shipped learned reading flags (docs/reasoning-guard.md,
// "The learned reading"): --rules-only leaves it to the rules.
TEST_CASE("check-wording CLI: --rules-only leaves the learned reading out") {
  const std::string sentence = "So the paint flake on his sleeve tells us plainly where he was standing that evening.\n";
  const Run both = run_cli("-", sentence);
  CHECK(both.exit_code == 3);
  CHECK(both.out.find("[LW-") != std::string::npos);
  const Run rules = run_cli("- --rules-only", sentence);
  CHECK(rules.exit_code == 0);
  CHECK(rules.out.find("[LW-") == std::string::npos);
}
