#include "core/uncertainty/unordered_draws_summary.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>
#include <vector>

namespace counterpoise::uncertainty {

namespace {

// Where definition 7 of Hyndman & Fan (1996) reads the q-quantile of n ordered values: between
// order statistics lo and lo + 1 (0-based, the last at most) at fraction h - lo.
struct QuantilePosition {
  double fraction;
  std::size_t lo, hi;
};

QuantilePosition position_of(std::size_t n, double q) {
  const double h = (static_cast<double>(n) - 1.0) * q;
  const auto lo = static_cast<std::size_t>(std::floor(h));
  return {h - static_cast<double>(lo), lo, std::min(lo + 1, n - 1)};
}

// Puts the values at `positions` (ascending, distinct; `offset` is the position of `first`) of
// [first, last) where sorting would put them: the middle position first, then each side's
// positions within that side only.
void select_positions(std::span<double>::iterator first, std::span<double>::iterator last, std::size_t offset,
                      std::span<const std::size_t> positions) {
  if (positions.empty()) return;
  const std::size_t middle = positions.size() / 2;
  const auto at = first + static_cast<std::ptrdiff_t>(positions[middle] - offset);
  std::nth_element(first, at, last);
  select_positions(first, at, offset, positions.first(middle));
  select_positions(at + 1, last, positions[middle] + 1, positions.subspan(middle + 1));
}

}  // namespace

SpreadSummary summarize_unordered_draws(std::span<double> draws, const SpreadLevels& levels, double reported_log10) {
  if (draws.empty()) throw std::invalid_argument("summarize_unordered_draws: no draws");
  const double tail = 0.5 * (1.0 - levels.credible);
  // The levels summarize_draws reads: median, interval ends, the two conservative quantiles.
  const double read[] = {0.5, tail, 1.0 - tail, 1.0 - levels.conservative, levels.conservative};
  std::vector<std::size_t> positions;
  for (double q : read) {
    const auto at = position_of(draws.size(), q);
    positions.push_back(at.lo);
    positions.push_back(at.hi);
  }
  std::sort(positions.begin(), positions.end());
  positions.erase(std::unique(positions.begin(), positions.end()), positions.end());
  select_positions(draws.begin(), draws.end(), 0, positions);
  // The two order statistics around a quantile, read by sorted_quantile itself, so the
  // interpolation (and its rule for equal or infinite neighbours) is the sorted summary's.
  const auto quantile = [&](double q) {
    const auto at = position_of(draws.size(), q);
    return sorted_quantile({draws[at.lo], draws[at.hi]}, at.fraction);
  };
  SpreadSummary s;
  s.median_log10 = quantile(read[0]);
  s.low_log10 = quantile(read[1]);
  s.high_log10 = quantile(read[2]);
  s.conservative_log10 = conservative_bound(reported_log10, quantile(read[3]), quantile(read[4]));
  s.levels = levels;
  s.method = "Monte Carlo (" + std::to_string(draws.size()) + " draws)";
  return s;
}

}  // namespace counterpoise::uncertainty
