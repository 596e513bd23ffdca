#include "core/method_validation/performance_curves.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <thread>

#include "core/method_validation/cllr.hpp"
#include "core/numbers/log10_math.hpp"

namespace counterpoise::method_validation {

SortedLog10Lrs::SortedLog10Lrs(std::vector<double> values) : values_(std::move(values)) {
  std::sort(values_.begin(), values_.end());
}

double SortedLog10Lrs::proportion_at_least(double x) const {
  if (values_.empty()) return 0.0;
  const auto first = std::lower_bound(values_.begin(), values_.end(), x);
  return static_cast<double>(values_.end() - first) / static_cast<double>(values_.size());
}

TippettCurves tippett_curves(const ValidationSet& set, std::span<const double> log10_lr_points) {
  const SortedLog10Lrs hp(set.hp_log10_lr), hd(set.hd_log10_lr);
  TippettCurves curves;
  for (double x : log10_lr_points) {
    curves.hp.push_back({x, hp.proportion_at_least(x)});
    curves.hd.push_back({x, hd.proportion_at_least(x)});
  }
  return curves;
}

std::vector<double> evenly_spaced(double from, double to, int count) {
  if (count < 2) throw std::invalid_argument("evenly_spaced: count must be at least 2");
  std::vector<double> points(static_cast<std::size_t>(count));
  for (int i = 0; i < count; ++i) points[static_cast<std::size_t>(i)] = from + (to - from) * i / (count - 1);
  return points;
}

namespace {

// P(Hp) and P(Hd) from the prior log10 odds, each computed directly (no 1 - p).
std::pair<double, double> prior_probabilities(double prior_log10_odds) {
  return {std::pow(10.0, numbers::log10_probability_from_log10_odds(prior_log10_odds)),
          std::pow(10.0, numbers::log10_probability_from_log10_odds(-prior_log10_odds))};
}

}  // namespace

double empirical_cross_entropy(const ValidationSet& set, double o) {
  require_both_truths(set);
  const auto [p_hp, p_hd] = prior_probabilities(o);
  double hp_bits = 0.0, hd_bits = 0.0;
  for (double x : set.hp_log10_lr) hp_bits += log2_one_plus_pow10(-(x + o));
  for (double x : set.hd_log10_lr) hd_bits += log2_one_plus_pow10(x + o);
  return p_hp * hp_bits / static_cast<double>(set.hp_log10_lr.size()) +
         p_hd * hd_bits / static_cast<double>(set.hd_log10_lr.size());
}

double empirical_cross_entropy(const PavFit& fit, double o) {
  const auto [p_hp, p_hd] = prior_probabilities(o);
  double hp_bits = 0.0, hd_bits = 0.0;
  for (const PavBlock& b : fit.blocks) {
    if (b.hp_weight > 0.0) hp_bits += b.hp_weight * log2_one_plus_pow10(-(b.log10_lr + o));
    if (b.hd_weight > 0.0) hd_bits += b.hd_weight * log2_one_plus_pow10(b.log10_lr + o);
  }
  return p_hp * hp_bits / fit.hp_total + p_hd * hd_bits / fit.hd_total;
}

double neutral_cross_entropy(double o) {
  const auto [p_hp, p_hd] = prior_probabilities(o);
  return p_hp * log2_one_plus_pow10(-o) + p_hd * log2_one_plus_pow10(o);
}

namespace {

// The method's ECE at many priors without a power of ten per result and prior: 10^(x + o) is
// 10^x times 10^o, with 10^x formed once per result. Results with |log10 LR| above 250 (and
// priors beyond +-50) take the exact path of empirical_cross_entropy so nothing overflows.
class MethodCrossEntropy {
 public:
  explicit MethodCrossEntropy(const ValidationSet& set) : set_(set) {
    for (double x : set.hp_log10_lr) (std::abs(x) <= kModerate ? hp_inverse_lr_ : hp_extreme_).push_back(std::abs(x) <= kModerate ? std::pow(10.0, -x) : x);
    for (double x : set.hd_log10_lr) (std::abs(x) <= kModerate ? hd_lr_ : hd_extreme_).push_back(std::abs(x) <= kModerate ? std::pow(10.0, x) : x);
  }

  double at(double o) const {
    if (std::abs(o) > 50.0) return empirical_cross_entropy(set_, o);
    const auto [p_hp, p_hd] = prior_probabilities(o);
    const double odds = std::pow(10.0, o), inverse_odds = std::pow(10.0, -o);
    double hp_nats = 0.0, hd_nats = 0.0;
    for (double inverse_lr : hp_inverse_lr_) hp_nats += std::log1p(inverse_lr * inverse_odds);
    for (double lr : hd_lr_) hd_nats += std::log1p(lr * odds);
    constexpr double kLn2 = 0.693147180559945309417232121458176568;
    double hp_bits = hp_nats / kLn2, hd_bits = hd_nats / kLn2;
    for (double x : hp_extreme_) hp_bits += log2_one_plus_pow10(-(x + o));
    for (double x : hd_extreme_) hd_bits += log2_one_plus_pow10(x + o);
    return p_hp * hp_bits / static_cast<double>(set_.hp_log10_lr.size()) +
           p_hd * hd_bits / static_cast<double>(set_.hd_log10_lr.size());
  }

 private:
  static constexpr double kModerate = 250.0;
  const ValidationSet& set_;
  std::vector<double> hp_inverse_lr_, hd_lr_, hp_extreme_, hd_extreme_;
};

}  // namespace

EceCurves ece_curves(const ValidationSet& set, const PavFit& fit, std::span<const double> prior_log10_odds) {
  require_both_truths(set);
  EceCurves curves;
  curves.prior_log10_odds.assign(prior_log10_odds.begin(), prior_log10_odds.end());
  const std::size_t n = prior_log10_odds.size();
  curves.method.resize(n);
  const MethodCrossEntropy method(set);
  // The priors are independent: share them between the machine's cores (each writes its own slots).
  const std::size_t workers = std::clamp<std::size_t>(std::thread::hardware_concurrency(), 1, 8);
  std::vector<std::thread> threads;
  for (std::size_t w = 1; w < workers; ++w)
    threads.emplace_back([&, w] {
      for (std::size_t i = w; i < n; i += workers) curves.method[i] = method.at(prior_log10_odds[i]);
    });
  for (std::size_t i = 0; i < n; i += workers) curves.method[i] = method.at(prior_log10_odds[i]);
  for (std::thread& t : threads) t.join();
  for (double o : prior_log10_odds) {
    curves.calibrated.push_back(empirical_cross_entropy(fit, o));
    curves.neutral.push_back(neutral_cross_entropy(o));
  }
  return curves;
}

}  // namespace counterpoise::method_validation
