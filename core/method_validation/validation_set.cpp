#include "core/method_validation/validation_set.hpp"

#include <cmath>

#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

void ValidationSet::add(Truth truth, double log10_lr) {
  (truth == Truth::hp ? hp_log10_lr : hd_log10_lr).push_back(log10_lr);
}

InfiniteCounts count_infinite(const ValidationSet& set) {
  InfiniteCounts counts;
  for (double x : set.hp_log10_lr) {
    if (x == INFINITY) ++counts.hp_plus;
    if (x == -INFINITY) ++counts.hp_zero;
  }
  for (double x : set.hd_log10_lr) {
    if (x == INFINITY) ++counts.hd_plus;
    if (x == -INFINITY) ++counts.hd_zero;
  }
  return counts;
}

void require_both_truths(const ValidationSet& set) {
  if (set.hp_log10_lr.empty() || set.hd_log10_lr.empty())
    throw validation::InvalidValue(
        {"results", "truth"},
        "the results hold " + std::to_string(set.hp_log10_lr.size()) + " comparison(s) where Hp is true and " +
            std::to_string(set.hd_log10_lr.size()) +
            " where Hd is true; a validation needs both, since discrimination and calibration compare the two");
}

}  // namespace counterpoise::method_validation
