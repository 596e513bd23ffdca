// Checks of the two-level likelihood ratio: Lindley's exact form against numerical integration
// of the two-level model (GSL quadrature) and against the bivariate normal density (GSL), the
// kernel form against an independent kernel estimate (scipy) and against quadrature.
#include <catch2/catch.hpp>

#include <cmath>
#include <functional>
#include <iomanip>
#include <vector>

#include <gsl/gsl_integration.h>
#include <gsl/gsl_randist.h>

#include "core/models/continuous/two_level_lr.hpp"
#include "core/continuous/background_fixture.hpp"

using namespace counterpoise::models::continuous;

namespace {

constexpr double kLn10 = 2.302585092994045684;

// integral over theta of f(theta), with theta = centre + scale * u so the peak sits at u = 0
// with unit width; GSL QAGI on (-inf, inf) (GSL 2.7 reference manual, "QAGI adaptive
// integration on infinite intervals").
double integrate(const std::function<double(double)>& f, double centre, double scale) {
  struct Closure {
    const std::function<double(double)>* f;
    double centre, scale;
  } closure{&f, centre, scale};
  gsl_function g;
  g.function = [](double u, void* p) {
    auto* c = static_cast<Closure*>(p);
    return (*c->f)(c->centre + c->scale * u) * c->scale;
  };
  g.params = &closure;
  gsl_integration_workspace* work = gsl_integration_workspace_alloc(2000);
  double result = 0.0, error = 0.0;
  gsl_integration_qagi(&g, 0.0, 1e-12, 2000, work, &result, &error);
  gsl_integration_workspace_free(work);
  return result;
}

double normal_pdf(double x, double mean, double sd) { return gsl_ran_gaussian_pdf(x - mean, sd); }

GroupSummary group(double xbar, double ybar, double sigma, int m, int n) {
  return GroupSummary{xbar, ybar, sigma * sigma / m, sigma * sigma / n};
}

}  // namespace

TEST_CASE("Lindley's exact form equals the integrated two-level model", "[two-level]") {
  // The two-level model integrated numerically: numerator = ∫ phi(xbar; θ, a) phi(ybar; θ, b)
  // p(θ) dθ, denominator = ∏ ∫ phi(·; θ, ·) p(θ) dθ (Lindley 1977, Biometrika 64:207;
  // Aitken & Taroni 2004, Statistics and the Evaluation of Evidence, 2nd ed., ch. 10 — from memory
  // for the chapter).
  struct Row {
    double xbar, ybar, sigma;
    int m, n;
    double mu, tau;
  };
  const Row rows[] = {
      {1.51845, 1.51848, 4e-5, 2, 1, 1.5186, 0.004},   // the shape in the issue
      {1.51845, 1.51845, 4e-5, 5, 5, 1.5186, 0.004},   // identical means
      {1.51845, 1.51860, 4e-5, 1, 1, 1.5186, 0.004},   // m = n = 1, means 3.75 sigma apart
      {1.5300, 1.5300, 4e-5, 3, 4, 1.5186, 0.004},     // 2.85 tau from the population mean
      {10.0, 11.0, 2.0, 3, 2, 12.0, 1.5},              // tau comparable with sigma
  };
  for (const auto& r : rows) {
    const GroupSummary g = group(r.xbar, r.ybar, r.sigma, r.m, r.n);
    const double sa = std::sqrt(g.control_variance), sb = std::sqrt(g.recovered_variance);
    const auto p = [&](double t) { return normal_pdf(t, r.mu, r.tau); };
    const double numerator = integrate(
        [&](double t) { return normal_pdf(r.xbar, t, sa) * normal_pdf(r.ybar, t, sb) * p(t); },
        g.pooled_mean(), std::sqrt(g.pooled_mean_variance()));
    const double control = integrate([&](double t) { return normal_pdf(r.xbar, t, sa) * p(t); }, r.xbar, sa);
    const double recovered = integrate([&](double t) { return normal_pdf(r.ybar, t, sb) * p(t); }, r.ybar, sb);
    const auto d = lindley_exact(g, r.mu, r.tau);
    INFO(std::setprecision(17) << "xbar " << r.xbar << " ybar " << r.ybar << " sigma " << r.sigma);
    // quadrature asked for 1e-12 relative; 1e-9 leaves room for the peak-centred transform
    CHECK(d.ln_numerator == Approx(std::log(numerator)).epsilon(1e-9));
    CHECK(d.ln_denominator == Approx(std::log(control) + std::log(recovered)).epsilon(1e-9));
  }
}

TEST_CASE("Lindley's exact numerator is the bivariate normal density of the two means", "[two-level]") {
  // Under Hp (xbar, ybar) is bivariate normal with variances tau^2 + a, tau^2 + b and covariance
  // tau^2; density from GSL's gsl_ran_bivariate_gaussian_pdf (GSL 2.7 manual, "The Bivariate
  // Gaussian Distribution").
  const double mu = 1.5186, tau = 0.004, sigma = 4e-5;
  const GroupSummary g = group(1.51845, 1.51848, sigma, 2, 1);
  const double sx = std::sqrt(tau * tau + g.control_variance), sy = std::sqrt(tau * tau + g.recovered_variance);
  const double rho = tau * tau / (sx * sy);
  const double density = gsl_ran_bivariate_gaussian_pdf(g.control_mean - mu, g.recovered_mean - mu, sx, sy, rho);
  CHECK(lindley_exact(g, mu, tau).ln_numerator == Approx(std::log(density)).epsilon(1e-9));
}

