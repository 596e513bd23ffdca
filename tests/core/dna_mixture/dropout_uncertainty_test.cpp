// Uncertainty about the drop-out probability: the LR averaged over a distribution of d, checked
// against GSL's adaptive quadrature of the same likelihoods, and the curve over d.
#include <catch2/catch.hpp>

#include <cmath>
#include <functional>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_randist.h>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/models/dna_mixture/dropout_uncertainty.hpp"
#include "mixture_test_support.hpp"

using namespace counterpoise::models::dna_mixture;
using nlohmann::json;

namespace {

// A three-locus two-person mixture with drop-out at two loci (invented numbers for the test).
json three_loci_item(const json& dropout) {
  const json table = {{"D8S1179", {{"11", 0.08}, {"12", 0.15}, {"13", 0.30}, {"14", 0.21}, {"15", 0.16}, {"16", 0.10}}},
                      {"TH01", {{"6", 0.23}, {"7", 0.19}, {"8", 0.10}, {"9", 0.13}, {"9.3", 0.35}}},
                      {"FGA", {{"20", 0.13}, {"21", 0.18}, {"22", 0.20}, {"23", 0.15}, {"24", 0.14}, {"25", 0.10}}}};
  return {{"id", "M1"}, {"model", "dna-mixture"}, {"theta", 0.01},
          {"observed", {{"D8S1179", {"11", "12", "13"}}, {"TH01", {"6", "9.3"}}, {"FGA", {"20", "21", "22", "24"}}}},
          {"references", {{"victim", {{"D8S1179", {"11", "12"}}, {"TH01", {"6", "9.3"}}, {"FGA", {"20", "22"}}}},
                          {"suspect", {{"D8S1179", {"13", "14"}}, {"TH01", {"7", "9.3"}}, {"FGA", {"21", "24"}}}}}},
          {"hp", {{"contributors", {"suspect", "victim"}}, {"unknowns", 0}}},
          {"hd", {{"contributors", {"victim"}}, {"unknowns", 1}}},
          {"dropout", dropout}, {"dropin", 0.05}, {"min_allele_frequency", "none"},
          {"frequencies", {{"table", table}}}};
}

// log10 of the integral of P(E | side, d) w(d) over [a, b] by GSL's QAGS (adaptive Gauss-Kronrod
// with extrapolation, handles integrable endpoint singularities).
double gsl_log10_average(const DnaMixtureModel& model, Side side, const std::function<double(double)>& weight, double a,
                         double b) {
  struct Data {
    const DnaMixtureModel* model;
    Side side;
    const std::function<double(double)>* weight;
  } data{&model, side, &weight};
  gsl_function f;
  f.function = [](double d, void* params) {
    auto* x = static_cast<Data*>(params);
    return std::pow(10.0, x->model->log10_probability(x->side, d)) * (*x->weight)(d);
  };
  f.params = &data;
  // GSL reports a tolerance it cannot reach through its error handler (abort by default); the
  // status and GSL's own error estimate are checked instead.
  gsl_error_handler_t* previous = gsl_set_error_handler_off();
  gsl_integration_workspace* work = gsl_integration_workspace_alloc(1000);
  double result = 0.0, error = 0.0;
  const int status = gsl_integration_qags(&f, a, b, 0.0, 1e-11, 1000, work, &result, &error);
  gsl_integration_workspace_free(work);
  gsl_set_error_handler(previous);
  INFO("GSL status " << status << ", estimated error " << error << " of " << result);
  CHECK(error <= 1e-10 * result);
  return std::log10(result);
}

}  // namespace

TEST_CASE("a Beta distribution of d: the averaged probabilities agree with GSL quadrature", "[dna_mixture][dropout]") {
  for (auto [a, b] : {std::pair{2.0, 8.0}, std::pair{0.7, 3.0}, std::pair{1.0, 1.0}, std::pair{20.0, 60.0}}) {
    const auto model = mixture_test::read(three_loci_item({{"beta", {a, b}}}));
    auto density = [a = a, b = b](double d) { return gsl_ran_beta_pdf(d, a, b); };
    INFO("Beta(" << a << ", " << b << ")");
    // GSL QAGS to 1e-11 relative against tanh-sinh to 1e-10: agreement to 1e-9 relative, i.e.
    // about 4e-10 in log10.
    CHECK(model->log10_p_given_hp() == Approx(gsl_log10_average(*model, Side::hp, density, 0.0, 1.0)).margin(1e-9));
    CHECK(model->log10_p_given_hd() == Approx(gsl_log10_average(*model, Side::hd, density, 0.0, 1.0)).margin(1e-9));
    const auto result = model->evaluate();
    CHECK(result.lr.log10() == Approx(model->log10_p_given_hp() - model->log10_p_given_hd()).margin(1e-12));
    CHECK(result.detail["dropout"]["integrated"] == true);
    CHECK(result.detail["dropout"]["point"].get<double>() == Approx(a / (a + b)).epsilon(1e-15));
  }
}

