// The case interchange file: the shape of the issue, lossless round trips, every validation
// error named by item and field.
#include <catch2/catch.hpp>
#include <filesystem>

#include "core/interchange/case_json.hpp"
#include "core/reading/text_file.hpp"

using namespace counterpoise::interchange;
using nlohmann::json;

namespace {

json minimal_case() {
  // The example shape given in the Foundation issue (values invented).
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-1", "title": "Shape of the interchange file" },
    "propositions": { "level": "source", "hp": "The glass came from the window", "hd": "The glass came from another source" },
    "items": [
      { "id": "E1", "title": "Glass", "model": "assigned", "p_given_hp": 0.95, "p_given_hd": { "counts": { "k": 3, "n": 412 } } },
      { "id": "E2", "model": "reported-lr", "lr": 2.0e4, "interval": [5.0e3, 6.0e4] }
    ],
    "priors": { "odds": [1e-6, 1e-3, 1] } })");
}

std::string problems_text(const CaseReadResult& r) {
  std::string all;
  for (const auto& p : r.diagnostics.problems()) all += p.text() + "\n";
  return all;
}

CaseReadResult read_modified(const std::function<void(json&)>& change) {
  json doc = minimal_case();
  change(doc);
  return read_case(doc, ".");
}

}  // namespace

TEST_CASE("the issue's example case reads without problems") {
  const auto result = read_case(minimal_case(), ".");
  INFO(problems_text(result));
  REQUIRE(result.value);
  CHECK(result.value->items.size() == 2);
  CHECK(result.value->priors->odds.size() == 3);
}

TEST_CASE("writing a read case reproduces the document exactly (canonical form)") {
  const auto result = read_case(minimal_case(), ".");
  REQUIRE(result.value);
  CHECK(canonical_text(write_case(*result.value)) == canonical_text(minimal_case()));
}

TEST_CASE("every demo case round-trips losslessly") {
  for (const auto& entry : std::filesystem::directory_iterator(COUNTERPOISE_DEMO_DIR)) {
    if (entry.path().extension() != ".json") continue;
    CAPTURE(entry.path().string());
    const json doc = parse_json_text(counterpoise::reading::read_text_file(entry.path(), {"file", ""}), entry.path().string());
    const auto result = read_case(doc, entry.path().parent_path());
    INFO(problems_text(result));
    REQUIRE(result.value);
    CHECK(canonical_text(write_case(*result.value)) == canonical_text(doc));
  }
}

TEST_CASE("each validation error names the item and the field") {
  using Change = std::function<void(json&)>;
  const auto [change, fragment] = GENERATE(table<Change, const char*>({
      {[](json& d) { d["items"][0]["p_given_hp"] = 1.5; }, "item E1, field p_given_hp: probability 1.5 is outside [0, 1]"},
      {[](json& d) { d["items"][0]["p_given_hd"] = json{{"counts", {{"k", -2}, {"n", 10}}}}; }, "item E1, field p_given_hd.counts.k: count -2 must not be negative"},
      {[](json& d) { d["items"][0]["p_given_hd"] = json{{"counts", {{"k", 12}, {"n", 10}}}}; }, "item E1, field p_given_hd.counts.k: k = 12 is greater than n = 10"},
      {[](json& d) { d["items"][0]["p_given_hd"] = json{{"interval", {0.2, 0.1}}}; }, "item E1, field p_given_hd.interval: interval low 0.2 is greater than high 0.1"},
      {[](json& d) { d["items"][0]["p_given_hd"] = json{{"beta", {0, 3}}}; }, "item E1, field p_given_hd.beta[0]"},
      {[](json& d) { d["items"][0]["p_given_hp"] = 0; d["items"][0]["p_given_hd"] = 0; }, "item E1, field p_given_hd: P(E|Hp) and P(E|Hd) are both zero"},
      {[](json& d) { d["items"][0]["model"] = "palm-reading"; }, "item E1, field model: unknown model \"palm-reading\""},
      {[](json& d) { d["items"][1]["id"] = "E1"; }, "item E1, field id: duplicate item id"},
      {[](json& d) { d.erase("propositions"); }, "item propositions: missing"},
      {[](json& d) { d["propositions"].erase("hd"); }, "item propositions, field hd: missing field"},
      {[](json& d) { d["propositions"]["level"] = "planetary"; }, "item propositions, field level: unknown level"},
      {[](json& d) { d["format"] = "another.tool"; }, "item file, field format: not a Counterpoise case file"},
      {[](json& d) { d["version"] = 2; }, "item file, field version: case file version 2 is newer"},
      {[](json& d) { d["items"][1]["lr"] = -3; }, "item E2, field lr: likelihood ratio -3 must not be negative"},
      {[](json& d) { d["items"][1]["interval"] = json{1e5, 2e5}; }, "item E2, field interval: the interval does not contain"},
      {[](json& d) { d["items"][0]["p_given_hq"] = 0.1; }, "item E1, field p_given_hq: unknown field"},
      {[](json& d) { d["items"][0]["combination"] = json{{"included", false}}; }, "item E1, field combination.exclusion_reason"},
      {[](json& d) { d["priors"]["odds"] = json{1e-6, -1}; }, "item priors, field odds[1]"},
      {[](json& d) { d["priors"]["one_of_n"] = json{1}; }, "item priors, field one_of_n[0]: N must be at least 2"},
      {[](json& d) { d["priors"]["thresholds"] = json{1.0}; }, "item priors, field thresholds[0]"},
      {[](json& d) { d["uncertainty"] = json{{"seed", -4}}; }, "item uncertainty, field seed"},
      {[](json& d) { d["items"] = json::array(); }, "item items: a case needs at least one item"},
      {[](json& d) { d["case"].erase("reference"); }, "item case, field reference: missing field"},
      {[](json& d) { d["verbal_scale"] = "horoscope"; }, "item verbal_scale: unknown built-in scale"},
  }));
  const auto result = read_modified(change);
  CAPTURE(fragment);
  CHECK_FALSE(result.value);
  CHECK_THAT(problems_text(result), Catch::Contains(fragment));
}

TEST_CASE("validate lists every problem, not only the first") {
  const auto result = read_modified([](json& d) {
    d["items"][0]["p_given_hp"] = 2.0;
    d["items"][1]["lr"] = -1;
    d["propositions"].erase("hp");
  });
  CHECK(result.diagnostics.problems().size() == 3);
}

TEST_CASE("hostile JSON text: syntax errors name the line, deep nesting and huge numbers are refused") {
  CHECK_THROWS_WITH(parse_json_text("{\n  \"format\": ,\n}", "x.json"), Catch::Contains("line 2"));
  CHECK_THROWS_WITH(parse_json_text(std::string(10000, '[') + std::string(10000, ']'), "deep.json"),
                    Catch::Contains("nested more than 64 levels"));
  CHECK_THROWS_WITH(parse_json_text("{\"a\": \"\xff\xfe\"}", "utf.json"), Catch::Contains("JSON syntax error at line 1"));
  CHECK_THROWS_WITH(parse_json_text("{\"p\": 1e400}", "huge.json"), Catch::Contains("too large to represent"));
  const auto missing = read_case_file("/nonexistent/case.json");
  CHECK_THAT(problems_text(missing), Catch::Contains("/nonexistent/case.json: cannot read"));
}
