// An item's own interval, median and conservative bound are read from a lattice that follows the
// item's own spread, at every width down to a point mass, and never leave what is possible.
// Exact values: the quantiles of the Beta distribution from GSL (gsl_cdf_beta_Pinv, GNU
// Scientific Library Reference Manual, "The Beta Distribution"), and the closed form of a
// distribution uniform on the log10 scale.
#include <catch2/catch.hpp>
#include <gsl/gsl_cdf.h>

#include <cmath>
#include <iomanip>

#include "core/evaluation/case_evaluation.hpp"
#include "core/evaluation/item_lattice.hpp"
#include "core/interchange/case_json.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

json case_with(const json& item, const json& uncertainty = json::object()) {
  json doc = {{"format", "counterpoise.case"},
              {"version", 1},
              {"case", {{"reference", "VFL-TEST-LATTICE"}}},
              {"propositions", {{"level", "source"}, {"hp", "The fibres came from the mat"}, {"hd", "The fibres came from elsewhere"}}},
              {"items", json::array({item})}};
  if (!uncertainty.empty()) doc["uncertainty"] = uncertainty;
  return doc;
}

evaluation::CaseEvaluation evaluate(const json& doc) {
  auto read = interchange::read_case(doc, ".");
  REQUIRE(read.value);
  return evaluation::evaluate_case(*read.value);
}

}  // namespace

TEST_CASE("a narrow item's interval is the exact Beta interval, not a coarse lattice's") {
  // P(E|Hp) = 0.5; P(E|Hd) from 100704 of 105949, i.e. Beta(100705, 5246) with the uniform prior
  // (Laplace's rule). log10 LR = log10 0.5 - log10 X, so its q-quantile is log10 0.5 minus
  // log10 of the (1 - q)-quantile of X, here from gsl_cdf_beta_Pinv.
  const auto result = evaluate(case_with(
      {{"id", "E1"}, {"model", "assigned"}, {"p_given_hp", 0.5}, {"p_given_hd", {{"counts", {{"k", 100704}, {"n", 105949}}}}}}));
  const auto& spread = *result.items[0].spread;
  const double a = 100705.0, b = 5246.0;
  const auto lr_quantile = [&](double q) { return std::log10(0.5) - std::log10(gsl_cdf_beta_Pinv(1.0 - q, a, b)); };
  // The lattice's bin masses are exact CDF differences and the quantile is interpolated inside the
  // bin that holds it, so each value is within one lattice step of the exact quantile; the step
  // must follow the item's own spread (about 1e-3 wide here), i.e. be far below 1e-5.
  CAPTURE(std::setprecision(17), spread.low_log10, spread.high_log10, spread.median_log10, spread.lattice_step);
  CHECK(spread.lattice_step < 1e-5);
  CHECK(std::abs(spread.low_log10 - lr_quantile(0.05)) <= spread.lattice_step);
  CHECK(std::abs(spread.high_log10 - lr_quantile(0.95)) <= spread.lattice_step);
  CHECK(std::abs(spread.median_log10 - lr_quantile(0.5)) <= spread.lattice_step);
  // The findings favour Hd: the conservative bound is the 95th percentile of log10 LR (less support
  // for Hd), unless that claims more support for Hd than the reported value.
  const double reported = result.items[0].point.lr.log10();
  CHECK(std::abs(spread.conservative_log10 - std::max(reported, lr_quantile(0.95))) <= spread.lattice_step);
  // The values quoted in the issue this fixes, to 5 decimals: [-0.27947, -0.27847].
  CHECK(spread.low_log10 == Approx(-0.27947).margin(5e-6));
  CHECK(spread.high_log10 == Approx(-0.27847).margin(5e-6));
}

TEST_CASE("a reported LR of 50 with interval [49, 51] keeps every summary inside [49, 51]") {
  // The interval is uniform on the log10 scale (docs/methods.md): the q-quantile of log10 LR is
  // log10 49 + q (log10 51 - log10 49), exact up to the lattice step.
  const double lo = std::log10(49.0), hi = std::log10(51.0);
  for (const double level : {0.90, 0.99, 0.999}) {
    CAPTURE(level);
    const auto result = evaluate(case_with({{"id", "E1"}, {"model", "reported-lr"}, {"lr", 50}, {"interval", {49, 51}}},
                                           {{"credible_level", level}, {"conservative_level", level}}));
    const auto& s = *result.items[0].spread;
    for (double v : {s.low_log10, s.median_log10, s.high_log10, s.conservative_log10}) {
      CHECK(v >= lo);
      CHECK(v <= hi);
    }
    const double tail = 0.5 * (1.0 - level);
    CHECK(std::abs(s.low_log10 - (lo + tail * (hi - lo))) <= s.lattice_step);
    CHECK(std::abs(s.high_log10 - (hi - tail * (hi - lo))) <= s.lattice_step);
    CHECK(std::abs(s.median_log10 - 0.5 * (lo + hi)) <= s.lattice_step);
  }
}

