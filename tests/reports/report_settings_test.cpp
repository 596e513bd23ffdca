// The "report" section of a case file: defaults, and an error naming the field for each problem.
#include "reports/report_settings.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {
casefile::Case with_report(const std::string& report) {
  return case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 10})", R"(, "report": )" + report));
}
}  // namespace

TEST_CASE("settings: absent section gives the defaults, a full section reads back") {
  const auto none = case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 10})"));
  const auto defaults = read_report_settings(none);
  CHECK(defaults.reported_value == ReportedValue::point);
  CHECK(defaults.wording_overrides.empty());
  const auto full = read_report_settings(with_report(
      R"({"reported_value": "conservative", "wording_overrides": [{"rule": "r1", "item": "E1", "reason": "quoted from the request"}]})"));
  CHECK(full.reported_value == ReportedValue::conservative);
  REQUIRE(full.wording_overrides.size() == 1);
  CHECK(full.wording_overrides[0].rule == "r1");
  CHECK(full.wording_overrides[0].item == "E1");
  CHECK(full.wording_overrides[0].reason == "quoted from the request");
}

TEST_CASE("settings: each problem is an InvalidValue naming the field") {
  struct Row {
    const char* report;
    const char* field;
  };
  const Row rows[] = {
      {R"({"reported": "point"})", ""},
      {R"({"reported_value": "median"})", "reported_value"},
      {R"({"wording_overrides": {}})", "wording_overrides"},
      {R"({"wording_overrides": [{"rule": "r1", "item": "E1"}]})", "wording_overrides[0].reason"},
      {R"({"wording_overrides": [{"rule": "r1", "item": "E1", "reason": "  "}]})", "wording_overrides[0].reason"},
      {R"({"wording_overrides": [{"rule": "", "item": "E1", "reason": "x"}]})", "wording_overrides[0].rule"},
      {R"({"wording_overrides": [{"rule": "r1", "item": "E9", "reason": "x"}]})", "wording_overrides[0].item"},
      {R"({"wording_overrides": [{"rule": "r1", "item": "E1", "reason": "x", "by": "me"}]})", "wording_overrides[0]"},
  };
  for (const auto& row : rows) {
    INFO(row.report);
    const auto value = with_report(row.report);
    try {
      read_report_settings(value);
      FAIL("no error");
    } catch (const validation::InvalidValue& error) {
      CHECK(error.where().item == "report");
      CHECK(error.where().field.rfind(row.field, 0) == 0);
    }
  }
}
