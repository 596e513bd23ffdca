#include "core/casefile/case_model.hpp"

namespace counterpoise::casefile {

std::vector<double> PriorSettings::thresholds_or_default() const {
  return thresholds.value_or(std::vector<double>{0.5, 0.95, 0.99});
}

std::vector<std::string> Propositions::alternative_ids() const {
  if (alternatives.empty()) return {kSingleAlternativeId};
  std::vector<std::string> ids;
  for (const auto& alternative : alternatives) ids.push_back(alternative.id);
  return ids;
}

std::optional<std::vector<double>> Propositions::normalised_weights() const {
  if (alternatives.empty()) return std::nullopt;
  double total = 0.0;
  for (const auto& alternative : alternatives) {
    if (!alternative.weight) return std::nullopt;
    total += *alternative.weight;
  }
  std::vector<double> weights;
  for (const auto& alternative : alternatives) weights.push_back(*alternative.weight / total);
  return weights;
}

const Item* Case::find_item(const std::string& id) const {
  for (const auto& item : items)
    if (item.id == id) return &item;
  return nullptr;
}

std::string_view mode_name(CaseMode mode) { return mode == CaseMode::training ? "training" : "casework"; }

}  // namespace counterpoise::casefile
