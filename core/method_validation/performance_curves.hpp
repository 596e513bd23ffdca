#pragma once
// The curves a validation report plots.
// Tippett plot: for each truth, the proportion of results whose log10 LR is at least x, over x
// (common practice in forensic validation; Meuwly, Ramos & Haraksim 2017, FSI 276:142, as a
// graphical representation of performance).
// Empirical cross-entropy over the prior log odds (Ramos & González-Rodríguez 2013, "Reliable
// support: measuring calibration of likelihood ratios", FSI 230:156, eq. for ECE):
//   ECE(O) = P(Hp)/Np sum_{Hp} log2(1 + 1/(LR_i O)) + P(Hd)/Nd sum_{Hd} log2(1 + LR_j O),
// with O = P(Hp)/P(Hd). At O = 1 it equals Cllr. The neutral reference (every LR = 1) is the
// entropy of the prior; the calibrated reference uses the PAV-transformed LRs.

#include <span>
#include <vector>

#include "core/method_validation/pav.hpp"
#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

// log10 LRs of one truth, sorted, for Tippett proportions.
struct SortedLog10Lrs {
  explicit SortedLog10Lrs(std::vector<double> values);
  // The proportion of values >= x.
  double proportion_at_least(double x) const;
  const std::vector<double>& values() const noexcept { return values_; }

 private:
  std::vector<double> values_;
};

struct CurvePoint {
  double x = 0.0;
  double y = 0.0;
};

// Tippett curves at the given x values (log10 LR).
struct TippettCurves {
  std::vector<CurvePoint> hp;
  std::vector<CurvePoint> hd;
};
TippettCurves tippett_curves(const ValidationSet& set, std::span<const double> log10_lr_points);

// `count` evenly spaced points from `from` to `to` inclusive (count >= 2).
std::vector<double> evenly_spaced(double from, double to, int count);

struct EceCurves {
  std::vector<double> prior_log10_odds;
  std::vector<double> method;      // the LRs as given
  std::vector<double> calibrated;  // after PAV
  std::vector<double> neutral;     // every LR = 1
};

// ECE of the method's LRs at the prior log10 odds `o`.
double empirical_cross_entropy(const ValidationSet& set, double prior_log10_odds);
// ECE of weighted blocks (a PAV fit) at `o`.
double empirical_cross_entropy(const PavFit& fit, double prior_log10_odds);
// ECE of a method that always says LR = 1.
double neutral_cross_entropy(double prior_log10_odds);

// The three ECE curves at the given prior log10 odds. Throws as require_both_truths.
EceCurves ece_curves(const ValidationSet& set, const PavFit& fit, std::span<const double> prior_log10_odds);

}  // namespace counterpoise::method_validation
