#include "core/numbers/number_text.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace counterpoise::numbers {

namespace {

constexpr const char* kMinus = "\u2212";
constexpr const char* kGroupSpace = "\u202f";  // narrow no-break space: a thin space that never breaks a line
constexpr const char* kTimes = " \u00d7 ";

// A value within this relative distance of its rounded text counts as exact at that precision
// (a value that went through log10 and back differs from a round number only in its last bits).
constexpr double kExactRelative = 1e-9;

// x > 0 rounded to `figures` significant figures: the digits (no point) and the decimal exponent
// of the first one. "%e" rounds correctly and carries (9.996 -> 1.00e+01).
struct Rounded {
  std::string digits;  // exactly `figures` digits
  int exponent = 0;
  bool exact = false;  // x equals the rounded value (within kExactRelative)
};

Rounded rounded(double x, int figures) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*e", figures - 1, x);
  Rounded r;
  const std::string text = buffer;
  const auto e = text.find('e');
  for (std::size_t i = 0; i < e; ++i)
    if (text[i] >= '0' && text[i] <= '9') r.digits += text[i];
  r.exponent = std::atoi(text.c_str() + e + 1);
  const double value = std::strtod(buffer, nullptr);
  r.exact = std::abs(value - x) <= kExactRelative * x;
  return r;
}

// The digits with trailing zeros removed (kept to at least one digit).
std::string trimmed(std::string digits) {
  while (digits.size() > 1 && digits.back() == '0') digits.pop_back();
  return digits;
}

std::string grouped_integer(const std::string& digits) {
  if (digits.size() < 4) return digits;
  std::string out;
  const std::size_t n = digits.size();
  for (std::size_t i = 0; i < n; ++i) {
    out += digits[i];
    const std::size_t left = n - 1 - i;
    if (left > 0 && left % 3 == 0) out += kGroupSpace;
  }
  return out;
}

const char* superscript(char digit) {
  static const char* const kDigits[] = {"\u2070", "\u00b9", "\u00b2", "\u00b3", "\u2074",
                                        "\u2075", "\u2076", "\u2077", "\u2078", "\u2079"};
  return kDigits[digit - '0'];
}

// "2.27 × 10⁶", or "10⁶" for an exact mantissa of 1.
std::string scientific(const Rounded& r) {
  const std::string digits = r.exact ? trimmed(r.digits) : r.digits;
  if (digits == "1") return power_of_ten_text(r.exponent);
  std::string mantissa = digits.substr(0, 1);
  if (digits.size() > 1) mantissa += "." + digits.substr(1);
  return mantissa + kTimes + power_of_ten_text(r.exponent);
}

// The rounded value in plain decimal form: "2 300", "94.2", "0.00430".
std::string plain(const Rounded& r) {
  const std::string digits = r.exact ? trimmed(r.digits) : r.digits;
  const int n = static_cast<int>(digits.size());
  if (r.exponent >= 0) {
    // Integer part: the first exponent + 1 digits (padded with zeros), then the rest as decimals.
    std::string integer = digits.substr(0, static_cast<std::size_t>(std::min(n, r.exponent + 1)));
    integer += std::string(static_cast<std::size_t>(std::max(0, r.exponent + 1 - n)), '0');
    const std::string decimals = n > r.exponent + 1 ? digits.substr(static_cast<std::size_t>(r.exponent + 1)) : "";
    return grouped_integer(integer) + (decimals.empty() ? "" : "." + decimals);
  }
  return "0." + std::string(static_cast<std::size_t>(-r.exponent - 1), '0') + digits;
}

// x > 0 and finite: plain within [10^lowest, 10^6), scientific outside.
std::string positive(double x, int figures, int lowest_plain_exponent) {
  const Rounded r = rounded(x, figures);
  if (r.exponent >= 6 || r.exponent < lowest_plain_exponent) return scientific(r);
  return plain(r);
}

// From log10 x: the plain value when it is representable, else mantissa and exponent directly,
// so 10^400 and 10^-400 are written without overflow.
std::string positive_from_log10(double log10_x, int figures, int lowest_plain_exponent) {
  if (log10_x > 300.0 || log10_x < -300.0) {
    const double whole = std::floor(log10_x);
    Rounded r = rounded(std::pow(10.0, log10_x - whole), figures);
    r.exponent += static_cast<int>(whole);
    return scientific(r);
  }
  return positive(std::pow(10.0, log10_x), figures, lowest_plain_exponent);
}

}  // namespace

