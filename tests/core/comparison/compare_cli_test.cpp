// counterpoise-cli compare, run as a user would run it: the demo pair, a case against itself,
// sealed revisions of a case store, and the errors.
#include <array>
#include <cmath>
#include <cstdio>

#include <catch2/catch.hpp>
#include <sys/wait.h>

#include "core/store/case_store.hpp"
#include "tests/core/comparison/comparison_test_support.hpp"
#include "tests/core/store/store_test_support.hpp"

using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

struct Run {
  int code = -1;
  std::string output;  // stdout and stderr together
};

std::string quoted(const std::string& text) {
  std::string out = "'";
  for (char c : text) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

Run cli(const std::vector<std::string>& args) {
  std::string command = quoted(COUNTERPOISE_CLI);
  for (const auto& a : args) command += " " + quoted(a);
  Run run;
  FILE* pipe = ::popen((command + " 2>&1").c_str(), "r");
  REQUIRE(pipe != nullptr);
  std::array<char, 4096> buffer{};
  while (std::size_t n = std::fread(buffer.data(), 1, buffer.size(), pipe)) run.output.append(buffer.data(), n);
  const int status = ::pclose(pipe);
  run.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return run;
}

const std::string kDemo = std::string(COUNTERPOISE_DEMO_DIR) + "/comparison/";
const std::string kProsecution = kDemo + "harwick-vale-grain-store-prosecution.json";
const std::string kDefence = kDemo + "harwick-vale-grain-store-defence.json";

double evaluated_log10(const std::string& path) {
  const Run run = cli({"evaluate", path, "--json"});
  REQUIRE(run.code == 0);
  return json::parse(run.output)["combined"]["log10_lr"].get<double>();
}

}  // namespace

TEST_CASE("compare: the demo pair, prosecution and defence versions of one case", "[comparison][cli]") {
  const Run text = cli({"compare", kProsecution, kDefence});
  REQUIRE(text.code == 0);
  CHECK_THAT(text.output, Contains("Data file changed: allele frequencies of G1"));
  CHECK_THAT(text.output, Contains("Item added: item G5"));
  CHECK_THAT(text.output, Contains("Item now included in the combined LR: combination of G4"));
  CHECK_THAT(text.output, Contains("The verbal expression changes: extremely strong support for Hp → very strong support for Hp"));
  CHECK_THAT(text.output, Contains("fact-finder"));

  const Run run = cli({"compare", kProsecution, kDefence, "--json"});
  REQUIRE(run.code == 0);
  const json result = json::parse(run.output);
  // The combined LRs are the ones evaluate reports for each version on its own.
  CHECK(result["log10_lr_a"].get<double>() == Approx(evaluated_log10(kProsecution)).margin(1e-12));
  CHECK(result["log10_lr_b"].get<double>() == Approx(evaluated_log10(kDefence)).margin(1e-12));
  const double total = result["total_change_log10"].get<double>();
  CHECK(total == Approx(result["log10_lr_b"].get<double>() - result["log10_lr_a"].get<double>()).margin(1e-12));
  double sum = 0.0;
  for (const auto& d : result["differences"]) {
    REQUIRE(d.contains("path"));
    CHECK(d["path"].contains("section"));
    CHECK(d.contains("old"));
    CHECK(d.contains("new"));
    sum += d["effect_log10"].get<double>();
  }
  // The shares add up to the total change (JSON carries 17 significant digits).
  CHECK(std::abs(sum - total) < 1e-12);
  CHECK(result["band_changes"] == true);
}

TEST_CASE("compare: a case with itself has no difference", "[comparison][cli]") {
  const Run run = cli({"compare", kProsecution, kProsecution});
  CHECK(run.code == 0);
  CHECK_THAT(run.output, Contains("none: the two versions are the same case"));
  const json result = json::parse(cli({"compare", kProsecution, kProsecution, "--json"}).output);
  CHECK(result["differences"].empty());
  CHECK(result["total_change_log10"] == 0.0);
}

TEST_CASE("compare: sealed revisions of a case store and its current state", "[comparison][cli][store]") {
  using namespace counterpoise;
  store_test::TempDir dir;
  const std::string path = (dir / "case.cpcase").string();
  {
    auto stored = store::CaseStore::create(path, store_test::sample_case(), store_test::kThwaite);
    stored.seal_revision(store_test::kThwaite, "report 1", "report-1.pdf");
    stored.set_field(store_test::kThwaite, store::EntityRef::item("E3"), "p_given_hd", json(0.05));
    stored.seal_revision(store_test::kThwaite, "report 2", "report-2.pdf");
    stored.set_field(store_test::kThwaite, store::EntityRef::item("E2"), "lr", json(1.0e4));
  }
  const Run sealed_run = cli({"compare", path + "@1", path + "@2", "--json"});
  INFO(sealed_run.output);
  REQUIRE(sealed_run.code == 0);
  const json sealed = json::parse(sealed_run.output);
  REQUIRE(sealed["differences"].size() == 1);
  CHECK(sealed["differences"][0]["path"] == json({{"section", "items"}, {"item", "E3"}, {"field", "p_given_hd"}}));
  // Assigned model: log10 P(E|Hd) moved from log10 0.013 to log10 0.05.
  CHECK(sealed["differences"][0]["effect_log10"].get<double>() == Approx(std::log10(0.013 / 0.05)).epsilon(1e-13));
  // The store without a revision is its current state: revision 2 plus the open edit.
  const Run current_run = cli({"compare", path + "@2", path, "--json"});
  INFO(current_run.output);
  REQUIRE(current_run.code == 0);
  const json current = json::parse(current_run.output);
  REQUIRE(current["differences"].size() == 1);
  CHECK(current["differences"][0]["path"]["field"] == "lr");

  const Run unsealed = cli({"compare", path + "@3", path});
  CHECK(unsealed.code == 1);
  CHECK_THAT(unsealed.output, Contains("@3"));
  CHECK(cli({"compare", path + "@x", path}).code == 2);
}

TEST_CASE("compare: usage and input errors", "[comparison][cli]") {
  CHECK(cli({"compare", kProsecution}).code == 2);
  CHECK(cli({"compare", kProsecution, kDefence, "--colour"}).code == 2);
  const Run missing = cli({"compare", kProsecution, "/nonexistent/case.json"});
  CHECK(missing.code == 1);
  CHECK_THAT(missing.output, Contains("/nonexistent/case.json"));
}

TEST_CASE("compare: text from a case reaches the terminal escaped", "[comparison][cli]") {
  store_test::TempDir dir;
  json hostile = comparison_test::three_item_case();
  hostile["items"][0]["title"] = "Paint\x1b]0;owned\x07 on the crowbar";
  const auto a = (dir / "a.json").string(), b = (dir / "b.json").string();
  store_test::write_bytes(a, comparison_test::three_item_case().dump());
  store_test::write_bytes(b, hostile.dump());
  const Run run = cli({"compare", a, b});
  CHECK(run.code == 0);
  CHECK(run.output.find('\x1b') == std::string::npos);
  CHECK_THAT(run.output, Contains("\\x1b]0;owned\\x07"));
}