TEST_CASE("the item's lattice follows its width down to a point mass") {
  // A reported LR of 1000 with an interval [1000, 1000 * 10^w] uniform on the log10 scale: the
  // 90 % interval is [3 + 0.05 w, 3 + 0.95 w] (closed form). The step must resolve the width
  // (hundreds of bins across the central 99.8 %), whatever the width.
  const double w = GENERATE(1.0, 0.05, 1e-3, 1e-6, 1e-9);
  CAPTURE(w);
  const double high = 1000.0 * std::pow(10.0, w);
  const auto result = evaluate(case_with({{"id", "E1"}, {"model", "reported-lr"}, {"lr", 1000}, {"interval", {1000, high}}}));
  const auto& s = *result.items[0].spread;
  const double span = std::log10(high) - 3.0;  // w as the program sees it
  CHECK(s.lattice_step <= span / 200.0);
  CHECK(std::abs(s.low_log10 - (3.0 + 0.05 * span)) <= s.lattice_step);
  CHECK(std::abs(s.high_log10 - (3.0 + 0.95 * span)) <= s.lattice_step);
}

TEST_CASE("an item whose spread is a point mass keeps its exact value") {
  // A Beta with enormous counts is a point mass in double precision: 10^15 of 2 * 10^15.
  const auto result = evaluate(case_with({{"id", "E1"},
                                          {"model", "assigned"},
                                          {"p_given_hp", 0.5},
                                          {"p_given_hd", {{"beta", {1e15, 1e15}}}}}));
  const auto& s = *result.items[0].spread;
  // log10(0.5 / 0.5) = 0, Beta(1e15, 1e15) has standard deviation about 1.1e-8, so log10 LR's
  // 90 % interval is about ±8e-9 (normal approximation, common practice).
  CHECK(std::abs(s.low_log10) < 2e-8);
  CHECK(std::abs(s.high_log10) < 2e-8);
  CHECK(s.low_log10 < s.high_log10);
}

TEST_CASE("an interval never goes beyond what is possible") {
  // P(E|Hp) ~ Beta(0.2, 0.3) against P(E|Hd) = 1e-6: P(E|Hp) <= 1, so log10 LR <= 6. The 99 %
  // interval's upper end is 6 + log10 of the 0.995-quantile of Beta(0.2, 0.3) (gsl_cdf_beta_Pinv),
  // just below 6; a lattice bin straddling 6 must not report more than 6.
  const auto result = evaluate(case_with({{"id", "E1"}, {"model", "assigned"}, {"p_given_hp", {{"beta", {0.2, 0.3}}}}, {"p_given_hd", 1e-6}},
                                         {{"credible_level", 0.99}}));
  const auto& s = *result.items[0].spread;
  const double exact_high = 6.0 + std::log10(gsl_cdf_beta_Pinv(0.995, 0.2, 0.3));
  CAPTURE(std::setprecision(17), s.high_log10, exact_high, s.lattice_step);
  CHECK(s.high_log10 <= 6.0);
  CHECK(std::abs(s.high_log10 - exact_high) <= s.lattice_step);
  const double exact_low = 6.0 + std::log10(gsl_cdf_beta_Pinv(0.005, 0.2, 0.3));
  CHECK(std::abs(s.low_log10 - exact_low) <= s.lattice_step);
}

TEST_CASE("an assigned item leaves the lattice for Monte Carlo when its Beta reaches below 1e-300") {
  // For Beta(a, 1), P(X <= x) = x^a, so the 1e-12 quantile is 10^(-12 / a): below 10^-300 (the
  // smallest normal double is about 2.2e-308) exactly when a < 0.04 (closed form of the Beta(a, 1)
  // CDF). Beta(0.035, 1) is therefore drawn, Beta(0.045, 1) stays on the lattice.
  const auto method_for = [](double a) {
    return evaluate(case_with({{"id", "E1"}, {"model", "assigned"}, {"p_given_hp", {{"beta", {a, 1.0}}}}, {"p_given_hd", 0.01}}))
        .items[0]
        .spread->method;
  };
  CHECK(method_for(0.035).rfind("Monte Carlo", 0) == 0);
  CHECK(method_for(0.045) == "lattice convolution");
}
