// The lattice distribution: convolution against closed forms, quantiles, tails.
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "core/uncertainty/grid_pmf.hpp"
#include "core/uncertainty/lattice_choice.hpp"
#include "core/uncertainty/spread_summary.hpp"

using namespace counterpoise::uncertainty;

namespace {
GridPmf uniform(double lo, double hi, double step) {
  return GridPmf::from_cdf([=](double t) { return std::clamp((t - lo) / (hi - lo), 0.0, 1.0); }, lo, hi, step);
}
}  // namespace

TEST_CASE("the sum of two independent uniforms has the triangular distribution") {
  // X, Y ~ U(0, 1): X + Y is triangular on [0, 2]; P(S <= s) = s^2/2 for s <= 1, so the
  // q-quantile is sqrt(2q) below the median (standard result, e.g. Feller 1971, vol. II, I.9).
  const double step = 0.001;
  const auto sum = convolve(uniform(0, 1, step), uniform(0, 1, step));
  for (double q : {0.005, 0.05, 0.25, 0.5}) {
    CAPTURE(q);
    CHECK(sum.quantile(q) == Approx(std::sqrt(2.0 * q)).margin(2.0 * step));
  }
  CHECK(sum.quantile(0.95) == Approx(2.0 - std::sqrt(2.0 * 0.05)).margin(2.0 * step));
}

TEST_CASE("a point mass keeps its exact value through the shift") {
  const auto p = GridPmf::point(3.14159, 0.01);
  const auto shifted = convolve(p, uniform(0, 1, 0.01));
  CHECK(shifted.quantile(0.5) == Approx(3.14159 + 0.5).margin(0.01));
  CHECK(GridPmf::point(2.5, 0.1).quantile(0.3) == 2.5);  // the support of a point is the point
}

TEST_CASE("negation mirrors the distribution and swaps the tails") {
  auto a = uniform(1, 3, 0.01);
  a.mass_minus_inf = 0.0;
  const auto n = a.negated();
  CHECK(n.quantile(0.25) == Approx(-a.quantile(0.75)).margin(0.011));
  GridPmf zero = GridPmf::point(-std::numeric_limits<double>::infinity(), 0.01);
  CHECK(zero.negated().mass_plus_inf == 1.0);
}

TEST_CASE("mass at minus infinity absorbs finite values, minus with plus infinity is a contradiction") {
  auto a = uniform(0, 1, 0.01);
  for (auto& m : a.mass) m *= 0.9;
  a.mass_minus_inf = 0.1;
  auto b = uniform(0, 1, 0.01);
  for (auto& m : b.mass) m *= 0.8;
  b.mass_plus_inf = 0.2;
  double clash = 0.0;
  const auto c = convolve(a, b, &clash);
  CHECK(c.mass_minus_inf == Approx(0.1 * 0.8));
  CHECK(c.mass_plus_inf == Approx(0.9 * 0.2));
  CHECK(clash == Approx(0.1 * 0.2));
  CHECK_THROWS_AS(convolve(uniform(0, 1, 0.01), uniform(0, 1, 0.02)), std::invalid_argument);
}

TEST_CASE("trimming drops only negligible tails and keeps the total mass") {
  auto s = convolve(uniform(0, 1, 0.001), uniform(0, 1, 0.001));
  const double moved = trim_tails(s, 1e-6);
  double total = 0.0;
  for (double m : s.mass) total += m;
  CHECK(total == Approx(1.0).epsilon(1e-12));
  CHECK(moved < 2e-6);
}

TEST_CASE("rebinning onto a coarser lattice keeps quantiles within a coarse step") {
  const auto fine = uniform(-2, 5, 0.001);
  const auto coarse = rebin(fine, 0.05);
  for (double q : {0.05, 0.5, 0.95}) CHECK(coarse.quantile(q) == Approx(fine.quantile(q)).margin(0.05));
}

TEST_CASE("sample quantiles follow Hyndman and Fan's definition 7") {
  // Hyndman & Fan (1996), The American Statistician 50:361, definition 7 (R's default):
  // for 1..5, the 0.25 quantile is 2 and the 0.1 quantile is 1.4.
  const std::vector<double> sorted = {1, 2, 3, 4, 5};
  CHECK(sorted_quantile(sorted, 0.25) == Approx(2.0));
  CHECK(sorted_quantile(sorted, 0.1) == Approx(1.4));
  CHECK(sorted_quantile(sorted, 1.0) == 5.0);
  CHECK_THROWS_AS(sorted_quantile({}, 0.5), std::invalid_argument);
}

TEST_CASE("the conservative bound lies on the side of less support for the favoured proposition") {
  // U(0, 10) on log10 LR: the 5th percentile is 0.5, the 95th 9.5 (closed form).
  auto pmf = uniform(0, 10, 0.01);
  const SpreadLevels levels{0.9, 0.95};
  CHECK(summarize(pmf, levels, 5.0).conservative_log10 == Approx(0.5).margin(0.01));
  CHECK(summarize(pmf.negated(), levels, -5.0).conservative_log10 == Approx(-0.5).margin(0.01));
}

TEST_CASE("the conservative bound never claims more support than the reported value") {
  // Reported log10 LR 0.3 below the whole interval [0.5, 9.5]: the bound is the reported value.
  auto pmf = uniform(0, 10, 0.01);
  const SpreadLevels levels{0.9, 0.95};
  CHECK(summarize(pmf, levels, 0.3).conservative_log10 == 0.3);
  CHECK(summarize(pmf.negated(), levels, -0.3).conservative_log10 == -0.3);
  // At LR exactly 1 no proposition is favoured: the bound is LR 1 (log10 0), also for an LR that
  // equals 1 within the stated relative tolerance of 1e-12.
  CHECK(summarize(pmf, levels, 0.0).conservative_log10 == 0.0);
  CHECK(conservative_bound(1e-13, -2.0, 2.0) == 0.0);
  // Below the first verbal band (1 < LR < 2) the bound follows the side of 1 the value is on and
  // may cross 1: it says the findings might favour the other proposition.
  CHECK(conservative_bound(0.2, -0.4, 0.9) == -0.4);
  CHECK(conservative_bound(-0.2, -0.9, 0.4) == 0.4);
}

TEST_CASE("quantiles stay within the support however coarse the lattice") {
  // U(0, 1) read from a lattice of step 0.3, whose end bins reach -0.15 and 1.05: no quantile may
  // leave [0, 1], the support.
  auto pmf = uniform(0, 1, 0.3).within(0.0, 1.0);
  for (double q : {1e-9, 0.001, 0.5, 0.999, 1.0 - 1e-9}) {
    CAPTURE(q);
    CHECK(pmf.quantile(q) >= 0.0);
    CHECK(pmf.quantile(q) <= 1.0);
  }
  // Supports add under convolution and mirror under negation.
  const auto sum = convolve(pmf, uniform(2, 3, 0.3).within(2.0, 3.0));
  CHECK(sum.support_low == 2.0);
  CHECK(sum.support_high == 4.0);
  CHECK(sum.negated().support_low == -4.0);
  CHECK(rebin(sum, 0.6).support_high == 4.0);
  CHECK_THROWS_AS(pmf.within(1.0, 0.0), std::invalid_argument);
}
