// The two-level model against several alternatives to Hp: each alternative may name the
// population the recovered material's source comes from if it is true (population_hd). Checked
// against the densities of the two-level model written out with GSL's normal density.
#include <catch2/catch.hpp>

#include <gsl/gsl_randist.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>
#include <vector>

#include <unistd.h>

#include "core/continuous/background_fixture.hpp"
#include "core/models/continuous/continuous_model.hpp"
#include "core/validation/input_error.hpp"

using nlohmann::json;
using namespace counterpoise;
using namespace counterpoise::models::continuous;
using Catch::Matchers::Contains;

namespace {

const std::filesystem::path& temp_dir() {
  static const std::filesystem::path dir = [] {
    auto d = std::filesystem::temp_directory_path() / ("counterpoise-continuous-alt-" + std::to_string(::getpid()));
    std::filesystem::create_directories(d);
    return d;
  }();
  return dir;
}

models::ReadContext context() { return models::ReadContext{temp_dir(), validation::Location{"G1", ""}}; }

// Invented refractive indices: the window (control), fragments from the jacket (recovered).
json shared_item() {
  return json::parse(R"({ "id": "G1", "model": "continuous-two-level", "control": [1.51844, 1.51846, 1.51850],
    "recovered": [1.51848, 1.51852], "within_sd": 4e-5, "population": { "normal": { "mean": 1.5186, "sd": 0.004 } } })");
}

const std::vector<double> kControl{1.51844, 1.51846, 1.51850}, kRecovered{1.51848, 1.51852};
constexpr double kSigma = 4e-5;

double mean_of(const std::vector<double>& v) {
  double s = 0;
  for (double x : v) s += x;
  return s / static_cast<double>(v.size());
}

// The two-level densities (Lindley 1977, Biometrika 64:207; Aitken & Lucy 2004, Appl. Statist.
// 53:109) with a = sigma^2/m, b = sigma^2/n, w = (b xbar + a ybar)/(a + b):
//   f(E|Hp)   = N(xbar - ybar; 0, a + b) N(w; mu, tau^2 + ab/(a+b))
//   f(E|Hd_i) = N(xbar; mu, tau^2 + a) f_i(ybar), f_i the recovered mean's density in the
//               population of Hd_i (normal: N(ybar; mu_i, tau_i^2 + b)).
struct Means {
  double x, y, a, b;
};
Means means() {
  return {mean_of(kControl), mean_of(kRecovered), kSigma * kSigma / 3.0, kSigma * kSigma / 2.0};
}
double numerator(double mu, double tau) {
  const Means m = means();
  const double w = (m.b * m.x + m.a * m.y) / (m.a + m.b);
  return gsl_ran_gaussian_pdf(m.x - m.y, std::sqrt(m.a + m.b)) *
         gsl_ran_gaussian_pdf(w - mu, std::sqrt(tau * tau + m.a * m.b / (m.a + m.b)));
}
double control_term(double mu, double tau) {
  const Means m = means();
  return gsl_ran_gaussian_pdf(m.x - mu, std::sqrt(tau * tau + m.a));
}
double recovered_normal(double mu, double tau) {
  const Means m = means();
  return gsl_ran_gaussian_pdf(m.y - mu, std::sqrt(tau * tau + m.b));
}

}  // namespace

TEST_CASE("continuous: one alternative without population_hd gives the two-proposition LR bit for bit", "[continuous][alternatives]") {
  json item = shared_item();
  item.erase("within_sd");
  item["within_replicates"] = {{1.51840, 1.51846, 1.51849}, {1.52010, 1.52004}};  // uncertain sigma: draws compared too
  const auto two = read_continuous_model(item, context());
  json several = item;
  several["alternatives"] = {{"Hd1", json::object()}};
  const auto models = read_continuous_alternatives(several, std::vector<std::string>{"Hd1"}, context());
  REQUIRE(models.size() == 1);
  CHECK(models[0]->evaluate().lr.log10() == two->evaluate().lr.log10());
  std::vector<double> a(500), b(500);
  std::mt19937_64 rng_a(3), rng_b(3);
  two->draw_log10_lr(rng_a, a);
  models[0]->draw_log10_lr(rng_b, b);
  CHECK(a == b);
  // population_hd equal to population is the same model too.
  several["alternatives"]["Hd1"] = {{"population_hd", item["population"]}};
  CHECK(read_continuous_alternatives(several, std::vector<std::string>{"Hd1"}, context())[0]->evaluate().lr.log10() ==
        two->evaluate().lr.log10());
}

