#pragma once
// The `reported-lr` model: a likelihood ratio computed by another method (another laboratory,
// a validated software method, a published study), taken as given. An optional interval
// [low, high] is treated as uniform on the log10 scale (docs/methods.md).

#include <optional>
#include <span>
#include <vector>

#include "core/models/evidence_model.hpp"

namespace counterpoise::models {

class ReportedLrModel final : public EvidenceModel {
 public:
  struct Interval {
    double log10_low, log10_high;
  };
  // `as_written` holds the model's fields exactly as read, so writing reproduces them bit for bit
  // (a value turned into log10 and back need not be the same double).
  ReportedLrModel(numbers::LikelihoodRatio lr, std::optional<Interval> interval, std::string method,
                  nlohmann::json as_written);

  std::string kind() const override { return "reported-lr"; }
  PointResult evaluate() const override;
  bool is_uncertain() const override { return interval_ && interval_->log10_low < interval_->log10_high; }
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  std::optional<uncertainty::GridPmf> log10_lr_grid(double step) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override;

 private:
  numbers::LikelihoodRatio lr_;
  std::optional<Interval> interval_;
  std::string method_;
  nlohmann::json as_written_;
};

// Reads "lr" (a number >= 0, or "infinite") or "log10_lr", with optional "interval" [low, high]
// (or "interval_log10") and "method" text. Throws validation::InvalidValue for a negative LR,
// an interval with low > high, an interval that does not contain the LR, both forms given, or
// an interval around a zero or infinite LR.
EvidenceModelPtr read_reported_lr_model(const nlohmann::json& item, const ReadContext& context);

// Reads one LR per alternative: "alternatives": {"<id>": {"lr": ...}, ...}, each entry with the
// fields read_reported_lr_model reads (see models::read_per_alternative for the errors).
std::vector<EvidenceModelPtr> read_reported_lr_alternatives(const nlohmann::json& item,
                                                            std::span<const std::string> alternative_ids,
                                                            const ReadContext& context);

}  // namespace counterpoise::models
