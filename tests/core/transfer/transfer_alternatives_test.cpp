// The transfer model against several alternatives to Hp: the alternative's own transfer
// probabilities (t0_hd, tn_hd) enter the denominator, everything else is shared. Checked against
// the event tree's sums written out here, not the model's code.
#include <catch2/catch.hpp>

#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "core/models/transfer/transfer_model.hpp"
#include "core/validation/input_error.hpp"

using nlohmann::json;
using namespace counterpoise;
using Catch::Matchers::Contains;

namespace {

const models::ReadContext kContext{".", validation::Location{"T1", ""}};

// Invented glass case: one group of fragments found on the jacket.
json shared_item() {
  return json::parse(R"({ "id": "T1", "model": "transfer", "t0": 0.1, "tn": 0.05, "p0": 0.6, "p1": 0.3,
                          "sn": 0.1, "gamma": 0.02 })");
}

}  // namespace

TEST_CASE("transfer: one alternative with an empty entry gives the two-proposition LR bit for bit", "[transfer][alternatives]") {
  json item = shared_item();
  item["t0"] = {{"beta", {2, 18}}};  // uncertain, so the draws are compared too
  const auto two = models::transfer::read_transfer_model(item, kContext);
  json several = item;
  several["alternatives"] = {{"Hd1", json::object()}};
  const auto models = models::transfer::read_transfer_alternatives(several, std::vector<std::string>{"Hd1"}, kContext);
  REQUIRE(models.size() == 1);
  CHECK(models[0]->evaluate().lr.log10() == two->evaluate().lr.log10());
  std::vector<double> a(1000), b(1000);
  std::mt19937_64 rng_a(17), rng_b(17);
  two->draw_log10_lr(rng_a, a);
  models[0]->draw_log10_lr(rng_b, b);
  CHECK(a == b);
}

TEST_CASE("transfer: each alternative's transfer probabilities reach its denominator only", "[transfer][alternatives]") {
  // Hd1: the person was not involved (nothing transferred); Hd2: the person stood nearby when the
  // window broke (some transfer likely); Hd3: the person handled the broken glass afterwards but
  // nothing of it stayed (transfer without a group).
  json item = shared_item();
  item["alternatives"] = {{"Hd1", json::object()},
                          {"Hd2", {{"t0_hd", 0.4}, {"tn_hd", 0.02}}},
                          {"Hd3", {{"t0_hd", 0.9}, {"tn_hd", 0.0}}}};
  const std::vector<std::string> ids{"Hd1", "Hd2", "Hd3"};
  const auto models = models::transfer::read_transfer_alternatives(item, ids, kContext);
  // The event tree (Evett 1986, J. Forensic Sci. Soc. 26:3 — from memory; Aitken, Taroni & Bozza
  // 2021, chapter on transfer evidence — from memory for the chapter): one group of n found arises
  // from (n transferred, no background group) or (nothing transferred, one matching background
  // group of n), under each proposition with that proposition's transfer probabilities:
  //   P(E|H) = tn_H P0 + t0_H P1 Sn gamma, with t0 = 1, tn = 0 for "not involved".
  const double p0 = 0.6, p1 = 0.3, sn = 0.1, gamma = 0.02;
  const auto p_given = [&](double t0, double tn) { return tn * p0 + t0 * p1 * sn * gamma; };
  const double hp = p_given(0.1, 0.05);
  const double expected[] = {hp / p_given(1.0, 0.0), hp / p_given(0.4, 0.02), hp / p_given(0.9, 0.0)};
  for (std::size_t i = 0; i < ids.size(); ++i) {
    CAPTURE(ids[i]);
    const auto point = models[i]->evaluate();
    // 1e-13: the model sums the branches in log10 (log1p); a few ulps of each log.
    CHECK(point.lr.log10() == Approx(std::log10(expected[i])).epsilon(1e-13));
    CHECK(*point.log10_p_given_hp == Approx(std::log10(hp)).epsilon(1e-13));
  }
  // Hd1 is the published two-proposition form t0 + P0 tn / (P1 Sn gamma).
  CHECK(models[0]->evaluate().lr.log10() == Approx(std::log10(0.1 + p0 * 0.05 / (p1 * sn * gamma))).epsilon(1e-13));
}

