#include "core/numbers/reader_format.hpp"

#include <cmath>
#include <cstdio>

namespace counterpoise::numbers {

namespace {

// "2.50" -> "2.5", "10.0" -> "10", "3" -> "3" (plain decimal text only).
std::string without_trailing_zeros(std::string text) {
  if (text.find('.') == std::string::npos) return text;
  while (!text.empty() && text.back() == '0') text.pop_back();
  if (!text.empty() && text.back() == '.') text.pop_back();
  return text;
}

// Digits of an integer grouped in threes with spaces: 2300 -> "2 300".
std::string grouped(long long value) {
  std::string digits = std::to_string(value < 0 ? -value : value);
  std::string out;
  const int n = static_cast<int>(digits.size());
  for (int i = 0; i < n; ++i) {
    out += digits[static_cast<std::size_t>(i)];
    const int left = n - 1 - i;
    if (left > 0 && left % 3 == 0) out += ' ';
  }
  return (value < 0 ? "-" : "") + out;
}

// "1.2 × 10^9"; with `trim`, trailing zeros of the mantissa go and a mantissa of 1 is left out.
std::string scientific(double log10_x, int figures, bool trim = false) {
  int exponent = static_cast<int>(std::floor(log10_x));
  double mantissa = std::pow(10.0, log10_x - exponent);
  const double scale = std::pow(10.0, figures - 1);
  mantissa = std::round(mantissa * scale) / scale;
  if (mantissa >= 10.0) mantissa /= 10.0, ++exponent;
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", figures - 1, mantissa);
  std::string text = trim ? without_trailing_zeros(buffer) : std::string(buffer);
  if (trim && text == "1") return "10^" + std::to_string(exponent);
  return text + " × 10^" + std::to_string(exponent);
}

}  // namespace

int significant_figures_for(std::optional<double> width) { return width && *width > 1.0 ? 1 : 2; }

std::string magnitude_for_readers(double log10_x, int figures) {
  if (!std::isfinite(log10_x)) return log10_x > 0 ? "infinite" : "0";
  if (log10_x >= 6.0 || log10_x < -6.0) return scientific(log10_x, figures);
  const double x = std::pow(10.0, log10_x);
  const int exponent = static_cast<int>(std::floor(log10_x));
  const int decimals = figures - 1 - exponent;  // digits after the point for `figures` significant
  if (decimals <= 0) {
    const double unit = std::pow(10.0, -decimals);
    return grouped(static_cast<long long>(std::llround(std::round(x / unit) * unit)));
  }
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, x);
  std::string text = buffer;
  // Rounding may carry into a new digit (9.96 -> "10.0"): drop the digit that is then beyond the figures.
  if (std::floor(std::log10(std::stod(text))) > exponent && text.find('.') != std::string::npos) {
    std::snprintf(buffer, sizeof buffer, "%.*f", std::max(decimals - 1, 0), x);
    text = buffer;
  }
  return text;
}

std::string lr_for_readers(const LikelihoodRatio& lr, int figures) {
  if (lr.is_zero()) return "0";
  if (lr.is_infinite()) return "infinite";
  return magnitude_for_readers(lr.log10(), figures);
}

std::string probability_for_readers(double log10_p, int figures) {
  if (log10_p == -INFINITY) return "0";
  if (log10_p < -3.0) return scientific(log10_p, figures);
  return magnitude_for_readers(log10_p, figures);
}

std::string posterior_for_readers(const Posterior& posterior, int figures) {
  if (posterior.log10_complement == -INFINITY) return "1";
  if (posterior.log10_probability == -INFINITY) return "0";
  if (posterior.complement() < 0.01) return "1 − " + probability_for_readers(posterior.log10_complement, figures);
  return probability_for_readers(posterior.log10_probability, figures);
}

std::string odds_for_readers(double log10_odds) {
  const auto text = [](double l) {
    return l >= 6.0 ? scientific(l, 3, true) : without_trailing_zeros(magnitude_for_readers(l, 3));
  };
  if (log10_odds >= 0.0) return text(log10_odds) + " to 1";
  return "1 to " + text(-log10_odds);
}

}  // namespace counterpoise::numbers
