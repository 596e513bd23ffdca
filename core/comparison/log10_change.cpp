#include "core/comparison/log10_change.hpp"

#include <cmath>
#include <limits>

#include "core/numbers/number_text.hpp"

namespace counterpoise::comparison {

Log10Change Log10Change::between(double log10_from, double log10_to) {
  if (std::isfinite(log10_from) && std::isfinite(log10_to)) return finite_change(log10_to - log10_from);
  if (log10_from == log10_to) return finite_change(0.0);  // both zero or both infinite: no move
  // One end (or both, opposite) infinite: the move is infinite towards the larger end.
  return Log10Change{log10_to > log10_from ? State::plus_infinite : State::minus_infinite, 0.0};
}

double Log10Change::value() const {
  constexpr double inf = std::numeric_limits<double>::infinity();
  switch (state) {
    case State::plus_infinite: return inf;
    case State::minus_infinite: return -inf;
    case State::finite: break;
  }
  return log10;
}

double Log10Change::size() const { return std::abs(value()); }

std::string state_name(Log10Change::State state) {
  switch (state) {
    case Log10Change::State::plus_infinite: return "plus-infinite";
    case Log10Change::State::minus_infinite: return "minus-infinite";
    case Log10Change::State::finite: break;
  }
  return "finite";
}

std::string change_for_readers(const Log10Change& change) {
  switch (change.state) {
    case Log10Change::State::plus_infinite: return "+infinite (to an infinite LR, or away from LR zero)";
    case Log10Change::State::minus_infinite: return "−infinite (to LR zero, or away from an infinite LR)";
    case Log10Change::State::finite: break;
  }
  const std::string text = numbers::log10_for_readers(change.log10);
  // log10_for_readers signs negatives with U+2212; a rise gets an explicit plus.
  return change.log10 > 0.0 && text != "0.00" ? "+" + text : text;
}

}  // namespace counterpoise::comparison
