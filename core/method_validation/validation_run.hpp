#pragma once
// One validation of an LR method: the results read, calibrated when they are raw scores, every
// measure with its bootstrap interval, the breakdown by condition, the laboratory's criteria
// judged, and the curves a report plots. The CLI, the editor's window and the validation report
// all show this one object.

#include <map>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/method_validation/performance_curves.hpp"
#include "core/method_validation/performance_summary.hpp"
#include "core/method_validation/results_file.hpp"
#include "core/method_validation/validation_criteria.hpp"

namespace counterpoise::method_validation {

enum class Calibration { none, linear, pav };

struct RunOptions {
  Calibration calibration = Calibration::none;
  std::optional<ResultsTable> training;  // scores to fit the calibration on; else the results themselves
  BootstrapOptions bootstrap;
  std::vector<Criterion> criteria;       // empty: the guideline's rows without criteria
};

struct ValidationRun {
  std::string source;
  ResultValue input = ResultValue::log10_lr;
  Calibration calibration = Calibration::none;
  std::string calibration_text;  // how the scores became LRs, in words
  std::vector<std::string> warnings;
  ValidationSet log10_lrs;       // the LRs judged (after calibration)
  PerformanceSummary summary;
  BootstrapIntervals intervals;
  std::map<std::string, PerformanceSummary> by_condition;
  std::vector<CriterionResult> criteria;  // judged (laboratory criteria)
  std::vector<Criterion> rows_without_criteria;
  TippettCurves tippett;
  EceCurves ece;
  PavFit pav;  // the PAV fit of the LRs judged (for the calibration plot)
};

// Runs the validation. A calibration may be applied to LRs too (their log10 is then the score).
// Throws validation::InvalidValue (item "options") when the results are raw scores and no
// calibration is chosen, when a training set is given without a calibration or gives another kind
// of value, and as the measures throw (one truth only; scores that separate the truths for the
// linear calibration).
ValidationRun run_validation(const ResultsTable& results, const RunOptions& options);

// The run as JSON: cllr, cllr_min, cllr_cal, eer, misleading {hp, hd, strong_hp, strong_hd},
// intervals {...}, counts, infinite, by_condition, criteria, warnings. Infinite values are the
// strings "inf"/"-inf" (JSON has no infinity).
nlohmann::json run_to_json(const ValidationRun& run);

}  // namespace counterpoise::method_validation
