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
    tree.log10_hd_background = t.has_hd_transfer ? t.t0_hd + t.p0 : t.p0;
    tree.log10_hd = tree.log10_hd_background;
    return tree;
  }
  const double background_group = t.p1 + t.sn + t.gamma;
  tree.log10_hp_transfer = t.tn + t.p0;
  tree.log10_hp_background = t.t0 + background_group;
  if (!t.has_hd_transfer) {
    tree.log10_hd_background = background_group;
    tree.log10_hd = background_group;
    return tree;
  }
  tree.log10_hd_transfer = t.tn_hd + t.p0;
  tree.log10_hd_background = t.t0_hd + background_group;
  tree.log10_hd = numbers::log10_add(tree.log10_hd_transfer, tree.log10_hd_background);
  return tree;
}

TransferModel::TransferModel(TransferInputs inputs, json as_written, std::uint32_t hd_stream)
    : inputs_(std::move(inputs)), as_written_(std::move(as_written)), hd_stream_(hd_stream) {}

TransferLog10Terms TransferModel::mean_terms() const {
  const auto log10_of = [](const std::optional<probability::Assignment>& a) {
    return a ? probability::log10_mean(*a) : kMinusInf;
  };
  TransferLog10Terms terms{log10_of(inputs_.t0), log10_of(inputs_.tn), log10_of(inputs_.p0),
                           log10_of(inputs_.p1), log10_of(inputs_.sn), log10_of(inputs_.gamma)};
  if (inputs_.t0_hd) {
    terms.has_hd_transfer = true;
    terms.t0_hd = log10_of(inputs_.t0_hd);
    terms.tn_hd = log10_of(inputs_.tn_hd);
  }
  return terms;
}

bool TransferModel::is_uncertain() const {
  const bool group = inputs_.found == Found::group;
  const auto uncertain = [](const std::optional<probability::Assignment>& a) { return a && probability::is_uncertain(*a); };
  return uncertain(inputs_.t0) || uncertain(inputs_.p0) || uncertain(inputs_.t0_hd) ||
         (group && (uncertain(inputs_.tn) || uncertain(inputs_.p1) || uncertain(inputs_.sn) || uncertain(inputs_.gamma) ||
                    uncertain(inputs_.tn_hd)));
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
  const bool hd_transfer = inputs_.t0_hd.has_value();
  if (!hd_transfer)
    detail["formula"] = group ? "LR = t0 + P0 tn / (P1 Sn gamma)" : "LR = t0 P0 / P0 = t0";
  else
    detail["formula"] = group ? "LR = (tn P0 + t0 P1 Sn gamma) / (tn_hd P0 + t0_hd P1 Sn gamma)"
                              : "LR = t0 P0 / (t0_hd P0) = t0 / t0_hd";
  json inputs = json::object();
  const std::pair<const char*, const std::optional<probability::Assignment>*> named[] = {
      {"t0", &inputs_.t0}, {"tn", &inputs_.tn}, {"p0", &inputs_.p0},
      {"p1", &inputs_.p1}, {"sn", &inputs_.sn}, {"gamma", &inputs_.gamma},
      {"t0_hd", &inputs_.t0_hd}, {"tn_hd", &inputs_.tn_hd}};
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
        {"hd", hd_transfer
                   ? json{branch("n items transferred, persisted and recovered under the alternative; no background "
                                 "group", "tn_hd * P0", tree.log10_hd_transfer),
                          branch("nothing transferred under the alternative; one background group of n items with the "
                                 "matching characteristics", "t0_hd * P1 * Sn * gamma", tree.log10_hd_background)}
                   : json{branch("one background group of n items with the matching characteristics", "P1 * Sn * gamma",
                                 tree.log10_hd)}}};
  } else {
    detail["event_tree"] = {
        {"hp", {branch("nothing transferred, persisted and recovered; no background group", "t0 * P0",
                       tree.log10_hp_background)}},
        {"hd", {hd_transfer ? branch("nothing transferred, persisted and recovered under the alternative; no "
                                     "background group", "t0_hd * P0", tree.log10_hd)
                            : branch("no background group", "P0", tree.log10_hd)}}};
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
  // The alternative's own terms come from a generator of its own stream, seeded from a copy of
  // `rng`, so that `rng` moves exactly as it would without them and the shared terms below are
  // the same draw for draw against every alternative.
  std::mt19937_64 copy = rng;
  std::seed_seq hd_seed{static_cast<std::uint32_t>(copy()), static_cast<std::uint32_t>(copy()),
                        static_cast<std::uint32_t>(copy()), static_cast<std::uint32_t>(copy()), hd_stream_};
  std::mt19937_64 hd_rng(hd_seed);
  // Draw in a fixed order (t0, tn, p0, p1, sn, gamma) so a seed reproduces every draw.
  const auto draw = [](const std::optional<probability::Assignment>& a, double fallback, bool used,
                       std::mt19937_64& generator) {
    return (a && used) ? probability::draw_log10(*a, generator) : fallback;
  };
  for (double& value : out) {
    TransferLog10Terms t = means;
    t.t0 = draw(inputs_.t0, means.t0, true, rng);
    t.tn = draw(inputs_.tn, means.tn, group, rng);
    t.p0 = draw(inputs_.p0, means.p0, true, rng);
    t.p1 = draw(inputs_.p1, means.p1, group, rng);
    t.sn = draw(inputs_.sn, means.sn, group, rng);
    t.gamma = draw(inputs_.gamma, means.gamma, group, rng);
    t.t0_hd = draw(inputs_.t0_hd, means.t0_hd, true, hd_rng);
    t.tn_hd = draw(inputs_.tn_hd, means.tn_hd, group, hd_rng);
    value = event_tree(inputs_.found, t).log10_lr();
  }
}

