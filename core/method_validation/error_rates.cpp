#include "core/method_validation/error_rates.hpp"

#include <cmath>

#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

MisleadingRates misleading_rates(const ValidationSet& set, double strong_threshold) {
  require_both_truths(set);
  if (!(strong_threshold > 1.0) || !std::isfinite(strong_threshold))
    throw validation::InvalidValue({"options", "strong_threshold"}, "the threshold for strongly misleading evidence must be a finite number above 1");
  const double log10_strong = std::log10(strong_threshold);
  std::size_t hp = 0, strong_hp = 0, hd = 0, strong_hd = 0;
  MisleadingRates rates;
  for (double x : set.hp_log10_lr) {
    if (x < 0) ++hp;
    if (x <= -log10_strong) ++strong_hp;
    if (x == 0) ++rates.neutral_hp;
  }
  for (double x : set.hd_log10_lr) {
    if (x > 0) ++hd;
    if (x >= log10_strong) ++strong_hd;
    if (x == 0) ++rates.neutral_hd;
  }
  const double np = static_cast<double>(set.hp_log10_lr.size());
  const double nd = static_cast<double>(set.hd_log10_lr.size());
  rates.hp = static_cast<double>(hp) / np;
  rates.strong_hp = static_cast<double>(strong_hp) / np;
  rates.hd = static_cast<double>(hd) / nd;
  rates.strong_hd = static_cast<double>(strong_hd) / nd;
  return rates;
}

double equal_error_rate(const PavFit& fit) {
  // Vertices of the hull from threshold below every score (miss 0, false alarm 1) to above every
  // score (miss 1, false alarm 0); each block moves the threshold past its results.
  double miss = 0.0, false_alarm = 1.0;
  for (const PavBlock& b : fit.blocks) {
    const double next_miss = miss + b.hp_weight / fit.hp_total;
    const double next_false_alarm = false_alarm - b.hd_weight / fit.hd_total;
    if (next_miss >= next_false_alarm) {
      const double before = miss - false_alarm;             // <= 0
      const double after = next_miss - next_false_alarm;    // >= 0
      const double t = after == before ? 0.0 : -before / (after - before);
      return false_alarm + t * (next_false_alarm - false_alarm);
    }
    miss = next_miss;
    false_alarm = next_false_alarm;
  }
  return 0.0;  // unreachable: after the last block miss = 1 >= false alarm = 0
}

}  // namespace counterpoise::method_validation
