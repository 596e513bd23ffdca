// The network model against several alternatives to Hp: each alternative names the states of
// the proposition node that stand for it (hd); the network, its tables and the findings are
// shared. Checked against the probabilities summed out by hand from the tables.
#include <catch2/catch.hpp>

#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "core/validation/input_error.hpp"
#include "network_test_support.hpp"

using namespace counterpoise::models::network;
using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

counterpoise::models::ReadContext context() { return {{}, {"N1", ""}}; }

// Invented: who handled the bag (the suspect, his brother, someone unknown), whether fibres were
// transferred (depends on who: the brother shares the suspect's jumper), and what was found.
//   P(T = yes | S = suspect, brother, unknown) = 0.7, 0.5, 0.05
//   P(F = match | T = yes, no)                = 0.9, 0.02
//   P(G = found | S = suspect, brother, unknown) = 0.6, 0.3, 0.1   (a second finding)
json shared_item() {
  return json::parse(R"({
    "id": "N1", "model": "network",
    "nodes": [
      {"name": "S", "states": ["suspect", "brother", "unknown"], "cpt": [[0.2, 0.1, 0.7]]},
      {"name": "T", "states": ["yes", "no"], "parents": ["S"], "cpt": [[0.7, 0.3], [0.5, 0.5], [0.05, 0.95]]},
      {"name": "F", "states": ["match", "none"], "parents": ["T"], "cpt": [[0.9, 0.1], [0.02, 0.98]]},
      {"name": "G", "states": ["found", "not"], "parents": ["S"], "cpt": [[0.6, 0.4], [0.3, 0.7], [0.1, 0.9]]}
    ],
    "proposition": {"node": "S", "hp": "suspect"},
    "observed": {"F": "match", "G": "found"},
    "alternatives": {"Hd1": {"hd": "unknown"}, "Hd2": {"hd": "brother"}, "Hd3": {"hd": ["brother", "unknown"]}}
  })");
}

// P(F = match, G = found | S = s) = (P(T=yes|s) 0.9 + P(T=no|s) 0.02) P(G=found|s): F and G are
// independent given S (the network's arrows; Taroni et al. 2014, Bayesian Networks for
// Probabilistic Inference and Decision Analysis in Forensic Science, ch. 2 on d-separation).
double given(double t_yes, double g_found) { return (t_yes * 0.9 + (1 - t_yes) * 0.02) * g_found; }

}  // namespace

TEST_CASE("network: one alternative with the two-proposition hd gives its LR bit for bit", "[network][alternatives]") {
  json two = shared_item();
  two.erase("alternatives");
  two["proposition"]["hd"] = "unknown";
  two["nodes"][1]["cpt"][0] = {{"dirichlet", {7, 3}}};  // an uncertain row, so the draws are compared too
  json several = two;
  several["proposition"].erase("hd");
  several["alternatives"] = {{"Hd1", {{"hd", "unknown"}}}};
  const auto model = network_test::read_model(two);
  const auto models = read_network_alternatives(several, std::vector<std::string>{"Hd1"}, context());
  REQUIRE(models.size() == 1);
  CHECK(models[0]->evaluate().lr.log10() == model->evaluate().lr.log10());
  std::vector<double> a(300), b(300);
  std::mt19937_64 rng_a(11), rng_b(11);
  model->draw_log10_lr(rng_a, a);
  models[0]->draw_log10_lr(rng_b, b);
  CHECK(a == b);
  // A shared proposition.hd with an empty entry reads the same.
  several["proposition"]["hd"] = "unknown";
  several["alternatives"]["Hd1"] = json::object();
  CHECK(read_network_alternatives(several, std::vector<std::string>{"Hd1"}, context())[0]->evaluate().lr.log10() ==
        model->evaluate().lr.log10());
}

TEST_CASE("network: each alternative's states give its own denominator", "[network][alternatives]") {
  const auto models = read_network_alternatives(shared_item(), std::vector<std::string>{"Hd1", "Hd2", "Hd3"}, context());
  const double hp = given(0.7, 0.6), brother = given(0.5, 0.3), unknown = given(0.05, 0.1);
  // Hd3 groups two states: P(E | S in {brother, unknown}) weighs them by their prior 0.1 : 0.7.
  const double either = (0.1 * brother + 0.7 * unknown) / 0.8;
  const double expected[] = {hp / unknown, hp / brother, hp / either};
  for (std::size_t i = 0; i < 3; ++i) {
    CAPTURE(i);
    const auto point = models[i]->evaluate();
    // 1e-12: variable elimination sums products in log10; a few ulps per term.
    CHECK(point.lr.log10() == Approx(std::log10(expected[i])).epsilon(1e-12));
    CHECK(*point.log10_p_given_hp == Approx(std::log10(hp)).epsilon(1e-12));
  }
}

TEST_CASE("network: bad per-alternative states name the alternative and the field", "[network][alternatives][errors]") {
  const std::vector<std::string> ids{"Hd1", "Hd2"};
  json item = shared_item();
  item["alternatives"] = {{"Hd1", {{"hd", "unknown"}}}, {"Hd2", {{"hd", "cousin"}}}};
  CHECK_THROWS_WITH(read_network_alternatives(item, ids, context()),
                    Contains("item N1, field alternatives.Hd2.hd") && Contains("cousin"));
  item["alternatives"]["Hd2"] = {{"hd", "suspect"}};
  CHECK_THROWS_WITH(read_network_alternatives(item, ids, context()),
                    Contains("field alternatives.Hd2.hd") && Contains("in both hp and hd"));
  item["alternatives"]["Hd2"] = {{"hd", json::array()}};
  CHECK_THROWS_WITH(read_network_alternatives(item, ids, context()), Contains("field alternatives.Hd2.hd"));
  item["alternatives"]["Hd2"] = {{"hd", "brother"}, {"observed", {{"F", "none"}}}};
  CHECK_THROWS_WITH(read_network_alternatives(item, ids, context()), Contains("field alternatives.Hd2.observed"));
  // A state of prior probability zero cannot stand for an alternative.
  json zero = shared_item();
  zero["nodes"][0]["cpt"] = {{0.3, 0.0, 0.7}};
  zero["alternatives"] = {{"Hd1", {{"hd", "unknown"}}}, {"Hd2", {{"hd", "brother"}}}};
  CHECK_THROWS_WITH(read_network_alternatives(zero, ids, context()),
                    Contains("field alternatives.Hd2.hd") && Contains("probability zero"));
  // Hd's states given nowhere.
  item["alternatives"] = {{"Hd1", {{"hd", "unknown"}}}, {"Hd2", json::object()}};
  CHECK_THROWS_WITH(read_network_alternatives(item, ids, context()), Contains("field alternatives.Hd2.hd: missing"));
}
