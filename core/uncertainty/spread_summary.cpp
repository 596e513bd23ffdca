#include "core/uncertainty/spread_summary.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "core/numbers/lr_tolerance.hpp"

namespace counterpoise::uncertainty {

double conservative_bound(double reported_log10, double lower, double upper) {
  if (numbers::is_neutral_log10(reported_log10)) return 0.0;
  return reported_log10 > 0.0 ? std::min(reported_log10, lower) : std::max(reported_log10, upper);
}

SpreadSummary summarize(const GridPmf& pmf, const SpreadLevels& levels, double reported_log10) {
  const double tail = 0.5 * (1.0 - levels.credible);
  SpreadSummary s;
  s.median_log10 = pmf.quantile(0.5);
  s.low_log10 = pmf.quantile(tail);
  s.high_log10 = pmf.quantile(1.0 - tail);
  s.conservative_log10 = conservative_bound(reported_log10, pmf.quantile(1.0 - levels.conservative),
                                            pmf.quantile(levels.conservative));
  s.levels = levels;
  s.method = "lattice convolution";
  s.lattice_step = pmf.step;
  return s;
}

double sorted_quantile(const std::vector<double>& sorted, double q) {
  if (sorted.empty()) throw std::invalid_argument("sorted_quantile: no values");
  if (!(q >= 0.0 && q <= 1.0)) throw std::invalid_argument("sorted_quantile: q outside [0, 1]");
  const double h = (static_cast<double>(sorted.size()) - 1.0) * q;
  const auto lo = static_cast<std::size_t>(std::floor(h));
  const auto hi = std::min(lo + 1, sorted.size() - 1);
  const double a = sorted[lo], b = sorted[hi];
  if (a == b || std::isinf(a) || std::isinf(b)) return h - static_cast<double>(lo) < 0.5 ? a : b;
  return a + (h - static_cast<double>(lo)) * (b - a);
}

SpreadSummary summarize_draws(std::vector<double>& draws, const SpreadLevels& levels, double reported_log10) {
  std::sort(draws.begin(), draws.end());
  const double tail = 0.5 * (1.0 - levels.credible);
  SpreadSummary s;
  s.median_log10 = sorted_quantile(draws, 0.5);
  s.low_log10 = sorted_quantile(draws, tail);
  s.high_log10 = sorted_quantile(draws, 1.0 - tail);
  s.conservative_log10 = conservative_bound(reported_log10, sorted_quantile(draws, 1.0 - levels.conservative),
                                            sorted_quantile(draws, levels.conservative));
  s.levels = levels;
  s.method = "Monte Carlo (" + std::to_string(draws.size()) + " draws)";
  return s;
}

}  // namespace counterpoise::uncertainty