std::string rounding_policy_text() {
  return "Results (likelihood ratios, probabilities and odds) are rounded to " + std::to_string(kReaderFigures) +
         " significant figures, intermediate values for recomputation to " + std::to_string(kWorkingFigures) +
         " and log10 values to " + std::to_string(kLog10Decimals) +
         " decimals; inputs are given as entered. Calculations use the unrounded values.";
}

std::string exact_text(double x) {
  if (std::isnan(x)) return "nan";
  if (std::isinf(x)) return x > 0 ? "inf" : "-inf";
  char buffer[64];
  auto result = std::to_chars(buffer, buffer + sizeof buffer, x);
  return std::string(buffer, result.ptr);
}

std::string significant_text(double x, int digits) {
  if (!std::isfinite(x)) return exact_text(x);
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, x);
  return buffer;
}

std::string power_of_ten_text(int exponent) {
  std::string text = "10";
  if (exponent < 0) text += "\u207b";
  for (char c : std::to_string(exponent < 0 ? -static_cast<long long>(exponent) : exponent)) text += superscript(c);
  return text;
}

std::string magnitude_for_readers(double log10_x) {
  if (std::isnan(log10_x)) return "undefined";
  if (std::isinf(log10_x)) return log10_x > 0 ? "infinite" : "0";
  return positive_from_log10(log10_x, kReaderFigures, -6);
}

std::string lr_for_readers(const LikelihoodRatio& lr) {
  if (lr.is_zero()) return "0";
  if (lr.is_infinite()) return "infinite";
  return magnitude_for_readers(lr.log10());
}

std::string probability_for_readers(double log10_p) {
  if (std::isnan(log10_p)) return "undefined";
  if (log10_p == -INFINITY) return "0";
  return positive_from_log10(log10_p, kReaderFigures, -3);
}

std::string posterior_for_readers(const Posterior& posterior) {
  if (posterior.log10_complement == -INFINITY) return "1";
  if (posterior.log10_probability == -INFINITY) return "0";
  if (posterior.complement() < 0.01) return "1 " + std::string(kMinus) + " " + probability_for_readers(posterior.log10_complement);
  return probability_for_readers(posterior.log10_probability);
}

std::string odds_for_readers(double log10_odds) {
  if (log10_odds >= 0.0) return magnitude_for_readers(log10_odds) + " to 1";
  return "1 to " + magnitude_for_readers(-log10_odds);
}

std::string log10_for_readers(double log10_x) {
  if (std::isnan(log10_x)) return "undefined";
  if (std::isinf(log10_x)) return log10_x > 0 ? "infinite" : "minus infinite";
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.*f", kLog10Decimals, std::abs(log10_x));
  const std::string text = buffer;
  const bool zero = text.find_first_not_of("0.") == std::string::npos;
  return (log10_x < 0 && !zero ? std::string(kMinus) : std::string()) + text;
}

std::string decimal_for_readers(double x, int figures) {
  if (std::isnan(x)) return "undefined";
  if (std::isinf(x)) return x > 0 ? "infinite" : "minus infinite";
  if (x == 0.0) return "0";
  return (x < 0 ? std::string(kMinus) : std::string()) + positive(std::abs(x), figures, -3);
}

std::string entered_for_readers(double x) {
  if (!std::isfinite(x) || x == 0.0) return decimal_for_readers(x);
  // The significant digits of the shortest round-trip text ("1.5e-05" has 2).
  const std::string text = exact_text(std::abs(x));
  const std::string mantissa = text.substr(0, text.find('e'));
  std::string digits;
  for (char c : mantissa)
    if (c >= '0' && c <= '9') digits += c;
  const auto first = digits.find_first_not_of('0');
  const int figures = first == std::string::npos ? 1 : static_cast<int>(digits.size() - first);
  return decimal_for_readers(x, std::max(figures, 1));
}

std::string count_for_readers(std::int64_t n) {
  const std::string digits = std::to_string(n < 0 ? -n : n);
  return (n < 0 ? std::string(kMinus) : std::string()) + grouped_integer(digits);
}

std::string percent_for_readers(double level) {
  return decimal_for_readers(level * 100.0, 4) + " %";
}

}  // namespace counterpoise::numbers
