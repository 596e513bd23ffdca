#pragma once
// The likelihood ratio of the univariate two-level model for control mean xbar (of m values) and
// recovered mean ybar (of n values), within-source variance sigma^2, so the means have variances
// a = sigma^2/m and b = sigma^2/n about their source means (docs/methods.md, "Continuous
// measurements, two-level model"; Lindley 1977, "A problem in forensic science", Biometrika
// 64:207; Aitken & Lucy 2004, Appl. Statist. 53:109).
//
// Same source (Hp): one source mean theta for both, so with w = (m xbar + n ybar)/(m + n)
//   f(xbar, ybar | Hp) = phi(xbar - ybar; 0, a + b) * integral phi(w; theta, ab/(a+b)) p(theta) dtheta
// (xbar - ybar and w are independent given theta and the change of variables has Jacobian 1).
// Different sources (Hd): independent source means
//   f(xbar, ybar | Hd) = integral phi(xbar; theta, a) p(theta) dtheta * integral phi(ybar; theta, b) p(theta) dtheta.
// Normal population p = N(mu, tau^2): the integrals are normal densities with the variances
// added (exact form). Kernel population p = (1/N) sum_i N(z_i, h^2): each integral is the kernel
// estimate with kernel variance h^2 plus the within variance. Lindley's approximation for
// tau^2 >> a, b: LR ~ phi(xbar - ybar; 0, a + b) / phi(w; mu, tau^2).
// All values are natural logs of densities.

#include "core/models/continuous/kernel_density.hpp"

namespace counterpoise::models::continuous {

struct GroupSummary {
  double control_mean;
  double recovered_mean;
  double control_variance;    // a = sigma^2 / m
  double recovered_variance;  // b = sigma^2 / n
  double pooled_mean() const noexcept;            // w = (b xbar + a ybar) / (a + b)
  double pooled_mean_variance() const noexcept;   // ab / (a + b)
};

struct TwoLevelDensities {
  double ln_numerator;    // ln f(xbar, ybar | Hp)
  double ln_denominator;  // ln f(xbar, ybar | Hd)
  // Bound on the relative error of the LR from the kernel method (0 for the normal forms).
  double relative_error_bound = 0.0;
  // The three kernel estimates (kernel form only): at w, xbar and ybar.
  KdeEvaluation kde_pooled, kde_control, kde_recovered;
};

// ln of the normal density phi(x; mean, variance). variance > 0 (not checked: callers validate).
double ln_normal_density(double x, double mean, double variance) noexcept;

// The exact normal two-level densities (bivariate normal under Hp; Lindley 1977).
TwoLevelDensities lindley_exact(const GroupSummary& g, double mu, double tau) noexcept;
// Lindley's approximate form: numerator phi(xbar-ybar; 0, a+b) phi(w; mu, tau^2), denominator
// phi(w; mu, tau^2)^2.
TwoLevelDensities lindley_approximate(const GroupSummary& g, double mu, double tau) noexcept;
// The kernel form (Aitken & Lucy 2004, univariate): the between-source density is `kde`.
// Throws std::invalid_argument as KernelDensity::ln_density.
TwoLevelDensities kernel_two_level(const GroupSummary& g, const KernelDensity& kde, KdeMethod method);

}  // namespace counterpoise::models::continuous
