// One-way sensitivity, Monte Carlo draws and the drawing layout of the network model.
#include <catch2/catch.hpp>

#include <algorithm>
#include <numeric>
#include <stdexcept>
#include <cmath>
#include <random>

#include <boost/math/distributions/beta.hpp>

#include "network_test_support.hpp"

using nlohmann::json;
using network_test::burglary_network;
using network_test::read_model;

namespace {
json simple(json f_row_hp) {
  json item = json::parse(R"({"id": "S1", "model": "network",
    "nodes": [{"name": "H", "states": ["hp", "hd"], "cpt": [[0.5, 0.5]]},
              {"name": "F", "states": ["present", "absent"], "parents": ["H"], "cpt": [null, [0.01, 0.99]]},
              {"name": "Unused", "states": ["y", "n"], "parents": ["F"], "cpt": [[0.5, 0.5], [0.5, 0.5]]}],
    "proposition": {"node": "H", "hp": "hp", "hd": "hd"}, "observed": {"F": "present"}})");
  item["nodes"][1]["cpt"][0] = std::move(f_row_hp);
  return item;
}
}  // namespace

TEST_CASE("sensitivity of LR = a / b to a has the exact derivative 1 / (a ln 10)") {
  const auto model = read_model(simple({0.8, 0.2}));
  const auto rows = model->sensitivity();
  const auto it = std::find_if(rows.begin(), rows.end(), [](const auto& e) { return e.node == 1 && e.row == 0 && e.state == 0; });
  REQUIRE(it != rows.end());
  // d/da log10(a / b) = 1 / (a ln 10) (calculus).
  REQUIRE(it->derivative_log10_lr);
  CHECK(*it->derivative_log10_lr == Approx(1.0 / (0.8 * std::log(10.0))).epsilon(1e-12));
  // The range for a point entry: 0.8 ± 0.1·min(0.8, 0.2) = [0.78, 0.82].
  CHECK(it->range.low == Approx(0.78).epsilon(1e-15));
  CHECK(it->range.high == Approx(0.82).epsilon(1e-15));
  CHECK(it->lr_at_low->value() == Approx(0.78 / 0.01).epsilon(1e-12));
  CHECK(it->lr_at_high->value() == Approx(0.82 / 0.01).epsilon(1e-12));
  // The barren node "Unused" (not an ancestor of the findings) is left out of the table.
  CHECK(std::none_of(rows.begin(), rows.end(), [](const auto& e) { return e.node == 2; }));
  const auto tables = model->cpt_tables();
  CHECK_FALSE(tables[2].affects_lr);
  CHECK(tables[1].affects_lr);
}

TEST_CASE("the sensitivity line equals a fresh evaluation with the co-varied row") {
  const auto model = read_model(burglary_network());
  const auto rows = model->sensitivity();
  // Alarm's row 2 (Burglary=no, Earthquake=yes), state yes: set it to x and co-vary its complement.
  const auto it = std::find_if(rows.begin(), rows.end(), [](const auto& e) { return e.node == 2 && e.row == 2 && e.state == 0; });
  REQUIRE(it != rows.end());
  CHECK(it->value == Approx(0.29).epsilon(1e-15));
  for (double x : {0.0, 0.1, 0.29, 0.5, 0.97, 1.0}) {
    auto item = burglary_network();
    item["nodes"][2]["cpt"][2] = {x, 1.0 - x};
    const auto direct = read_model(item)->evaluate().lr;
    INFO("x = " << x);
    // Identity: the one-way sensitivity function is linear in x for each probability.
    CHECK(it->line.lr_at(x)->log10() == Approx(direct.log10()).epsilon(1e-12));
  }
  // Derivative against a central difference of the exact line (step 1e-6: error ~ h² f''').
  const double h = 1e-6;
  const double numeric = (it->line.lr_at(0.29 + h)->log10() - it->line.lr_at(0.29 - h)->log10()) / (2 * h);
  CHECK(*it->derivative_log10_lr == Approx(numeric).epsilon(1e-6));
  // Every relevant entry has a row; JSON form carries the columns the report needs.
  const auto table = counterpoise::models::network::sensitivity_to_json(model->network(), rows);
  CHECK(table.size() == rows.size());
  CHECK(table[0].contains("derivative_log10_lr"));
  CHECK(table[0].at("row") == "no parents");
}

