#include "core/numbers/lr_tolerance.hpp"

#include <cmath>

namespace counterpoise::numbers {

bool reaches_edge(double log10_lr, double log10_edge) noexcept {
  if (std::isinf(log10_lr) || std::isinf(log10_edge)) return log10_lr >= log10_edge;
  return log10_lr >= log10_edge - kLog10LrTolerance;
}

bool is_neutral_log10(double log10_lr) noexcept { return std::abs(log10_lr) <= kLog10LrTolerance; }

}  // namespace counterpoise::numbers
