#pragma once
// What a model can offer besides EvidenceModel::draw_log10_lr when an item is weighed against
// several alternatives to Hp: its draws of log10 LR in two parts, log10 LR = shared + own.
// `shared` is what the item's models against every alternative have in common draw for draw,
// given the same generator state (log10 P(E|Hp)); `own` is this alternative's part
// (-log10 P(E|Hd_i)). The interval of the LR against the weighted set (evaluation/compound_spread)
// then draws the shared part once per item instead of once per alternative. A model that does not
// implement it is drawn whole, as its own part, from the same generator state for every
// alternative, so what its alternatives share moves together by construction.

#include <random>
#include <span>

namespace counterpoise::models {

class DrawsInParts {
 public:
  virtual ~DrawsInParts() = default;

  // The draws of draw_log10_lr from the same generator state, in parts (shared + own, rounding
  // aside). `shared` empty: that part is not drawn (the caller has it from the item's model
  // against another alternative), and the generator moves on exactly as when it is. Otherwise
  // both spans have the same length.
  virtual void draw_log10_lr_parts(std::mt19937_64& rng, std::span<double> shared, std::span<double> own) const = 0;
};

}  // namespace counterpoise::models