TEST_CASE("sensitivity over a stated interval and a Beta entry uses their ends") {
  const auto interval_model = read_model(simple({{{"interval", {0.6, 0.9}}, {"scale", "linear"}}, "complement"}));
  const auto rows = interval_model->sensitivity();
  const auto it = std::find_if(rows.begin(), rows.end(), [](const auto& e) { return e.node == 1 && e.row == 0 && e.state == 0; });
  REQUIRE(it != rows.end());
  CHECK(it->range.basis == "stated interval");
  CHECK(it->lr_at_low->value() == Approx(0.6 / 0.01).epsilon(1e-12));
  CHECK(it->lr_at_high->value() == Approx(0.9 / 0.01).epsilon(1e-12));
  const auto beta_model = read_model(simple({{{"beta", {8, 2}}}, "complement"}));
  const auto beta_rows = beta_model->sensitivity();
  const auto b = std::find_if(beta_rows.begin(), beta_rows.end(), [](const auto& e) { return e.node == 1 && e.row == 0 && e.state == 0; });
  // Reference quantiles from Boost.Math's beta_distribution (the library the tool uses).
  const boost::math::beta_distribution<> beta(8, 2);
  CHECK(b->range.low == Approx(boost::math::quantile(beta, 0.05)).epsilon(1e-12));
  CHECK(b->range.high == Approx(boost::math::quantile(beta, 0.95)).epsilon(1e-12));
  CHECK(b->value == Approx(0.8).epsilon(1e-14));  // Beta(8, 2) mean 8 / 10
}

TEST_CASE("Monte Carlo draws are reproducible with a seed and follow the Beta entry") {
  const auto model = read_model(simple({{{"beta", {8, 2}}}, "complement"}));
  REQUIRE(model->is_uncertain());
  std::vector<double> first(20000), second(20000), other(20000);
  std::mt19937_64 rng1(20240611), rng2(20240611), rng3(7);
  model->draw_log10_lr(rng1, first);
  model->draw_log10_lr(rng2, second);
  model->draw_log10_lr(rng3, other);
  CHECK(first == second);
  CHECK(first != other);
  // log10 LR = log10 x − log10 0.01 with x ~ Beta(8, 2): its median is log10 of the Beta median
  // (Boost.Math quantile). Monte Carlo error of a median with n = 20000 is about 0.004 in x.
  std::sort(first.begin(), first.end());
  const double median_x = std::pow(10.0, first[first.size() / 2]) * 0.01;
  CHECK(median_x == Approx(boost::math::quantile(boost::math::beta_distribution<>(8, 2), 0.5)).margin(0.01));
  // Point models do not draw.
  CHECK_FALSE(read_model(simple({0.8, 0.2}))->is_uncertain());
}

TEST_CASE("Dirichlet rows: mean for the point LR, draws with the right mean") {
  json item = json::parse(R"({"id": "D1", "model": "network",
    "nodes": [{"name": "H", "states": ["hp", "hd"]},
              {"name": "F", "states": ["a", "b", "c"], "parents": ["H"],
               "cpt": [{"counts": [5, 2, 0]}, [0.2, 0.3, 0.5]]}],
    "proposition": {"node": "H", "hp": "hp", "hd": "hd"}, "observed": {"F": "a"}})");
  const auto model = read_model(item);
  // Counts (5, 2, 0) with prior 1 → Dirichlet(6, 3, 1): mean of a = 6 / 10 (rule of succession,
  // multinomial form).
  CHECK(model->evaluate().lr.value() == Approx(0.6 / 0.2).epsilon(1e-13));
  std::vector<double> draws(40000);
  std::mt19937_64 rng(99);
  model->draw_log10_lr(rng, draws);
  double mean_p = 0.0;
  for (double d : draws) mean_p += std::pow(10.0, d) * 0.2;
  mean_p /= static_cast<double>(draws.size());
  // Marginal Beta(6, 4): sd = sqrt(6·4 / (10²·11)) ≈ 0.148; MC standard error ≈ 0.0007.
  CHECK(mean_p == Approx(0.6).margin(0.004));
}

