// Network LRs checked against published values and hand derivations.
#include <catch2/catch.hpp>

#include <cmath>
#include <iomanip>
#include <sstream>

#include "core/numbers/log10_math.hpp"
#include "network_test_support.hpp"

using nlohmann::json;
using network_test::burglary_network;
using network_test::read_model;

TEST_CASE("burglary network: posterior P(Burglary | j, m) matches Russell & Norvig") {
  const auto model = read_model(burglary_network());
  const auto result = model->evaluate();
  const double log10_lr = result.lr.log10();
  // Posterior from the LR and the network's own prior P(b) = 0.001 (odds form of Bayes' theorem).
  const double log10_prior_odds = std::log10(0.001 / 0.999);
  const double posterior = std::pow(10.0, counterpoise::numbers::log10_probability_from_log10_odds(log10_lr + log10_prior_odds));
  // Russell & Norvig 2010, AIMA 3rd ed., section 14.4.1: P(Burglary | j, m) ≈ <0.284, 0.716>
  // (printed to 3 decimals, so the tolerance is half a unit in the last place).
  CHECK(posterior == Approx(0.284).margin(0.0005));
  // The LR implied by the published posterior: (0.284 / 0.716) / (0.001 / 0.999) ≈ 396.1;
  // the 3-decimal rounding of the posterior allows 395.0 .. 397.1.
  const double lr = result.lr.value();
  CHECK(lr > (0.2835 / 0.7165) / (0.001 / 0.999));
  CHECK(lr < (0.2845 / 0.7155) / (0.001 / 0.999));
}

TEST_CASE("burglary network: the two conditional probabilities") {
  const auto result = read_model(burglary_network())->evaluate();
  // Russell & Norvig 2010, section 14.4.1 (from memory): P(b, j, m) = alpha 0.00059224 and
  // P(not b, j, m) = alpha 0.0014919 (5 significant digits); divide by P(b) and P(not b).
  CHECK(std::pow(10.0, *result.log10_p_given_hp) == Approx(0.00059224 / 0.001).epsilon(1e-4));
  CHECK(std::pow(10.0, *result.log10_p_given_hd) == Approx(0.0014919 / 0.999).epsilon(1e-4));
  // Hand derivation from the figure 14.2 CPTs: P(a|b) = 0.95·0.002 + 0.94·0.998 = 0.94002,
  // P(a|not b) = 0.29·0.002 + 0.001·0.998 = 0.001578, P(j,m|a) = 0.63, P(j,m|not a) = 0.0005.
  const double p_hp = 0.94002 * 0.63 + (1 - 0.94002) * 0.0005;
  const double p_hd = 0.001578 * 0.63 + (1 - 0.001578) * 0.0005;
  CHECK(std::pow(10.0, *result.log10_p_given_hp) == Approx(p_hp).epsilon(1e-13));
  CHECK(std::pow(10.0, *result.log10_p_given_hd) == Approx(p_hd).epsilon(1e-13));
  CHECK(result.lr.log10() == Approx(std::log10(p_hp / p_hd)).epsilon(1e-13));
  // The detail carries both probabilities, the order and the largest factor.
  CHECK(result.detail.at("p_given_hp").at("value").get<double>() == Approx(p_hp).epsilon(1e-13));
  CHECK(result.detail.at("elimination_order").size() == 2);  // Earthquake and Alarm are summed out
  CHECK(result.detail.at("largest_factor_size").get<std::size_t>() >= 4);
}

TEST_CASE("burglary network: the proposition's own prior does not change the LR (root node)") {
  auto item = burglary_network();
  item["nodes"][0]["cpt"] = json::array({json::array({0.3, 0.7})});
  const double changed = read_model(item)->evaluate().lr.log10();
  const double original = read_model(burglary_network())->evaluate().lr.log10();
  // Definition of conditional probability: P(E | H = h) does not involve P(H) when H is a root.
  CHECK(changed == Approx(original).epsilon(1e-13));
  item["nodes"][0].erase("cpt");  // a root proposition node may omit its table
  CHECK(read_model(item)->evaluate().lr.log10() == Approx(original).epsilon(1e-13));
}

TEST_CASE("swapping Hp and Hd inverts the LR") {
  auto item = burglary_network();
  item["proposition"]["hp"] = "no";
  item["proposition"]["hd"] = "yes";
  // Identity: LR(Hd, Hp) = 1 / LR(Hp, Hd) (common practice).
  CHECK(read_model(item)->evaluate().lr.log10() ==
        Approx(-read_model(burglary_network())->evaluate().lr.log10()).epsilon(1e-13));
}

namespace {
json two_findings_network(bool shared_cause) {
  // H -> F and H -> G (independent given H), or H -> C -> F, C -> G (dependent through C).
  json item = json::parse(R"({"id": "N2", "model": "network",
    "proposition": {"node": "H", "hp": "hp", "hd": "hd"},
    "observed": {"F": "present", "G": "present"}})");
  json nodes = json::array();
  nodes.push_back({{"name", "H"}, {"states", {"hp", "hd"}}, {"cpt", {{0.5, 0.5}}}});
  const std::string parent = shared_cause ? "C" : "H";
  if (shared_cause)
    nodes.push_back({{"name", "C"}, {"states", {"yes", "no"}}, {"parents", {"H"}}, {"cpt", {{0.9, 0.1}, {0.2, 0.8}}}});
  nodes.push_back({{"name", "F"}, {"states", {"present", "absent"}}, {"parents", {parent}}, {"cpt", {{0.8, 0.2}, {0.05, 0.95}}}});
  nodes.push_back({{"name", "G"}, {"states", {"present", "absent"}}, {"parents", {parent}}, {"cpt", {{0.6, 0.4}, {0.1, 0.9}}}});
  item["nodes"] = nodes;
  return item;
}
}  // namespace

