#include "core/models/continuous/two_level_lr.hpp"

#include <cmath>

namespace counterpoise::models::continuous {

namespace {
constexpr double kLnSqrt2Pi = 0.91893853320467274178032973640561764;
}

double GroupSummary::pooled_mean() const noexcept {
  const double a = control_variance, b = recovered_variance;
  return (b * control_mean + a * recovered_mean) / (a + b);
}

double GroupSummary::pooled_mean_variance() const noexcept {
  const double a = control_variance, b = recovered_variance;
  return a * b / (a + b);
}

double ln_normal_density(double x, double mean, double variance) noexcept {
  const double d = x - mean;
  return -kLnSqrt2Pi - 0.5 * std::log(variance) - 0.5 * d * d / variance;
}

TwoLevelDensities lindley_exact(const GroupSummary& g, double mu, double tau) noexcept {
  const double a = g.control_variance, b = g.recovered_variance, tau2 = tau * tau;
  const double ln_difference = ln_normal_density(g.control_mean - g.recovered_mean, 0.0, a + b);
  TwoLevelDensities out{};
  out.ln_numerator = ln_difference + ln_normal_density(g.pooled_mean(), mu, tau2 + g.pooled_mean_variance());
  out.ln_denominator = ln_normal_density(g.control_mean, mu, tau2 + a) +
                       ln_normal_density(g.recovered_mean, mu, tau2 + b);
  return out;
}

TwoLevelDensities lindley_approximate(const GroupSummary& g, double mu, double tau) noexcept {
  const double a = g.control_variance, b = g.recovered_variance, tau2 = tau * tau;
  const double ln_between = ln_normal_density(g.pooled_mean(), mu, tau2);
  TwoLevelDensities out{};
  out.ln_numerator = ln_normal_density(g.control_mean - g.recovered_mean, 0.0, a + b) + ln_between;
  out.ln_denominator = 2.0 * ln_between;
  return out;
}

TwoLevelDensities kernel_two_level(const GroupSummary& g, const KernelDensity& kde, KdeMethod method) {
  const double a = g.control_variance, b = g.recovered_variance;
  const double h2 = kde.bandwidth() * kde.bandwidth();
  const auto same = kde.ln_density(g.pooled_mean(), std::sqrt(h2 + g.pooled_mean_variance()), method);
  const auto control = kde.ln_density(g.control_mean, std::sqrt(h2 + a), method);
  const auto recovered = kde.ln_density(g.recovered_mean, std::sqrt(h2 + b), method);
  TwoLevelDensities out{};
  out.ln_numerator = ln_normal_density(g.control_mean - g.recovered_mean, 0.0, a + b) + same.ln_density;
  out.ln_denominator = control.ln_density + recovered.ln_density;
  // (1 + e1)/((1 + e2)(1 + e3)) - 1 is bounded by this for small e (first order, plus margin).
  out.kde_pooled = same;
  out.kde_control = control;
  out.kde_recovered = recovered;
  out.relative_error_bound = 2.0 * (same.relative_error_bound + control.relative_error_bound +
                                    recovered.relative_error_bound);
  return out;
}

}  // namespace counterpoise::models::continuous
