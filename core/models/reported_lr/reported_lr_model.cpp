#include "core/models/reported_lr/reported_lr_model.hpp"

#include <cmath>

#include "core/models/item_fields.hpp"
#include "core/models/per_alternative.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"
#include "core/validation/checks.hpp"

namespace counterpoise::models {

using nlohmann::json;
using numbers::exact_text;
using numbers::LikelihoodRatio;
using validation::InvalidValue;
using validation::Location;

ReportedLrModel::ReportedLrModel(LikelihoodRatio lr, std::optional<Interval> interval, std::string method,
                                 json as_written)
    : lr_(lr), interval_(interval), method_(std::move(method)), as_written_(std::move(as_written)) {}

PointResult ReportedLrModel::evaluate() const {
  PointResult result;
  result.lr = lr_;
  result.detail = {{"reported_log10_lr", lr_.log10()}, {"lr_state", numbers::state_name(lr_.state())}};
  if (interval_) result.detail["reported_interval_log10"] = {interval_->log10_low, interval_->log10_high};
  if (!method_.empty()) result.detail["method"] = method_;
  return result;
}

void ReportedLrModel::draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const {
  if (!is_uncertain()) return EvidenceModel::draw_log10_lr(rng, out);
  std::uniform_real_distribution<double> uniform(interval_->log10_low, interval_->log10_high);
  for (double& value : out) value = uniform(rng);
}

std::optional<uncertainty::GridPmf> ReportedLrModel::log10_lr_grid(double step) const {
  if (!is_uncertain()) return uncertainty::GridPmf::point(lr_.log10(), step);
  const double lo = interval_->log10_low, hi = interval_->log10_high;
  return uncertainty::GridPmf::from_cdf([lo, hi](double t) { return std::clamp((t - lo) / (hi - lo), 0.0, 1.0); },
                                        lo, hi, step)
      .within(lo, hi);
}

std::string ReportedLrModel::assumptions() const {
  std::string text = "The likelihood ratio was taken as reported";
  text += method_.empty() ? "" : " (" + method_ + ")";
  text += "; its propositions and assumptions are those of the method that produced it and must match the "
          "propositions of this case.";
  if (interval_) text += " The stated interval is treated as uniform on the log10 scale.";
  return text;
}

json ReportedLrModel::to_json() const { return as_written_; }

namespace {

LikelihoodRatio read_lr_value(const json& value, const Location& where) {
  if (value.is_string()) {
    if (value.get<std::string>() == "infinite") return LikelihoodRatio::infinite();
    throw InvalidValue(where, "an LR is a number >= 0 or the word \"infinite\"");
  }
  const double lr = reading::read_number(value, where);
  if (lr < 0.0) throw InvalidValue(where, "likelihood ratio " + exact_text(lr) + " must not be negative");
  return LikelihoodRatio::from_value(lr);
}

std::optional<ReportedLrModel::Interval> read_interval(const json& item, bool as_log10, const Location& where) {
  const char* key = as_log10 ? "interval_log10" : "interval";
  const json* member = reading::find_member(item, key);
  if (!member) return std::nullopt;
  const Location at = where.with_field(key);
  auto bounds = reading::read_number_array(*member, at);
  if (bounds.size() != 2) throw InvalidValue(at, "an interval has exactly two numbers [low, high]");
  if (!as_log10) {
    for (int i = 0; i < 2; ++i)
      validation::check_positive(Location{at.item, at.field + "[" + std::to_string(i) + "]"}, bounds[i]);
    bounds = {std::log10(bounds[0]), std::log10(bounds[1])};
  }
  validation::check_ordered(at, bounds[0], bounds[1]);
  return ReportedLrModel::Interval{bounds[0], bounds[1]};
}

}  // namespace

EvidenceModelPtr read_reported_lr_model(const json& item, const ReadContext& context) {
  const Location& where = context.where;
  check_model_members(item, {"lr", "log10_lr", "interval", "interval_log10", "method"}, where);
  const json* lr_member = reading::find_member(item, "lr");
  const json* log10_member = reading::find_member(item, "log10_lr");
  if (lr_member && log10_member)
    throw InvalidValue(where.with_field("log10_lr"), "give either \"lr\" or \"log10_lr\", not both");
  if (!lr_member && !log10_member) {
    // A member written as null counts as absent; the message names the field the case wrote.
    if (item.contains("log10_lr") && !item.contains("lr"))
      throw InvalidValue(where.with_field("log10_lr"), "is null; a number is required (or give \"lr\" instead)");
    throw InvalidValue(where.with_field("lr"), "missing field");
  }
  if (reading::find_member(item, "interval") && reading::find_member(item, "interval_log10"))
    throw InvalidValue(where.with_field("interval_log10"), "give either \"interval\" or \"interval_log10\", not both");
  const bool as_log10 = log10_member != nullptr;
  const LikelihoodRatio lr =
      as_log10 ? LikelihoodRatio::from_log10(reading::read_number(*log10_member, where.with_field("log10_lr")))
               : read_lr_value(*lr_member, where.with_field("lr"));
  auto interval = read_interval(item, as_log10, where);
  if (!interval) interval = read_interval(item, !as_log10, where);
  if (interval) {
    const Location at = where.with_field(reading::find_member(item, "interval") ? "interval" : "interval_log10");
    if (!lr.is_finite())
      throw InvalidValue(at, "an interval cannot be given around a zero or infinite likelihood ratio");
    // A small relative slack absorbs the rounding of log10 for an LR equal to an interval end.
    const double slack = 1e-12 * std::max(1.0, std::abs(lr.log10()));
    if (lr.log10() < interval->log10_low - slack || lr.log10() > interval->log10_high + slack)
      throw InvalidValue(at, "the interval does not contain the reported likelihood ratio");
  }
  json as_written = json::object();
  for (const char* key : {"lr", "log10_lr", "interval", "interval_log10", "method"})
    if (const json* member = reading::find_member(item, key)) as_written[key] = *member;
  return std::make_shared<ReportedLrModel>(lr, interval, reading::read_string_or(item, "method", where),
                                           std::move(as_written));
}

std::vector<EvidenceModelPtr> read_reported_lr_alternatives(const json& item, std::span<const std::string> alternative_ids,
                                                            const ReadContext& context) {
  return read_per_alternative(item, alternative_ids, {"lr", "log10_lr", "interval", "interval_log10", "method"},
                              &read_reported_lr_model, context);
}

}  // namespace counterpoise::models
