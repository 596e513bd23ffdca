#include "core/interchange/evaluation_json.hpp"

#include <cmath>

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

const char* favours_name(verbal::Favours f) {
  switch (f) {
    case verbal::Favours::hp: return "hp";
    case verbal::Favours::hd: return "hd";
    case verbal::Favours::neither: break;
  }
  return "neither";
}

json posterior_json(const numbers::Posterior& p) {
  return {{"posterior_log10_odds", log10_json(p.log10_odds)},
          {"posterior_probability", p.probability()},
          {"posterior_complement", p.complement()},
          {"posterior_log10_probability", log10_json(p.log10_probability)},
          {"posterior_log10_complement", log10_json(p.log10_complement)}};
}

}  // namespace

json warnings_to_json(const std::vector<guard::CaseWarning>& warnings) {
  json list = json::array();
  for (const auto& w : warnings) {
    json j = {{"item", w.item}, {"rule", w.rule}, {"severity", std::string(guard::severity_name(w.severity))},
              {"message", w.message}};
    if (!w.field.empty()) j["field"] = w.field;
    list.push_back(j);
  }
  return list;
}

json evaluation_to_json(const casefile::Case& value, const evaluation::CaseEvaluation& result,
                        const std::vector<guard::CaseWarning>& warnings) {
  json items = json::array();
  for (const auto& item : result.items) {
    json j = {{"id", item.id},
              {"log10_lr", log10_json(item.point.lr.log10())},
              {"lr", lr_json(item.point.lr)},
              {"lr_state", numbers::state_name(item.point.lr.state())},
              {"verbal", item.verbal.sentence},
              {"verbal_label", item.verbal.label},
              {"favours", favours_name(item.verbal.favours)},
              {"included", item.included},
              {"model", value.find_item(item.id)->model_name},
              {"model_detail", item.point.detail}};
    if (item.point.log10_p_given_hp) j["p_given_hp"] = std::pow(10.0, *item.point.log10_p_given_hp);
    if (item.point.log10_p_given_hd) j["p_given_hd"] = std::pow(10.0, *item.point.log10_p_given_hd);
    if (!item.included) j["exclusion_reason"] = item.exclusion_reason;
    if (const auto files = value.find_item(item.id)->model->data_files(); !files.empty()) {
      json list = json::array();
      for (const auto& f : files) list.push_back({{"field", f.field}, {"file", f.name}, {"bytes", f.bytes}, {"sha256", f.sha256}});
      j["data_files"] = list;
    }
    if (!item.point.notes.empty()) {
      json notes = json::array();
      for (const auto& note : item.point.notes) notes.push_back({{"code", note.code}, {"message", note.message}});
      j["notes"] = notes;
    }
    put_spread(j, item.spread);
    items.push_back(j);
  }
  const auto& c = result.combined;
  json combined = {{"log10_lr", log10_json(c.lr.log10())},
                   {"lr", lr_json(c.lr)},
                   {"lr_state", numbers::state_name(c.lr.state())},
                   {"verbal", c.verbal.sentence},
                   {"verbal_label", c.verbal.label},
                   {"favours", favours_name(c.verbal.favours)},
                   {"included", c.included_ids}};
  put_spread(combined, c.spread);
  if (c.monte_carlo_check) {
    json check;
    put_spread(check, c.monte_carlo_check);
    combined["monte_carlo_check"] = check;
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
    rows.push_back(r);
  }
  json thresholds = json::array();
  for (const auto& t : result.sensitivity.thresholds) {
    json r = {{"threshold", t.threshold}, {"prior_log10_odds", log10_json(t.log10_prior_odds)}};
    if (t.log10_prior_odds_low_lr) r["prior_log10_odds_at_interval_low"] = log10_json(*t.log10_prior_odds_low_lr);
    if (t.log10_prior_odds_high_lr) r["prior_log10_odds_at_interval_high"] = log10_json(*t.log10_prior_odds_high_lr);
    thresholds.push_back(r);
  }
  return {{"case", value.details.reference},
          {"mode", std::string(casefile::mode_name(value.mode_or_default()))},
          {"verbal_scale", value.verbal_scale.name()},
          {"seed", value.uncertainty_or_default().seed_or_default()},
          {"items", items},
          {"combined", combined},
          {"sensitivity", rows},
          {"sensitivity_note", "Posterior figures illustrate how the likelihood ratio would change prior odds held "
                               "by the fact-finder; the scientist proposes no prior."},
          {"thresholds", thresholds},
          {"warnings", warnings_to_json(warnings)}};
}

}  // namespace counterpoise::interchange
