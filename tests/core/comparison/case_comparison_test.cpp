// The comparison of two versions of a case: the differences in words and the attribution of the
// change of the combined log10 LR to them.
#include <cmath>

#include <catch2/catch.hpp>

#include "core/comparison/case_comparison.hpp"
#include "core/comparison/comparison_json.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "tests/core/comparison/comparison_test_support.hpp"

using namespace counterpoise::comparison;
using comparison_test::three_item_case;
using comparison_test::version_of;
using nlohmann::json;

namespace {

double combined_log10(const CaseVersion& version) {
  return counterpoise::evaluation::evaluate_case(version.value).combined.lr.log10();
}

const Difference& only_difference(const CaseComparison& c) {
  REQUIRE(c.differences.size() == 1);
  return c.differences.front();
}

}  // namespace

TEST_CASE("identical cases give no difference", "[comparison]") {
  for (const char* name : {"harwick-vale-breakin.json", "harwick-vale-dna.json", "harwick-vale-fibres.json"}) {
    INFO(name);
    const auto a = comparison_test::demo_version(name);
    const auto b = comparison_test::demo_version(name);
    const auto c = compare_cases(a, b);
    CHECK(c.differences.empty());
    CHECK(c.items.empty());
    CHECK(c.total_change.is_finite());
    CHECK(c.total_change.log10 == 0.0);
    CHECK_FALSE(c.band_changes());
    CHECK(c.a.sha256 == c.b.sha256);
    CHECK(comparison_to_json(c)["differences"].empty());
  }
}

TEST_CASE("one changed value gives exactly its item's change", "[comparison]") {
  const json original = three_item_case();
  json changed = original;
  changed["items"][0]["p_given_hd"] = 0.005;
  const auto a = version_of(original, "A");
  const auto b = version_of(changed, "B");
  const auto c = compare_cases(a, b);
  const Difference& d = only_difference(c);
  CHECK(d.kind == DifferenceKind::input_value);
  CHECK(d.path == DifferencePath{"items", "E1", "p_given_hd"});
  CHECK(d.place == "P(E|Hd) of E1");
  CHECK(value_words(d.old_value) == "0.02");
  CHECK(value_words(d.new_value) == "0.005");
  // The item's change, by the assigned model's formula log10 P(E|Hp) - log10 P(E|Hd): only
  // P(E|Hd) moved, from 0.02 to 0.005, so the change is log10(0.02 / 0.005) = log10 4.
  const auto& effect = c.effects.front();
  REQUIRE(effect.combined_share.is_finite());
  CHECK(effect.combined_share.log10 == Approx(std::log10(4.0)).epsilon(1e-14));
  // Exactly the item's change, and exactly the change evaluate_case sees in the combined LR.
  const double item_a = a.value.items[0].model->evaluate().lr.log10();
  const double item_b = b.value.items[0].model->evaluate().lr.log10();
  CHECK(effect.combined_share.log10 == item_b - item_a);
  CHECK(effect.item_share->log10 == item_b - item_a);
  CHECK(effect.combined_alone->log10 == item_b - item_a);
  CHECK(c.total_change.log10 == Approx(combined_log10(b) - combined_log10(a)).margin(1e-12));
}

