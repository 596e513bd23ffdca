#include "core/casefile/case_model.hpp"

namespace counterpoise::casefile {

std::vector<double> PriorSettings::thresholds_or_default() const {
  return thresholds.value_or(std::vector<double>{0.5, 0.95, 0.99});
}

const Item* Case::find_item(const std::string& id) const {
  for (const auto& item : items)
    if (item.id == id) return &item;
  return nullptr;
}

std::string_view mode_name(CaseMode mode) { return mode == CaseMode::training ? "training" : "casework"; }

}  // namespace counterpoise::casefile