TEST_CASE("layered layout of the burglary network") {
  const auto layout = read_model(burglary_network())->layout();
  // Burglary, Earthquake (roots) in layer 0; Alarm in 1; the two calls in 2; no crossings.
  CHECK(layout.nodes[0].layer == 0);
  CHECK(layout.nodes[1].layer == 0);
  CHECK(layout.nodes[2].layer == 1);
  CHECK(layout.nodes[3].layer == 2);
  CHECK(layout.nodes[4].layer == 2);
  CHECK(layout.layer_widths == std::vector<std::size_t>{2, 1, 2});
  CHECK(layout.crossings == 0);
  CHECK(layout.edges.size() == 4);
}

TEST_CASE("layout: arrows point to later layers, long arrows get bends, crossings are reduced") {
  // A -> B -> C and A -> C: C is in layer 2 and the arrow A -> C bends through layer 1.
  json item = json::parse(R"({"id": "L1", "model": "network",
    "nodes": [{"name": "A", "states": ["y", "n"]},
              {"name": "B", "states": ["y", "n"], "parents": ["A"], "cpt": [[0.5, 0.5], [0.5, 0.5]]},
              {"name": "C", "states": ["y", "n"], "parents": ["A", "B"],
               "cpt": [[0.5, 0.5], [0.5, 0.5], [0.5, 0.5], [0.5, 0.5]]}],
    "proposition": {"node": "A", "hp": "y", "hd": "n"}, "observed": {"C": "y"}})");
  const auto layout = read_model(item)->layout();
  CHECK(layout.nodes[2].layer == 2);
  const auto edge = std::find_if(layout.edges.begin(), layout.edges.end(), [](const auto& e) { return e.parent == 0 && e.child == 2; });
  REQUIRE(edge != layout.edges.end());
  REQUIRE(edge->bends.size() == 1);
  CHECK(edge->bends[0].layer == 1);
  // Crossed start: X1 -> Y2, X2 -> Y1 given in the crossing order; the barycenter sweep uncrosses it.
  json crossed = json::parse(R"({"id": "L2", "model": "network",
    "nodes": [{"name": "X1", "states": ["y", "n"]},
              {"name": "X2", "states": ["y", "n"], "cpt": [[0.5, 0.5]]},
              {"name": "Y1", "states": ["y", "n"], "parents": ["X2"], "cpt": [[0.5, 0.5], [0.5, 0.5]]},
              {"name": "Y2", "states": ["y", "n"], "parents": ["X1"], "cpt": [[0.5, 0.5], [0.5, 0.5]]}],
    "proposition": {"node": "X1", "hp": "y", "hd": "n"}, "observed": {"Y2": "y"}})");
  const auto uncrossed = read_model(crossed)->layout();
  CHECK(uncrossed.crossings == 0);
  CHECK((uncrossed.nodes[0].position < uncrossed.nodes[1].position) ==
        (uncrossed.nodes[3].position < uncrossed.nodes[2].position));
}

TEST_CASE("the sensitivity line rejects values outside [0, 1]") {
  const auto rows = read_model(simple({0.8, 0.2}))->sensitivity();
  REQUIRE_FALSE(rows.empty());
  CHECK_THROWS_AS(rows[0].line.lr_at(1.5), std::domain_error);
  CHECK_THROWS_AS(rows[0].line.lr_at(-0.1), std::domain_error);
}

