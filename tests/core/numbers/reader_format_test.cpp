// The reader rounding rule of docs/methods.md ("How numbers are written"): our own convention,
// checked here so the report and the documentation cannot drift apart.
#include <catch2/catch.hpp>
#include <cmath>

#include "core/numbers/reader_format.hpp"

using namespace counterpoise::numbers;

TEST_CASE("LRs get two significant figures, grouped digits, scientific from 10^6") {
  const auto [lr, text] = GENERATE(table<double, const char*>({{2345.0, "2 300"},
                                                               {94.2, "94"},
                                                               {1.53, "1.5"},
                                                               {9.96, "10"},
                                                               {0.0043, "0.0043"},
                                                               {1.234e9, "1.2 × 10^9"},
                                                               {2.0e6, "2.0 × 10^6"},
                                                               {999999.0, "1 000 000"},
                                                               {3.1e-8, "3.1 × 10^-8"}}));
  CAPTURE(lr);
  CHECK(lr_for_readers(LikelihoodRatio::from_value(lr), 2) == text);
}

TEST_CASE("one significant figure when the interval spans more than a factor of ten") {
  CHECK(significant_figures_for(1.35) == 1);
  CHECK(significant_figures_for(0.8) == 2);
  CHECK(significant_figures_for(std::nullopt) == 2);
  CHECK(lr_for_readers(LikelihoodRatio::from_value(2.27e6), 1) == "2 × 10^6");
}

TEST_CASE("explicit states are written as words, posteriors near 1 through their complement") {
  CHECK(lr_for_readers(LikelihoodRatio::zero(), 2) == "0");
  CHECK(lr_for_readers(LikelihoodRatio::infinite(), 2) == "infinite");
  const auto p = posterior_from(-3.0, LikelihoodRatio::from_log10(18.0));
  CHECK(posterior_for_readers(p) == "1 − 1.0 × 10^-15");
  CHECK(posterior_for_readers(posterior_from(0.0, LikelihoodRatio::neutral())) == "0.50");
  CHECK(odds_for_readers(-6.0) == "1 to 10^6");
  CHECK(odds_for_readers(-3.0) == "1 to 1 000");
  CHECK(odds_for_readers(2.0) == "100 to 1");
}