TEST_CASE("transfer: nothing found against an alternative with transfer gives t0 / t0_hd", "[transfer][alternatives]") {
  const json item = json::parse(R"({ "id": "T1", "model": "transfer", "found": "none", "t0": 0.2, "p0": 0.7,
                                     "alternatives": {"Hd1": {}, "Hd2": {"t0_hd": 0.8}} })");
  const auto models = models::transfer::read_transfer_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, kContext);
  // Nothing found: P(E|H) = t0_H P0, so P0 cancels (the derivation in docs/methods.md).
  CHECK(models[0]->evaluate().lr.log10() == Approx(std::log10(0.2)).epsilon(1e-13));
  CHECK(models[1]->evaluate().lr.log10() == Approx(std::log10(0.2 / 0.8)).epsilon(1e-13));
}

TEST_CASE("transfer: the shared terms are drawn alike against every alternative", "[transfer][alternatives]") {
  // P(E|Hp) depends on the shared draws alone: with only Hp's terms uncertain, the difference of
  // two alternatives' draws is the difference of their point denominators in every draw.
  json item = shared_item();
  item["tn"] = {{"beta", {5, 95}}};
  item["alternatives"] = {{"Hd1", json::object()}, {"Hd2", {{"t0_hd", 0.4}, {"tn_hd", 0.02}}}};
  const auto models = models::transfer::read_transfer_alternatives(item, std::vector<std::string>{"Hd1", "Hd2"}, kContext);
  std::vector<double> a(200), b(200);
  std::mt19937_64 rng_a(5), rng_b(5);
  models[0]->draw_log10_lr(rng_a, a);
  models[1]->draw_log10_lr(rng_b, b);
  const double background = 0.3 * 0.1 * 0.02;
  const double expected = std::log10(0.02 * 0.6 + 0.4 * background) - std::log10(background);
  for (std::size_t k = 0; k < a.size(); ++k) CHECK(a[k] - b[k] == Approx(expected).epsilon(1e-9));
}

TEST_CASE("transfer: bad per-alternative entries name the alternative and the field", "[transfer][alternatives][errors]") {
  const std::vector<std::string> ids{"Hd1", "Hd2"};
  json item = shared_item();
  item["alternatives"] = {{"Hd1", json::object()}, {"Hd2", {{"t0_hd", 0.7}, {"tn_hd", 0.5}}}};
  CHECK_THROWS_WITH(models::transfer::read_transfer_alternatives(item, ids, kContext),
                    Contains("item T1, field alternatives.Hd2.tn_hd") && Contains("exceeds 1"));
  item["alternatives"]["Hd2"] = {{"t0_hd", 0.7}};
  CHECK_THROWS_WITH(models::transfer::read_transfer_alternatives(item, ids, kContext),
                    Contains("field alternatives.Hd2.tn_hd: missing field"));
  item["alternatives"]["Hd2"] = {{"tn_hd", 0.1}};
  CHECK_THROWS_WITH(models::transfer::read_transfer_alternatives(item, ids, kContext),
                    Contains("field alternatives.Hd2.t0_hd: missing field"));
  item["alternatives"]["Hd2"] = {{"t0_hd", 1.4}, {"tn_hd", 0.0}};
  CHECK_THROWS_WITH(models::transfer::read_transfer_alternatives(item, ids, kContext),
                    Contains("field alternatives.Hd2.t0_hd"));
  item["alternatives"]["Hd2"] = {{"p1", 0.2}};
  CHECK_THROWS_WITH(models::transfer::read_transfer_alternatives(item, ids, kContext),
                    Contains("field alternatives.Hd2.p1"));
  // Both sides zero: tn P0 = 0 and gamma = 0 under Hp, and no transfer under Hd2 either.
  json zero = shared_item();
  zero["tn"] = 0.0;
  zero["gamma"] = 0.0;
  zero["alternatives"] = {{"Hd1", {{"t0_hd", 0.5}, {"tn_hd", 0.0}}}, {"Hd2", {{"t0_hd", 0.5}, {"tn_hd", 0.1}}}};
  CHECK_THROWS_WITH(models::transfer::read_transfer_alternatives(zero, ids, kContext),
                    Contains("field alternatives.Hd1.t0_hd") && Contains("impossible under both"));
}

TEST_CASE("transfer: t0_hd and tn_hd in a two-proposition item", "[transfer][alternatives]") {
  json item = shared_item();
  item["t0_hd"] = 0.4;
  item["tn_hd"] = 0.02;
  const auto model = models::transfer::read_transfer_model(item, kContext);
  const double background = 0.3 * 0.1 * 0.02;
  CHECK(model->evaluate().lr.log10() ==
        Approx(std::log10((0.05 * 0.6 + 0.1 * background) / (0.02 * 0.6 + 0.4 * background))).epsilon(1e-13));
  CHECK(model->to_json()["t0_hd"] == 0.4);
  CHECK(model->evaluate().detail["event_tree"]["hd"].size() == 2);
}
