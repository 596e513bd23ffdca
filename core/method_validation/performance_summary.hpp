#pragma once
// Every measure of a validation run in one place, with seeded bootstrap intervals.
// Cllr, Cllr_min and the calibration loss Cllr_cal = Cllr - Cllr_min: Brümmer & du Preez 2006,
// Computer Speech and Language 20:230. Bootstrap: Efron & Tibshirani 1993, An Introduction to the
// Bootstrap, ch. 13 (percentile intervals), resampling within each truth so every resample keeps
// the numbers of Hp-true and Hd-true comparisons.

#include <cstddef>
#include <cstdint>

#include "core/method_validation/error_rates.hpp"
#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

struct PerformanceSummary {
  std::size_t hp_count = 0;
  std::size_t hd_count = 0;
  InfiniteCounts infinite;
  double cllr = 0.0;      // bits
  double cllr_min = 0.0;  // bits
  double cllr_cal = 0.0;  // bits; infinite when Cllr is
  double eer = 0.0;       // proportion
  MisleadingRates misleading;
};

// All measures of `set`. Throws as require_both_truths.
PerformanceSummary summarize_performance(const ValidationSet& set);

struct Interval {
  double low = 0.0;
  double high = 0.0;
};

struct BootstrapOptions {
  int resamples = 1000;
  std::uint64_t seed = 20260101;
  double level = 0.95;  // central percentile interval
};

struct BootstrapIntervals {
  BootstrapOptions options;
  Interval cllr, cllr_min, cllr_cal, eer;
  Interval misleading_hp, misleading_hd, strong_hp, strong_hd;
};

// Percentile intervals of every measure over resamples drawn with std::mt19937_64 (whose output
// the C++ standard fixes, so a seed gives the same intervals on every platform). Throws as
// require_both_truths, and validation::InvalidValue (item "options") unless resamples is at
// least 20 and level is inside (0, 1).
BootstrapIntervals bootstrap_intervals(const ValidationSet& set, const BootstrapOptions& options);

}  // namespace counterpoise::method_validation
