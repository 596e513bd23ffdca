#include "core/numbers/log10_math.hpp"

#include <algorithm>
#include <limits>
#include <stdexcept>

namespace counterpoise::numbers {

namespace {
constexpr double kMinusInf = -std::numeric_limits<double>::infinity();
constexpr double kLog10Half = -0.30102999566398119521373889472449302677;
}  // namespace

double log10_add(double log10_a, double log10_b) {
  const double hi = std::max(log10_a, log10_b);
  const double lo = std::min(log10_a, log10_b);
  if (hi == kMinusInf) return kMinusInf;
  if (std::isinf(hi)) return hi;
  return hi + std::log1p(std::pow(10.0, lo - hi)) / kLn10;
}

double log10_sum(std::span<const double> log10_terms) {
  if (log10_terms.empty()) return kMinusInf;
  const double hi = *std::max_element(log10_terms.begin(), log10_terms.end());
  if (hi == kMinusInf || std::isinf(hi)) return hi;
  double scaled = 0.0;
  for (double t : log10_terms) scaled += std::pow(10.0, t - hi);
  return hi + std::log10(scaled);
}

double log10_one_minus(double log10_x) {
  if (log10_x > 0.0) throw std::domain_error("log10_one_minus: argument above 0 (probability above 1)");
  if (log10_x == 0.0) return kMinusInf;
  if (log10_x < kLog10Half) return std::log1p(-std::pow(10.0, log10_x)) / kLn10;
  return std::log10(-std::expm1(log10_x * kLn10));
}

double log10_probability_from_log10_odds(double log10_odds) {
  if (log10_odds == std::numeric_limits<double>::infinity()) return 0.0;
  if (log10_odds == kMinusInf) return kMinusInf;
  // p = 1 / (1 + 10^-L). For L >= 0: -log1p(10^-L)/ln10. For L < 0: L - log10(1 + 10^L).
  if (log10_odds >= 0.0) return -std::log1p(std::pow(10.0, -log10_odds)) / kLn10;
  return log10_odds - std::log1p(std::pow(10.0, log10_odds)) / kLn10;
}

double log10_odds_from_log10_probability(double log10_p) {
  return log10_p - log10_one_minus(log10_p);
}

}  // namespace counterpoise::numbers
