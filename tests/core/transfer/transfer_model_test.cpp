// The transfer model against a direct enumeration of the event tree, its limiting cases, its
// uncertainty draws and a throw test for every documented validation error.
#include <catch2/catch.hpp>

#include <boost/math/distributions/beta.hpp>

#include <algorithm>
#include <cmath>
#include <functional>
#include <random>
#include <string>
#include <vector>

#include "core/models/transfer/transfer_model.hpp"
#include "core/validation/input_error.hpp"

using nlohmann::json;
using namespace counterpoise;

namespace {

models::EvidenceModelPtr read(const json& item) {
  return models::transfer::read_transfer_model(item, models::ReadContext{std::filesystem::path("."), validation::Location{"T1", ""}});
}

json issue_item() {
  // the item shape given in the issue
  return json::parse(R"({ "id": "T1", "model": "transfer", "t0": 0.1, "tn": 0.05, "p0": 0.6, "p1": 0.3,
                          "sn": 0.1, "gamma": 0.02 })");
}

struct Probabilities {
  double t0, tn, p0, p1, sn, gamma;
};

// Every leaf of the event tree, enumerated directly (the tree of Evett 1986, J. Forensic Sci.
// Soc. 26:3, as set out in Aitken, Taroni & Bozza 2021, Statistics and the Evaluation of Evidence
// for Forensic Scientists, 3rd ed. — from memory for the chapter). A leaf is (items transferred:
// none / n / another number) x (background groups: 0 / 1 / 2 or more) x (size of a single
// background group: n / other) x (it matches the control: yes / no). Returns P(findings | H)
// where the findings are "exactly one group, of n items, matching the control".
double enumerate(const Probabilities& p, bool activity, bool nothing_found) {
  const double transfer[3] = {activity ? p.t0 : 1.0, activity ? p.tn : 0.0, activity ? 1.0 - p.t0 - p.tn : 0.0};
  const double background[3] = {p.p0, p.p1, 1.0 - p.p0 - p.p1};
  const double size[2] = {p.sn, 1.0 - p.sn};
  const double match[2] = {p.gamma, 1.0 - p.gamma};
  double total = 0.0;
  for (int t = 0; t < 3; ++t)
    for (int b = 0; b < 3; ++b)
      for (int s = 0; s < 2; ++s)
        for (int m = 0; m < 2; ++m) {
          if (b != 1 && (s != 0 || m != 0)) continue;  // size and match only branch for one background group
          const double leaf = transfer[t] * background[b] * (b == 1 ? size[s] * match[m] : 1.0);
          const int groups = (t == 0 ? 0 : 1) + (b == 0 ? 0 : b == 1 ? 1 : 2);
          bool findings;
          if (nothing_found)
            findings = groups == 0;
          else if (groups != 1)
            findings = false;
          else if (t == 1)
            findings = true;  // a transferred group of n matches the control
          else if (t == 2)
            findings = false;  // transferred, but not n items
          else
            findings = s == 0 && m == 0;
          if (findings) total += leaf;
        }
  return total;
}

}  // namespace

TEST_CASE("The formula agrees with a direct enumeration of the event tree", "[transfer]") {
  const Probabilities rows[] = {
      {0.1, 0.05, 0.6, 0.3, 0.1, 0.02},  // the issue's item
      {0.3, 0.4, 0.9, 0.08, 0.25, 0.001},
      {0.0, 0.7, 0.5, 0.5, 1.0, 1.0},
      {0.6, 0.0, 0.2, 0.1, 0.5, 0.3},
      {0.05, 0.2, 0.7, 0.2, 0.05, 1e-6},
  };
  for (const auto& p : rows) {
    json item = {{"t0", p.t0}, {"tn", p.tn}, {"p0", p.p0}, {"p1", p.p1}, {"sn", p.sn}, {"gamma", p.gamma}};
    const auto result = read(item)->evaluate();
    const double expected = enumerate(p, true, false) / enumerate(p, false, false);
    INFO("t0 " << p.t0 << " tn " << p.tn << " gamma " << p.gamma);
    CHECK(std::pow(10.0, result.lr.log10()) == Approx(expected).epsilon(1e-12));
    CHECK(result.detail["numerator"]["value"].get<double>() == Approx(enumerate(p, true, false)).epsilon(1e-12));
    CHECK(result.detail["denominator"]["value"].get<double>() == Approx(enumerate(p, false, false)).epsilon(1e-12));

    item["found"] = "none";
    item.erase("tn");
    const auto absence = read(item)->evaluate();
    const double expected_absence = enumerate(p, true, true) / enumerate(p, false, true);
    if (p.t0 == 0.0)
      CHECK(absence.lr.is_zero());
    else
      CHECK(std::pow(10.0, absence.lr.log10()) == Approx(expected_absence).epsilon(1e-12));
  }
}

TEST_CASE("Limiting cases of the transfer formula", "[transfer]") {
  auto item = issue_item();
  item["t0"] = 0.0;  // t0 = 0: LR = P0 tn / (P1 Sn gamma)
  CHECK(std::pow(10.0, read(item)->evaluate().lr.log10()) == Approx(0.6 * 0.05 / (0.3 * 0.1 * 0.02)).epsilon(1e-12));
  item = issue_item();
  item["tn"] = 0.0;  // tn = 0: LR = t0
  CHECK(std::pow(10.0, read(item)->evaluate().lr.log10()) == Approx(0.1).epsilon(1e-12));
  item = issue_item();  // the issue's numbers: 0.1 + 0.6 * 0.05 / (0.3 * 0.1 * 0.02) = 50.1
  CHECK(std::pow(10.0, read(item)->evaluate().lr.log10()) == Approx(50.1).epsilon(1e-12));
  item["gamma"] = 0.0;  // no chance match in the population: impossible under Hd
  CHECK(read(item)->evaluate().lr.is_infinite());
}