TEST_CASE("findings independent given H reproduce the product of their separate LRs") {
  const double joint = read_model(two_findings_network(false))->evaluate().lr.log10();
  auto only_f = two_findings_network(false);
  only_f["observed"].erase("G");
  auto only_g = two_findings_network(false);
  only_g["observed"].erase("F");
  const double f = read_model(only_f)->evaluate().lr.log10();
  const double g = read_model(only_g)->evaluate().lr.log10();
  // Independent items multiply (Taroni et al. 2014, Bayesian Networks for Probabilistic Inference
  // and Decision Analysis in Forensic Science, 2nd ed., ch. 2 — from memory for the chapter).
  CHECK(joint == Approx(f + g).epsilon(1e-13));
  CHECK(f == Approx(std::log10(0.8 / 0.05)).epsilon(1e-13));
  CHECK(g == Approx(std::log10(0.6 / 0.1)).epsilon(1e-13));
}

TEST_CASE("findings dependent through a shared node are not the product") {
  const double joint = read_model(two_findings_network(true))->evaluate().lr.log10();
  // By hand: P(F, G | h) = sum_c P(c | h) P(F | c) P(G | c).
  const double p_hp = 0.9 * 0.8 * 0.6 + 0.1 * 0.05 * 0.1;
  const double p_hd = 0.2 * 0.8 * 0.6 + 0.8 * 0.05 * 0.1;
  CHECK(joint == Approx(std::log10(p_hp / p_hd)).epsilon(1e-13));
  const double pf_hp = 0.9 * 0.8 + 0.1 * 0.05, pf_hd = 0.2 * 0.8 + 0.8 * 0.05;
  const double pg_hp = 0.9 * 0.6 + 0.1 * 0.1, pg_hd = 0.2 * 0.6 + 0.8 * 0.1;
  // Multiplying the separate LRs would double-count the shared transfer.
  CHECK(std::fabs(joint - std::log10(pf_hp / pf_hd * pg_hp / pg_hd)) > 0.1);
}

TEST_CASE("products of tiny probabilities do not underflow") {
  // 100 findings, each with P = 1e-2 under Hp and 1e-4 under Hd, independent given H:
  // P(E | Hp) = 1e-200, P(E | Hd) = 1e-400 (below the smallest double), LR = 1e200.
  json item = json::parse(R"({"id": "N3", "model": "network",
    "proposition": {"node": "H", "hp": "hp", "hd": "hd"}, "observed": {}})");
  json nodes = json::array();
  nodes.push_back({{"name", "H"}, {"states", {"hp", "hd"}}});
  for (int i = 0; i < 100; ++i) {
    const std::string name = "F" + std::to_string(i);
    nodes.push_back({{"name", name}, {"states", {"yes", "no"}}, {"parents", {"H"}},
                     {"cpt", {{1e-2, 1.0 - 1e-2}, {1e-4, 1.0 - 1e-4}}}});
    item["observed"][name] = "yes";
  }
  item["nodes"] = nodes;
  const auto result = read_model(item)->evaluate();
  // Exact arithmetic: log10 P = 100 · log10(p); tolerance for 100 rounded additions.
  CHECK(*result.log10_p_given_hp == Approx(-200.0).epsilon(1e-13));
  CHECK(*result.log10_p_given_hd == Approx(-400.0).epsilon(1e-13));
  CHECK(result.lr.is_finite());
  CHECK(result.lr.log10() == Approx(200.0).epsilon(1e-13));
}

TEST_CASE("a finding impossible under Hp gives an LR of zero, not an error") {
  auto item = two_findings_network(false);
  item["nodes"][1]["cpt"] = json::array({json::array({0.0, 1.0}), json::array({0.05, 0.95})});
  const auto result = read_model(item)->evaluate();
  CHECK(result.lr.is_zero());
  CHECK(result.detail.at("p_given_hp").at("log10").is_null());
  CHECK(result.detail.at("p_given_hp").at("value") == 0.0);
}

TEST_CASE("a multi-state proposition node with grouped states") {
  // H in {a, b, c} with prior (0.2, 0.3, 0.5); Hp = a, Hd = b or c; F | H = (0.9, 0.4, 0.1).
  json item = json::parse(R"({"id": "N4", "model": "network",
    "nodes": [{"name": "H", "states": ["a", "b", "c"], "cpt": [[0.2, 0.3, 0.5]]},
              {"name": "F", "states": ["y", "n"], "parents": ["H"],
               "cpt": [[0.9, 0.1], [0.4, 0.6], [0.1, 0.9]]}],
    "proposition": {"node": "H", "hp": "a", "hd": ["b", "c"]}, "observed": {"F": "y"}})");
  const auto result = read_model(item)->evaluate();
  // By hand: P(F | b or c) = (0.3·0.4 + 0.5·0.1) / 0.8 = 0.2125; the prior of H matters here.
  CHECK(std::pow(10.0, *result.log10_p_given_hd) == Approx(0.2125).epsilon(1e-13));
  CHECK(result.lr.value() == Approx(0.9 / 0.2125).epsilon(1e-13));
  CHECK_FALSE(result.notes.empty());
}
