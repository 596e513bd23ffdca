#pragma once
// The point evaluation the editor shows while the user types: the case read back through the
// core's reader (so every message is the core's), each item's point LR from its model, and the
// combined LR of the included items (core LikelihoodRatio multiplication: a sum of log10 LRs).
// Items the reader refuses are left out and marked, so one mistyped value does not blank the
// whole view. Cheap: no uncertainty, no prior sweep (those run in SpreadRunner).

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/casefile/case_model.hpp"
#include "core/models/evidence_model.hpp"
#include "core/numbers/likelihood_ratio.hpp"
#include "core/validation/input_error.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::editor {

struct ItemPoint {
  std::string id;
  bool evaluated = false;      // false when the core refused the item (see problems)
  bool included = true;
  models::PointResult point;   // meaningful when evaluated
  verbal::VerbalExpression verbal;
  // With several alternatives (when evaluated): the item's point result against each, in the
  // list's order, the first being `point`. Computed once per edit here, so the forms and the
  // result line read them instead of evaluating the models again at every render.
  std::vector<models::PointResult> by_alternative;
};

struct PointSnapshot {
  // The case as read, without the refused items; absent when the case as a whole cannot be read
  // (missing propositions, a bad section).
  std::optional<casefile::Case> evaluated_case;
  std::vector<validation::Problem> problems;  // every problem the core reported
  std::vector<ItemPoint> items;               // in document order
  std::optional<numbers::LikelihoodRatio> combined;  // against the first alternative
  verbal::VerbalExpression combined_verbal;
  // With several alternatives (when combined is given): the combined LR against each, in the
  // list's order, and against the weighted set when weights are given.
  std::vector<numbers::LikelihoodRatio> combined_by_alternative;
  std::optional<numbers::LikelihoodRatio> combined_compound;
  std::string combined_problem;               // why there is no combined LR
  std::vector<std::string> refused_items;     // ids of items left out because of problems

  const ItemPoint* item(const std::string& id) const;
  bool complete() const { return problems.empty(); }
};

// Reads `document` (relative paths against base_dir) and evaluates the point values. Never throws.
PointSnapshot evaluate_points(const nlohmann::json& document, const std::filesystem::path& base_dir);

}  // namespace counterpoise::editor
