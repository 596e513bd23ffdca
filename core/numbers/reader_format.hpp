#pragma once
// Numbers written for readers of a report (docs/methods.md, "How numbers are written"):
// - an LR gets two significant figures, or one when its central interval spans more than a
//   factor of 10, so no more precision is shown than the interval supports;
// - from 10^6 up (and below 10^-6) it is written as "1.2 × 10^9";
// - digits are grouped in threes with a space ("about 2 300");
// - a posterior probability above 0.99 is written through its complement ("1 − 3.2 × 10^-15").
// Plain ASCII apart from "×" and "−", so the text extracts from a PDF exactly as printed.

#include <optional>
#include <string>

#include "core/numbers/likelihood_ratio.hpp"
#include "core/numbers/posterior.hpp"

namespace counterpoise::numbers {

// Significant figures for an LR with an optional central interval of log10 width `width`.
int significant_figures_for(std::optional<double> log10_interval_width);

// "2 300", "1.2 × 10^9", "0.0043", "1.2 × 10^-9"; "0" and "infinite" for the explicit states.
std::string lr_for_readers(const LikelihoodRatio& lr, int significant_figures);

// A positive number x given by log10 x, in the same style.
std::string magnitude_for_readers(double log10_x, int significant_figures);

// "0.27", "1 − 3.2 × 10^-15", "3.2 × 10^-9"; probabilities given as a Posterior so the
// complement is exact.
std::string posterior_for_readers(const Posterior& posterior, int significant_figures = 2);

// A probability given as log10 p: plain down to 0.001, scientific below ("4.4 × 10^-7").
std::string probability_for_readers(double log10_p, int significant_figures);

// Prior odds as "1 to 1 000 000" style text ("1 to 999 999" for one of 1 000 000).
std::string odds_for_readers(double log10_odds);

}  // namespace counterpoise::numbers
