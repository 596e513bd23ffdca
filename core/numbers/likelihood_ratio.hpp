#pragma once
// A likelihood ratio carried as log10, with zero (findings impossible under Hp: an exclusion)
// and infinity (findings impossible under Hd) as explicit states rather than ±inf or NaN.

#include <string>

namespace counterpoise::numbers {

class LikelihoodRatio {
 public:
  enum class State { zero, finite, infinite };

  // LR = 10^log10_lr. Throws std::invalid_argument if log10_lr is NaN or infinite.
  static LikelihoodRatio from_log10(double log10_lr);
  // LR from a plain value: 0 gives zero, +inf gives infinite. Throws std::invalid_argument
  // for NaN or a negative value.
  static LikelihoodRatio from_value(double lr);
  // P(E|Hp) / P(E|Hd) from their log10 values (-inf for a probability of zero). Throws
  // std::invalid_argument when both are zero (the findings are impossible under both) or NaN.
  static LikelihoodRatio from_log10_probabilities(double log10_p_given_hp, double log10_p_given_hd);
  static LikelihoodRatio zero() { return LikelihoodRatio(State::zero, 0.0); }
  static LikelihoodRatio infinite() { return LikelihoodRatio(State::infinite, 0.0); }
  static LikelihoodRatio neutral() { return LikelihoodRatio(State::finite, 0.0); }

  State state() const noexcept { return state_; }
  bool is_zero() const noexcept { return state_ == State::zero; }
  bool is_infinite() const noexcept { return state_ == State::infinite; }
  bool is_finite() const noexcept { return state_ == State::finite; }

  // log10 LR as a double: -inf for zero, +inf for infinite.
  double log10() const noexcept;
  // LR as a double (may overflow to inf or underflow to 0 for |log10| > 308; use log10()).
  double value() const noexcept;

  // The LR with Hp and Hd swapped.
  LikelihoodRatio inverse() const noexcept;
  // Independent items multiply. Throws std::invalid_argument for zero × infinite (the items
  // contradict each other: one excludes Hp, the other excludes Hd).
  LikelihoodRatio operator*(const LikelihoodRatio& other) const;

  bool favours_hp() const noexcept { return log10() > 0.0; }
  bool favours_hd() const noexcept { return log10() < 0.0; }

  friend bool operator==(const LikelihoodRatio&, const LikelihoodRatio&) = default;

 private:
  LikelihoodRatio(State state, double log10_lr) : state_(state), log10_lr_(log10_lr) {}
  State state_;
  double log10_lr_;  // meaningful only when state_ == finite
};

// "zero", "infinite" or "finite" for files and messages.
std::string state_name(LikelihoodRatio::State state);

}  // namespace counterpoise::numbers
