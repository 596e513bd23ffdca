#pragma once
// The one formatter for every number a person reads: the report, the editor and the command line
// all write numbers through these functions, so one quantity has one text everywhere
// (docs/methods.md, "How numbers are written"). The policy:
// - results (likelihood ratios, probabilities, posterior probabilities, odds) are rounded to
//   kReaderFigures significant figures; calculations always use the unrounded values;
// - trailing zeros are kept when they are significant ("2.00 × 10⁶" for 1 999 800) and dropped
//   when the value is exact at that precision ("2 × 10⁶" for 2 000 000, "0.5");
// - from 10⁶ up and below 10⁻⁶ (probabilities below 0.001) a number is written as "2.27 × 10⁶",
//   the power of ten with superscript digits, never "10^6";
// - digits are grouped in threes with a narrow no-break space (U+202F): "2 300";
// - negative numbers use the minus sign U+2212, never the hyphen;
// - log10 values get kLog10Decimals decimals ("2.36", "−4.52");
// - a posterior probability above 0.99 is written through its complement ("1 − 3.16 × 10⁻¹⁵").
// Apart from "×", "−", the superscripts and U+202F the text is ASCII, so it extracts from a PDF
// exactly as printed. exact_text and significant_text are for files and messages, not readers.

#include <cstdint>
#include <string>

#include "core/numbers/likelihood_ratio.hpp"
#include "core/numbers/posterior.hpp"

namespace counterpoise::numbers {

// Significant figures of every result a reader sees.
inline constexpr int kReaderFigures = 3;
// Significant figures of the intermediate values printed for recomputation: enough that a
// result recomputed from them agrees with the unrounded one to kReaderFigures.
inline constexpr int kWorkingFigures = 6;
// Decimals of a log10 value (hundredths of a decade, about 2 % in the value).
inline constexpr int kLog10Decimals = 2;

// The sentence a report prints to state the policy above.
std::string rounding_policy_text();

// The shortest decimal text that reads back to exactly x ("0.1", "1e-300", "inf", "nan").
std::string exact_text(double x);

// x with the given number of significant digits in plain or e-notation, for files and messages.
std::string significant_text(double x, int digits);

// "2 300", "2.27 × 10⁶", "0.00430", "3.10 × 10⁻⁸"; "0" and "infinite" for the explicit states.
std::string lr_for_readers(const LikelihoodRatio& lr);

// A positive number x given by log10 x, in the same style; "infinite" and "0" for ±inf.
std::string magnitude_for_readers(double log10_x);

// A probability given as log10 p: plain down to 0.001, then "4.40 × 10⁻⁷"; "0" for -inf.
std::string probability_for_readers(double log10_p);

// "0.270", "1 − 3.16 × 10⁻¹⁵"; given as a Posterior so the complement is exact.
std::string posterior_for_readers(const Posterior& posterior);

// Odds as "1 to 1 000", "1 to 2.27 × 10⁶", "100 to 1".
std::string odds_for_readers(double log10_odds);

// A log10 value: "2.36", "−4.52", "0.00"; "infinite" and "minus infinite".
std::string log10_for_readers(double log10_x);

// Any finite real number (a measurement, a mean, a parameter) with `figures` significant figures
// in the style above, signed with U+2212: "1.51991", "3.50 × 10⁻⁵", "−0.250".
std::string decimal_for_readers(double x, int figures = kReaderFigures);

// A value as entered in the case (a measurement, a frequency, a parameter): every digit of the
// shortest text that reads back to x, in reader style ("1.51991", "3.5 × 10⁻⁵"); nothing rounded.
std::string entered_for_readers(double x);

// A whole number with its digits grouped: "412", "2 300", "1 000 000".
std::string count_for_readers(std::int64_t n);

// A level as a percentage: "90 %", "95 %", "99.5 %".
std::string percent_for_readers(double level);

// "10⁶", "10⁻¹⁵": ten to a whole power with superscript digits and minus.
std::string power_of_ten_text(int exponent);

}  // namespace counterpoise::numbers