TEST_CASE("Far in the tail the LR stays finite in log space", "[two-level]") {
  // Recovered and control both 60 tau from the population mean: every density underflows in
  // linear space. Reference: the bivariate normal quadratic form written out directly, in log
  // space (common practice: log density = -log(2 pi) - log(det)/2 - Q/2).
  const double mu = 1.5186, tau = 0.004, sigma = 4e-5;
  const GroupSummary g = group(mu + 60 * tau, mu + 60 * tau + 2e-5, sigma, 3, 2);
  const double a = g.control_variance, b = g.recovered_variance, t2 = tau * tau;
  const double d1 = g.control_mean - mu, d2 = g.recovered_mean - mu;
  const double det = (t2 + a) * (t2 + b) - t2 * t2;
  const double q = ((t2 + b) * d1 * d1 - 2 * t2 * d1 * d2 + (t2 + a) * d2 * d2) / det;
  const double ln_numerator = -std::log(2 * M_PI) - 0.5 * std::log(det) - 0.5 * q;
  const auto d = lindley_exact(g, mu, tau);
  REQUIRE(std::isfinite(d.ln_numerator));
  REQUIRE(std::isfinite(d.ln_denominator));
  CHECK(d.ln_numerator == Approx(ln_numerator).epsilon(1e-9));
  // a match this rare in the population gives a very large LR, not inf or NaN
  CHECK((d.ln_numerator - d.ln_denominator) / kLn10 > 700.0);
}

TEST_CASE("A tiny within-source sd gives a large but finite LR", "[two-level]") {
  const GroupSummary g = group(1.51845, 1.51845, 1e-15, 2, 2);
  const auto d = lindley_exact(g, 1.5186, 0.004);
  REQUIRE(std::isfinite(d.ln_numerator - d.ln_denominator));
  // LR ~ tau / sqrt(a + b) * exp((w - mu)^2 / 2 tau^2) for sigma -> 0 (Lindley's approximation)
  const double expected = std::log(0.004 / std::sqrt(2 * g.control_variance)) +
                          0.5 * std::pow((1.51845 - 1.5186) / 0.004, 2);
  CHECK(d.ln_numerator - d.ln_denominator == Approx(expected).epsilon(1e-9));
}

TEST_CASE("Lindley's approximation approaches the exact form as tau / sigma grows", "[two-level]") {
  double previous = INFINITY;
  for (double tau : {1e-3, 1e-2, 1e-1, 1.0}) {
    const GroupSummary g = group(1.51845, 1.51848, 4e-5, 2, 1);
    const auto exact = lindley_exact(g, 1.5186, tau);
    const auto approx = lindley_approximate(g, 1.5186, tau);
    const double error = std::abs((approx.ln_numerator - approx.ln_denominator) - (exact.ln_numerator - exact.ln_denominator));
    CHECK(error < previous);
    previous = error;
  }
  CHECK(previous < 1e-8);
}

TEST_CASE("The kernel form matches scipy's kernel estimate and quadrature", "[two-level][kde]") {
  const std::vector<double>& background = counterpoise::test::kInventedBackground;
  const double h = 1e-3, sigma = 4e-5;
  const KernelDensity kde(background, h);
  // Reference log10 LR: scipy 1.10.1 gaussian_kde(...).logpdf for the three kernel estimates
  // (kernel sd sqrt(h^2 + variance)) and scipy.stats.norm.logpdf for the difference term.
  struct Row {
    std::vector<double> control, recovered;
    double log10_lr;
  };
  const Row rows[] = {
      {{1.51844, 1.51846, 1.51848}, {1.51848, 1.51850}, 1.9982108782018988},
      {{1.52300, 1.52302, 1.52298}, {1.52305, 1.52301}, 1.8341336267574908},
      {{1.5300, 1.5300, 1.5300}, {1.5300, 1.5300}, 8.987111628053322},  // beyond the background
  };
  for (const auto& r : rows) {
    double xbar = 0, ybar = 0;
    for (double v : r.control) xbar += v / r.control.size();
    for (double v : r.recovered) ybar += v / r.recovered.size();
    const GroupSummary g = group(xbar, ybar, sigma, static_cast<int>(r.control.size()), static_cast<int>(r.recovered.size()));
    for (auto method : {KdeMethod::exact, KdeMethod::fast}) {
      const auto d = kernel_two_level(g, kde, method);
      // 1e-9 absolute on log10 LR: both sides are double-precision evaluations of the same sums
      CHECK((d.ln_numerator - d.ln_denominator) / kLn10 == Approx(r.log10_lr).margin(1e-9));
    }
    // Quadrature of the two-level model with the kernel estimate as p(θ) (Aitken & Lucy 2004,
    // Appl. Statist. 53:109, the kernel likelihood ratio, univariate case).
    const auto p = [&](double t) {
      double f = 0;
      for (double z : background) f += normal_pdf(t, z, h);
      return f / background.size();
    };
    const double sa = std::sqrt(g.control_variance), sb = std::sqrt(g.recovered_variance);
    const double numerator = integrate([&](double t) { return normal_pdf(xbar, t, sa) * normal_pdf(ybar, t, sb) * p(t); },
                                       g.pooled_mean(), std::sqrt(g.pooled_mean_variance()));
    const double control = integrate([&](double t) { return normal_pdf(xbar, t, sa) * p(t); }, xbar, sa);
    const double recovered = integrate([&](double t) { return normal_pdf(ybar, t, sb) * p(t); }, ybar, sb);
    const auto d = kernel_two_level(g, kde, KdeMethod::exact);
    CHECK(d.ln_numerator == Approx(std::log(numerator)).epsilon(1e-9));
    CHECK(d.ln_denominator == Approx(std::log(control * recovered)).epsilon(1e-9));
  }
}
