#include "core/models/assigned/assigned_model.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

#include "core/models/item_fields.hpp"
#include "core/models/per_alternative.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models {

using numbers::LikelihoodRatio;

AssignedModel::AssignedModel(probability::Assignment p_given_hp, probability::Assignment p_given_hd,
                             const validation::Location& where, std::uint32_t hd_stream)
    : p_given_hp_(std::move(p_given_hp)), p_given_hd_(std::move(p_given_hd)), hd_stream_(hd_stream) {
  if (std::isinf(probability::log10_mean(p_given_hp_)) && std::isinf(probability::log10_mean(p_given_hd_)))
    throw validation::InvalidValue(where.with_field("p_given_hd"),
                                   "P(E|Hp) and P(E|Hd) are both zero: the findings would be impossible "
                                   "under both propositions");
}

PointResult AssignedModel::evaluate() const {
  PointResult result;
  result.log10_p_given_hp = probability::log10_mean(p_given_hp_);
  result.log10_p_given_hd = probability::log10_mean(p_given_hd_);
  result.lr = LikelihoodRatio::from_log10_probabilities(*result.log10_p_given_hp, *result.log10_p_given_hd);
  result.detail = {{"p_given_hp", std::pow(10.0, *result.log10_p_given_hp)},
                   {"p_given_hd", std::pow(10.0, *result.log10_p_given_hd)},
                   {"p_given_hp_assigned", probability::describe(p_given_hp_)},
                   {"p_given_hd_assigned", probability::describe(p_given_hd_)}};
  return result;
}

bool AssignedModel::is_uncertain() const {
  return probability::is_uncertain(p_given_hp_) || probability::is_uncertain(p_given_hd_);
}

void AssignedModel::draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const {
  // In blocks: all P(E|Hp) draws of a block, then all P(E|Hd) draws, so each distribution's
  // constants are set up once per block and nothing is allocated per draw. P(E|Hp) and P(E|Hd)
  // each come from a bulk engine of their own, both seeded from this item's generator: the draws
  // of P(E|Hp) then depend on the generator alone, so the item's models against several
  // alternatives share them draw for draw, and P(E|Hd) is drawn from the alternative's stream.
  constexpr std::size_t kBlock = 1024;
  std::array<double, kBlock> hd;
  auto hp_engine = uncertainty::bulk_engine_from(rng);
  auto hd_engine = uncertainty::bulk_engine_from(rng, hd_stream_);
  for (std::size_t start = 0; start < out.size(); start += kBlock) {
    const std::size_t count = std::min(kBlock, out.size() - start);
    const auto block = out.subspan(start, count);
    probability::fill_log10(p_given_hp_, hp_engine, block);
    probability::fill_log10(p_given_hd_, hd_engine, std::span<double>(hd.data(), count));
    for (std::size_t i = 0; i < count; ++i) {
      // Both zero in one draw is possible only for linear intervals from 0; such a joint draw
      // describes no LR, so it is drawn again (probability ~0 for any real assignment).
      while (std::isinf(block[i]) && std::isinf(hd[i]) && block[i] < 0.0 && hd[i] < 0.0) {
        block[i] = probability::draw_log10(p_given_hp_, rng);
        hd[i] = probability::draw_log10(p_given_hd_, rng);
      }
      block[i] -= hd[i];
    }
  }
}

void AssignedModel::draw_log10_lr_parts(std::mt19937_64& rng, std::span<double> shared, std::span<double> own) const {
  // The engines are seeded in the order draw_log10_lr seeds them, whether P(E|Hp) is drawn or not,
  // so the draws of both parts are those of draw_log10_lr.
  auto hp_engine = uncertainty::bulk_engine_from(rng);
  auto hd_engine = uncertainty::bulk_engine_from(rng, hd_stream_);
  if (!shared.empty()) probability::fill_log10(p_given_hp_, hp_engine, shared);
  probability::fill_log10(p_given_hd_, hd_engine, own);
  for (double& part : own) part = -part;
}

std::optional<uncertainty::GridPmf> AssignedModel::log10_lr_grid(double step) const {
  auto hp = probability::log10_grid(p_given_hp_, step);
  auto hd = probability::log10_grid(p_given_hd_, step);
  if (!hp || !hd) return std::nullopt;
  // The far log tails of a Beta (below its 1e-10 quantile) are folded into the end bins before
  // convolving: they cannot move any reported quantile and would dominate the lattice length.
  uncertainty::trim_tails(*hp, 1e-10);
  uncertainty::trim_tails(*hd, 1e-10);
  return uncertainty::convolve(*hp, hd->negated());
}

std::string AssignedModel::assumptions() const {
  std::string text =
      "The probability of these findings if Hp is true was assigned as " + probability::describe(p_given_hp_) +
      ", and the probability of these findings if Hd is true as " + probability::describe(p_given_hd_) +
      ". The likelihood ratio is the ratio of the mean (marginal) probabilities.";
  if (is_uncertain())
    text += " The spread of the assigned values is carried into the interval; it describes how well the "
            "probabilities are known, not a second likelihood ratio.";
  return text;
}

nlohmann::json AssignedModel::to_json() const {
  return {{"p_given_hp", probability::to_json(p_given_hp_)}, {"p_given_hd", probability::to_json(p_given_hd_)}};
}

EvidenceModelPtr read_assigned_model(const nlohmann::json& item, const ReadContext& context) {
  const auto& where = context.where;
  check_model_members(item, {"p_given_hp", "p_given_hd"}, where);
  auto hp = probability::read_assignment(reading::require_member(item, "p_given_hp", where),
                                         where.with_field("p_given_hp"));
  auto hd = probability::read_assignment(reading::require_member(item, "p_given_hd", where),
                                         where.with_field("p_given_hd"));
  return std::make_shared<AssignedModel>(std::move(hp), std::move(hd), where);
}

std::vector<EvidenceModelPtr> read_assigned_alternatives(const nlohmann::json& item,
                                                         std::span<const std::string> alternative_ids,
                                                         const ReadContext& context) {
  const auto& where = context.where;
  for (const char* single : {"p_given_hp", "p_given_hd"})
    if (reading::find_member(item, single))
      throw validation::InvalidValue(where.with_field(single),
                                     "the case has several alternatives to Hp: give \"p_given\" keyed by proposition id "
                                     "({\"Hp\": ..., \"" + alternative_ids.front() + "\": ...}) instead");
  check_model_members(item, {"p_given"}, where);
  const auto& keyed = reading::require_member(item, "p_given", where);
  const auto at = where.with_field("p_given");
  check_proposition_keys(keyed, alternative_ids, true, at);
  const auto hp = probability::read_assignment(keyed.at("Hp"), at.with_field("Hp"));
  std::vector<EvidenceModelPtr> models;
  for (const auto& id : alternative_ids) {
    const auto field = at.with_field(id);
    auto hd = probability::read_assignment(keyed.at(id), field);
    if (std::isinf(probability::log10_mean(hp)) && std::isinf(probability::log10_mean(hd)))
      throw validation::InvalidValue(field, "P(E|Hp) and P(E|" + id + ") are both zero: the findings would be impossible "
                                            "under both propositions");
    models.push_back(std::make_shared<AssignedModel>(hp, std::move(hd), field, static_cast<std::uint32_t>(models.size())));
  }
  return models;
}

}  // namespace counterpoise::models
