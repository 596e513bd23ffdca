#pragma once
// A set of validation results: the log10 likelihood ratios a method gave to comparisons whose
// ground truth is known, split by that truth. Infinite values are kept as they are (a method
// that says "impossible under Hd" gives +inf): every measure decides what an infinite LR means
// explicitly instead of letting it turn into NaN.

#include <cstddef>
#include <vector>

namespace counterpoise::method_validation {

// The ground truth of one comparison.
enum class Truth { hp, hd };

struct ValidationSet {
  std::vector<double> hp_log10_lr;  // comparisons where Hp is true (e.g. same source)
  std::vector<double> hd_log10_lr;  // comparisons where Hd is true (e.g. different sources)

  void add(Truth truth, double log10_lr);
  std::size_t size() const noexcept { return hp_log10_lr.size() + hd_log10_lr.size(); }
  bool has_both_truths() const noexcept { return !hp_log10_lr.empty() && !hd_log10_lr.empty(); }
};

// How many results are infinite in each direction, counted and reported, never hidden.
struct InfiniteCounts {
  std::size_t hp_plus = 0;   // Hp true, LR = +inf (right, and as strong as can be)
  std::size_t hp_zero = 0;   // Hp true, LR = 0 (a confident error: Cllr becomes infinite)
  std::size_t hd_plus = 0;   // Hd true, LR = +inf (a confident error: Cllr becomes infinite)
  std::size_t hd_zero = 0;   // Hd true, LR = 0 (right)
  std::size_t total() const noexcept { return hp_plus + hp_zero + hd_plus + hd_zero; }
};
InfiniteCounts count_infinite(const ValidationSet& set);

// Throws validation::InvalidValue (item "results", field "truth") unless the set holds at least
// one result of each truth: no measure of discrimination or calibration exists otherwise.
void require_both_truths(const ValidationSet& set);

}  // namespace counterpoise::method_validation