std::string TransferModel::assumptions() const {
  const bool hd_transfer = inputs_.t0_hd.has_value();
  if (inputs_.found == Found::none) {
    std::string text =
        "The findings are that no material matching the control was recovered. If the person carried out the "
        "activity (Hp), this requires that nothing was transferred, persisted and recovered (probability t0) and "
        "that the person carried no background group (P0); ";
    if (!hd_transfer)
      return text + "if not (Hd), only that no background group was carried (P0). The background load is assumed to "
                    "be the same under both propositions, so P0 cancels and the likelihood ratio is t0.";
    return text + "if Hd is true, that nothing was transferred, persisted and recovered in what the person did "
                  "instead (t0_hd) and that no background group was carried (P0). The background load is assumed to "
                  "be the same under both propositions, so P0 cancels and the likelihood ratio is t0 / t0_hd.";
  }
  std::string text =
      "The findings are one group of items matching the control and no other group. If the person carried out "
      "the activity (Hp), either the group was transferred, persisted and was recovered (tn) and the person "
      "carried no background group (P0), or nothing was transferred (t0) and the group is background: one group "
      "(P1) of this size (Sn) with the matching characteristics by chance (\u03b3). ";
  text += hd_transfer ? "If Hd is true, the same two ways are open with the transfer probabilities of what the person "
                        "did instead (tn_hd P0 + t0_hd P1 Sn \u03b3). "
                      : "If not (Hd), the group is background (P1 Sn \u03b3). ";
  return text + "Background presence is assumed independent of the activity and the same under both propositions; at "
                "most one group is transferred; the characteristics of a transferred group match the control.";
}

json TransferModel::to_json() const {
  if (!as_written_.is_null()) return as_written_;
  json out;
  if (inputs_.found_given) out["found"] = inputs_.found == Found::group ? "group" : "none";
  if (inputs_.items) out["n"] = *inputs_.items;
  const std::pair<const char*, const std::optional<probability::Assignment>*> named[] = {
      {"t0", &inputs_.t0}, {"tn", &inputs_.tn}, {"p0", &inputs_.p0},
      {"p1", &inputs_.p1}, {"sn", &inputs_.sn}, {"gamma", &inputs_.gamma},
      {"t0_hd", &inputs_.t0_hd}, {"tn_hd", &inputs_.tn_hd}};
  for (const auto& [name, assignment] : named)
    if (*assignment) out[name] = probability::to_json(**assignment);
  return out;
}