TEST_CASE("the shares add up to the total change, and each item's to its own change", "[comparison]") {
  json changed = three_item_case();
  changed["items"][0]["p_given_hp"] = 0.5;
  changed["items"][0]["p_given_hd"] = 0.1;
  changed["items"][1]["lr"] = 12;
  changed["items"][2]["t0"] = 0.4;
  changed["items"][2]["tn"] = 0.05;
  changed["items"][2]["gamma"] = 0.5;
  changed["items"][2]["title"] = "Fibres on the door frame and hinge";
  changed["propositions"]["conditioning_information"] = "The shed door was forced on 3 June 2026.";
  const auto a = version_of(three_item_case(), "A");
  const auto b = version_of(changed, "B");
  const auto c = compare_cases(a, b);
  CHECK(c.differences.size() == 8);
  REQUIRE(c.total_change.is_finite());
  // The combined LR as evaluate_case finds it in each version.
  CHECK(c.total_change.log10 == Approx(combined_log10(b) - combined_log10(a)).margin(1e-12));
  double sum = 0.0;
  for (const auto& e : c.effects) sum += e.combined_share.value();
  CHECK(std::abs(sum - c.total_change.log10) < 1e-12);
  CHECK(std::abs(c.sum_of_shares() - c.total_change.log10) < 1e-12);
  // T1's three inputs interact: Shapley values over them, checked against the transfer formula
  // LR = t0 + P0 tn / (P1 Sn gamma) worked out over all 6 orders.
  const auto t1 = std::find_if(c.items.begin(), c.items.end(), [](const ItemAttribution& i) { return i.item_id == "T1"; });
  REQUIRE(t1 != c.items.end());
  CHECK(t1->method == AttributionMethod::exact);
  CHECK(t1->players == 3);
  const auto lr = [](double t0, double tn, double gamma) { return std::log10(t0 + 0.6 * tn / (0.3 * 0.2 * gamma)); };
  // Orders of (t0, tn, gamma); t0's marginal in each of the 6 orders.
  const double t0_share = (2 * (lr(0.4, 0.3, 0.05) - lr(0.1, 0.3, 0.05)) + (lr(0.4, 0.05, 0.05) - lr(0.1, 0.05, 0.05)) +
                           (lr(0.4, 0.3, 0.5) - lr(0.1, 0.3, 0.5)) + 2 * (lr(0.4, 0.05, 0.5) - lr(0.1, 0.05, 0.5))) /
                          6.0;
  for (std::size_t k = 0; k < c.differences.size(); ++k) {
    const auto& d = c.differences[k];
    if (d.path.item_id == "T1" && d.path.field == "t0") CHECK(c.effects[k].combined_share.log10 == Approx(t0_share).margin(1e-13));
    if (d.path.field == "title" || d.kind == DifferenceKind::conditioning) {
      CHECK_FALSE(d.enters_lr());
      CHECK(c.effects[k].combined_share.log10 == 0.0);
    }
  }
  // The JSON carries the same shares, largest first.
  const json j = comparison_to_json(c);
  double json_sum = 0.0;
  double previous = INFINITY;
  for (const auto& d : j["differences"]) {
    json_sum += d["effect_log10"].get<double>();
    CHECK(std::abs(d["effect_log10"].get<double>()) <= previous);
    previous = std::abs(d["effect_log10"].get<double>());
  }
  CHECK(std::abs(json_sum - j["total_change_log10"].get<double>()) < 1e-12);
  CHECK(j["log10_lr_a"].get<double>() == Approx(combined_log10(a)).margin(1e-12));
  CHECK(j["log10_lr_b"].get<double>() == Approx(combined_log10(b)).margin(1e-12));
}

TEST_CASE("items added, removed, included and left out move the combined LR by their whole term", "[comparison]") {
  json changed = three_item_case();
  changed["items"].erase(1);  // E2 (LR 40) removed
  changed["items"].push_back(json::parse(R"({"id": "E4", "model": "reported-lr", "lr": 5})"));
  changed["items"][0]["combination"] = {{"included", false}, {"exclusion_reason", "The paint is too common."}};
  const auto a = version_of(three_item_case(), "A");
  const auto b = version_of(changed, "B");
  const auto c = compare_cases(a, b);
  std::map<std::string, double> share;
  for (std::size_t k = 0; k < c.differences.size(); ++k) share[kind_name(c.differences[k].kind)] = c.effects[k].combined_share.log10;
  CHECK(share.at("item-removed") == Approx(-std::log10(40.0)).epsilon(1e-14));
  CHECK(share.at("item-added") == Approx(std::log10(5.0)).epsilon(1e-14));
  CHECK(share.at("item-excluded") == Approx(-std::log10(0.8 / 0.02)).epsilon(1e-14));
  CHECK(c.total_change.log10 == Approx(combined_log10(b) - combined_log10(a)).margin(1e-12));
}

TEST_CASE("an exclusion on one side is an infinite change, never NaN", "[comparison]") {
  json changed = three_item_case();
  changed["items"][0]["p_given_hp"] = 0;  // the findings impossible if Hp is true: LR zero
  changed["items"][2]["gamma"] = 0.5;     // a finite change on another item
  const auto c = compare_cases(version_of(three_item_case(), "A"), version_of(changed, "B"));
  CHECK(c.total_change.state == Log10Change::State::minus_infinite);
  CHECK(c.b.combined_lr.is_zero());
  for (std::size_t k = 0; k < c.differences.size(); ++k) {
    const auto& share = c.effects[k].combined_share;
    CHECK_FALSE(std::isnan(share.value()));
    if (c.differences[k].path.field == "p_given_hp") CHECK(share.state == Log10Change::State::minus_infinite);
    if (c.differences[k].path.field == "gamma") CHECK(share.is_finite());
  }
  const json j = comparison_to_json(c);
  CHECK(j["total_change_log10"].is_null());
  CHECK(j["total_change_state"] == "minus-infinite");
  CHECK(j["log10_lr_b"].is_null());
  CHECK(j["b"]["lr_state"] == "zero");
  CHECK(j.dump().find("nan") == std::string::npos);
}

