// The interval of the compound LR of Hp against weighted alternatives,
//   LR = P(E|Hp) / sum_i w_i P(E|Hd_i)   (Bayes' theorem for exclusive propositions; common practice),
// from joint draws in which P(E|Hp) is shared by every alternative and each P(E|Hd_i) is drawn on
// its own. Checked against quantiles computed here without draws, by GSL (GNU Scientific Library
// Reference Manual: gsl_cdf_beta_Pinv, "The Beta Distribution"; gsl_integration_qags, "QAGS
// adaptive integration with singularities"; gsl_root_fsolver_brent, "Root bracketing
// algorithms"):
// - P(E|Hp) ~ Beta(a, b), each P(E|Hd_i) a point: the compound is X / sum_i w_i p_i, increasing in
//   X, so its q-quantile is the Beta's q-quantile over the same sum;
// - P(E|Hp) a point, P(E|Hd_1) ~ Beta, P(E|Hd_2) ~ Beta, independent: the compound is
//   p / S with S = w_1 Y_1 + w_2 Y_2, so its q-quantile is p over the (1 - q)-quantile of S, whose
//   distribution function F(t) = int f_1(y) F_2((t - w_1 y) / w_2) dy is integrated by GSL and
//   inverted by Brent's method.
// Had the alternatives drawn P(E|Hp) separately (the compound then averages over independent
// draws: narrower), or their P(E|Hd_i) from the same random numbers (wider), the quantiles would
// not be those computed here.
#include <catch2/catch.hpp>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_roots.h>

#include <algorithm>
#include <cmath>

#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/models/draws_in_parts.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

casefile::Case read(const json& doc) {
  auto result = interchange::read_case(doc, ".");
  INFO((result.diagnostics.empty() ? "" : result.diagnostics.problems().front().text()));
  REQUIRE(result.value);
  return std::move(*result.value);
}

// Two alternatives with weights 1 : 1, the given items (invented numbers, Harwick Vale).
json case_with(const json& items) {
  json doc = json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-COMPOUND" },
    "propositions": { "level": "source", "hp": "The glass came from the window of 3 Tanner Row",
      "alternatives": [
        { "id": "Hd1", "text": "The glass came from another window of the same kind", "weight": 1 },
        { "id": "Hd2", "text": "The glass came from the workshop at Cooper's Yard", "weight": 1 } ] },
    "uncertainty": { "seed": 20261203, "draws": 100000, "credible_level": 0.9 } })");
  doc["items"] = items;
  return doc;
}

// P(S <= t) for S = w1 Y1 + w2 Y2, Y1 ~ Beta(a1, b1) and Y2 ~ Beta(a2, b2) independent.
struct WeightedBetaSum {
  double w1, a1, b1, w2, a2, b2;

  double cdf(double t) const {
    struct At {
      const WeightedBetaSum* sum;
      double t;
    } at{this, t};
    gsl_function f;
    f.function = [](double y, void* p) {
      const auto* a = static_cast<const At*>(p);
      const double x = (a->t - a->sum->w1 * y) / a->sum->w2;
      const double f2 = x <= 0.0 ? 0.0 : x >= 1.0 ? 1.0 : gsl_cdf_beta_P(x, a->sum->a2, a->sum->b2);
      return gsl_ran_beta_pdf(y, a->sum->a1, a->sum->b1) * f2;
    };
    f.params = &at;
    gsl_integration_workspace* work = gsl_integration_workspace_alloc(1000);
    double result = 0.0, error = 0.0;
    const int status = gsl_integration_qags(&f, 0.0, std::min(1.0, t / w1), 0.0, 1e-12, 1000, work, &result, &error);
    gsl_integration_workspace_free(work);
    REQUIRE(status == GSL_SUCCESS);
    return result;
  }

  double quantile(double q) const {
    struct Target {
      const WeightedBetaSum* sum;
      double q;
    } target{this, q};
    gsl_function f;
    f.function = [](double t, void* p) {
      const auto* x = static_cast<const Target*>(p);
      return x->sum->cdf(t) - x->q;
    };
    f.params = &target;
    gsl_root_fsolver* solver = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    gsl_root_fsolver_set(solver, &f, 1e-9, w1 + w2);
    double root = 0.0;
    for (int i = 0; i < 200; ++i) {
      gsl_root_fsolver_iterate(solver);
      root = gsl_root_fsolver_root(solver);
      if (gsl_root_test_interval(gsl_root_fsolver_x_lower(solver), gsl_root_fsolver_x_upper(solver), 0.0, 1e-13) ==
          GSL_SUCCESS)
        break;
    }
    gsl_root_fsolver_free(solver);
    return root;
  }
};

}  // namespace

