#include "core/method_validation/validation_run.hpp"

#include <algorithm>
#include <cmath>
#include <functional>

#include "core/method_validation/score_calibration.hpp"
#include "core/numbers/number_text.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

namespace {

// The chosen calibration fitted on `training`, as a map from score to log10 LR; fills the run's
// description of it.
std::function<double(double)> fitted_calibration(const ValidationSet& training, Calibration method, ValidationRun& run) {
  if (method == Calibration::linear) {
    const LinearCalibration fit = fit_linear_calibration(training);
    run.calibration_text = "linear (logistic-regression) calibration: log10 LR = " +
                           numbers::significant_text(fit.slope_log10, 4) + " x score " +
                           (fit.offset_log10 < 0 ? "- " : "+ ") + numbers::significant_text(std::abs(fit.offset_log10), 4);
    return [fit](double score) { return fit.log10_lr(score); };
  }
  PavCalibration fit = fit_pav_calibration(training);
  run.calibration_text = "PAV calibration: a monotone step function of the score with " +
                         std::to_string(fit.fit.blocks.size()) + " steps";
  return [fit = std::move(fit)](double score) { return fit.log10_lr(score); };
}

double curve_low(const ValidationSet& s) {
  double lo = INFINITY;
  for (const auto* v : {&s.hp_log10_lr, &s.hd_log10_lr})
    for (double x : *v)
      if (std::isfinite(x)) lo = std::min(lo, x);
  return std::isfinite(lo) ? std::floor(lo) : -1.0;
}

double curve_high(const ValidationSet& s) {
  double hi = -INFINITY;
  for (const auto* v : {&s.hp_log10_lr, &s.hd_log10_lr})
    for (double x : *v)
      if (std::isfinite(x)) hi = std::max(hi, x);
  return std::isfinite(hi) ? std::ceil(hi) : 1.0;
}

// A percentile interval that misses its own estimate says the measure is biased in resamples
// (Cllr_min is: PAV fits resampled data, with its repeated results, more closely). Say so rather
// than let a reader take either figure for the other.
void note_estimates_outside_intervals(ValidationRun& run) {
  const PerformanceSummary& s = run.summary;
  const BootstrapIntervals& b = run.intervals;
  const std::pair<const char*, std::pair<double, Interval>> measures[] = {
      {"Cllr", {s.cllr, b.cllr}}, {"Cllr_min", {s.cllr_min, b.cllr_min}}, {"the calibration loss", {s.cllr_cal, b.cllr_cal}},
      {"the equal error rate", {s.eer, b.eer}}};
  for (const auto& [name, value] : measures) {
    const auto& [estimate, interval] = value;
    if (std::isfinite(estimate) && (estimate < interval.low || estimate > interval.high))
      run.warnings.push_back(std::string("the bootstrap interval of ") + name +
                             " does not contain its estimate: the measure is biased in resamples, so read the interval "
                             "as its spread, not as a range around the estimate");
  }
}

}  // namespace

ValidationRun run_validation(const ResultsTable& results, const RunOptions& options) {
  ValidationRun run;
  run.source = results.source;
  run.input = results.value;
  run.calibration = options.calibration;
  require_both_truths(results.all);
  if (results.value == ResultValue::score && options.calibration == Calibration::none)
    throw validation::InvalidValue({"options", "calibration"},
                                   results.source + " holds raw scores, not likelihood ratios: choose a calibration "
                                                    "(linear or pav) to turn them into LRs");
  if (options.training && options.calibration == Calibration::none)
    throw validation::InvalidValue({"options", "training"}, "a training set is used only with a calibration");
  std::function<double(double)> to_log10_lr = [](double x) { return x; };
  if (options.calibration == Calibration::none) {
    run.calibration_text = "none: the LRs are judged as the method gave them";
  } else {
    if (options.training && options.training->value != results.value)
      throw validation::InvalidValue({"options", "training"},
                                     "the training set gives " + std::string(result_value_name(options.training->value)) +
                                         " but the results give " + std::string(result_value_name(results.value)));
    if (!options.training)
      run.warnings.push_back(
          "the calibration was fitted on the same results it is judged on, so the calibration loss is optimistic; "
          "give a separate training set for an honest figure");
    to_log10_lr = fitted_calibration(options.training ? options.training->all : results.all, options.calibration, run);
  }
  run.log10_lrs = apply_calibration(results.all, to_log10_lr);
  run.summary = summarize_performance(run.log10_lrs);
  run.intervals = bootstrap_intervals(run.log10_lrs, options.bootstrap);
  for (const auto& [condition, set] : results.by_condition) {
    if (set.has_both_truths())
      run.by_condition[condition] = summarize_performance(apply_calibration(set, to_log10_lr));
    else
      run.warnings.push_back("condition '" + condition + "' has results of one truth only, so it has no measures of its own");
  }
  const InfiniteCounts& inf = run.summary.infinite;
  if (inf.hp_zero + inf.hd_plus > 0)
    run.warnings.push_back(std::to_string(inf.hp_zero + inf.hd_plus) +
                           " result(s) were infinite in the wrong direction (LR 0 with Hp true, or infinite with Hd "
                           "true), so Cllr is infinite: the method was certain and wrong");
  if (inf.total() > 0)
    run.warnings.push_back(std::to_string(inf.total()) + " result(s) have an infinite or zero LR; they are counted in "
                                                         "every measure as they are, not replaced by a finite value");
  note_estimates_outside_intervals(run);
  if (options.criteria.empty())
    run.rows_without_criteria = guideline_rows_without_criteria();
  else
    run.criteria = judge(options.criteria, run.summary);
  run.tippett = tippett_curves(run.log10_lrs, evenly_spaced(curve_low(run.log10_lrs), curve_high(run.log10_lrs), 201));
  const std::vector<ScoreAtom> atoms = pooled_atoms(run.log10_lrs);
  run.pav = fit_pav(atoms);
  run.ece = ece_curves(run.log10_lrs, run.pav, evenly_spaced(-2.5, 2.5, 101));
  return run;
}

