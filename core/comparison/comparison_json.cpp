#include "core/comparison/comparison_json.hpp"

#include <cmath>

namespace counterpoise::comparison {

using nlohmann::json;

namespace {

// A log10 value, or null for ±inf (JSON has no infinity; the state member says which).
json log10_or_null(double log10) { return std::isfinite(log10) ? json(log10) : json(nullptr); }

json change_json(const std::optional<Log10Change>& change) {
  if (!change) return nullptr;
  return change->is_finite() ? json(change->log10) : json(nullptr);
}

json version_json(const VersionSummary& v) {
  return {{"label", v.label},
          {"sha256", v.sha256},
          {"log10_lr", log10_or_null(v.combined_lr.log10())},
          {"lr_state", numbers::state_name(v.combined_lr.state())},
          {"verbal", v.verbal.label}};
}

json files_json(const std::vector<DataFileChange>& files) {
  json list = json::array();
  const auto use_json = [](const std::optional<models::DataFileUse>& use) -> json {
    if (!use) return nullptr;
    return {{"name", use->name}, {"sha256", use->sha256}, {"bytes", use->bytes}};
  };
  for (const auto& f : files) list.push_back({{"field", f.field}, {"old", use_json(f.old_use)}, {"new", use_json(f.new_use)}});
  return list;
}

json difference_json(const Difference& d, const DifferenceEffect& e) {
  json entry = {{"kind", kind_name(d.kind)},
                {"path", {{"section", d.path.section}, {"item", d.path.item_id}, {"field", d.path.field}}},
                {"place", d.place},
                {"old", d.old_value ? *d.old_value : json(nullptr)},
                {"new", d.new_value ? *d.new_value : json(nullptr)},
                {"old_present", d.old_value.has_value()},
                {"new_present", d.new_value.has_value()},
                {"enters_lr", d.enters_lr()},
                {"effect_log10", change_json(e.combined_share)},
                {"effect_state", state_name(e.combined_share.state)},
                {"item_effect_log10", change_json(e.item_share)},
                {"alone_log10", change_json(e.combined_alone)},
                {"item_alone_log10", change_json(e.item_alone)}};
  if (!e.note.empty()) entry["note"] = e.note;
  if (!d.files.empty()) entry["files"] = files_json(d.files);
  return entry;
}

json flags_json(const std::vector<WordingFlag>& flags) {
  json list = json::array();
  for (const auto& f : flags)
    list.push_back({{"rule_id", f.rule_id},
                    {"family", f.family_name},
                    {"severity", f.severity},
                    {"assertion", f.assertion},
                    {"wording", f.matched_text},
                    {"explanation", f.explanation}});
  return list;
}

json item_json(const ItemAttribution& item) {
  json entry = {{"id", item.item_id},
                {"included_a", item.included_a},
                {"included_b", item.included_b},
                {"change_log10", change_json(item.combined_change)},
                {"change_state", state_name(item.combined_change.state)},
                {"method", method_name(item.method)},
                {"players", item.players}};
  entry["log10_lr_a"] = item.log10_lr_a ? log10_or_null(*item.log10_lr_a) : json(nullptr);
  entry["log10_lr_b"] = item.log10_lr_b ? log10_or_null(*item.log10_lr_b) : json(nullptr);
  entry["item_change_log10"] = change_json(item.item_change);
  return entry;
}

// "finite", "zero" or "infinite" for a log10 LR.
std::string lr_state_of(double log10) {
  if (std::isfinite(log10)) return "finite";
  return log10 < 0 ? "zero" : "infinite";
}

json alternative_json(const AlternativeAttribution& against, const std::vector<Difference>& differences) {
  json entry = {{"id", against.id}, {"in_a", against.in_a()}, {"in_b", against.in_b()}, {"attributed", against.attributed}};
  for (const auto& [side, log10] : {std::pair{"a", against.log10_lr_a}, std::pair{"b", against.log10_lr_b}}) {
    entry[std::string("log10_lr_") + side] = log10 ? log10_or_null(*log10) : json(nullptr);
    entry[std::string("lr_state_") + side] = log10 ? json(lr_state_of(*log10)) : json(nullptr);
  }
  const bool both = against.in_a() && against.in_b();
  entry["total_change_log10"] = both ? change_json(against.total_change) : json(nullptr);
  entry["total_change_state"] = both ? json(state_name(against.total_change.state)) : json(nullptr);
  for (const auto& [side, words] : {std::pair{"a", &against.verbal_a}, std::pair{"b", &against.verbal_b}}) {
    entry[std::string("verbal_") + side] = *words ? json((*words)->label) : json(nullptr);
    entry[std::string("favours_") + side] = *words ? json(verbal::favours_name((*words)->favours)) : json(nullptr);
  }
  entry["band_changes"] = against.band_changes();
  if (against.attributed) entry["method"] = method_name(against.method);
  if (!against.note.empty()) entry["note"] = against.note;
  json effects = json::array();
  for (std::size_t k : against.movers_first()) {
    const Difference& d = differences[k];
    const DifferenceEffect& e = against.effects[k];
    json effect = {{"path", {{"section", d.path.section}, {"item", d.path.item_id}, {"field", d.path.field}}},
                   {"place", d.place},
                   {"effect_log10", change_json(e.combined_share)},
                   {"effect_state", state_name(e.combined_share.state)},
                   {"alone_log10", change_json(e.combined_alone)},
                   {"moves_conclusion", static_cast<bool>(against.moves_conclusion.at(k))}};
    if (!e.note.empty()) effect["note"] = e.note;
    effects.push_back(std::move(effect));
  }
  entry["effects"] = effects;
  return entry;
}

}  // namespace

json comparison_to_json(const CaseComparison& comparison) {
  json document = {{"format", kComparisonFormatName},
                   {"version", kComparisonFormatVersion},
                   {"a", version_json(comparison.a)},
                   {"b", version_json(comparison.b)},
                   {"log10_lr_a", log10_or_null(comparison.a.combined_lr.log10())},
                   {"log10_lr_b", log10_or_null(comparison.b.combined_lr.log10())},
                   {"total_change_log10", change_json(comparison.total_change)},
                   {"total_change_state", state_name(comparison.total_change.state)},
                   {"band_changes", comparison.band_changes()},
                   {"propositions_differ", comparison.propositions_differ()}};
  json differences = json::array();
  for (std::size_t k : comparison.movers_first()) {
    json entry = difference_json(comparison.differences[k], comparison.effects[k]);
    entry["moves_conclusion"] = static_cast<bool>(comparison.moves_conclusion.at(k));
    entry["moves_any_conclusion"] = comparison.moves_any_conclusion(k);
    if (!comparison.alternatives.by_alternative.empty()) {
      json moved = json::array();
      for (const auto& against : comparison.alternatives.by_alternative)
        if (against.moves_conclusion.at(k)) moved.push_back(against.id);
      entry["moves_alternatives"] = moved;
    }
    if (comparison.alternatives.compound)
      entry["moves_compound"] = static_cast<bool>(comparison.alternatives.compound->moves_conclusion.at(k));
    if (const auto& review = comparison.wording.by_difference.at(k))
      entry["guard"] = {{"a", flags_json(review->a)}, {"b", flags_json(review->b)}};
    differences.push_back(std::move(entry));
  }
  document["differences"] = differences;
  json items = json::array();
  for (const auto& item : comparison.items) items.push_back(item_json(item));
  document["items"] = items;
  if (!comparison.alternatives.by_alternative.empty()) {
    json by_alternative = json::array();
    for (const auto& against : comparison.alternatives.by_alternative)
      by_alternative.push_back(alternative_json(against, comparison.differences));
    document["by_alternative"] = by_alternative;
  }
  if (comparison.alternatives.compound)
    document["compound"] = alternative_json(*comparison.alternatives.compound, comparison.differences);
  if (!comparison.wording.not_checked.empty()) document["wording_not_checked"] = comparison.wording.not_checked;
  return document;
}

}  // namespace counterpoise::comparison
