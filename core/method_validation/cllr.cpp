#include "core/method_validation/cllr.hpp"

#include <cmath>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::method_validation {

namespace {
constexpr double kLog2Of10 = 3.321928094887362347870319429489390175864;
constexpr double kLn2 = 0.693147180559945309417232121458176568;
}  // namespace

double log2_one_plus_pow10(double log10_x) {
  if (log10_x == INFINITY) return INFINITY;
  if (log10_x == -INFINITY) return 0.0;
  // Factor out the larger term so 10^x never overflows (common practice, as log10_add).
  if (log10_x > 0) return log10_x * kLog2Of10 + std::log1p(std::pow(10.0, -log10_x)) / kLn2;
  return std::log1p(std::pow(10.0, log10_x)) / kLn2;
}

double mean_hp_cost_bits(std::span<const double> hp_log10_lr) {
  double sum = 0.0;
  for (double x : hp_log10_lr) sum += log2_one_plus_pow10(-x);
  return sum / static_cast<double>(hp_log10_lr.size());
}

double mean_hd_cost_bits(std::span<const double> hd_log10_lr) {
  double sum = 0.0;
  for (double x : hd_log10_lr) sum += log2_one_plus_pow10(x);
  return sum / static_cast<double>(hd_log10_lr.size());
}

double cllr(const ValidationSet& set) {
  require_both_truths(set);
  return 0.5 * (mean_hp_cost_bits(set.hp_log10_lr) + mean_hd_cost_bits(set.hd_log10_lr));
}

}  // namespace counterpoise::method_validation