TEST_CASE("A tiny gamma stays exact in log space", "[transfer]") {
  auto item = issue_item();
  item["gamma"] = 1e-300;
  item["sn"] = 1e-10;
  const double expected = std::log10(0.6 * 0.05 / (0.3)) + 300 + 10;  // t0 is negligible next to 1e309
  CHECK(read(item)->evaluate().lr.log10() == Approx(expected).epsilon(1e-12));
}

TEST_CASE("The detail carries the event-tree terms", "[transfer]") {
  const auto result = read(issue_item())->evaluate();
  const auto& tree = result.detail["event_tree"];
  REQUIRE(tree["hp"].size() == 2);
  CHECK(tree["hp"][0]["terms"] == "tn * P0");
  CHECK(tree["hp"][0]["value"].get<double>() == Approx(0.05 * 0.6));
  CHECK(tree["hp"][1]["value"].get<double>() == Approx(0.1 * 0.3 * 0.1 * 0.02));
  CHECK(tree["hd"][0]["value"].get<double>() == Approx(0.3 * 0.1 * 0.02));
  CHECK(result.detail["formula"] == "LR = t0 + P0 tn / (P1 Sn gamma)");
}

TEST_CASE("Count-based gamma carries its uncertainty through seeded draws", "[transfer]") {
  auto item = issue_item();
  item["gamma"] = {{"counts", {{"k", 4}, {"n", 200}}}};
  const auto model = read(item);
  REQUIRE(model->is_uncertain());
  // point value from the mean (k + 1)/(n + 2) (Laplace's rule of succession)
  const double gamma_mean = 5.0 / 202.0;
  CHECK(std::pow(10.0, model->evaluate().lr.log10()) == Approx(0.1 + 0.6 * 0.05 / (0.3 * 0.1 * gamma_mean)).epsilon(1e-12));

  std::vector<double> draws(20000), repeat(20000);
  std::mt19937_64 rng(2024), again(2024);
  model->draw_log10_lr(rng, draws);
  model->draw_log10_lr(again, repeat);
  CHECK(draws == repeat);
  // The LR falls as gamma rises, so P(LR <= LR(gamma_q)) = 1 - q with gamma_q the q-quantile of
  // Beta(5, 197) (Boost.Math beta_distribution quantile).
  for (double q : {0.1, 0.5, 0.9}) {
    const double gamma_q = boost::math::quantile(boost::math::beta_distribution<double>(5.0, 197.0), q);
    const double log10_lr_q = std::log10(0.1 + 0.6 * 0.05 / (0.3 * 0.1 * gamma_q));
    const double below = static_cast<double>(std::count_if(draws.begin(), draws.end(), [&](double v) { return v <= log10_lr_q; })) / draws.size();
    // binomial standard error at 20000 draws is at most 0.0036; 0.015 is four of them
    CHECK(below == Approx(1.0 - q).margin(0.015));
  }
  CHECK(model->to_json() == json::parse(R"({"t0": 0.1, "tn": 0.05, "p0": 0.6, "p1": 0.3, "sn": 0.1,
                                           "gamma": {"counts": {"k": 4, "n": 200}}})"));
  CHECK_FALSE(read(issue_item())->is_uncertain());
}

TEST_CASE("Every validation error of the transfer model names its field", "[transfer][validation]") {
  struct Case {
    const char* what;
    std::function<void(json&)> change;
    std::string field;
  };
  const std::vector<Case> cases = {
      {"missing t0", [](json& i) { i.erase("t0"); }, "t0"},
      {"missing gamma", [](json& i) { i.erase("gamma"); }, "gamma"},
      {"missing p0 for none", [](json& i) { i["found"] = "none"; i.erase("p0"); }, "p0"},
      {"t0 above 1", [](json& i) { i["t0"] = 1.5; }, "t0"},
      {"negative sn", [](json& i) { i["sn"] = -0.1; }, "sn"},
      {"bad counts", [](json& i) { i["gamma"] = {{"counts", {{"k", 5}, {"n", 4}}}}; }, "gamma.counts"},
      {"t0 + tn > 1", [](json& i) { i["t0"] = 0.7; i["tn"] = 0.4; }, "tn"},
      {"p0 + p1 > 1", [](json& i) { i["p0"] = 0.8; i["p1"] = 0.3; }, "p1"},
      {"both sides zero", [](json& i) { i["p1"] = 0.0; i["tn"] = 0.0; }, "p1"},
      {"p0 zero, nothing found", [](json& i) { i["found"] = "none"; i["p0"] = 0.0; i["p1"] = 0.5; }, "p0"},
      {"unknown found", [](json& i) { i["found"] = "several"; }, "found"},
      {"n zero", [](json& i) { i["n"] = 0; }, "n"},
      {"n with none", [](json& i) { i["n"] = 3; i["found"] = "none"; }, "n"},
      {"unknown field", [](json& i) { i["t1"] = 0.2; }, "t1"},
  };
  for (const auto& c : cases) {
    json item = issue_item();
    c.change(item);
    INFO(c.what);
    std::string field = "no error";
    try {
      read(item);
    } catch (const validation::InvalidValue& e) {
      field = e.where().field;
    }
    // read_assignment may name a sub-field (gamma.counts.k); the item field must lead it
    CHECK(field.rfind(c.field, 0) == 0);
  }
  // read back what was read
  auto item = issue_item();
  item["found"] = "group";
  item["n"] = 4;
  item.erase("id");
  item.erase("model");
  CHECK(read(item)->to_json() == item);
}
