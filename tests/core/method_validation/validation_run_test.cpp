// The whole validation run: bootstrap intervals, criteria and the guards around calibration.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include "core/method_validation/cllr.hpp"
#include "core/method_validation/performance_summary.hpp"
#include "core/method_validation/validation_criteria.hpp"
#include "core/method_validation/validation_run.hpp"
#include "core/validation/input_error.hpp"
#include "simulated_method.hpp"

using namespace counterpoise::method_validation;
using counterpoise::validation::InvalidValue;

namespace {
ResultsTable table_of(const ValidationSet& set, ResultValue kind) {
  ResultsTable t;
  t.source = "simulated";
  t.value = kind;
  t.all = set;
  return t;
}
}  // namespace

TEST_CASE("bootstrap intervals are reproducible from the seed and hold the estimate") {
  const auto m = testing::simulate_gaussian_method(2.0, 2000, 41);
  BootstrapOptions options;
  options.resamples = 200;
  const BootstrapIntervals a = bootstrap_intervals(m.log10_lrs, options);
  const BootstrapIntervals b = bootstrap_intervals(m.log10_lrs, options);
  CHECK(a.cllr.low == b.cllr.low);
  CHECK(a.eer.high == b.eer.high);
  options.seed += 1;
  const BootstrapIntervals c = bootstrap_intervals(m.log10_lrs, options);
  CHECK(a.cllr.low != c.cllr.low);
  const PerformanceSummary s = summarize_performance(m.log10_lrs);
  CHECK(a.cllr.low < s.cllr);
  CHECK(s.cllr < a.cllr.high);
  CHECK(a.cllr_min.low < s.cllr_min);
  CHECK(s.cllr_min < a.cllr_min.high);
  CHECK(a.eer.low < s.eer);
  CHECK(s.eer < a.eer.high);
  // The percentile interval of Cllr is about +-2 standard errors; the per-trial cost has an SD
  // below 1 bit, so the width is below 4 / sqrt(2000) (Efron & Tibshirani 1993, ch. 13).
  CHECK(a.cllr.high - a.cllr.low < 4.0 / std::sqrt(2000.0));
  options.resamples = 10;
  CHECK_THROWS_AS(bootstrap_intervals(m.log10_lrs, options), InvalidValue);
}

TEST_CASE("the summary splits Cllr into discrimination and calibration") {
  auto m = testing::simulate_gaussian_method(2.0, 5000, 43);
  for (double& x : m.log10_lrs.hp_log10_lr) x += 1.0;  // every LR ten times too large
  for (double& x : m.log10_lrs.hd_log10_lr) x += 1.0;
  const PerformanceSummary s = summarize_performance(m.log10_lrs);
  CHECK(s.cllr == Approx(cllr(m.log10_lrs)));
  CHECK(s.cllr_cal == Approx(s.cllr - s.cllr_min).epsilon(1e-14));
  CHECK(s.cllr_cal > 0.05);  // a shift of one order of magnitude is a clear calibration loss
}

TEST_CASE("criteria are judged with the bound itself passing") {
  PerformanceSummary s;
  s.cllr = 0.3;
  s.eer = 0.1;
  const auto criteria = parse_criteria_json(
      R"({"criteria": [{"characteristic": "accuracy", "metric": "cllr", "at_most": 0.3},
                        {"characteristic": "discriminating power", "metric": "eer", "at_most": 0.05, "note": "lab SOP 12"}]})",
      "c.json");
  const auto judged = judge(criteria, s);
  CHECK(judged[0].pass);
  CHECK_FALSE(judged[1].pass);
  CHECK(judged[1].value == 0.1);
}

TEST_CASE("criteria files name the entry and field at fault") {
  auto message = [](const std::string& text) {
    try {
      parse_criteria_json(text, "c.json");
    } catch (const InvalidValue& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  CHECK_THAT(message(R"({"criteria": [{"characteristic": "a", "metric": "cllr_max", "at_most": 1}]})"),
             Catch::Contains("criteria[0]") && Catch::Contains("metric") && Catch::Contains("cllr_max"));
  CHECK_THAT(message(R"({"criteria": [{"characteristic": "a", "metric": "cllr"}]})"), Catch::Contains("at_most, at_least"));
  CHECK_THAT(message(R"({"criteria": [{"characteristic": "a", "metric": "cllr", "at_most": 1, "at_least": 2}]})"),
             Catch::Contains("no value could pass"));
}

TEST_CASE("raw scores must be calibrated, and calibrating on the judged data is called out") {
  const auto m = testing::simulate_gaussian_method(2.0, 500, 47);
  RunOptions options;
  options.bootstrap.resamples = 50;
  CHECK_THROWS_AS(run_validation(table_of(m.scores, ResultValue::score), options), InvalidValue);
  options.calibration = Calibration::linear;
  const ValidationRun run = run_validation(table_of(m.scores, ResultValue::score), options);
  REQUIRE_FALSE(run.warnings.empty());
  CHECK_THAT(run.warnings[0], Catch::Contains("same results"));
  // With a separate training set there is no such warning.
  options.training = table_of(testing::simulate_gaussian_method(2.0, 500, 53).scores, ResultValue::score);
  const ValidationRun honest = run_validation(table_of(m.scores, ResultValue::score), options);
  for (const std::string& w : honest.warnings) CHECK_THAT(w, !Catch::Contains("same results"));
  CHECK(honest.summary.cllr < 1.0);
}

TEST_CASE("infinite LRs are counted and reported, and JSON carries them as text") {
  RunOptions options;
  options.bootstrap.resamples = 50;
  const ValidationRun run = run_validation(table_of({{2.0, -INFINITY, 1.0}, {-1.0, INFINITY, -2.0}}, ResultValue::log10_lr), options);
  CHECK(run.summary.cllr == INFINITY);
  CHECK(run.summary.infinite.hp_zero == 1);
  CHECK(run.summary.infinite.hd_plus == 1);
  const auto j = run_to_json(run);
  CHECK(j.at("cllr") == "inf");
  CHECK(j.at("misleading").contains("strong_hd"));
  CHECK(j.at("intervals").contains("cllr_min"));
  CHECK_FALSE(j.at("warnings").empty());
}
