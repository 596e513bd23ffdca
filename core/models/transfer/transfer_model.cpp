#include "core/models/transfer/transfer_model.hpp"

#include <cmath>
#include <limits>
#include <vector>

#include "core/models/item_fields.hpp"
#include "core/numbers/log10_math.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models::transfer {

using nlohmann::json;
using numbers::LikelihoodRatio;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr double kMinusInf = -std::numeric_limits<double>::infinity();

json probability_json(double log10_p) {
  json out = {{"log10", std::isinf(log10_p) ? json(nullptr) : json(log10_p)}};
  out["value"] = std::isinf(log10_p) ? 0.0 : std::pow(10.0, log10_p);
  return out;
}

json branch(const char* description, const char* terms, double log10_p) {
  json out = {{"branch", description}, {"terms", terms}};
  out.update(probability_json(log10_p));
  return out;
}

}  // namespace

double EventTree::log10_numerator() const { return numbers::log10_add(log10_hp_transfer, log10_hp_background); }

double EventTree::log10_lr() const {
  const double numerator = log10_numerator();
  if (std::isinf(log10_hd) && std::isinf(numerator)) return std::nan("");  // both zero: caller rejects
  return numerator - log10_hd;
}

EventTree event_tree(Found found, const TransferLog10Terms& t) {
  EventTree tree;
  if (found == Found::none) {
    tree.log10_hp_transfer = kMinusInf;
    tree.log10_hp_background = t.t0 + t.p0;
    tree.log10_hd = t.p0;
    return tree;
  }
  const double background_group = t.p1 + t.sn + t.gamma;
  tree.log10_hp_transfer = t.tn + t.p0;
  tree.log10_hp_background = t.t0 + background_group;
  tree.log10_hd = background_group;
  return tree;
}

TransferModel::TransferModel(TransferInputs inputs, json as_written)
    : inputs_(std::move(inputs)), as_written_(std::move(as_written)) {}

TransferLog10Terms TransferModel::mean_terms() const {
  const auto log10_of = [](const std::optional<probability::Assignment>& a) {
    return a ? probability::log10_mean(*a) : kMinusInf;
  };
  return {log10_of(inputs_.t0), log10_of(inputs_.tn), log10_of(inputs_.p0),
          log10_of(inputs_.p1), log10_of(inputs_.sn), log10_of(inputs_.gamma)};
}

bool TransferModel::is_uncertain() const {
  const bool group = inputs_.found == Found::group;
  const auto uncertain = [](const std::optional<probability::Assignment>& a) { return a && probability::is_uncertain(*a); };
  return uncertain(inputs_.t0) || uncertain(inputs_.p0) ||
         (group && (uncertain(inputs_.tn) || uncertain(inputs_.p1) || uncertain(inputs_.sn) || uncertain(inputs_.gamma)));
}

