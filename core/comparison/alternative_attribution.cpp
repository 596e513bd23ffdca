#include "core/comparison/alternative_attribution.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <stdexcept>

#include "core/comparison/band_move.hpp"
#include "core/numbers/compound_lr.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::comparison {

namespace {

// The combined point log10 LR of `version` against its alternative `index`: the sum of its
// included items' log10 LRs against it.
double combined_log10_against(const CaseVersion& version, std::size_t index) {
  numbers::LikelihoodRatio combined = numbers::LikelihoodRatio::neutral();
  for (const auto& item : version.value.items) {
    if (!item.included()) continue;
    try {
      combined = combined * item.model_against(index).evaluate().lr;
    } catch (const std::invalid_argument&) {
      throw validation::InvalidValue(
          validation::Location{"combination", ""},
          version.label + ": against " + version.value.propositions.alternative_ids().at(index) +
              ", one included item has LR zero and another an infinite LR; the items contradict each other and "
              "cannot be combined");
    }
  }
  return combined.log10();
}

std::optional<std::size_t> index_of(const std::vector<std::string>& ids, const std::string& id) {
  const auto found = std::find(ids.begin(), ids.end(), id);
  if (found == ids.end()) return std::nullopt;
  return static_cast<std::size_t>(found - ids.begin());
}

// The item's log10 LR against alternative `id` in `version` (which holds both).
double item_log10_against(const CaseVersion& version, const std::string& item_id, const std::string& id) {
  const auto ids = version.value.propositions.alternative_ids();
  return version.value.find_item(item_id)->model_against(*index_of(ids, id)).evaluate().lr.log10();
}

bool item_included(const CaseVersion& version, const std::string& item_id) {
  return version.value.find_item(item_id)->included();
}

// The change against alternative `id`, held by both versions: item by item, as the combined LR's.
void attribute_against(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences,
                       std::vector<ChangedItem>& items, AlternativeAttribution& out) {
  out.attributed = true;
  out.total_change = Log10Change::between(*out.log10_lr_a, *out.log10_lr_b);
  for (auto& item : items) {
    if (item.mixed) {
      attribute_item(*item.mixed, out.id, item.id, out.effects);
    } else {
      const bool added = b.value.find_item(item.id) != nullptr;
      const CaseVersion& holder = added ? b : a;
      attribute_presence(item.id, item_log10_against(holder, item.id, out.id), item_included(holder, item.id), added,
                         item.presence_index(differences), out.effects);
    }
    for (std::size_t k : item.indexes) out.entering.push_back(k);
  }
  std::sort(out.entering.begin(), out.entering.end());
}

// The normalised weights of `version` by alternative id; nullopt when it gives none.
std::optional<std::map<std::string, double>> weights_by_id(const CaseVersion& version) {
  const auto weights = version.value.propositions.normalised_weights();
  if (!weights || !version.value.propositions.has_alternatives()) return std::nullopt;
  std::map<std::string, double> by_id;
  const auto ids = version.value.propositions.alternative_ids();
  for (std::size_t i = 0; i < ids.size(); ++i) by_id[ids[i]] = (*weights)[i];
  return by_id;
}

double compound_log10_of(const CaseVersion& version) {
  const auto& propositions = version.value.propositions;
  std::vector<double> log10_pairwise;
  for (std::size_t i = 0; i < propositions.alternatives.size(); ++i) log10_pairwise.push_back(combined_log10_against(version, i));
  const auto weights = propositions.normalised_weights();
  std::vector<double> log10_weights;
  for (double w : *weights) log10_weights.push_back(std::log10(w));
  return numbers::compound_log10_lr(log10_pairwise, log10_weights);
}

// The game of the compound log10 LR: every player of every changed item, then the weights.
class CompoundGame {
 public:
  CompoundGame(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences,
               std::vector<ChangedItem>& items, std::optional<std::size_t> weights_player)
      : ids_(a.value.propositions.alternative_ids()) {
    const auto weights_a = *weights_by_id(a), weights_b = *weights_by_id(b);
    for (const auto& id : ids_) {
      log10_weights_a_.push_back(std::log10(weights_a.at(id)));
      log10_weights_b_.push_back(std::log10(weights_b.at(id)));
    }
    // The items without a difference that enters the LR are the same in both versions.
    std::vector<std::string> changed;
    for (const auto& item : items) changed.push_back(item.id);
    base_.assign(ids_.size(), 0.0);
    for (const auto& item : a.value.items) {
      if (!item.included() || std::find(changed.begin(), changed.end(), item.id) != changed.end()) continue;
      for (std::size_t j = 0; j < ids_.size(); ++j) base_[j] += item.model_against(j).evaluate().lr.log10();
    }
    for (auto& item : items) {
      Part part{&item, players_, item.mixed ? item.mixed->players().count() : 1, {}};
      if (!item.mixed) {
        const bool added = b.value.find_item(item.id) != nullptr;
        const CaseVersion& holder = added ? b : a;
        for (const auto& id : ids_) {
          const double term = item_included(holder, item.id) ? item_log10_against(holder, item.id, id) : 0.0;
          part.presence_terms.push_back(added ? std::pair{0.0, term} : std::pair{term, 0.0});
        }
      }
      for (int p = 0; p < part.count; ++p)
        members_.push_back(item.mixed ? item.mixed->players().members(p)
                                      : std::vector<std::size_t>{item.presence_index(differences)});
      players_ += part.count;
      parts_.push_back(std::move(part));
    }
    if (weights_player) {
      weights_bit_ = players_++;
      members_.push_back({*weights_player});
    }
  }