namespace {

constexpr std::string_view kTransferFields[] = {"found", "n", "t0", "tn", "p0", "p1", "sn", "gamma", "t0_hd", "tn_hd"};

// The transfer probabilities if Hd is true, when given (see read_transfer_model).
void read_hd_transfer(const json& item, const Location& where, TransferInputs& inputs) {
  const bool group = inputs.found == Found::group;
  const json* t0_hd = reading::find_member(item, "t0_hd");
  const json* tn_hd = reading::find_member(item, "tn_hd");
  if (!t0_hd && !tn_hd) return;
  if (!t0_hd)
    throw InvalidValue(where.with_field("t0_hd"), "missing field: with tn_hd given, the transfer if Hd is true needs t0_hd "
                                                  "too (the probability that nothing is transferred)");
  if (group && !tn_hd)
    throw InvalidValue(where.with_field("tn_hd"), "missing field: with t0_hd given, the transfer if Hd is true needs tn_hd "
                                                  "too (the probability that n items are transferred)");
  inputs.t0_hd = probability::read_assignment(*t0_hd, where.with_field("t0_hd"));
  if (tn_hd) inputs.tn_hd = probability::read_assignment(*tn_hd, where.with_field("tn_hd"));
}

EvidenceModelPtr read_transfer(const json& item, const ReadContext& context, std::uint32_t hd_stream) {
  const Location& where = context.where;
  check_model_members(item, {"found", "n", "t0", "tn", "p0", "p1", "sn", "gamma", "t0_hd", "tn_hd"}, where);
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
  read_hd_transfer(item, where, inputs);

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
  check_sum(inputs.t0_hd, inputs.tn_hd, "t0_hd", "tn_hd");

  // Both sides of the tree zero: the findings would be impossible under both propositions.
  if (inputs.t0_hd) {
    const double p0 = probability::mean(*inputs.p0);
    double numerator = probability::mean(*inputs.t0) * p0, denominator = probability::mean(*inputs.t0_hd) * p0;
    if (group) {
      const double background = probability::mean(*inputs.p1) * probability::mean(*inputs.sn) * probability::mean(*inputs.gamma);
      numerator = probability::mean(*inputs.tn) * p0 + probability::mean(*inputs.t0) * background;
      denominator = probability::mean(*inputs.tn_hd) * p0 + probability::mean(*inputs.t0_hd) * background;
    }
    if (numerator == 0.0 && denominator == 0.0)
      throw InvalidValue(where.with_field("t0_hd"), "with these probabilities the findings are impossible under both "
                                                    "propositions");
  } else if (group) {
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
  for (const auto key : kTransferFields)
    if (const json* member = reading::find_member(item, key)) as_written[std::string(key)] = *member;
  return std::make_shared<TransferModel>(std::move(inputs), std::move(as_written), hd_stream);
}

}  // namespace

EvidenceModelPtr read_transfer_model(const json& item, const ReadContext& context) { return read_transfer(item, context, 0); }

std::vector<EvidenceModelPtr> read_transfer_alternatives(const json& item, std::span<const std::string> alternative_ids,
                                                         const ReadContext& context) {
  // Each alternative draws its own transfer terms from a stream of its own (its position).
  std::uint32_t stream = 0;
  const auto read = [&stream](const json& merged, const ReadContext& merged_context) {
    return read_transfer(merged, merged_context, stream++);
  };
  return read_per_alternative(item, alternative_ids, {"t0_hd", "tn_hd"}, read, context);
}

}  // namespace counterpoise::models::transfer