TEST_CASE("counts of drop-outs give Beta(k + 1, n - k + 1), an interval is averaged uniformly", "[dna_mixture][dropout]") {
  // Laplace's rule: counts k of n with the uniform prior are Beta(k + 1, n - k + 1) (see
  // probability_assignment.hpp for the source).
  const auto counts = mixture_test::read(three_loci_item({{"counts", {{"k", 3}, {"n", 20}}}}));
  const auto beta = mixture_test::read(three_loci_item({{"beta", {4, 18}}}));
  CHECK(counts->evaluate().lr.log10() == Approx(beta->evaluate().lr.log10()).margin(1e-12));

  const auto linear = mixture_test::read(three_loci_item({{"interval", {0.05, 0.4}}, {"scale", "linear"}}));
  auto flat = [](double) { return 1.0 / 0.35; };
  CHECK(linear->log10_p_given_hd() == Approx(gsl_log10_average(*linear, Side::hd, flat, 0.05, 0.4)).margin(1e-9));

  // Uniform on log10 d over [0.01, 0.5]: density 1 / (d ln(50)) on d.
  const auto log_scale = mixture_test::read(three_loci_item({{"interval", {0.01, 0.5}}}));
  auto log_density = [](double d) { return 1.0 / (d * std::log(50.0)); };
  CHECK(log_scale->log10_p_given_hp() == Approx(gsl_log10_average(*log_scale, Side::hp, log_density, 0.01, 0.5)).margin(1e-9));
}

TEST_CASE("a point value of d is used as it is", "[dna_mixture][dropout]") {
  const auto model = mixture_test::read(three_loci_item(0.2));
  CHECK(model->evaluate().lr.log10() == Approx(*model->log10_lr_at(0.2)).epsilon(1e-15));
  CHECK(model->evaluate().detail["dropout"]["integrated"] == false);
}

TEST_CASE("the curve over d marks the d that minimises the LR", "[dna_mixture][dropout]") {
  const auto model = mixture_test::read(three_loci_item(0.2));
  const auto& curve = model->curve();
  REQUIRE(curve.points.size() == static_cast<std::size_t>(kDropoutCurvePoints));
  CHECK(curve.points.front().d == 0.0);
  CHECK(curve.points.back().d == 1.0);
  // With drop-out at two loci of the suspect's alleles, d = 0 needs drop-in for each: the LR is
  // positive but small there; the LR vanishes nowhere inside (0, 1).
  REQUIRE(curve.minimum.log10_lr.has_value());
  // The marked minimum is no higher than a fine scan of 100,001 points (its refinement is
  // Brent's method to 40 bits).
  double scan = std::numeric_limits<double>::infinity();
  for (int i = 0; i <= 100000; ++i) {
    const auto value = model->log10_lr_at(i / 100000.0);
    if (value) scan = std::min(scan, *value);
  }
  CHECK(*curve.minimum.log10_lr <= scan + 1e-9);
  const json detail = model->evaluate().detail["dropout_curve"];
  CHECK(detail["points"].size() == curve.points.size());
  CHECK(detail["minimum"]["dropout"].get<double>() == curve.minimum.d);
}

TEST_CASE("the curve marks an LR of zero at d = 0 when a contributor's allele is missing", "[dna_mixture][dropout]") {
  // With no drop-out the suspect's unseen alleles exclude him (LR 0 at d = 0); any d > 0 allows it.
  const auto model = mixture_test::read(three_loci_item({{"beta", {2, 8}}}));
  CHECK(model->curve().points.front().log10_lr.has_value());
  json item = three_loci_item(0.0);
  item["dropin"] = 0.0;
  item["observed"]["TH01"] = {"6", "7", "9.3"};
  item["observed"]["D8S1179"] = {"11", "12", "13", "14"};
  item["observed"]["FGA"] = {"20", "21", "22", "24"};
  const auto full = mixture_test::read(item);
  CHECK(std::isfinite(full->evaluate().lr.log10()));
  item["observed"]["FGA"] = {"20", "21", "22"};  // the suspect's 24 is missing, d = 0: exclusion
  item["hd"] = {{"contributors", {"victim"}}, {"unknowns", 1}};
  const auto excluded = mixture_test::read(item);
  CHECK(excluded->evaluate().lr.is_zero());
  CHECK(*excluded->curve().minimum.log10_lr == -std::numeric_limits<double>::infinity());
  CHECK(excluded->curve().minimum.d == 0.0);
}
