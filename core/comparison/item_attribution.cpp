#include "core/comparison/item_attribution.hpp"

#include <algorithm>

namespace counterpoise::comparison {

std::vector<std::size_t> largest_share_first(std::vector<std::size_t> indexes, const std::vector<DifferenceEffect>& effects) {
  std::stable_sort(indexes.begin(), indexes.end(), [&](std::size_t x, std::size_t y) {
    return effects[x].combined_share.size() > effects[y].combined_share.size();
  });
  return indexes;
}

double sum_of_shares(const std::vector<std::size_t>& indexes, const std::vector<DifferenceEffect>& effects,
                     const Log10Change& total) {
  if (!total.is_finite()) return total.value();
  double sum = 0.0;
  for (std::size_t k : indexes) sum += effects[k].combined_share.value();
  return sum;
}

ItemAttribution attribute_presence(const std::string& item_id, double log10_lr, bool included, bool added,
                                   std::size_t index, std::vector<DifferenceEffect>& effects) {
  ItemAttribution result;
  result.item_id = item_id;
  (added ? result.log10_lr_b : result.log10_lr_a) = log10_lr;
  (added ? result.included_b : result.included_a) = included;
  const double term = included ? log10_lr : 0.0;
  result.combined_change = added ? Log10Change::between(0.0, term) : Log10Change::between(term, 0.0);
  result.method = AttributionMethod::presence;
  result.players = 1;
  auto& effect = effects[index];
  effect.combined_alone = result.combined_change;
  effect.combined_share = result.combined_change;
  if (!included) effect.note = "left out of the combined LR in the version that has it";
  return result;
}

ItemAttribution attribute_item(MixedItem& mixed, const LrTarget& target, const std::string& item_id,
                               std::vector<DifferenceEffect>& effects) {
  const ItemPlayers& players = mixed.players();
  const int model_players = players.model_count();
  const int all_players = players.count();
  const std::uint64_t all_model = model_players == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << model_players) - 1;
  ItemAttribution result;
  result.item_id = item_id;
  result.log10_lr_a = mixed.log10_lr(0, target);
  result.log10_lr_b = mixed.log10_lr(all_model, target);
  result.included_a = mixed.included_a();
  result.included_b = mixed.included_b();
  result.players = all_players;
  result.item_change = Log10Change::between(*result.log10_lr_a, *result.log10_lr_b);

  // The item's own LR: the model players only; its term in the combined LR: the inclusion
  // player is the last bit.
  const CoalitionValue item_value = [&](std::uint64_t mask) { return mixed.log10_lr(mask, target); };
  const CoalitionValue term_value = [&](std::uint64_t mask) { return mixed.term(mask, target); };
  const GameShares item_shares = share_out(model_players, item_value);
  const GameShares term_shares = share_out(all_players, term_value);
  result.combined_change = term_shares.total;
  result.method = all_players == 1 ? AttributionMethod::single : term_shares.method;

  for (int p = 0; p < all_players; ++p) {
    const std::uint64_t bit = std::uint64_t{1} << p;
    const bool is_model = p < model_players;
    const std::vector<std::size_t> members = players.members(p);
    const auto item_alone = is_model ? known_change(item_value(0), item_value(bit)) : std::nullopt;
    const auto term_alone = known_change(term_value(0), term_value(bit));
    // A player of several differences (a changed model with its inputs) shares equally among
    // them: the differences act as one.
    for (std::size_t k : members) {
      DifferenceEffect& effect = effects[k];
      if (is_model) {
        effect.item_alone = item_alone;
        effect.item_share = part_of(item_shares.shares[static_cast<std::size_t>(p)], members.size());
      }
      effect.combined_alone = term_alone;
      effect.combined_share = part_of(term_shares.shares[static_cast<std::size_t>(p)], members.size());
      effect.note = term_shares.note.empty() && is_model ? item_shares.note : term_shares.note;
      if (members.size() > 1)
        effect.note = "the model changed: its inputs are counted together and share the effect equally";
      if (!is_model && !item_alone && !term_alone)
        effect.note = "cannot be evaluated alone";
    }
  }
  return result;
}

}  // namespace counterpoise::comparison