PointResult TransferModel::evaluate() const {
  const TransferLog10Terms t = mean_terms();
  const EventTree tree = event_tree(inputs_.found, t);
  PointResult result;
  result.lr = LikelihoodRatio::from_log10_probabilities(tree.log10_numerator(), tree.log10_hd);
  result.log10_p_given_hp = tree.log10_numerator();
  result.log10_p_given_hd = tree.log10_hd;

  json detail;
  const bool group = inputs_.found == Found::group;
  detail["found"] = group ? "group" : "none";
  if (inputs_.items) detail["items_in_group"] = *inputs_.items;
  detail["formula"] = group ? "LR = t0 + P0 tn / (P1 Sn gamma)" : "LR = t0 P0 / P0 = t0";
  json inputs = json::object();
  const std::pair<const char*, const std::optional<probability::Assignment>*> named[] = {
      {"t0", &inputs_.t0}, {"tn", &inputs_.tn}, {"p0", &inputs_.p0},
      {"p1", &inputs_.p1}, {"sn", &inputs_.sn}, {"gamma", &inputs_.gamma}};
  for (const auto& [name, assignment] : named)
    if (*assignment)
      inputs[name] = {{"mean", probability::mean(**assignment)}, {"assigned", probability::describe(**assignment)}};
  detail["probabilities"] = inputs;
  if (group) {
    detail["event_tree"] = {
        {"hp",
         {branch("n items transferred, persisted and recovered; no background group", "tn * P0",
                 tree.log10_hp_transfer),
          branch("nothing transferred; one background group of n items with the matching characteristics",
                 "t0 * P1 * Sn * gamma", tree.log10_hp_background)}},
        {"hd", {branch("one background group of n items with the matching characteristics", "P1 * Sn * gamma",
                       tree.log10_hd)}}};
  } else {
    detail["event_tree"] = {
        {"hp", {branch("nothing transferred, persisted and recovered; no background group", "t0 * P0",
                       tree.log10_hp_background)}},
        {"hd", {branch("no background group", "P0", tree.log10_hd)}}};
  }
  detail["numerator"] = probability_json(tree.log10_numerator());
  detail["denominator"] = probability_json(tree.log10_hd);
  detail["log10_lr"] = result.lr.is_finite() ? json(result.lr.log10()) : json(numbers::state_name(result.lr.state()));
  result.detail = std::move(detail);
  return result;
}

void TransferModel::draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const {
  if (!is_uncertain()) return EvidenceModel::draw_log10_lr(rng, out);
  const TransferLog10Terms means = mean_terms();
  const bool group = inputs_.found == Found::group;
  // Draw in a fixed order (t0, tn, p0, p1, sn, gamma) so a seed reproduces every draw.
  const auto draw = [&rng](const std::optional<probability::Assignment>& a, double fallback, bool used) {
    return (a && used) ? probability::draw_log10(*a, rng) : fallback;
  };
  for (double& value : out) {
    TransferLog10Terms t;
    t.t0 = draw(inputs_.t0, means.t0, true);
    t.tn = draw(inputs_.tn, means.tn, group);
    t.p0 = draw(inputs_.p0, means.p0, true);
    t.p1 = draw(inputs_.p1, means.p1, group);
    t.sn = draw(inputs_.sn, means.sn, group);
    t.gamma = draw(inputs_.gamma, means.gamma, group);
    value = event_tree(inputs_.found, t).log10_lr();
  }
}

std::string TransferModel::assumptions() const {
  if (inputs_.found == Found::none)
    return "The findings are that no material matching the control was recovered. If the person carried out the "
           "activity (Hp), this requires that nothing was transferred, persisted and recovered (probability t0) and "
           "that the person carried no background group (P0); if not (Hd), only that no background group was "
           "carried (P0). The background load is assumed to be the same under both propositions, so P0 cancels and "
           "the likelihood ratio is t0.";
  return "The findings are one group of items matching the control and no other group. If the person carried out "
         "the activity (Hp), either the group was transferred, persisted and was recovered (tn) and the person "
         "carried no background group (P0), or nothing was transferred (t0) and the group is background: one group "
         "(P1) of this size (Sn) with the matching characteristics by chance (gamma). If not (Hd), the group is "
         "background (P1 Sn gamma). Background presence is assumed independent of the activity and the same under "
         "both propositions; at most one group is transferred; the characteristics of a transferred group match the "
         "control.";
}

json TransferModel::to_json() const {
  if (!as_written_.is_null()) return as_written_;
  json out;
  if (inputs_.found_given) out["found"] = inputs_.found == Found::group ? "group" : "none";
  if (inputs_.items) out["n"] = *inputs_.items;
  const std::pair<const char*, const std::optional<probability::Assignment>*> named[] = {
      {"t0", &inputs_.t0}, {"tn", &inputs_.tn}, {"p0", &inputs_.p0},
      {"p1", &inputs_.p1}, {"sn", &inputs_.sn}, {"gamma", &inputs_.gamma}};
  for (const auto& [name, assignment] : named)
    if (*assignment) out[name] = probability::to_json(**assignment);
  return out;
}

