#include "app/editor/point_evaluation.hpp"

#include "core/numbers/compound_lr.hpp"

#include <algorithm>
#include <set>

#include "core/casefile/item_index.hpp"
#include "core/interchange/case_json.hpp"

namespace counterpoise::editor {

const ItemPoint* PointSnapshot::item(const std::string& id) const {
  for (const auto& entry : items)
    if (entry.id == id) return &entry;
  return nullptr;
}

namespace {

std::string id_of(const nlohmann::json& item) {
  if (item.is_object()) {
    auto it = item.find("id");
    if (it != item.end() && it->is_string()) return it->get<std::string>();
  }
  return {};
}

// Whether an item's file says it is left out of the combination ("combination": {"included":
// false}), read from the JSON so that an item the core refused still shows as left out.
bool left_out(const nlohmann::json& item) {
  if (!item.is_object()) return false;
  const auto combination = item.find("combination");
  if (combination == item.end() || !combination->is_object()) return false;
  const auto included = combination->find("included");
  return included != combination->end() && included->is_boolean() && !included->get<bool>();
}

}  // namespace

PointSnapshot evaluate_points(const nlohmann::json& document, const std::filesystem::path& base_dir) {
  PointSnapshot snapshot;
  auto first = interchange::read_case(document, base_dir);
  snapshot.problems = first.diagnostics.problems();

  std::optional<casefile::Case> value = std::move(first.value);
  if (!value && document.is_object() && document.contains("items") && document["items"].is_array()) {
    // Leave out the items the core refused and read the rest again.
    std::set<std::string> refused;
    for (const auto& problem : snapshot.problems) refused.insert(problem.where.item);
    nlohmann::json reduced = document;
    nlohmann::json kept = nlohmann::json::array();
    std::size_t index = 0;
    for (const auto& item : document["items"]) {
      ++index;
      const std::string id = id_of(item);
      if (refused.count(id) || refused.count("#" + std::to_string(index))) {
        snapshot.refused_items.push_back(id);
        continue;
      }
      kept.push_back(item);
    }
    if (!kept.empty() && !snapshot.refused_items.empty()) {
      reduced["items"] = std::move(kept);
      value = interchange::read_case(reduced, base_dir).value;
    }
  }

  if (document.is_object() && document.contains("items") && document["items"].is_array()) {
    // One pass over the items, not a scan of them per item.
    const std::optional<casefile::ItemIndex> index = value ? std::optional<casefile::ItemIndex>(*value) : std::nullopt;
    for (const auto& body : document["items"]) {
      ItemPoint entry;
      entry.id = id_of(body);
      entry.included = !left_out(body);
      if (index) {
        if (const auto* item = index->find(entry.id)) {
          entry.included = item->included();
          try {
            entry.point = item->model->evaluate();
            entry.verbal = value->verbal_scale.express(entry.point.lr);
            // The model read for the first alternative is the item's own model (case_json).
            if (!item->alternative_models.empty()) entry.by_alternative.push_back(entry.point);
            for (std::size_t i = 1; i < item->alternative_models.size(); ++i)
              entry.by_alternative.push_back(item->alternative_models[i]->evaluate());
            entry.evaluated = true;
          } catch (const std::exception& error) {
            snapshot.problems.push_back({validation::Location{entry.id, ""}, error.what()});
          }
        }
      }
      snapshot.items.push_back(std::move(entry));
    }
  }

  if (!value) {
    snapshot.combined_problem = "The case cannot be evaluated until the problems marked in the forms are corrected.";
  } else if (std::any_of(snapshot.items.begin(), snapshot.items.end(), [&](const ItemPoint& entry) {
               return entry.included && std::find(snapshot.refused_items.begin(), snapshot.refused_items.end(), entry.id) !=
                                            snapshot.refused_items.end();
             })) {
    // A refused item left out of the combination does not stop it: only included ones do.
    snapshot.combined_problem = "Not combined: some items have problems (marked in their forms).";
  } else {
    numbers::LikelihoodRatio combined = numbers::LikelihoodRatio::neutral();
    try {
      for (const auto& entry : snapshot.items)
        if (entry.evaluated && entry.included) combined = combined * entry.point.lr;
      snapshot.combined = combined;
      snapshot.combined_verbal = value->verbal_scale.express(combined);
      if (value->propositions.has_alternatives()) {
        // Independent items multiply under each proposition: against each alternative, the
        // product of the included items' LRs against it (as evaluate_case combines them).
        const std::size_t count = value->propositions.alternatives.size();
        std::vector<numbers::LikelihoodRatio> by_alternative(count, numbers::LikelihoodRatio::neutral());
        for (const auto& entry : snapshot.items) {
          if (!entry.evaluated || !entry.included) continue;
          for (std::size_t i = 0; i < count && i < entry.by_alternative.size(); ++i)
            by_alternative[i] = by_alternative[i] * entry.by_alternative[i].lr;
        }
        if (const auto weights = value->propositions.normalised_weights())
          snapshot.combined_compound = numbers::compound_lr(by_alternative, *weights);
        snapshot.combined_by_alternative = std::move(by_alternative);
      }
    } catch (const std::exception&) {
      snapshot.combined_problem =
          "Not combined: one included item has LR zero and another an infinite LR; the items contradict each other.";
    }
  }
  snapshot.evaluated_case = std::move(value);
  return snapshot;
}

}  // namespace counterpoise::editor
