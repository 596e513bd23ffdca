#pragma once
// How an uncertain log10 LR is summarised: the median, a central credible interval and a
// conservative one-sided bound. The bound is the (1 - level) quantile when the point LR
// favours Hp and the level quantile when it favours Hd, so it always lies on the side of
// less support for the favoured proposition (common practice; docs/methods.md).

#include <string>
#include <vector>

#include "core/uncertainty/grid_pmf.hpp"

namespace counterpoise::uncertainty {

struct SpreadLevels {
  double credible = 0.90;      // central interval
  double conservative = 0.95;  // one-sided
};

struct SpreadSummary {
  double median_log10;
  double low_log10, high_log10;      // central credible interval (±inf allowed)
  double conservative_log10;
  SpreadLevels levels;
  std::string method;                 // "lattice convolution" or "Monte Carlo (N draws)"
  double lattice_step = 0.0;          // resolution of a lattice result, in log10 units
};

// Summary of a discretised distribution; `favours_hp` is the direction of the point LR.
SpreadSummary summarize(const GridPmf& pmf, const SpreadLevels& levels, bool favours_hp);

// Summary of draws (sorted in place); quantiles by linear interpolation between order
// statistics (Hyndman & Fan 1996, The American Statistician 50:361, definition 7).
SpreadSummary summarize_draws(std::vector<double>& draws, const SpreadLevels& levels, bool favours_hp);

// The q-quantile of sorted draws, definition 7 of Hyndman & Fan (1996). Throws
// std::invalid_argument for an empty vector or q outside [0, 1].
double sorted_quantile(const std::vector<double>& sorted, double q);

}  // namespace counterpoise::uncertainty
