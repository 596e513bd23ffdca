// Vector logarithms against the C library's long double log1p and log (glibc's log1pl and logl), which are
// accurate well beyond a double. libmvec's double functions are documented to a few units in the
// last place (glibc manual, "Known Maximum Errors in Math Functions"); the checks allow 4 units
// of the double result.
#include <catch2/catch.hpp>

#include <cmath>
#include <iomanip>
#include <limits>
#include <random>
#include <vector>

#include "core/numbers/vector_logarithms.hpp"

using namespace counterpoise::numbers;

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

// |got - reference| in units of the last place of the reference rounded to double.
double ulps(double got, long double reference) {
  const double rounded = static_cast<double>(reference);
  const double unit = std::nextafter(std::abs(rounded), kInf) - std::abs(rounded);
  return static_cast<double>(std::abs(static_cast<long double>(got) - reference)) / unit;
}

}  // namespace

TEST_CASE("log_one_plus_each is within 4 units in the last place of log1pl") {
  // Arguments spread over 2^-40 .. 2^40 and just above -1, as the Beta draws' ratios y / x are.
  std::mt19937_64 rng(5);
  std::vector<double> x(10001);
  for (double& v : x) v = std::ldexp(std::uniform_real_distribution<double>(0.5, 1.0)(rng), static_cast<int>(rng() % 81) - 40);
  x.back() = -0.999999;
  std::vector<double> out(x.size());
  log_one_plus_each(x, out);
  double worst = 0.0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    const double error = ulps(out[i], std::log1p(static_cast<long double>(x[i])));
    if (error > worst) {
      worst = error;
      CAPTURE(std::setprecision(17), x[i], out[i]);
      CHECK(error <= 4.0);
    }
  }
  CAPTURE(worst);
  CHECK(worst <= 4.0);
}

TEST_CASE("log_one_plus_each at the ends of its domain") {
  // log1p(0) = 0, log1p(-1) = -inf, log1p(+inf) = +inf, and log1p(x) = x to the last bit for
  // |x| below 2^-54 (the next term, x^2 / 2, is below half a unit of x) (C standard, F.10.3.9,
  // for the special values; the series for the small argument).
  const std::vector<double> x{0.0, -1.0, kInf, 1e-300, 0x1p-60};
  std::vector<double> out(x.size());
  log_one_plus_each(x, out);
  CHECK(out[0] == 0.0);
  CHECK(out[1] == -kInf);
  CHECK(out[2] == kInf);
  CHECK(out[3] == 1e-300);
  CHECK(out[4] == 0x1p-60);
}

TEST_CASE("log_one_plus_each gives a value that depends on the argument alone, in place too") {
  // The same argument at every position of spans of lengths 1 to 9 (whole vectors and the rest).
  const double argument = 0.123456789;
  std::vector<double> single(1);
  log_one_plus_each(std::vector<double>{argument}, single);
  for (std::size_t length = 1; length <= 9; ++length) {
    for (std::size_t position = 0; position < length; ++position) {
      std::vector<double> values(length, 3.0);
      values[position] = argument;
      log_one_plus_each(values, values);
      CAPTURE(length, position);
      CHECK(values[position] == single[0]);
    }
  }
  std::vector<double> empty;
  log_one_plus_each(empty, empty);  // nothing to do, nothing touched
  CHECK(empty.empty());
}

TEST_CASE("log_of_pair is within 4 units in the last place of logl for each of the two") {
  const auto [a, b] = GENERATE(table<double, double>({{0.5, 2.0}, {1e-300, 1e300}, {0.999999999, 1.000000001}, {3.0, 0.1}}));
  const auto [log_a, log_b] = log_of_pair(a, b);
  CAPTURE(std::setprecision(17), a, b, log_a, log_b);
  CHECK(ulps(log_a, std::log(static_cast<long double>(a))) <= 4.0);
  CHECK(ulps(log_b, std::log(static_cast<long double>(b))) <= 4.0);
  const auto [log_one, log_zero] = log_of_pair(1.0, 0.0);
  CHECK(log_one == 0.0);
  CHECK(log_zero == -kInf);
}