TEST_CASE("layout of random networks: every arrow goes down, every slot is used once") {
  const auto seed = GENERATE(range<std::uint64_t>(1, 21));
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  counterpoise::models::network::Dag dag(15);
  for (std::size_t i = 0; i < dag.size(); ++i)
    for (std::size_t j = 0; j < i; ++j)
      if (unit(rng) < 0.2) dag[i].parents.push_back(j);
  const auto layout = counterpoise::models::network::layered_layout(dag);
  for (const auto& e : layout.edges) {
    CHECK(layout.nodes[e.child].layer > layout.nodes[e.parent].layer);
    CHECK(e.bends.size() == layout.nodes[e.child].layer - layout.nodes[e.parent].layer - 1);
  }
  // Slots of nodes and bends within a layer are distinct and fill 0 .. width − 1.
  std::vector<std::vector<std::size_t>> used(layout.layer_widths.size());
  for (const auto& p : layout.nodes) used[p.layer].push_back(p.position);
  for (const auto& e : layout.edges)
    for (const auto& b : e.bends) used[b.layer].push_back(b.position);
  for (std::size_t l = 0; l < used.size(); ++l) {
    std::sort(used[l].begin(), used[l].end());
    std::vector<std::size_t> expected(layout.layer_widths[l]);
    std::iota(expected.begin(), expected.end(), 0);
    CHECK(used[l] == expected);
  }
}

TEST_CASE("entries are ordered by the larger move of log10 LR at the ends of their ranges") {
  // LR = a / b with a = P(F = present | hp) = 0.8 and b = P(F = present | hd) = 0.01 (Bayes'
  // theorem written out for one finding). Each point entry is tried over x ± 0.1·min(x, 1 − x).
  const auto model = read_model(simple({0.8, 0.2}));
  auto rows = model->sensitivity();
  counterpoise::models::network::order_by_effect(rows);
  REQUIRE(rows.size() >= 4);  // at least F's two rows of two states each
  // b in [0.009, 0.011]: log10 LR moves by log10(0.01 / 0.009) at the low end, the larger one.
  const double move_b = std::log10(0.01 / 0.009);
  // a in [0.78, 0.82]: log10(0.8 / 0.78) at the low end.
  const double move_a = std::log10(0.8 / 0.78);
  REQUIRE(move_b > move_a);
  const auto& first = rows.front();
  CHECK(first.node == 1);
  CHECK(first.row == 1);
  CHECK(counterpoise::models::network::largest_log10_move(first) == Approx(move_b).epsilon(1e-12));
  for (std::size_t i = 1; i < rows.size(); ++i)
    CHECK(counterpoise::models::network::largest_log10_move(rows[i - 1]) >=
          counterpoise::models::network::largest_log10_move(rows[i]));
  const auto a_row = std::find_if(rows.begin(), rows.end(), [](const auto& e) { return e.node == 1 && e.row == 0 && e.state == 0; });
  REQUIRE(a_row != rows.end());
  CHECK(counterpoise::models::network::largest_log10_move(*a_row) == Approx(move_a).epsilon(1e-12));
}

TEST_CASE("an end where the LR is zero or undefined reads in words and orders first") {
  using counterpoise::models::network::sensitivity_end_text;
  using counterpoise::numbers::LikelihoodRatio;
  CHECK(sensitivity_end_text(std::nullopt) == "undefined");
  CHECK(sensitivity_end_text(LikelihoodRatio::zero()) == "LR zero");
  CHECK(sensitivity_end_text(LikelihoodRatio::infinite()) == "LR infinite");
  // log10 100 = 2, written with the readers' two decimals (common practice).
  CHECK(sensitivity_end_text(LikelihoodRatio::from_log10(2.0)) == "2.00");
  CHECK(sensitivity_end_text(LikelihoodRatio::from_log10(-0.5)) == "\u22120.50");
  // a = 0: the findings are impossible under Hp, so the LR is zero at every entry's value and
  // at a's ends (0 ± 0): an infinite move, which no finite move outranks.
  const auto model = read_model(simple({0.0, 1.0}));
  auto rows = model->sensitivity();
  counterpoise::models::network::order_by_effect(rows);
  const auto a_row = std::find_if(rows.begin(), rows.end(), [](const auto& e) { return e.node == 1 && e.row == 0 && e.state == 0; });
  REQUIRE(a_row != rows.end());
  CHECK(std::isinf(counterpoise::models::network::largest_log10_move(*a_row)));
  CHECK(std::isinf(counterpoise::models::network::largest_log10_move(rows.front())));
  CHECK(sensitivity_end_text(a_row->lr_at_low) == "LR zero");
}