TEST_CASE("compound interval: P(E|Hp) uncertain is shared by the alternatives in every draw", "[alternatives][compound]") {
  const auto value = read(case_with(json::parse(R"([{ "id": "E1", "model": "assigned",
      "p_given": { "Hp": { "beta": [38, 4] }, "Hd1": 0.05, "Hd2": 0.2 } }])")));
  const auto result = evaluation::evaluate_case(value);
  const auto& compound = result.items[0].compound;
  REQUIRE(compound);
  REQUIRE(compound->spread);
  // Point: E[X] / (0.5 * 0.05 + 0.5 * 0.2) = (38/42) / 0.125.
  const double sum = 0.5 * 0.05 + 0.5 * 0.2;
  CHECK(compound->lr.log10() == Approx(std::log10((38.0 / 42.0) / sum)).epsilon(1e-14));
  // The 5 % and 95 % quantiles of X / 0.125. Tolerance 1e-3 in log10: the standard error of a
  // sample quantile of 100 000 draws, sqrt(q(1 - q)/n) / f(x_q), is below 2e-4 in log10 here.
  CHECK(compound->spread->low_log10 == Approx(std::log10(gsl_cdf_beta_Pinv(0.05, 38, 4) / sum)).margin(1e-3));
  CHECK(compound->spread->high_log10 == Approx(std::log10(gsl_cdf_beta_Pinv(0.95, 38, 4) / sum)).margin(1e-3));
  // One item: the combination's interval is the item's own draws summarised again.
  REQUIRE(result.combined.compound);
  REQUIRE(result.combined.compound->spread);
  CHECK(result.combined.compound->spread->low_log10 == compound->spread->low_log10);
  CHECK(result.combined.compound->interval_note.empty());
}

TEST_CASE("compound interval: each alternative's P(E|Hd_i) is drawn on its own", "[alternatives][compound]") {
  const auto value = read(case_with(json::parse(R"([{ "id": "E1", "model": "assigned",
      "p_given": { "Hp": 0.9, "Hd1": { "beta": [5, 57] }, "Hd2": { "beta": [7, 115] } } }])")));
  const auto result = evaluation::evaluate_case(value);
  const auto& compound = result.items[0].compound;
  REQUIRE(compound);
  REQUIRE(compound->spread);
  const WeightedBetaSum s{0.5, 5, 57, 0.5, 7, 115};
  // Point: 0.9 / (0.5 * 5/62 + 0.5 * 7/122), the means of the Betas.
  CHECK(compound->lr.log10() == Approx(std::log10(0.9 / (0.5 * 5.0 / 62.0 + 0.5 * 7.0 / 122.0))).epsilon(1e-14));
  // Tolerance 3e-3 in log10: the sample quantile's standard error is below 6e-4 in log10 here.
  CHECK(compound->spread->low_log10 == Approx(std::log10(0.9 / s.quantile(0.95))).margin(3e-3));
  CHECK(compound->spread->high_log10 == Approx(std::log10(0.9 / s.quantile(0.05))).margin(3e-3));
}

