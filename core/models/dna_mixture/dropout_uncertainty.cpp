#include "core/models/dna_mixture/dropout_uncertainty.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <variant>

#include <boost/math/distributions/beta.hpp>
#include <boost/math/quadrature/tanh_sinh.hpp>
#include <boost/math/tools/minima.hpp>

#include "core/numbers/math_policy.hpp"

namespace counterpoise::models::dna_mixture {

namespace {

constexpr double kMinusInfinity = -std::numeric_limits<double>::infinity();
// Relative tolerance of the quadrature; the tests compare with GSL's adaptive quadrature.
constexpr double kQuadratureTolerance = 1e-10;
constexpr int kScalePoints = 201;

// log10 of the integral of 10^g(x) w(x) over [a, b]: g is shifted by its largest value on a
// grid so that 10^(g - shift) neither overflows nor underflows where the mass is.
double log10_integral(const std::function<double(double)>& g, const std::function<double(double)>& weight,
                      double a, double b) {
  double shift = kMinusInfinity;
  for (int i = 0; i < kScalePoints; ++i) shift = std::max(shift, g(a + (b - a) * i / (kScalePoints - 1.0)));
  if (shift == kMinusInfinity) {
    // Each locus probability is a sum of non-negative terms that are each either positive on the
    // whole open interval (0, 1) of d or zero on all of it, so zero on the grid's inner points
    // means zero wherever the distribution puts mass.
    return kMinusInfinity;
  }
  auto integrand = [&](double x) {
    if (!(x > a && x < b)) return 0.0;
    const double value = g(x);
    return value == kMinusInfinity ? 0.0 : std::pow(10.0, value - shift) * weight(x);
  };
  boost::math::quadrature::tanh_sinh<double> integrator;
  const double integral = integrator.integrate(integrand, a, b, kQuadratureTolerance);
  return integral > 0.0 ? shift + std::log10(integral) : kMinusInfinity;
}

}  // namespace

double log10_expected_likelihood(const probability::Assignment& dropout,
                                 const std::function<double(double)>& log10_likelihood) {
  using namespace probability;
  if (const auto* point = std::get_if<PointValue>(&dropout)) return log10_likelihood(point->p);
  if (const auto* interval = std::get_if<IntervalValue>(&dropout)) {
    if (interval->low == interval->high) return log10_likelihood(interval->low);
    if (interval->linear)
      return log10_integral(log10_likelihood, [](double) { return 1.0; }, interval->low, interval->high) -
             std::log10(interval->high - interval->low);
    // Uniform on log10 d: integrate over t = log10 d.
    const double a = std::log10(interval->low), b = std::log10(interval->high);
    return log10_integral([&](double t) { return log10_likelihood(std::pow(10.0, t)); },
                          [](double) { return 1.0; }, a, b) -
           std::log10(b - a);
  }
  BetaValue beta{0.0, 0.0};
  if (const auto* b = std::get_if<BetaValue>(&dropout)) {
    beta = *b;
  } else {
    const auto& counts = std::get<CountsValue>(dropout);
    beta = BetaValue{static_cast<double>(counts.k) + counts.prior_a,
                     static_cast<double>(counts.n - counts.k) + counts.prior_b};
  }
  const boost::math::beta_distribution<double, numbers::MathPolicy> density(beta.a, beta.b);
  return log10_integral(log10_likelihood, [&density](double d) { return boost::math::pdf(density, d); }, 0.0, 1.0);
}

DropoutCurve dropout_curve(const std::function<std::optional<double>(double)>& log10_lr, int count) {
  if (count < 3) throw std::invalid_argument("dropout_curve: fewer than 3 points");
  DropoutCurve curve;
  std::optional<std::size_t> lowest;
  for (int i = 0; i < count; ++i) {
    const double d = static_cast<double>(i) / (count - 1);
    curve.points.push_back({d, log10_lr(d)});
    const auto& value = curve.points.back().log10_lr;
    if (value && (!lowest || *value < *curve.points[*lowest].log10_lr)) lowest = curve.points.size() - 1;
  }
  if (!lowest) return curve;  // undefined everywhere: the reader rejects such findings
  curve.minimum = curve.points[*lowest];
  if (!std::isfinite(*curve.minimum.log10_lr)) return curve;
  // Refine between the neighbours; an undefined or infinite value there counts as +inf.
  const double a = curve.points[*lowest > 0 ? *lowest - 1 : 0].d;
  const double b = curve.points[std::min<std::size_t>(*lowest + 1, curve.points.size() - 1)].d;
  auto objective = [&](double d) {
    const auto value = log10_lr(d);
    return value && !std::isnan(*value) ? *value : std::numeric_limits<double>::infinity();
  };
  const auto [d, value] = boost::math::tools::brent_find_minima(objective, a, b, 40);
  if (value < *curve.minimum.log10_lr) curve.minimum = {d, value};
  return curve;
}

}  // namespace counterpoise::models::dna_mixture
