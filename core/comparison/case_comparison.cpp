#include "core/comparison/case_comparison.hpp"

#include <algorithm>
#include <stdexcept>

#include "core/comparison/band_move.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::comparison {

namespace {

// The combined point LR of a version: the product of its included items' LRs.
numbers::LikelihoodRatio combined_lr(const CaseVersion& version) {
  numbers::LikelihoodRatio combined = numbers::LikelihoodRatio::neutral();
  for (const auto& item : version.value.items) {
    if (!item.included()) continue;
    try {
      combined = combined * item.model->evaluate().lr;
    } catch (const std::invalid_argument&) {
      throw validation::InvalidValue(validation::Location{"combination", ""},
                                     version.label + ": one included item has LR zero and another an infinite LR; "
                                                     "the items contradict each other and cannot be combined");
    }
  }
  return combined;
}

VersionSummary summarize(const CaseVersion& version) {
  VersionSummary summary{version.label, version.sha256, combined_lr(version), {}};
  summary.verbal = version.value.verbal_scale.express(summary.combined_lr);
  return summary;
}

}  // namespace

bool CaseComparison::band_changes() const { return band_differs(a.verbal, b.verbal); }

bool CaseComparison::moves_any_conclusion(std::size_t k) const {
  if (moves_conclusion.at(k)) return true;
  const auto moves = [k](const AlternativeAttribution& against) { return against.moves_conclusion.at(k); };
  return std::any_of(alternatives.by_alternative.begin(), alternatives.by_alternative.end(), moves) ||
         (alternatives.compound && moves(*alternatives.compound));
}

std::vector<std::size_t> CaseComparison::movers_first() const {
  return comparison::movers_first(by_effect(), [this](std::size_t k) { return moves_any_conclusion(k); });
}

bool CaseComparison::propositions_differ() const {
  return std::any_of(differences.begin(), differences.end(), [](const Difference& d) {
    return d.kind == DifferenceKind::propositions;
  });
}

std::vector<std::size_t> CaseComparison::by_effect() const {
  std::vector<std::size_t> order(differences.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  return largest_share_first(std::move(order), effects);
}

double CaseComparison::sum_of_shares() const {
  std::vector<std::size_t> all(effects.size());
  for (std::size_t i = 0; i < all.size(); ++i) all[i] = i;
  return comparison::sum_of_shares(all, effects, total_change);
}

CaseComparison compare_cases(const CaseVersion& a, const CaseVersion& b) {
  CaseComparison result;
  result.a = summarize(a);
  result.b = summarize(b);
  result.total_change = Log10Change::between(result.a.combined_lr.log10(), result.b.combined_lr.log10());
  result.differences = list_differences(a, b);
  result.effects.assign(result.differences.size(), DifferenceEffect{});

  // The differences that enter the LR, item by item, in document order of their items.
  auto changed = changed_items(a, b, result.differences);
  for (auto& item : changed) {
    if (item.mixed) {
      result.items.push_back(attribute_item(*item.mixed, std::nullopt, item.id, result.effects));
      continue;
    }
    const bool added = b.value.find_item(item.id) != nullptr;
    const casefile::Item& held = *(added ? b : a).value.find_item(item.id);
    result.items.push_back(attribute_presence(item.id, held.model->evaluate().lr.log10(), held.included(), added,
                                              item.presence_index(result.differences), result.effects));
  }
  result.alternatives = compare_alternatives(a, b, result.differences, changed);
  result.wording = review_wording(a, b, result.differences);
  result.moves_conclusion.assign(result.differences.size(), false);
  for (std::size_t k = 0; k < result.differences.size(); ++k)
    result.moves_conclusion[k] = alone_moves_band(result.a.combined_lr.log10(), result.a.verbal,
                                                  result.effects[k].combined_alone, b.value.verbal_scale);
  return result;
}

}  // namespace counterpoise::comparison