TEST_CASE("inputs that only make sense together share the change equally", "[comparison]") {
  // Changing the model of E2 from a reported LR to assigned probabilities: the model and its
  // inputs form one change, shared equally among its members (changing one without the others
  // gives no readable item).
  json changed = three_item_case();
  changed["items"][1] = json::parse(R"({"id": "E2", "title": "Tool mark on the door", "model": "assigned",
                                        "p_given_hp": 0.9, "p_given_hd": 0.01})");
  const auto a = version_of(three_item_case(), "A");
  const auto b = version_of(changed, "B");
  const auto c = compare_cases(a, b);
  double sum = 0.0;
  int members = 0;
  for (std::size_t k = 0; k < c.differences.size(); ++k)
    if (c.differences[k].path.item_id == "E2") sum += c.effects[k].combined_share.log10, ++members;
  CHECK(members == 4);  // model, lr, p_given_hp, p_given_hd
  CHECK(sum == Approx(std::log10(90.0) - std::log10(40.0)).epsilon(1e-13));
}

TEST_CASE("differences are named in the user's words, section by section", "[comparison]") {
  json changed = three_item_case();
  changed["propositions"]["hd"] = "Mr Ellery Vance was at the shed only as a guest.";
  changed["propositions"]["level"] = "source";
  changed["propositions"]["assumptions"] = {"The crowbar was not cleaned."};
  changed["items"][2]["tn"] = 0.2;
  const auto c = compare_cases(version_of(three_item_case(), "A"), version_of(changed, "B"));
  std::vector<std::string> places;
  for (const auto& d : c.differences) places.push_back(d.place + " / " + kind_name(d.kind));
  CHECK(places == std::vector<std::string>{"assumptions (propositions) / assumptions",
                                           "Hd (propositions) / propositions",
                                           "level addressed (propositions) / propositions",
                                           "tn (this group transferred, persisted and recovered) of T1 / input-value"});
  CHECK(c.propositions_differ());
}

TEST_CASE("a change that alone moves the verbal conclusion is marked", "[comparison]") {
  // A's combined log10 LR: log10 40 (E1: 0.8 / 0.02) + log10 40 (E2) + log10 60.1 (T1: 0.1 + 0.6 ·
  // 0.3 / (0.3 · 0.2 · 0.05), the transfer formula) = 4.98, very strong support on the ENFSI
  // (2015) scale (10^4 to 10^6). E2's LR 40 → 4 alone takes it to 3.98, strong support; E1's
  // P(E|Hd) 0.02 → 0.01 alone to 5.28, still very strong.
  json changed = three_item_case();
  changed["items"][1]["lr"] = 4;
  changed["items"][0]["p_given_hd"] = 0.01;
  const auto c = compare_cases(version_of(three_item_case(), "A"), version_of(changed, "B"));
  CHECK(c.a.combined_lr.log10() == Approx(std::log10(40.0 * 40.0 * 60.1)).epsilon(1e-13));
  CHECK(c.a.verbal.label == "very strong support");
  for (std::size_t k = 0; k < c.differences.size(); ++k) {
    INFO(c.differences[k].place);
    CHECK(c.moves_conclusion[k] == (c.differences[k].path.item_id == "E2"));
  }
  CHECK(comparison_to_json(c)["differences"][0]["moves_conclusion"] == true);  // E2's share is the largest
}

TEST_CASE("an LR zero in both versions is no change, and its other inputs get no share", "[comparison]") {
  json first = three_item_case();
  first["items"][0]["p_given_hp"] = 0;  // an exclusion in both versions
  first["items"][0]["combination"] = {{"included", false}, {"exclusion_reason", "Shown for completeness."}};
  json second = first;
  second["items"][0]["p_given_hd"] = 0.5;
  const auto c = compare_cases(version_of(first, "A"), version_of(second, "B"));
  const Difference& d = only_difference(c);
  CHECK(d.path.field == "p_given_hd");
  const auto& effect = c.effects.front();
  REQUIRE(effect.item_share);
  CHECK(effect.item_share->is_finite());
  CHECK(effect.item_share->log10 == 0.0);
  CHECK(effect.note == "the LR is zero in both versions");
  CHECK(effect.combined_share.log10 == 0.0);  // left out on both sides: its term is 0 in both
  REQUIRE(c.items.size() == 1);
  CHECK(c.items[0].item_change->is_finite());
  CHECK(c.items[0].item_change->log10 == 0.0);
}

TEST_CASE("the same items in another order are one difference that moves nothing", "[comparison]") {
  json moved = three_item_case();
  std::swap(moved["items"][0], moved["items"][2]);
  const auto c = compare_cases(version_of(three_item_case(), "A"), version_of(moved, "B"));
  const Difference& d = only_difference(c);
  CHECK(d.kind == DifferenceKind::item_order);
  CHECK(d.place == "order of the items");
  CHECK(value_words(d.old_value) == "[E1, E2, T1]");
  CHECK(value_words(d.new_value) == "[T1, E2, E1]");
  CHECK(c.total_change.log10 == 0.0);
}
