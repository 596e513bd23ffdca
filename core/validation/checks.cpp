#include "core/validation/checks.hpp"

#include <cmath>

#include "core/numbers/number_text.hpp"

namespace counterpoise::validation {

using numbers::exact_text;

double check_finite(const Location& where, double x) {
  if (std::isnan(x)) throw InvalidValue(where, "value is NaN (not a number)");
  if (std::isinf(x)) throw InvalidValue(where, "value is infinite; a finite number is required");
  return x;
}

double check_probability(const Location& where, double p) {
  check_finite(where, p);
  if (p < 0.0 || p > 1.0)
    throw InvalidValue(where, "probability " + exact_text(p) + " is outside [0, 1]");
  return p;
}

double check_positive(const Location& where, double x) {
  check_finite(where, x);
  if (!(x > 0.0)) throw InvalidValue(where, "value " + exact_text(x) + " must be greater than 0");
  return x;
}

double check_non_negative(const Location& where, double x) {
  check_finite(where, x);
  if (x < 0.0) throw InvalidValue(where, "value " + exact_text(x) + " must not be negative");
  return x;
}

double check_in_range(const Location& where, double x, double lo, double hi) {
  check_finite(where, x);
  if (x < lo || x > hi)
    throw InvalidValue(where, "value " + exact_text(x) + " is outside [" + exact_text(lo) + ", " +
                                  exact_text(hi) + "]");
  return x;
}

void check_ordered(const Location& where, double lo, double hi) {
  if (lo > hi)
    throw InvalidValue(where, "interval low " + exact_text(lo) + " is greater than high " +
                                  exact_text(hi));
}

}  // namespace counterpoise::validation