  int players() const { return players_; }
  const std::vector<std::size_t>& members(int p) const { return members_[static_cast<std::size_t>(p)]; }

  double value(std::uint64_t mask) {
    std::vector<double> log10_lrs = base_;
    for (const auto& part : parts_) {
      const std::uint64_t local = (mask >> part.first) & ((std::uint64_t{1} << part.count) - 1);
      for (std::size_t j = 0; j < ids_.size(); ++j)
        log10_lrs[j] += part.item->mixed ? part.item->mixed->term(local, ids_[j])
                                         : (local ? part.presence_terms[j].second : part.presence_terms[j].first);
    }
    const bool weights_from_b = weights_bit_ && (mask >> *weights_bit_) & 1;
    return numbers::compound_log10_lr(log10_lrs, weights_from_b ? log10_weights_b_ : log10_weights_a_);
  }

 private:
  struct Part {
    ChangedItem* item;
    int first;  // its first player
    int count;
    std::vector<std::pair<double, double>> presence_terms;  // added or removed: its term in A and in B
  };
  std::vector<std::string> ids_;
  std::vector<double> base_, log10_weights_a_, log10_weights_b_;
  std::vector<Part> parts_;
  std::vector<std::vector<std::size_t>> members_;
  int players_ = 0;
  std::optional<int> weights_bit_;
};

// The difference that changed the list of alternatives, when it changed their weights.
std::optional<std::size_t> weights_difference(const CaseVersion& a, const CaseVersion& b,
                                              const std::vector<Difference>& differences) {
  if (weights_by_id(a) == weights_by_id(b)) return std::nullopt;
  for (std::size_t k = 0; k < differences.size(); ++k)
    if (differences[k].path.section == "propositions" && differences[k].path.field == "alternatives") return k;
  return std::nullopt;
}

AlternativeAttribution compound_of(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences,
                                   std::vector<ChangedItem>& items) {
  AlternativeAttribution out;
  out.id = kCompoundId;
  out.effects.assign(differences.size(), DifferenceEffect{});
  const auto weights_a = weights_by_id(a), weights_b = weights_by_id(b);
  if (weights_a) out.log10_lr_a = compound_log10_of(a);
  if (weights_b) out.log10_lr_b = compound_log10_of(b);
  if (!weights_a || !weights_b) {
    out.note = std::string("only version ") + (weights_a ? "A" : "B") +
               " gives weights to its alternatives: the compound LR has no value in the other";
    return out;
  }
  out.total_change = Log10Change::between(*out.log10_lr_a, *out.log10_lr_b);
  std::vector<std::string> ids_a, ids_b;
  for (const auto& [id, _] : *weights_a) ids_a.push_back(id);
  for (const auto& [id, _] : *weights_b) ids_b.push_back(id);
  if (ids_a != ids_b) {
    out.note = "the two versions weigh different sets of alternatives: their compound LRs are against different "
               "sets and the change is not shared out";
    return out;
  }
  CompoundGame game(a, b, differences, items, weights_difference(a, b, differences));
  if (game.players() > kMaxShapleyPlayers) {
    out.note = "more than " + std::to_string(kMaxShapleyPlayers) +
               " changes enter the compound LR: the change is not shared out (see the LR against each alternative)";
    return out;
  }
  out.attributed = true;
  const CoalitionValue value = [&](std::uint64_t mask) { return game.value(mask); };
  const GameShares shares = share_out(game.players(), value);
  out.method = game.players() == 1 ? AttributionMethod::single : shares.method;
  out.note = shares.note;
  for (int p = 0; p < game.players(); ++p) {
    const auto& members = game.members(p);
    const auto alone = known_change(value(0), value(std::uint64_t{1} << p));
    for (std::size_t k : members) {
      out.effects[k].combined_alone = alone;
      out.effects[k].combined_share = part_of(shares.shares[static_cast<std::size_t>(p)], members.size());
      if (members.size() > 1) out.effects[k].note = "the model changed: its inputs are counted together and share the effect equally";
      out.entering.push_back(k);
    }
  }
  std::sort(out.entering.begin(), out.entering.end());
  return out;
}

}  // namespace

