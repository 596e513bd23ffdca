#pragma once
// Text forms of numbers for messages and files: never rounds silently.

#include <string>

namespace counterpoise::numbers {

// The shortest decimal text that reads back to exactly x ("0.1", "1e-300", "inf", "nan").
std::string exact_text(double x);

// x with the given number of significant digits in plain or scientific form, for tables.
std::string significant_text(double x, int digits);

}  // namespace counterpoise::numbers
