#pragma once
// Elementary functions in base-10 log space. Every function is exact at the extremes in the
// sense that no intermediate result is formed by subtracting numbers close to 1.
// Identities used (common practice): log10(1 + 10^x) = log1p(10^x) / ln 10, with the larger
// term factored out so 10^x never overflows; log10(1 - 10^x) = log1p(-10^x) for x < log10(0.5)
// and log10(-expm1(x ln 10)) otherwise (Maechler 2012, "Accurately computing log(1 - exp(-|a|))",
// Rmpfr package vignette, eq. 7, applied in base 10).

#include <cmath>
#include <span>

namespace counterpoise::numbers {

inline constexpr double kLn10 = 2.302585092994045684017991454684364208;

// ln(1 + r) for r >= 0, to within 5 units in the last place, with one call of the natural log
// (several times faster than glibc's log1p): for r < 3/4, ln(1 + r) = r · ln(u) / (u - 1) with
// u = 1 + r rounded, and r itself when u rounds to 1 (Goldberg 1991, "What every computer
// scientist should know about floating-point arithmetic", ACM Computing Surveys 23(1):5-48,
// Theorem 4); above, ln(1 + r) >= 0.55 and the rounding of 1 + r costs nothing relative.
inline double log_one_plus(double r) {
  const double u = 1.0 + r;
  if (r >= 0.75) return std::log(u);
  return u == 1.0 ? r : std::log(u) * (r / (u - 1.0));
}

// log10(10^a + 10^b); -inf + -inf gives -inf.
double log10_add(double log10_a, double log10_b);

// log10(sum 10^x_i) shifted by the maximum; empty or all -inf gives -inf.
double log10_sum(std::span<const double> log10_terms);

// log10(1 - 10^x) for x <= 0; x == 0 gives -inf. Throws std::domain_error for x > 0.
double log10_one_minus(double log10_x);

// log10 of the probability whose log10 odds are L: -log10(1 + 10^-L). Exact for |L| up to 1e300;
// L = +inf gives 0, L = -inf gives -inf.
double log10_probability_from_log10_odds(double log10_odds);

// log10 odds of probability p given as log10 p: log10 p - log10(1 - p).
double log10_odds_from_log10_probability(double log10_p);

}  // namespace counterpoise::numbers