std::vector<std::size_t> AlternativeAttribution::by_effect() const { return largest_share_first(entering, effects); }

double AlternativeAttribution::sum_of_shares() const { return comparison::sum_of_shares(entering, effects, total_change); }

namespace {

// The LR's verbal expression in each version, and which differences alone would change A's.
void add_words(const CaseVersion& a, const CaseVersion& b, AlternativeAttribution& against) {
  if (against.log10_lr_a) against.verbal_a = words_for_log10(a.value.verbal_scale, *against.log10_lr_a);
  if (against.log10_lr_b) against.verbal_b = words_for_log10(b.value.verbal_scale, *against.log10_lr_b);
  against.moves_conclusion.assign(against.effects.size(), false);
  if (!against.attributed || !against.verbal_a || !against.verbal_b) return;
  for (std::size_t k : against.entering)
    against.moves_conclusion[k] = alone_moves_band(*against.log10_lr_a, *against.verbal_a,
                                                   against.effects[k].combined_alone, b.value.verbal_scale);
}

}  // namespace

bool AlternativeAttribution::band_changes() const { return verbal_a && verbal_b && band_differs(*verbal_a, *verbal_b); }

std::vector<std::size_t> AlternativeAttribution::movers_first() const {
  return comparison::movers_first(by_effect(), [this](std::size_t k) { return moves_conclusion.at(k); });
}

AlternativesComparison compare_alternatives(const CaseVersion& a, const CaseVersion& b,
                                            const std::vector<Difference>& differences,
                                            std::vector<ChangedItem>& items) {
  AlternativesComparison result;
  const auto& pa = a.value.propositions;
  const auto& pb = b.value.propositions;
  if (!pa.has_alternatives() && !pb.has_alternatives()) return result;
  const auto ids_a = pa.alternative_ids(), ids_b = pb.alternative_ids();
  std::vector<std::string> ids = ids_a;
  for (const auto& id : ids_b)
    if (!index_of(ids, id)) ids.push_back(id);
  for (const auto& id : ids) {
    AlternativeAttribution against;
    against.id = id;
    against.effects.assign(differences.size(), DifferenceEffect{});
    if (const auto i = index_of(ids_a, id)) against.log10_lr_a = combined_log10_against(a, *i);
    if (const auto i = index_of(ids_b, id)) against.log10_lr_b = combined_log10_against(b, *i);
    if (against.in_a() && against.in_b()) attribute_against(a, b, differences, items, against);
    else against.note = std::string("an alternative only in version ") + (against.in_a() ? "A" : "B") + ": not attributed";
    add_words(a, b, against);
    result.by_alternative.push_back(std::move(against));
  }
  if (pa.normalised_weights() || pb.normalised_weights()) {
    result.compound = compound_of(a, b, differences, items);
    add_words(a, b, *result.compound);
  }
  return result;
}

}  // namespace counterpoise::comparison