EvidenceModelPtr read_transfer_model(const json& item, const ReadContext& context) {
  const Location& where = context.where;
  check_model_members(item, {"found", "n", "t0", "tn", "p0", "p1", "sn", "gamma"}, where);
  TransferInputs inputs;
  if (const json* found = reading::find_member(item, "found")) {
    const std::string name = reading::read_string(*found, where.with_field("found"));
    if (name == "group")
      inputs.found = Found::group;
    else if (name == "none")
      inputs.found = Found::none;
    else
      throw InvalidValue(where.with_field("found"), "unknown value '" + name + "' (expected group or none)");
    inputs.found_given = true;
  }
  const bool group = inputs.found == Found::group;
  if (const json* n = reading::find_member(item, "n")) {
    if (!group) throw InvalidValue(where.with_field("n"), "n is the size of a group found; it does not apply to found \"none\"");
    const auto count = reading::read_count(*n, where.with_field("n"));
    if (count < 1) throw InvalidValue(where.with_field("n"), "a group has at least one item");
    inputs.items = count;
  }
  const auto read = [&](const char* key, bool required) -> std::optional<probability::Assignment> {
    const json* member = reading::find_member(item, key);
    if (!member) {
      if (required) throw InvalidValue(where.with_field(key), "missing field");
      return std::nullopt;
    }
    return probability::read_assignment(*member, where.with_field(key));
  };
  inputs.t0 = read("t0", true);
  inputs.tn = read("tn", group);
  inputs.p0 = read("p0", true);
  inputs.p1 = read("p1", group);
  inputs.sn = read("sn", group);
  inputs.gamma = read("gamma", group);

  // t0 and tn are probabilities of exclusive outcomes (0 or n items), as are P0 and P1 (0 or 1
  // group); checked on the assigned means, which are the values of the point LR.
  const auto check_sum = [&](const std::optional<probability::Assignment>& a, const std::optional<probability::Assignment>& b,
                             const char* a_name, const char* b_name) {
    if (!a || !b) return;
    const double total = probability::mean(*a) + probability::mean(*b);
    if (total > 1.0)
      throw InvalidValue(where.with_field(b_name), std::string(a_name) + " + " + b_name + " = " +
                                                       numbers::exact_text(total) + " exceeds 1; they are probabilities "
                                                       "of exclusive outcomes");
  };
  check_sum(inputs.t0, inputs.tn, "t0", "tn");
  check_sum(inputs.p0, inputs.p1, "p0", "p1");

  // Both sides of the tree zero: the findings would be impossible under both propositions.
  if (group) {
    const double denominator = probability::mean(*inputs.p1) * probability::mean(*inputs.sn) * probability::mean(*inputs.gamma);
    const double transfer = probability::mean(*inputs.tn) * probability::mean(*inputs.p0);
    if (denominator == 0.0 && transfer == 0.0) {
      const char* zero = probability::mean(*inputs.p1) == 0.0 ? "p1" : probability::mean(*inputs.sn) == 0.0 ? "sn" : "gamma";
      throw InvalidValue(where.with_field(zero), "with this probability 0 and tn P0 = 0 the findings are impossible "
                                                 "under both propositions");
    }
  } else if (probability::mean(*inputs.p0) == 0.0) {
    throw InvalidValue(where.with_field("p0"), "with P0 = 0 finding nothing is impossible under both propositions");
  }

  json as_written = json::object();
  for (const char* key : {"found", "n", "t0", "tn", "p0", "p1", "sn", "gamma"})
    if (const json* member = reading::find_member(item, key)) as_written[key] = *member;
  return std::make_shared<TransferModel>(std::move(inputs), std::move(as_written));
}

}  // namespace counterpoise::models::transfer
