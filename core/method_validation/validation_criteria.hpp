#pragma once
// The laboratory's validation criteria and the table that judges a run against them, after the
// guideline for the validation of LR methods (Meuwly, Ramos & Haraksim 2017, "A guideline for
// the validation of likelihood ratio methods used for forensic evidence evaluation", FSI
// 276:142, the validation matrix: performance characteristic, performance metric, graphical
// representation, validation criteria). The criteria are the laboratory's, set before the run;
// Counterpoise sets none of its own.
//
// Criteria file (JSON):
//   {"criteria": [{"characteristic": "accuracy", "metric": "cllr", "at_most": 0.3}, ...]}
// metric one of the names in metric_names(); at_most and/or at_least (at least one); an optional
// "note".

#include <filesystem>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/method_validation/performance_summary.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

struct Criterion {
  std::string characteristic;  // e.g. "accuracy", "discriminating power", "calibration"
  std::string metric;          // e.g. "cllr"
  std::optional<double> at_most;
  std::optional<double> at_least;
  std::string note;
};

// The metric names a criterion may use: cllr, cllr_min, cllr_cal, eer, misleading_hp,
// misleading_hd, strong_misleading_hp, strong_misleading_hd.
std::span<const std::string_view> metric_names();
// The metric's value in `summary`; throws validation::InvalidValue (at `where`) for an unknown name.
double metric_value(const PerformanceSummary& summary, std::string_view metric, const validation::Location& where);
// The metric's name in words for the table, e.g. "log-likelihood-ratio cost (Cllr)".
std::string metric_description(std::string_view metric);

// Reads criteria; every error names criteria[i] and the field.
std::vector<Criterion> parse_criteria_json(std::string_view text, const std::string& source);
std::vector<Criterion> read_criteria_file(const std::filesystem::path& path);

struct CriterionResult {
  Criterion criterion;
  double value = 0.0;
  bool pass = false;
};

// Each criterion judged against the summary (a value equal to the bound passes).
std::vector<CriterionResult> judge(std::span<const Criterion> criteria, const PerformanceSummary& summary);

// The rows of the guideline's matrix this run reports when the laboratory gave no criteria: one
// per characteristic and metric computed here, without a criterion.
std::vector<Criterion> guideline_rows_without_criteria();

}  // namespace counterpoise::method_validation
