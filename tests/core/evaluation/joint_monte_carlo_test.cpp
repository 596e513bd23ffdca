// The joint Monte Carlo of a case: the draws do not depend on the number of threads, and their
// mean is the sum of the items' expected log10 LRs. For X ~ Beta(a, b), E[ln X] = psi(a) -
// psi(a + b) and Var[ln X] = psi'(a) - psi'(a + b) (e.g. Johnson, Kotz & Balakrishnan 1995,
// Continuous Univariate Distributions vol. 2, ch. 25 — from memory for the chapter); digamma and
// trigamma from GSL (gsl_sf_psi, gsl_sf_psi_1).
#include <catch2/catch.hpp>
#include <gsl/gsl_sf_psi.h>

#include <cmath>
#include <numeric>
#include <vector>

#include "core/evaluation/joint_monte_carlo.hpp"
#include "core/interchange/case_json.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

constexpr double kLn10 = 2.302585092994045684;

// Five items, P(E|Hp) ~ Beta(a_i, b_i) and P(E|Hd) from counts k of n (Beta(k + 1, n - k + 1)).
struct ItemShapes {
  double a, b;
  int k, n;
};
const std::vector<ItemShapes> kItems = {{20, 3, 2, 300}, {21, 4, 3, 310}, {6, 2, 9, 1150}, {38, 4, 3, 412}, {2.5, 1.5, 0, 80}};

casefile::Case five_item_case() {
  json doc = {{"format", "counterpoise.case"}, {"version", 1}, {"case", {{"reference", "VFL-TEST-JOINT"}}},
              {"propositions", {{"level", "source"}, {"hp", "The fibres came from the mat"}, {"hd", "The fibres came from elsewhere"}}},
              {"uncertainty", {{"seed", 5}, {"draws", 40000}}}};
  json items = json::array();
  for (std::size_t i = 0; i < kItems.size(); ++i)
    items.push_back({{"id", "E" + std::to_string(i + 1)}, {"model", "assigned"},
                     {"p_given_hp", {{"beta", {kItems[i].a, kItems[i].b}}}},
                     {"p_given_hd", {{"counts", {{"k", kItems[i].k}, {"n", kItems[i].n}}}}}});
  doc["items"] = items;
  auto read = interchange::read_case(doc, ".");
  REQUIRE(read.value);
  return std::move(*read.value);
}

double log_beta_mean(double a, double b) { return gsl_sf_psi(a) - gsl_sf_psi(a + b); }
double log_beta_variance(double a, double b) { return gsl_sf_psi_1(a) - gsl_sf_psi_1(a + b); }

}  // namespace

TEST_CASE("joint draws are the same on one thread and on two and for the same seed") {
  const auto value = five_item_case();
  const std::vector<std::size_t> all = {0, 1, 2, 3, 4};
  const auto one = evaluation::joint_log10_lr_draws(value, all, 1);
  const auto two = evaluation::joint_log10_lr_draws(value, all, 2);
  REQUIRE(one.size() == 40000);
  CHECK(one == two);
  // The same seed again gives the same draws; another seed gives others.
  CHECK(evaluation::joint_log10_lr_draws(value, all, 2) == two);
  auto reseeded = value;
  reseeded.uncertainty->seed = 6;
  CHECK(evaluation::joint_log10_lr_draws(reseeded, all, 2) != two);
  // A different choice of items gives different draws.
  const std::vector<std::size_t> some = {0, 2, 4};
  CHECK(evaluation::joint_log10_lr_draws(value, some, 2) != two);
}

TEST_CASE("the mean of the joint draws is the sum of the items' expected log10 LRs") {
  const auto value = five_item_case();
  const std::vector<std::size_t> all = {0, 1, 2, 3, 4};
  const auto draws = evaluation::joint_log10_lr_draws(value, all);
  double expected = 0.0, variance = 0.0;
  for (const auto& s : kItems) {
    const double hd_a = s.k + 1.0, hd_b = s.n - s.k + 1.0;
    expected += (log_beta_mean(s.a, s.b) - log_beta_mean(hd_a, hd_b)) / kLn10;
    variance += (log_beta_variance(s.a, s.b) + log_beta_variance(hd_a, hd_b)) / (kLn10 * kLn10);
  }
  const double mean = std::accumulate(draws.begin(), draws.end(), 0.0) / static_cast<double>(draws.size());
  CAPTURE(mean, expected);
  // Five standard errors of the mean.
  CHECK(std::abs(mean - expected) < 5.0 * std::sqrt(variance / static_cast<double>(draws.size())));
}
