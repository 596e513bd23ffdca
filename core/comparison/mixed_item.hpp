#pragma once
// An item held by both versions, read with some of its changed members taken from the second
// version and the rest from the first: the coalitions of item_attribution's games. Mixing is
// done on the item's JSON and read through the model registry, so a new model needs nothing
// here. In a case with several alternatives to Hp the mixture is read with the alternatives'
// reader, giving the item's LR against each alternative: with the first version's alternatives
// when that reads, else with the second's (a member that names the alternatives, changed along
// with the list of alternatives).

#include <cstdint>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/comparison/case_differences.hpp"

namespace counterpoise::comparison {

// The players of one item: groups of difference indexes.
struct ItemPlayers {
  // Model inputs and data files, one player each; when the model itself changed, all of them
  // together are one player (the differences act as one).
  std::vector<std::vector<std::size_t>> model;
  std::optional<std::size_t> inclusion;  // the combination member, when inclusion changed

  int model_count() const { return static_cast<int>(model.size()); }
  int count() const { return model_count() + (inclusion ? 1 : 0); }
  // The differences of player `p` (the inclusion player is the last).
  std::vector<std::size_t> members(int p) const;
};

// The players of the item's differences `indexes` (all of one item, into `differences`).
ItemPlayers players_of(const std::vector<Difference>& differences, const std::vector<std::size_t>& indexes);

// Which LR of the item: its model (Hp against the first alternative, as the combined LR uses it)
// when empty, else the id of an alternative that both versions hold.
using LrTarget = std::optional<std::string>;

class MixedItem {
 public:
  // The item `item_id`, held by both versions, with its differences `indexes`.
  MixedItem(const CaseVersion& a, const CaseVersion& b, const std::string& item_id,
            const std::vector<Difference>& differences, const std::vector<std::size_t>& indexes);

  const ItemPlayers& players() const { return players_; }
  bool included_a() const { return included_a_; }
  bool included_b() const { return included_b_; }

  // The item's point log10 LR against `target` with the model players in `model_mask` (bit p:
  // player p from the second version); NaN for a mixture the model reader refuses or that has
  // no LR against `target`.
  double log10_lr(std::uint64_t model_mask, const LrTarget& target);
  // Its term in the combined log10 LR against `target` with the players in `mask` (the
  // inclusion player is the bit after the model players): the log10 LR when included, else 0.
  double term(std::uint64_t mask, const LrTarget& target);

 private:
  struct Values {
    double model = 0.0;                    // against the first alternative
    std::map<std::string, double> by_id;   // against each alternative ("Hd" in a two-proposition case)
  };
  Values read_mixture(std::uint64_t mask) const;
  const Values& values(std::uint64_t mask);

  const CaseVersion& a_;
  const CaseVersion& b_;
  nlohmann::json json_a_, json_b_;
  const std::vector<Difference>& differences_;
  ItemPlayers players_;
  bool included_a_ = true, included_b_ = true;
  std::uint64_t all_ = 0;
  std::map<std::uint64_t, Values> cache_;
};

// An item with differences that enter its LR, and those differences (in document order).
struct ChangedItem {
  std::string id;
  std::vector<std::size_t> indexes;
  std::unique_ptr<MixedItem> mixed;  // when both versions hold the item; else it was added or removed

  // The difference that adds or removes the item (when `mixed` is null).
  std::size_t presence_index(const std::vector<Difference>& differences) const;
};

// The items of `differences` that enter an LR, in document order of their items. The mixtures
// refer to `a`, `b` and `differences`, which must outlive them.
std::vector<ChangedItem> changed_items(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences);

}  // namespace counterpoise::comparison
