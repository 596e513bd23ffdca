#include "core/numbers/likelihood_ratio.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>

namespace counterpoise::numbers {

LikelihoodRatio LikelihoodRatio::from_log10(double log10_lr) {
  if (!std::isfinite(log10_lr))
    throw std::invalid_argument("log10 LR must be finite; use zero() or infinite() for the limits");
  return LikelihoodRatio(State::finite, log10_lr);
}

LikelihoodRatio LikelihoodRatio::from_value(double lr) {
  if (std::isnan(lr)) throw std::invalid_argument("LR is NaN");
  if (lr < 0.0) throw std::invalid_argument("LR is negative");
  if (lr == 0.0) return zero();
  if (std::isinf(lr)) return infinite();
  return from_log10(std::log10(lr));
}

LikelihoodRatio LikelihoodRatio::from_log10_probabilities(double log10_p_given_hp,
                                                          double log10_p_given_hd) {
  if (std::isnan(log10_p_given_hp) || std::isnan(log10_p_given_hd))
    throw std::invalid_argument("probability is NaN");
  const double minus_inf = -std::numeric_limits<double>::infinity();
  const bool hp_zero = log10_p_given_hp == minus_inf;
  const bool hd_zero = log10_p_given_hd == minus_inf;
  if (hp_zero && hd_zero)
    throw std::invalid_argument(
        "P(E|Hp) and P(E|Hd) are both zero: the findings would be impossible under both propositions");
  if (hp_zero) return zero();
  if (hd_zero) return infinite();
  return from_log10(log10_p_given_hp - log10_p_given_hd);
}

double LikelihoodRatio::log10() const noexcept {
  switch (state_) {
    case State::zero: return -std::numeric_limits<double>::infinity();
    case State::infinite: return std::numeric_limits<double>::infinity();
    case State::finite: break;
  }
  return log10_lr_;
}

double LikelihoodRatio::value() const noexcept { return std::pow(10.0, log10()); }

LikelihoodRatio LikelihoodRatio::inverse() const noexcept {
  switch (state_) {
    case State::zero: return infinite();
    case State::infinite: return zero();
    case State::finite: break;
  }
  return LikelihoodRatio(State::finite, -log10_lr_);
}

LikelihoodRatio LikelihoodRatio::operator*(const LikelihoodRatio& other) const {
  if ((is_zero() && other.is_infinite()) || (is_infinite() && other.is_zero()))
    throw std::invalid_argument(
        "an item with LR zero (findings impossible under Hp) cannot be combined with an item with "
        "infinite LR (findings impossible under Hd)");
  if (is_zero() || other.is_zero()) return zero();
  if (is_infinite() || other.is_infinite()) return infinite();
  return LikelihoodRatio(State::finite, log10_lr_ + other.log10_lr_);
}

std::string state_name(LikelihoodRatio::State state) {
  switch (state) {
    case LikelihoodRatio::State::zero: return "zero";
    case LikelihoodRatio::State::infinite: return "infinite";
    case LikelihoodRatio::State::finite: break;
  }
  return "finite";
}

}  // namespace counterpoise::numbers