TEST_CASE("continuous: each alternative's population reaches its denominator only", "[continuous][alternatives]") {
  // Hd1: another window of the same kind (the shared population); Hd2: a container from the
  // suspect's workplace (an invented population of container glass).
  json item = shared_item();
  item["alternatives"] = {{"Hd1", json::object()},
                          {"Hd2", {{"population_hd", {{"normal", {{"mean", 1.5205}, {"sd", 0.0015}}}}}}}};
  const auto models = read_continuous_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, context());
  const double hp = numerator(1.5186, 0.004);
  const double expected[] = {hp / (control_term(1.5186, 0.004) * recovered_normal(1.5186, 0.004)),
                             hp / (control_term(1.5186, 0.004) * recovered_normal(1.5205, 0.0015))};
  for (std::size_t i = 0; i < 2; ++i) {
    CAPTURE(i);
    // 1e-10: the densities differ from GSL's in the last bits of exp and log; the LR's log10 is
    // about 2, so this allows about 1e-8 in log10.
    CHECK(models[i]->evaluate().lr.log10() == Approx(std::log10(expected[i])).epsilon(1e-10));
  }
  CHECK(models[1]->evaluate().detail["population_hd"]["normal"]["mean"] == 1.5205);
  CHECK_FALSE(models[0]->evaluate().detail.contains("population_hd"));
}

TEST_CASE("continuous: a kernel population under one alternative", "[continuous][alternatives]") {
  {
    std::ofstream out(temp_dir() / "containers.csv");
    out << "ri\n";
    for (double v : test::kInventedBackground) out << v << "\n";
  }
  json item = shared_item();
  item["alternatives"] = {
      {"Hd1", json::object()},
      {"Hd2", {{"population_hd", {{"kde", {{"file", "containers.csv"}, {"column", "ri"}, {"bandwidth", 0.001},
                                            {"method", "exact"}}}}}}}};
  const auto models = read_continuous_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, context());
  // The kernel form (Aitken & Lucy 2004): f_2(ybar) = (1/N) sum_i N(ybar; z_i, h^2 + b).
  const Means m = means();
  double kernel = 0.0;
  for (double z : test::kInventedBackground) kernel += gsl_ran_gaussian_pdf(m.y - z, std::sqrt(0.001 * 0.001 + m.b));
  kernel /= static_cast<double>(test::kInventedBackground.size());
  const double expected = numerator(1.5186, 0.004) / (control_term(1.5186, 0.004) * kernel);
  // 1e-10 as above; the exact method sums every kernel term.
  CHECK(models[1]->evaluate().lr.log10() == Approx(std::log10(expected)).epsilon(1e-10));
  CHECK(models[1]->data_files().size() == 1);
}

TEST_CASE("continuous: bad per-alternative populations name the alternative and the field", "[continuous][alternatives][errors]") {
  const std::vector<std::string> ids{"Hd1", "Hd2"};
  json item = shared_item();
  item["alternatives"] = {{"Hd1", json::object()}, {"Hd2", {{"population_hd", {{"normal", {{"mean", 1.52}, {"sd", -1}}}}}}}};
  CHECK_THROWS_WITH(read_continuous_alternatives(item, ids, context()),
                    Contains("item G1, field alternatives.Hd2.population_hd.normal.sd"));
  item["alternatives"]["Hd2"] = {{"population_hd", {{"uniform", {}}}}};
  CHECK_THROWS_WITH(read_continuous_alternatives(item, ids, context()),
                    Contains("field alternatives.Hd2.population_hd"));
  item["alternatives"]["Hd2"] = {{"population", {{"normal", {{"mean", 1.52}, {"sd", 0.001}}}}}};
  CHECK_THROWS_WITH(read_continuous_alternatives(item, ids, context()), Contains("field alternatives.Hd2.population"));
  item["alternatives"]["Hd2"] = {{"population_hd", {{"kde", {{"file", "no-such-file.csv"}, {"column", "ri"}}}}}};
  CHECK_THROWS_WITH(read_continuous_alternatives(item, ids, context()),
                    Contains("field alternatives.Hd2.population_hd.kde.file"));
}

TEST_CASE("continuous: the approximate form cannot serve an alternative with a population of its own", "[continuous][alternatives][errors]") {
  json item = shared_item();
  item["form"] = "approximate";
  item["alternatives"] = {{"Hd1", json::object()},
                          {"Hd2", {{"population_hd", {{"normal", {{"mean", 1.5205}, {"sd", 0.0015}}}}}}}};
  CHECK_THROWS_WITH(read_continuous_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, context()),
                    Contains("item G1, field alternatives.Hd2.population_hd: the continuous-two-level model cannot"));
}
