#pragma once
// How an uncertain log10 LR is summarised around the reported (point) value: the median, a
// central credible interval and a conservative one-sided bound.
//
// The reported value is the LR from the expected (marginal) probabilities: the value of the
// findings given what the scientist knows (Taroni, Bozza, Biedermann & Aitken 2016, "Dismissal
// of the illusion of uncertainty in the assessment of a likelihood ratio", Law, Probability and
// Risk 15:1 — from memory). The interval describes how far the ratio would move if the assigned
// probabilities were known exactly: a sensitivity of the value to the assignments, not a range
// for a "true" LR. The reported value therefore need not lie inside the interval.
//
// The conservative bound is the (1 - level) quantile when the reported LR favours Hp and the
// level quantile when it favours Hd, but never more support than the reported value itself:
// min(reported, quantile) for Hp, max(reported, quantile) for Hd. At an LR of exactly 1 (within
// numbers::kLrRelativeTolerance) no proposition is favoured and the bound is 1. In the band below
// the first verbal band (1 < LR < 2) the direction is the side of 1 the reported value is on,
// and the bound may cross 1 (docs/methods.md).

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

// Summary of a discretised distribution around the reported value `reported_log10`.
SpreadSummary summarize(const GridPmf& pmf, const SpreadLevels& levels, double reported_log10);

// Summary of draws (sorted in place); quantiles by linear interpolation between order
// statistics (Hyndman & Fan 1996, The American Statistician 50:361, definition 7).
SpreadSummary summarize_draws(std::vector<double>& draws, const SpreadLevels& levels, double reported_log10);

// The conservative bound (above) from the reported value and the two one-sided quantiles at the
// conservative level: `lower` the (1 - level) quantile, `upper` the level quantile.
double conservative_bound(double reported_log10, double lower, double upper);

// The q-quantile of sorted draws, definition 7 of Hyndman & Fan (1996). Throws
// std::invalid_argument for an empty vector or q outside [0, 1].
double sorted_quantile(const std::vector<double>& sorted, double q);

}  // namespace counterpoise::uncertainty
