#include "core/interchange/evaluation_json.hpp"

#include <cmath>
#include <stdexcept>
#include <utility>

namespace counterpoise::interchange {

using nlohmann::json;

json log10_json(double x) {
  if (std::isinf(x)) return x > 0 ? "infinity" : "-infinity";
  return x;
}

namespace {

json lr_json(const numbers::LikelihoodRatio& lr) {
  if (lr.is_zero()) return 0;
  if (lr.is_infinite()) return "infinity";
  return lr.value();
}

void put_spread(json& j, const std::optional<uncertainty::SpreadSummary>& spread) {
  if (!spread) return;
  j["interval_log10"] = {log10_json(spread->low_log10), log10_json(spread->high_log10)};
  j["median_log10"] = log10_json(spread->median_log10);
  j["conservative_log10"] = log10_json(spread->conservative_log10);
  j["credible_level"] = spread->levels.credible;
  j["conservative_level"] = spread->levels.conservative;
  j["uncertainty_method"] = spread->method;
  if (spread->lattice_step > 0.0) j["lattice_step_log10"] = spread->lattice_step;
}

json posterior_json(const numbers::Posterior& p) {
  return {{"posterior_log10_odds", log10_json(p.log10_odds)},
          {"posterior_probability", p.probability()},
          {"posterior_complement", p.complement()},
          {"posterior_log10_probability", log10_json(p.log10_probability)},
          {"posterior_log10_complement", log10_json(p.log10_complement)}};
}

// The LR of Hp against each alternative: {"id", "log10_lr", "interval_log10", "verbal", ...};
// "interval_log10" is null when the LR has no spread.
json by_alternative_json(const std::vector<evaluation::AlternativeEvaluation>& list) {
  json out = json::array();
  for (const auto& a : list) {
    json j = {{"id", a.id},
              {"log10_lr", log10_json(a.lr.log10())},
              {"lr_state", numbers::state_name(a.lr.state())},
              {"interval_log10", nullptr},
              {"verbal", a.verbal.sentence},
              {"verbal_label", a.verbal.label},
              {"favours", verbal::favours_name(a.verbal.favours)}};
    if (a.spread) j["interval_log10"] = {log10_json(a.spread->low_log10), log10_json(a.spread->high_log10)};
    out.push_back(std::move(j));
  }
  return out;
}

json compound_json(const casefile::Case& value, const evaluation::CompoundEvaluation& compound) {
  json weights = json::object();
  for (std::size_t i = 0; i < compound.weights.size(); ++i)
    weights[value.propositions.alternatives.at(i).id] = compound.weights[i];
  json j = {{"log10_lr", log10_json(compound.lr.log10())},
            {"lr_state", numbers::state_name(compound.lr.state())},
            {"interval_log10", nullptr},
            {"weights", weights},
            {"verbal", compound.verbal.sentence},
            {"verbal_label", compound.verbal.label},
            {"favours", verbal::favours_name(compound.verbal.favours)}};
  if (compound.spread) {
    j["interval_log10"] = {log10_json(compound.spread->low_log10), log10_json(compound.spread->high_log10)};
    j["median_log10"] = log10_json(compound.spread->median_log10);
    j["conservative_log10"] = log10_json(compound.spread->conservative_log10);
    j["uncertainty_method"] = compound.spread->method;
  }
  if (!compound.interval_note.empty()) j["interval_note"] = compound.interval_note;
  if (compound.without_unspecified) {
    j["without_unspecified_log10_lr"] = log10_json(compound.without_unspecified->log10());
    j["without_unspecified_note"] = "the compound LR against the alternatives not marked unspecified alone, their "
                                    "weights renormalised: the difference is what the unspecified alternatives change";
  }
  return j;
}

// Adds the per-alternative fields of an item or of the combination (a case with alternatives).
void put_alternatives(json& j, const casefile::Case& value, const std::vector<evaluation::AlternativeEvaluation>& list,
                      const std::optional<evaluation::CompoundEvaluation>& compound) {
  if (list.empty()) return;
  j["by_alternative"] = by_alternative_json(list);
  if (compound) j["compound"] = compound_json(value, *compound);
}

// With several alternatives, the fields of a two-proposition evaluation are of Hp against the
// first: "alternative" names it beside them (a two-proposition case has no such field).
void put_first_alternative(json& j, const casefile::Case& value) {
  if (value.propositions.has_alternatives()) j["alternative"] = value.propositions.alternatives.front().id;
}

// The case item an item's evaluation belongs to. evaluate_case keeps the case's order, so the
// item at the same position is checked first; looking each id up from the start instead made
// the output of a 10 000-item case grow with the square of the number of items.
const casefile::Item& evaluated_item(const casefile::Case& value, const evaluation::ItemEvaluation& item,
                                     std::size_t index) {
  if (index < value.items.size() && value.items[index].id == item.id) return value.items[index];
  const casefile::Item* found = value.find_item(item.id);
  if (!found) throw std::invalid_argument("evaluation_to_json: item " + item.id + " is not in the case");
  return *found;
}

}  // namespace

json warnings_to_json(const std::vector<guard::CaseWarning>& warnings) {
  json list = json::array();
  for (const auto& w : warnings) {
    json j = {{"item", w.item}, {"rule", w.rule}, {"severity", std::string(guard::severity_name(w.severity))},
              {"message", w.message}};
    if (!w.field.empty()) j["field"] = w.field;
    list.push_back(std::move(j));
  }
  return list;
}

json evaluation_to_json(const casefile::Case& value, const evaluation::CaseEvaluation& result,
                        const std::vector<guard::CaseWarning>& warnings) {
  json items = json::array();
  for (std::size_t index = 0; index < result.items.size(); ++index) {
    const auto& item = result.items[index];
    const casefile::Item& source = evaluated_item(value, item, index);
    json j = {{"id", item.id},
              {"log10_lr", log10_json(item.point.lr.log10())},
              {"lr", lr_json(item.point.lr)},
              {"lr_state", numbers::state_name(item.point.lr.state())},
              {"verbal", item.verbal.sentence},
              {"verbal_label", item.verbal.label},
              {"favours", verbal::favours_name(item.verbal.favours)},
              {"included", item.included},
              {"model", source.model_name},
              {"model_detail", item.point.detail}};
    if (item.point.log10_p_given_hp) j["p_given_hp"] = std::pow(10.0, *item.point.log10_p_given_hp);
    if (item.point.log10_p_given_hd) j["p_given_hd"] = std::pow(10.0, *item.point.log10_p_given_hd);
    if (!item.included) j["exclusion_reason"] = item.exclusion_reason;
    if (const auto files = source.model->data_files(); !files.empty()) {
      json list = json::array();
      for (const auto& f : files) list.push_back({{"field", f.field}, {"file", f.name}, {"bytes", f.bytes}, {"sha256", f.sha256}});
      j["data_files"] = std::move(list);
    }
    if (!item.point.notes.empty()) {
      json notes = json::array();
      for (const auto& note : item.point.notes) notes.push_back({{"code", note.code}, {"message", note.message}});
      j["notes"] = std::move(notes);
    }
    put_spread(j, item.spread);
    put_alternatives(j, value, item.by_alternative, item.compound);
    put_first_alternative(j, value);
    items.push_back(std::move(j));
  }
  const auto& c = result.combined;
  json combined = {{"log10_lr", log10_json(c.lr.log10())},
                   {"lr", lr_json(c.lr)},
                   {"lr_state", numbers::state_name(c.lr.state())},
                   {"verbal", c.verbal.sentence},
                   {"verbal_label", c.verbal.label},
                   {"favours", verbal::favours_name(c.verbal.favours)},
                   {"included", c.included_ids}};
  put_spread(combined, c.spread);
  put_alternatives(combined, value, c.by_alternative, c.compound);
  put_first_alternative(combined, value);
  if (c.monte_carlo_check) {
    json check;
    put_spread(check, c.monte_carlo_check);
    combined["monte_carlo_check"] = std::move(check);
  }
  json rows = json::array();
  for (const auto& row : result.sensitivity.rows) {
    json r = posterior_json(row.posterior);
    r["prior_odds"] = std::pow(10.0, row.prior.log10_prior_odds);
    r["prior_log10_odds"] = row.prior.log10_prior_odds;
    r["prior_origin"] = row.prior.origin;
    if (row.prior.one_of_n) r["one_of_n"] = *row.prior.one_of_n;
    if (row.at_low) r["band_low"] = posterior_json(*row.at_low);
    if (row.at_high) r["band_high"] = posterior_json(*row.at_high);
    rows.push_back(std::move(r));
  }
  json thresholds = json::array();
  for (const auto& t : result.sensitivity.thresholds) {
    json r = {{"threshold", t.threshold}, {"prior_log10_odds", log10_json(t.log10_prior_odds)}};
    if (t.log10_prior_odds_low_lr) r["prior_log10_odds_at_interval_low"] = log10_json(*t.log10_prior_odds_low_lr);
    if (t.log10_prior_odds_high_lr) r["prior_log10_odds_at_interval_high"] = log10_json(*t.log10_prior_odds_high_lr);
    thresholds.push_back(std::move(r));
  }
  json document = {{"case", value.details.reference},
          {"mode", std::string(casefile::mode_name(value.mode_or_default()))},
          {"verbal_scale", value.verbal_scale.name()},
          {"seed", value.uncertainty_or_default().seed_or_default()},
          {"items", std::move(items)},
          {"combined", std::move(combined)},
          {"sensitivity", std::move(rows)},
          {"sensitivity_note", "Posterior figures illustrate how the likelihood ratio would change prior odds held "
                               "by the fact-finder; the scientist proposes no prior."},
          {"thresholds", std::move(thresholds)},
          {"warnings", warnings_to_json(warnings)}};
  if (value.propositions.has_alternatives()) {
    json alternatives = json::array();
    for (const auto& a : value.propositions.alternatives) {
      json entry = {{"id", a.id}, {"text", a.text}, {"unspecified", a.is_unspecified()}};
      if (a.weight) entry["weight"] = *a.weight;
      alternatives.push_back(std::move(entry));
    }
    document["alternatives"] = std::move(alternatives);
    json over_set = json::array();
    for (const auto& row : result.over_set) {
      json r = {{"prior_odds", std::pow(10.0, row.prior.log10_prior_odds)},
                {"prior_log10_odds", row.prior.log10_prior_odds},
                {"prior_origin", row.prior.origin}};
      if (row.prior.one_of_n) r["one_of_n"] = *row.prior.one_of_n;
      json posteriors = json::array();
      for (std::size_t j = 0; j < row.posteriors.size(); ++j) {
        json p = posterior_json(row.posteriors[j]);
        p["id"] = j == 0 ? std::string(casefile::kHpId) : value.propositions.alternatives[j - 1].id;
        posteriors.push_back(std::move(p));
      }
      r["propositions"] = std::move(posteriors);
      over_set.push_back(std::move(r));
    }
    if (!result.over_set.empty()) {
      document["sensitivity_over_set"] = std::move(over_set);
      document["sensitivity_over_set_note"] =
          "Illustration only: how the likelihood ratios would change prior odds held by the fact-finder, over the "
          "whole set of propositions (Hp against all the alternatives together, the alternatives sharing the rest by "
          "the fact-finder's weights); posterior_complement is that of all the other propositions. The scientist "
          "proposes no prior and no weights.";
    }
    document["sensitivity_alternative"] = value.propositions.alternatives.front().id;
    document["alternatives_note"] = "With several alternatives, the fields of each item and of the combination outside "
                                    "by_alternative and compound are those of Hp against the alternative named by their "
                                    "\"alternative\" field, the first (" + value.propositions.alternatives.front().id +
                                    "), and so are sensitivity and thresholds (sensitivity_alternative).";
  }
  return document;
}

}  // namespace counterpoise::interchange
