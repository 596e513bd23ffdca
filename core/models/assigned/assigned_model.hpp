#pragma once
// The `assigned` model: the scientist assigns P(E|Hp) and P(E|Hd) directly, each as a point,
// an interval, a Beta distribution or counts. LR = E[P(E|Hp)] / E[P(E|Hd)] (the ratio of the
// marginal probabilities; e.g. Taroni, Bozza, Biedermann & Aitken 2016, "Dismissal of the
// illusion of uncertainty in the assessment of a likelihood ratio", Law, Probability and
// Risk 15:1 — from memory for the page).

#include <cstdint>
#include <span>
#include <vector>

#include "core/models/draws_in_parts.hpp"
#include "core/models/evidence_model.hpp"
#include "core/probability/probability_assignment.hpp"

namespace counterpoise::models {

class AssignedModel final : public EvidenceModel, public DrawsInParts {
 public:
  // Throws validation::InvalidValue when both probabilities are point values of zero.
  // `hd_stream` numbers the alternative P(E|Hd) is of (0 for Hd, or the first of several): the
  // draws of P(E|Hd) come from their own stream, so an item's models against different
  // alternatives, drawn from one generator, share the draws of P(E|Hp) and draw each P(E|Hd_i)
  // independently.
  AssignedModel(probability::Assignment p_given_hp, probability::Assignment p_given_hd,
                const validation::Location& where, std::uint32_t hd_stream = 0);

  std::string kind() const override { return "assigned"; }
  PointResult evaluate() const override;
  bool is_uncertain() const override;
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  // shared: log10 P(E|Hp), own: -log10 P(E|Hd), from the engines draw_log10_lr uses. A draw with
  // both probabilities zero (possible only for a linear interval from 0, about 2^-53 a draw) is
  // left as drawn: its LR is undefined, and the caller says so.
  void draw_log10_lr_parts(std::mt19937_64& rng, std::span<double> shared, std::span<double> own) const override;
  std::optional<uncertainty::GridPmf> log10_lr_grid(double step) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override;

  const probability::Assignment& p_given_hp() const { return p_given_hp_; }
  const probability::Assignment& p_given_hd() const { return p_given_hd_; }

 private:
  probability::Assignment p_given_hp_;
  probability::Assignment p_given_hd_;
  std::uint32_t hd_stream_ = 0;
};

// Reads "p_given_hp" and "p_given_hd" (see probability::read_assignment).
EvidenceModelPtr read_assigned_model(const nlohmann::json& item, const ReadContext& context);

// Reads "p_given": {"Hp": ..., "<alternative id>": ..., ...} (each value as read_assignment
// reads it) into one model of Hp against each alternative. Throws validation::InvalidValue
// naming the item and "p_given.<id>" for a missing or unknown id and a bad value, and for
// P(E|Hp) and P(E|Hd_i) both zero; "p_given_hp"/"p_given_hd" in such a case are refused.
std::vector<EvidenceModelPtr> read_assigned_alternatives(const nlohmann::json& item,
                                                         std::span<const std::string> alternative_ids,
                                                         const ReadContext& context);

}  // namespace counterpoise::models