TEST_CASE("compound interval of the combination: items multiply under each proposition draw by draw",
          "[alternatives][compound]") {
  const auto value = read(case_with(json::parse(R"([
      { "id": "E1", "model": "assigned", "p_given": { "Hp": { "beta": [38, 4] }, "Hd1": 0.05, "Hd2": 0.2 } },
      { "id": "E2", "model": "assigned", "p_given": { "Hp": 0.5, "Hd1": 0.1, "Hd2": 0.4 } }])")));
  const auto result = evaluation::evaluate_case(value);
  REQUIRE(result.combined.compound);
  REQUIRE(result.combined.compound->spread);
  // Combined: X * 0.5 / (0.5 * 0.05 * 0.1 + 0.5 * 0.2 * 0.4), increasing in X ~ Beta(38, 4).
  const double denominator = 0.5 * 0.05 * 0.1 + 0.5 * 0.2 * 0.4;
  CHECK(result.combined.compound->lr.log10() == Approx(std::log10(38.0 / 42.0 * 0.5 / denominator)).epsilon(1e-14));
  // Tolerance as in the first test (the same draws of X).
  CHECK(result.combined.compound->spread->low_log10 ==
        Approx(std::log10(gsl_cdf_beta_Pinv(0.05, 38, 4) * 0.5 / denominator)).margin(1e-3));
  CHECK(result.combined.compound->spread->high_log10 ==
        Approx(std::log10(gsl_cdf_beta_Pinv(0.95, 38, 4) * 0.5 / denominator)).margin(1e-3));
  // A certain item has no interval of its own.
  CHECK_FALSE(result.items[1].compound->spread);
}

TEST_CASE("compound interval of the combination: each alternative's uncertain P(E|Hd_i) is carried over the items",
          "[alternatives][compound]") {
  // Item 1 leaves P(E|Hd1) uncertain, item 2 P(E|Hd2). Combined, the compound is
  // (0.9 * 0.8) / (0.5 * 0.4 * Y1 + 0.5 * 0.3 * Y2), Y1 ~ Beta(5, 57), Y2 ~ Beta(7, 115) independent:
  // the weighted Beta sum of the second test with weights 0.2 and 0.15.
  const auto value = read(case_with(json::parse(R"([
      { "id": "E1", "model": "assigned", "p_given": { "Hp": 0.9, "Hd1": { "beta": [5, 57] }, "Hd2": 0.3 } },
      { "id": "E2", "model": "assigned", "p_given": { "Hp": 0.8, "Hd1": 0.4, "Hd2": { "beta": [7, 115] } } }])")));
  const auto result = evaluation::evaluate_case(value);
  REQUIRE(result.combined.compound);
  REQUIRE(result.combined.compound->spread);
  const WeightedBetaSum s{0.2, 5, 57, 0.15, 7, 115};
  // Tolerance as in the second test.
  CHECK(result.combined.compound->spread->low_log10 == Approx(std::log10(0.72 / s.quantile(0.95))).margin(3e-3));
  CHECK(result.combined.compound->spread->high_log10 == Approx(std::log10(0.72 / s.quantile(0.05))).margin(3e-3));
  // Each item alone: a point over one Beta and a constant, monotone in the Beta draw.
  const double e1_low = std::log10(0.9 / (0.5 * gsl_cdf_beta_Pinv(0.95, 5, 57) + 0.5 * 0.3));
  REQUIRE(result.items[0].compound->spread);
  CHECK(result.items[0].compound->spread->low_log10 == Approx(e1_low).margin(1e-3));
}

TEST_CASE("compound interval: reported LRs against the alternatives move together within their intervals",
          "[alternatives][compound]") {
  // log10 LR against Hd1 uniform on [1, 2] and against Hd2 on [0, 1], at the same position u in
  // every draw: the compound -log10(0.5 * 10^-(1 + u) + 0.5 * 10^-u) increases with u ~ U(0, 1),
  // so its q-quantile is that expression at u = q (no draws needed to know it).
  const auto value = read(case_with(json::parse(R"([{ "id": "E1", "model": "reported-lr", "alternatives": {
      "Hd1": { "log10_lr": 1.5, "interval_log10": [1, 2] },
      "Hd2": { "log10_lr": 0.5, "interval_log10": [0, 1] } } }])")));
  const auto result = evaluation::evaluate_case(value);
  const auto& compound = result.items[0].compound;
  REQUIRE(compound);
  REQUIRE(compound->spread);
  const auto at = [](double u) { return -std::log10(0.5 * std::pow(10.0, -(1.0 + u)) + 0.5 * std::pow(10.0, -u)); };
  // Tolerance 2e-3: the sample quantile of 100 000 uniform draws has standard error
  // sqrt(0.05 * 0.95 / 1e5) = 7e-4 in u, and the compound's slope in u is at most 1.
  CHECK(compound->spread->low_log10 == Approx(at(0.05)).margin(2e-3));
  CHECK(compound->spread->high_log10 == Approx(at(0.95)).margin(2e-3));
  CHECK(compound->spread->median_log10 == Approx(at(0.5)).margin(2e-3));
}

TEST_CASE("compound interval: an assigned item's draws in parts are its draws against each alternative",
          "[alternatives][compound]") {
  // Identity: log10 LR_i = log10 P(E|Hp) - log10 P(E|Hd_i), draw for draw, from the same generator
  // state, whether the shared part is drawn (the first alternative) or not (the others).
  const auto value = read(case_with(json::parse(R"([{ "id": "E1", "model": "assigned",
      "p_given": { "Hp": { "counts": { "k": 3, "n": 300 } }, "Hd1": { "beta": [5, 57] }, "Hd2": { "beta": [0.5, 40] } } }])")));
  const auto& models = value.items[0].alternative_models;
  REQUIRE(models.size() == 2);
  constexpr std::size_t kDraws = 5000;
  std::vector<double> shared(kDraws), own(kDraws), whole(kDraws);
  for (std::size_t i = 0; i < models.size(); ++i) {
    auto for_parts = evaluation::item_generator(11, 0), for_whole = evaluation::item_generator(11, 0);
    const auto* in_parts = dynamic_cast<const models::DrawsInParts*>(models[i].get());
    REQUIRE(in_parts);
    if (i == 0) in_parts->draw_log10_lr_parts(for_parts, shared, own);
    else in_parts->draw_log10_lr_parts(for_parts, {}, own);
    models[i]->draw_log10_lr(for_whole, whole);
    for (std::size_t k = 0; k < kDraws; ++k) REQUIRE(shared[k] + own[k] == Approx(whole[k]).epsilon(1e-13));
    CHECK(for_parts() == for_whole());  // the generators moved on alike
  }
}
