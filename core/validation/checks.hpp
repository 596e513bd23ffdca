#pragma once
// Boundary checks shared by every reader. Each throws InvalidValue naming the location;
// none clamps or rounds. NaN is rejected first; infinities are decided explicitly.

#include <cstdint>

#include "core/validation/input_error.hpp"

namespace counterpoise::validation {

// Returns p; throws InvalidValue unless p is finite and 0 <= p <= 1.
double check_probability(const Location& where, double p);
// Returns x; throws InvalidValue if x is NaN or infinite.
double check_finite(const Location& where, double x);
// Returns x; throws InvalidValue unless x is finite and x > 0.
double check_positive(const Location& where, double x);
// Returns x; throws InvalidValue unless x is finite and x >= 0.
double check_non_negative(const Location& where, double x);
// Returns x; throws InvalidValue unless x is finite and lo <= x <= hi.
double check_in_range(const Location& where, double x, double lo, double hi);
// Throws InvalidValue unless lo <= hi (both already checked by the caller).
void check_ordered(const Location& where, double lo, double hi);

}  // namespace counterpoise::validation