namespace {

nlohmann::json number_json(double x) {
  if (x == INFINITY) return "inf";
  if (x == -INFINITY) return "-inf";
  return x;
}

nlohmann::json interval_json(const Interval& i) { return nlohmann::json::array({number_json(i.low), number_json(i.high)}); }

nlohmann::json summary_json(const PerformanceSummary& s) {
  return {{"hp_count", s.hp_count},
          {"hd_count", s.hd_count},
          {"cllr", number_json(s.cllr)},
          {"cllr_min", number_json(s.cllr_min)},
          {"cllr_cal", number_json(s.cllr_cal)},
          {"eer", s.eer},
          {"misleading",
           {{"hp", s.misleading.hp},
            {"hd", s.misleading.hd},
            {"strong_hp", s.misleading.strong_hp},
            {"strong_hd", s.misleading.strong_hd},
            {"neutral_hp", s.misleading.neutral_hp},
            {"neutral_hd", s.misleading.neutral_hd}}},
          {"infinite",
           {{"hp_infinite", s.infinite.hp_plus},
            {"hp_zero", s.infinite.hp_zero},
            {"hd_infinite", s.infinite.hd_plus},
            {"hd_zero", s.infinite.hd_zero}}}};
}

std::string_view calibration_name(Calibration c) {
  switch (c) {
    case Calibration::none: return "none";
    case Calibration::linear: return "linear";
    case Calibration::pav: return "pav";
  }
  return "?";
}

}  // namespace

nlohmann::json run_to_json(const ValidationRun& run) {
  nlohmann::json j = summary_json(run.summary);
  j["source"] = run.source;
  j["input"] = std::string(result_value_name(run.input));
  j["calibration"] = {{"method", std::string(calibration_name(run.calibration))}, {"description", run.calibration_text}};
  const BootstrapIntervals& b = run.intervals;
  j["intervals"] = {{"level", b.options.level},
                    {"resamples", b.options.resamples},
                    {"seed", b.options.seed},
                    {"cllr", interval_json(b.cllr)},
                    {"cllr_min", interval_json(b.cllr_min)},
                    {"cllr_cal", interval_json(b.cllr_cal)},
                    {"eer", interval_json(b.eer)},
                    {"misleading",
                     {{"hp", interval_json(b.misleading_hp)},
                      {"hd", interval_json(b.misleading_hd)},
                      {"strong_hp", interval_json(b.strong_hp)},
                      {"strong_hd", interval_json(b.strong_hd)}}}};
  j["by_condition"] = nlohmann::json::object();
  for (const auto& [condition, s] : run.by_condition) j["by_condition"][condition] = summary_json(s);
  j["criteria"] = nlohmann::json::array();
  for (const CriterionResult& r : run.criteria) {
    nlohmann::json c = {{"characteristic", r.criterion.characteristic},
                        {"metric", r.criterion.metric},
                        {"value", number_json(r.value)},
                        {"pass", r.pass}};
    if (r.criterion.at_most) c["at_most"] = *r.criterion.at_most;
    if (r.criterion.at_least) c["at_least"] = *r.criterion.at_least;
    j["criteria"].push_back(std::move(c));
  }
  j["warnings"] = run.warnings;
  return j;
}

}  // namespace counterpoise::method_validation
