#include "core/comparison/band_move.hpp"

#include <algorithm>
#include <cmath>

#include "core/numbers/likelihood_ratio.hpp"

namespace counterpoise::comparison {

verbal::VerbalExpression words_for_log10(const verbal::VerbalScale& scale, double log10_lr) {
  if (std::isinf(log10_lr))
    return scale.express(log10_lr > 0 ? numbers::LikelihoodRatio::infinite() : numbers::LikelihoodRatio::zero());
  return scale.express(numbers::LikelihoodRatio::from_log10(log10_lr));
}

bool band_differs(const verbal::VerbalExpression& x, const verbal::VerbalExpression& y) {
  return x.label != y.label || x.favours != y.favours;
}

bool alone_moves_band(double log10_from, const verbal::VerbalExpression& words_from,
                      const std::optional<Log10Change>& alone, const verbal::VerbalScale& scale) {
  if (!alone || (alone->is_finite() && alone->log10 == 0.0)) return false;
  // An infinite change from a finite LR ends at LR zero or an infinite LR. From LR zero or an
  // infinite LR it leaves it (a finite change cannot): wherever it ends, the words are no longer
  // those of zero or infinity, so the end taken here, the other infinity, gives the same answer.
  const double to = alone->is_finite() ? log10_from + alone->log10 : alone->value();
  return band_differs(words_from, words_for_log10(scale, to));
}

std::vector<std::size_t> movers_first(std::vector<std::size_t> order, const std::function<bool(std::size_t)>& moves) {
  std::stable_partition(order.begin(), order.end(), moves);
  return order;
}

}  // namespace counterpoise::comparison
