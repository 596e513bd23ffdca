#pragma once
// Turning a method's raw comparison scores into likelihood ratios, fitted on a training set of
// scores with known truth and applied to other scores.
// Linear (logistic-regression) calibration: log LR = a * score + b, with a and b minimising the
// prior-weighted cross-entropy at P(Hp) = 1/2, i.e. Cllr itself (Brümmer & du Preez 2006,
// Computer Speech and Language 20:230, section on logistic-regression calibration; Morrison
// 2013, "Tutorial on logistic-regression calibration and fusion", Australian Journal of Forensic
// Sciences 45:173 — from memory). Fitted by Newton's method on standardised scores.
// PAV calibration: the PAV fit of the training scores as a step function (pav.hpp). It gives
// infinite LRs beyond the training set's extreme blocks when those hold one truth only: that is
// reported, never clipped.

#include <functional>

#include "core/method_validation/pav.hpp"
#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

// log10 LR = slope_log10 * score + offset_log10.
struct LinearCalibration {
  double slope_log10 = 0.0;
  double offset_log10 = 0.0;
  int iterations = 0;
  double log10_lr(double score) const noexcept { return slope_log10 * score + offset_log10; }
};

// Fits the linear calibration to training scores (a ValidationSet whose values are raw scores).
// Throws as require_both_truths, and validation::InvalidValue (item "results", field "score")
// when the scores separate the two truths completely (no finite fit exists) or all are equal.
LinearCalibration fit_linear_calibration(const ValidationSet& training_scores);

struct PavCalibration {
  PavFit fit;
  double log10_lr(double score) const { return block_for_score(fit, score).log10_lr; }
};

// Fits the PAV calibration to training scores. Throws as require_both_truths.
PavCalibration fit_pav_calibration(const ValidationSet& training_scores);

// Each score mapped to a log10 LR by `to_log10_lr` (a fitted calibration's log10_lr).
ValidationSet apply_calibration(const ValidationSet& scores, const std::function<double(double)>& to_log10_lr);

}  // namespace counterpoise::method_validation
