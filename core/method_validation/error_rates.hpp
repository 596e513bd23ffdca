#pragma once
// Rates of misleading evidence and the equal error rate.
// Misleading evidence (Royall 2000, "On the probability of observing misleading statistical
// evidence", JASA 95:760): an LR below 1 when Hp is true, above 1 when Hd is true; strongly
// misleading at the threshold k = 100 (LR <= 1/100 when Hp is true, LR >= 100 when Hd is true).
// An LR of exactly 1 favours neither and is counted as neutral, not as misleading.
// The equal error rate is read off the ROC convex hull given by the PAV blocks (Brümmer &
// du Preez 2006, Computer Speech and Language 20:230; the convex-hull form: Provost & Fawcett
// 2001, Machine Learning 42:203), so it does not depend on which threshold happens to be tried.

#include <cstddef>

#include "core/method_validation/pav.hpp"
#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

struct MisleadingRates {
  double hp = 0.0;         // Hp true, LR < 1
  double hd = 0.0;         // Hd true, LR > 1
  double strong_hp = 0.0;  // Hp true, LR <= 1 / strong_threshold
  double strong_hd = 0.0;  // Hd true, LR >= strong_threshold
  std::size_t neutral_hp = 0;  // Hp true, LR exactly 1
  std::size_t neutral_hd = 0;
};

// The rates as proportions of each truth's results. Throws as require_both_truths, and
// validation::InvalidValue unless strong_threshold > 1.
MisleadingRates misleading_rates(const ValidationSet& set, double strong_threshold = 100.0);

// The equal error rate of a PAV fit: where the ROC convex hull crosses P(miss) = P(false alarm).
double equal_error_rate(const PavFit& fit);

}  // namespace counterpoise::method_validation
