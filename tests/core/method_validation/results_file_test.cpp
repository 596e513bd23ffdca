// Reading validation results: every bad row is named by its line and column.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include "core/method_validation/results_file.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::method_validation;
using counterpoise::validation::InvalidValue;

namespace {
std::string message_of(const std::string& text, bool json = false) {
  try {
    json ? parse_results_json(text, "r.json") : parse_results_csv(text, "r.csv");
  } catch (const InvalidValue& e) {
    return e.what();
  }
  return "no error";
}
}  // namespace

TEST_CASE("a CSV of LRs with conditions") {
  const ResultsTable t = parse_results_csv("truth,lr,condition\nhp,100,low\nHD,0.5,low\nhp,inf,high\nhd,2,high\n", "r.csv");
  CHECK(t.value == ResultValue::lr);
  REQUIRE(t.all.hp_log10_lr.size() == 2);
  CHECK(t.all.hp_log10_lr[0] == Approx(2.0));
  CHECK(t.all.hp_log10_lr[1] == INFINITY);
  CHECK(t.all.hd_log10_lr[0] == Approx(std::log10(0.5)));
  CHECK(t.by_condition.size() == 2);
  CHECK(t.by_condition.at("high").hp_log10_lr.size() == 1);
}

TEST_CASE("log10 LRs may be infinite in either direction, scores are read as they are") {
  const ResultsTable t = parse_results_csv("log10_lr,truth\n-inf,hd\n3.5,hp\n", "r.csv");
  CHECK(t.all.hd_log10_lr[0] == -INFINITY);
  const ResultsTable s = parse_results_csv("truth,score\nhp,12.5\nhd,-3\n", "r.csv");
  CHECK(s.value == ResultValue::score);
  CHECK(s.all.hp_log10_lr[0] == 12.5);
}

TEST_CASE("the JSON form reads the same") {
  const ResultsTable t = parse_results_json(R"({"results": [{"truth": "hp", "log10_lr": 2}, {"truth": "hd", "log10_lr": "-inf"}]})", "r.json");
  CHECK(t.all.hp_log10_lr[0] == 2.0);
  CHECK(t.all.hd_log10_lr[0] == -INFINITY);
}

TEST_CASE("bad rows are named by line and column") {
  CHECK_THAT(message_of("truth,lr\nhp,2\nsame,3\n"), Catch::Contains("line 3") && Catch::Contains("truth") && Catch::Contains("hp (Hp true) or hd"));
  CHECK_THAT(message_of("truth,lr\nhp,0\nhd,1\n"), Catch::Contains("line 2") && Catch::Contains("lr") && Catch::Contains("positive"));
  CHECK_THAT(message_of("truth,lr\nhp,-3\nhd,1\n"), Catch::Contains("positive"));
  CHECK_THAT(message_of("truth,lr\nhp,abc\nhd,1\n"), Catch::Contains("line 2") && Catch::Contains("lr"));
  CHECK_THAT(message_of("truth,score\nhp,inf\nhd,1\n"), Catch::Contains("line 2") && Catch::Contains("finite"));
  CHECK_THAT(message_of("truth,lr,score\nhp,1,1\n"), Catch::Contains("more than one"));
  CHECK_THAT(message_of("truth,value\nhp,1\n"), Catch::Contains("lr, log10_lr or score"));
  CHECK_THAT(message_of("lr\n1\n"), Catch::Contains("truth"));
  CHECK_THAT(message_of("truth,lr\n"), Catch::Contains("no results"));
  CHECK_THAT(message_of(R"({"results": [{"truth": "hp", "lr": 2}, {"truth": "hd", "log10_lr": 1}]})", true),
             Catch::Contains("results[1]") && Catch::Contains("same kind"));
  CHECK_THAT(message_of(R"({"results": [{"truth": "hq", "lr": 2}]})", true), Catch::Contains("results[0]") && Catch::Contains("truth"));
  CHECK_THAT(message_of(R"({"results": [{"truth": "hp", "lr": "2"}]})", true), Catch::Contains("results[0]") && Catch::Contains("lr"));
  CHECK_THAT(message_of("{not json", true), Catch::Contains("JSON syntax error") && Catch::Contains("line 1"));
}
