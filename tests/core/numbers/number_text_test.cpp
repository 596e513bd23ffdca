// The one formatter for readers (core/numbers/number_text): the rounding policy of docs/methods.md
// ("How numbers are written"), written against typographic standards for numbers:
// - BIPM 2019, The International System of Units (SI Brochure), 9th ed., sec. 5.4.4: digits are
//   grouped in threes by a thin space, never a comma or point; the multiplication sign is ×.
// - ISO 80000-1:2009, clause 7.1.3 and Annex B (from memory for the clause numbers): significant
//   figures, and the minus sign as a proper sign.
// - Unicode 15.0, chapter 22 (Superscripts and Subscripts block, U+2070–U+209F, and U+00B2, U+00B3,
//   U+00B9): the superscript digits and minus used for powers of ten.
#include <catch2/catch.hpp>
#include <cmath>

#include "core/numbers/number_text.hpp"
#include "core/numbers/operand_text.hpp"

using namespace counterpoise::numbers;

namespace {
// U+202F NARROW NO-BREAK SPACE: the thin space of the SI Brochure that never breaks a line.
const std::string kThin = "\u202f";
}  // namespace

TEST_CASE("LRs get three significant figures, thin-space groups, superscript powers from 10⁶") {
  const auto [lr, text] = GENERATE(table<double, std::string>({{2345.0, "2" + kThin + "350"},
                                                               {94.2, "94.2"},
                                                               {1.53, "1.53"},
                                                               {9.996, "10.0"},
                                                               {0.0043, "0.0043"},
                                                               {0.004321, "0.00432"},
                                                               {1.234e9, "1.23 × 10⁹"},
                                                               {2.27e6, "2.27 × 10⁶"},
                                                               {999999.0, "1.00 × 10⁶"},
                                                               {3.1e-8, "3.1 × 10⁻⁸"},
                                                               {3.14159e-8, "3.14 × 10⁻⁸"},
                                                               {199.5, "200"},
                                                               {1e12, "10¹²"}}));
  CAPTURE(lr);
  CHECK(lr_for_readers(LikelihoodRatio::from_value(lr)) == text);
}

TEST_CASE("trailing zeros are written only when the value was rounded") {
  // 2 000 000 exactly: "2 × 10⁶"; 1 999 800 rounds to the same digits and keeps them: "2.00 × 10⁶".
  CHECK(magnitude_for_readers(std::log10(2.0e6)) == "2 × 10⁶");
  CHECK(magnitude_for_readers(std::log10(1.9998e6)) == "2.00 × 10⁶");
  CHECK(magnitude_for_readers(std::log10(2.0)) == "2");
  CHECK(magnitude_for_readers(std::log10(2.0004)) == "2.00");
  CHECK(magnitude_for_readers(std::log10(1000.0)) == "1" + kThin + "000");
}

TEST_CASE("numbers too large or small for a double are written from their log10") {
  CHECK(magnitude_for_readers(400.5) == "3.16 × 10⁴⁰⁰");
  CHECK(probability_for_readers(-630.0) == "10⁻⁶³⁰");
}

TEST_CASE("explicit states are words, posteriors near 1 go through their complement") {
  CHECK(lr_for_readers(LikelihoodRatio::zero()) == "0");
  CHECK(lr_for_readers(LikelihoodRatio::infinite()) == "infinite");
  const auto p = posterior_from(-3.0, LikelihoodRatio::from_log10(18.0));
  CHECK(posterior_for_readers(p) == "1 − 10⁻¹⁵");
  CHECK(posterior_for_readers(posterior_from(0.0, LikelihoodRatio::neutral())) == "0.5");
  CHECK(posterior_for_readers(posterior_from(0.0, LikelihoodRatio::from_value(2.0))) == "0.667");
}

TEST_CASE("probabilities are plain down to 0.001, then a power of ten") {
  CHECK(probability_for_readers(std::log10(4.0 / 414.0)) == "0.00966");
  CHECK(probability_for_readers(std::log10(0.0009)) == "9 × 10⁻⁴");
  CHECK(probability_for_readers(std::log10(4.4e-7)) == "4.4 × 10⁻⁷");
}

TEST_CASE("odds are written as 'a to b' with the same numbers as the LR they come from") {
  CHECK(odds_for_readers(-6.0) == "1 to 10⁶");
  CHECK(odds_for_readers(-3.0) == "1 to 1" + kThin + "000");
  CHECK(odds_for_readers(2.0) == "100 to 1");
  const double log10_lr = std::log10(2.27e6);
  CHECK(odds_for_readers(-log10_lr) == "1 to " + lr_for_readers(LikelihoodRatio::from_log10(log10_lr)));
}

TEST_CASE("log10 values have two decimals and the minus sign, measurements their own figures") {
  CHECK(log10_for_readers(2.3567) == "2.36");
  CHECK(log10_for_readers(-4.521) == "−4.52");
  CHECK(log10_for_readers(-0.001) == "0.00");
  CHECK(log10_for_readers(-INFINITY) == "minus infinite");
  CHECK(decimal_for_readers(1.51991, kWorkingFigures) == "1.51991");
  CHECK(decimal_for_readers(3.5e-5, kWorkingFigures) == "3.5 × 10⁻⁵");
  CHECK(decimal_for_readers(-0.25) == "−0.25");
  CHECK(count_for_readers(412) == "412");
  CHECK(count_for_readers(1000000) == "1" + kThin + "000" + kThin + "000");
  CHECK(percent_for_readers(0.9) == "90 %");
  CHECK(percent_for_readers(0.995) == "99.5 %");
  CHECK(power_of_ten_text(-15) == "10⁻¹⁵");
}

// A divisor must keep its power of ten: 1 / 2.5 × 10⁻⁵ is (1 / 2.5) × 10⁻⁵ by the usual precedence
// of × and / (common practice), so a number written as a product, or as a complement, is bracketed.
TEST_CASE("an operand written as a calculation is bracketed, a plain number is not") {
  CHECK(operand_for_readers(probability_for_readers(std::log10(1.13e-19))) == "(1.13 × 10⁻¹⁹)");
  const std::string near_one = posterior_for_readers(posterior_from_log10_odds(15.0));  // "1 − 1.00 × 10⁻¹⁵"
  CHECK(operand_for_readers(near_one) == "(" + near_one + ")");
  CHECK(operand_for_readers(probability_for_readers(-19.0)) == "10⁻¹⁹");
  CHECK(operand_for_readers("0.25") == "0.25");
  CHECK(operand_for_readers(decimal_for_readers(-0.25)) == decimal_for_readers(-0.25));  // "−0.25": a sign, not an operation
  CHECK(operand_for_readers(count_for_readers(2300)) == count_for_readers(2300));
}

TEST_CASE("no caret, no hyphen-minus and no ASCII e-notation in any reader text") {
  for (double log10_x : {-400.0, -20.0, -7.3, -6.0, -3.5, -1.0, 0.0, 0.5, 3.3, 6.0, 9.4, 400.0}) {
    CAPTURE(log10_x);
    for (const std::string& text : {magnitude_for_readers(log10_x), probability_for_readers(std::min(log10_x, 0.0)),
                                    odds_for_readers(log10_x), log10_for_readers(log10_x)}) {
      CHECK(text.find('^') == std::string::npos);
      CHECK(text.find('-') == std::string::npos);
      CHECK(text.find('e') == std::string::npos);
    }
  }
}
