#pragma once
// How far a log10 LR moved between two versions of a case, with the moves to or from a zero or
// infinite LR as explicit states: an exclusion on one side is an infinite change, never NaN.

#include <string>

namespace counterpoise::comparison {

struct Log10Change {
  enum class State { finite, plus_infinite, minus_infinite };
  State state = State::finite;
  double log10 = 0.0;  // the change when finite

  // The change from `log10_from` to `log10_to` (each may be -inf for LR zero, +inf for an
  // infinite LR): finite when both are finite, none (0) when both are the same infinity, else
  // infinite in the direction of the move. Never NaN.
  static Log10Change between(double log10_from, double log10_to);
  static Log10Change finite_change(double log10) { return Log10Change{State::finite, log10}; }

  bool is_finite() const { return state == State::finite; }
  // The change as a double: ±inf for the infinite states.
  double value() const;
  // For sorting: infinite changes first, then by absolute size.
  double size() const;
};

// "finite", "plus-infinite" or "minus-infinite" for files.
std::string state_name(Log10Change::State state);

// "+1.23", "−0.45", "0.00", "+∞ (to an infinite LR, or from LR zero)", through the one number
// formatter (numbers::log10_for_readers) with an explicit sign.
std::string change_for_readers(const Log10Change& change);

}  // namespace counterpoise::comparison
