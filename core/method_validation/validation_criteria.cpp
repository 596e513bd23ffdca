#include "core/method_validation/validation_criteria.hpp"

#include <array>
#include <cmath>

#include <nlohmann/json.hpp>

#include "core/reading/json_fields.hpp"
#include "core/reading/json_text.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

using validation::InvalidValue;
using validation::Location;

namespace {
constexpr std::array<std::string_view, 8> kMetrics = {
    "cllr", "cllr_min", "cllr_cal", "eer", "misleading_hp", "misleading_hd", "strong_misleading_hp", "strong_misleading_hd"};
}  // namespace

std::span<const std::string_view> metric_names() { return kMetrics; }

double metric_value(const PerformanceSummary& s, std::string_view metric, const Location& where) {
  if (metric == "cllr") return s.cllr;
  if (metric == "cllr_min") return s.cllr_min;
  if (metric == "cllr_cal") return s.cllr_cal;
  if (metric == "eer") return s.eer;
  if (metric == "misleading_hp") return s.misleading.hp;
  if (metric == "misleading_hd") return s.misleading.hd;
  if (metric == "strong_misleading_hp") return s.misleading.strong_hp;
  if (metric == "strong_misleading_hd") return s.misleading.strong_hd;
  std::string known;
  for (std::string_view m : kMetrics) known += (known.empty() ? "" : ", ") + std::string(m);
  throw InvalidValue(where, "unknown metric '" + std::string(metric) + "'; known metrics: " + known);
}

std::string metric_description(std::string_view metric) {
  if (metric == "cllr") return "log-likelihood-ratio cost, Cllr (bits)";
  if (metric == "cllr_min") return "minimum cost after PAV, Cllr_min (bits)";
  if (metric == "cllr_cal") return "calibration loss, Cllr - Cllr_min (bits)";
  if (metric == "eer") return "equal error rate (ROC convex hull)";
  if (metric == "misleading_hp") return "rate of LR < 1 when Hp is true";
  if (metric == "misleading_hd") return "rate of LR > 1 when Hd is true";
  if (metric == "strong_misleading_hp") return "rate of LR <= 1/100 when Hp is true";
  if (metric == "strong_misleading_hd") return "rate of LR >= 100 when Hd is true";
  return std::string(metric);
}

std::vector<Criterion> parse_criteria_json(std::string_view text, const std::string& source) {
  using reading::json;
  // The bounded reader of untrusted JSON: size, depth and value limits, line and column in messages.
  const json doc = reading::parse_json_text(text, source);
  const Location top{"criteria", ""};
  reading::require_object(doc, top);
  reading::check_known_members(doc, {"criteria"}, top);
  const json& list = reading::require_member(doc, "criteria", top);
  if (!list.is_array()) throw InvalidValue(top, "criteria must be a list");
  std::vector<Criterion> criteria;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const Location where{"criteria[" + std::to_string(i) + "]", ""};
    const json& c = list[i];
    reading::require_object(c, where);
    reading::check_known_members(c, {"characteristic", "metric", "at_most", "at_least", "note"}, where);
    Criterion criterion;
    criterion.characteristic = reading::read_string(reading::require_member(c, "characteristic", where),
                                                        where.with_field("characteristic"));
    criterion.metric = reading::read_string(reading::require_member(c, "metric", where), where.with_field("metric"));
    metric_value(PerformanceSummary{}, criterion.metric, where.with_field("metric"));  // known name?
    criterion.at_most = reading::read_optional_number(c, "at_most", where);
    criterion.at_least = reading::read_optional_number(c, "at_least", where);
    if (!criterion.at_most && !criterion.at_least)
      throw InvalidValue(where, "a criterion needs at_most, at_least or both");
    if (criterion.at_most && criterion.at_least && *criterion.at_least > *criterion.at_most)
      throw InvalidValue(where.with_field("at_least"), "at_least is above at_most, so no value could pass");
    criterion.note = reading::read_string_or(c, "note", where);
    criteria.push_back(std::move(criterion));
  }
  return criteria;
}

std::vector<Criterion> read_criteria_file(const std::filesystem::path& path) {
  return parse_criteria_json(reading::read_text_file(path, {"criteria", "file"}), path.filename().string());
}

std::vector<CriterionResult> judge(std::span<const Criterion> criteria, const PerformanceSummary& summary) {
  std::vector<CriterionResult> results;
  for (std::size_t i = 0; i < criteria.size(); ++i) {
    const Criterion& c = criteria[i];
    CriterionResult r{c, metric_value(summary, c.metric, {"criteria[" + std::to_string(i) + "]", "metric"}), true};
    if (c.at_most && !(r.value <= *c.at_most)) r.pass = false;
    if (c.at_least && !(r.value >= *c.at_least)) r.pass = false;
    results.push_back(std::move(r));
  }
  return results;
}

std::vector<Criterion> guideline_rows_without_criteria() {
  return {{"accuracy", "cllr", {}, {}, ""},
          {"discriminating power", "cllr_min", {}, {}, ""},
          {"discriminating power", "eer", {}, {}, ""},
          {"calibration", "cllr_cal", {}, {}, ""},
          {"calibration", "strong_misleading_hp", {}, {}, ""},
          {"calibration", "strong_misleading_hd", {}, {}, ""}};
}

}  // namespace counterpoise::method_validation
