// Checks of the Gaussian kernel density estimate against an independent implementation and
// of the fast (windowed, block-expanded) method against the exact sum.
#include <catch2/catch.hpp>

#include <cmath>
#include <iomanip>
#include <random>
#include <sstream>
#include <stdexcept>
#include <vector>

#include "core/models/continuous/kernel_density.hpp"
#include "core/continuous/background_fixture.hpp"

using counterpoise::models::continuous::KdeMethod;
using counterpoise::models::continuous::KernelDensity;
using counterpoise::models::continuous::silverman_bandwidth;

namespace {

const std::vector<double>& kBackground = counterpoise::test::kInventedBackground;

std::string show(double x) {
  std::ostringstream out;
  out << std::setprecision(17) << x;
  return out.str();
}

}  // namespace

TEST_CASE("Silverman's rule of thumb matches an independent computation", "[kde]") {
  // Reference: numpy 1.24.2, 0.9 * min(std(ddof=1), IQR/1.34) * n**-0.2 with np.percentile
  // (linear interpolation); Silverman 1986, Density Estimation, eq. 3.31.
  CHECK(silverman_bandwidth(kBackground) == Approx(0.0012706763856941813).epsilon(1e-12));
  CHECK_THROWS_AS(silverman_bandwidth(std::vector<double>{1.5}), std::invalid_argument);
  CHECK_THROWS_AS(silverman_bandwidth(std::vector<double>{1.5, 1.5, 1.5}), std::invalid_argument);
}

TEST_CASE("Kernel density values match scipy.stats.gaussian_kde", "[kde]") {
  // Reference: scipy 1.10.1 (Debian python3-scipy 1.10.1-2), gaussian_kde(data,
  // bw_method = s / std(data, ddof=1)).logpdf(t), i.e. kernel standard deviation s.
  struct Row {
    double t, s, ln_density;
  };
  const Row rows[] = {
      {1.5185, 4e-4, 3.734745035873415},   {1.5230, 4e-4, 4.994802304537156},
      {1.5100, 4e-4, -15.117282002745187}, {1.5300, 1e-3, -11.408832544036494},
      {1.5215, 2.5e-4, 4.485466556790251},
      // far tails: scipy works in log space here too; a naive sum would underflow to -inf
      {1.60, 4e-4, -17702.104549584605},   {1.40, 1e-3, -6314.985527814847},
  };
  const KernelDensity kde(kBackground, 2.5e-4);
  for (const auto& row : rows) {
    for (auto method : {KdeMethod::exact, KdeMethod::fast}) {
      INFO("t = " << show(row.t) << ", s = " << show(row.s) << ", fast = " << (method == KdeMethod::fast));
      const auto e = kde.ln_density(row.t, row.s, method);
      REQUIRE(std::isfinite(e.ln_density));
      // 1e-12 relative on ln f: far below the stated method bound and rounding of either code
      CHECK(e.ln_density == Approx(row.ln_density).epsilon(1e-12).margin(1e-12));
    }
  }
}

TEST_CASE("The fast method agrees with the exact sum within its stated bound", "[kde]") {
  // A large background with a cluster and a long tail, so both the block expansion and the
  // term-by-term path are exercised (identity check: same estimate, two summation orders).
  std::mt19937_64 rng(20240611);
  std::normal_distribution<double> main_cluster(1.5185, 0.004), tail(1.530, 0.0008);
  std::vector<double> values;
  for (int i = 0; i < 20000; ++i) values.push_back(i % 10 == 0 ? tail(rng) : main_cluster(rng));
  const double h = silverman_bandwidth(values);
  const KernelDensity kde(values, h);
  double worst = 0.0;
  for (double t = 1.490; t <= 1.545; t += 0.00037) {
    for (double s : {h, 1.01 * h, 1.7 * h}) {
      const auto exact = kde.ln_density(t, s, KdeMethod::exact);
      const auto fast = kde.ln_density(t, s, KdeMethod::fast);
      INFO("t = " << show(t) << ", s = " << show(s));
      const double relative = std::abs(std::expm1(fast.ln_density - exact.ln_density));
      // the stated bound plus floating-point rounding (cancellation factor below e^9, so 1e-11)
      CHECK(relative <= fast.relative_error_bound + 1e-11);
      CHECK(fast.relative_error_bound < 1e-9);
      worst = std::max(worst, relative);
    }
  }
  INFO("worst relative difference " << show(worst));
  CHECK(worst < 1e-10);
}

TEST_CASE("Kernel density rejects bad construction and evaluation arguments", "[kde]") {
  CHECK_THROWS_AS(KernelDensity({}, 1e-3), std::invalid_argument);
  CHECK_THROWS_AS(KernelDensity(kBackground, 0.0), std::invalid_argument);
  CHECK_THROWS_AS(KernelDensity(kBackground, -1e-3), std::invalid_argument);
  CHECK_THROWS_AS(KernelDensity(kBackground, std::nan("")), std::invalid_argument);
  CHECK_THROWS_AS(KernelDensity({1.5, std::nan("")}, 1e-3), std::invalid_argument);
  const KernelDensity kde(kBackground, 1e-3);
  CHECK_THROWS_AS(kde.ln_density(1.5, 0.0, KdeMethod::fast), std::invalid_argument);
  CHECK_THROWS_AS(kde.ln_density(std::nan(""), 1e-3, KdeMethod::exact), std::invalid_argument);
}
