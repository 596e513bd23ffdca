#pragma once
// The summary of draws (uncertainty::summarize_draws, spread_summary.hpp) with the same values,
// made without sorting the draws: only the order statistics the summary reads are put in place
// (std::nth_element on the median first, then on each side for the positions on that side),
// which costs a few passes over the draws where sorting costs log2 of their number. For the
// many summaries of the interval against a weighted set (evaluation/compound_spread).

#include <span>

#include "core/uncertainty/spread_summary.hpp"

namespace counterpoise::uncertainty {

// The summary of `draws` (no NaN; left in another order) around `reported_log10`: the values of
// summarize_draws on the same draws. Throws std::invalid_argument for no draws.
SpreadSummary summarize_unordered_draws(std::span<double> draws, const SpreadLevels& levels, double reported_log10);

}  // namespace counterpoise::uncertainty
