#include "core/models/evidence_model.hpp"

#include <algorithm>

namespace counterpoise::models {

void EvidenceModel::draw_log10_lr(std::mt19937_64& /*rng*/, std::span<double> out) const {
  const double value = evaluate().lr.log10();
  std::fill(out.begin(), out.end(), value);
}

std::optional<uncertainty::GridPmf> EvidenceModel::log10_lr_grid(double /*step*/) const {
  return std::nullopt;
}

}  // namespace counterpoise::models
