#pragma once
// One game's shares of a change of a log10 LR (or of an item's term in it), with the explicit
// states item_attribution.hpp describes: Shapley values when both ends and every mixture are
// finite, an equal split when some mixture is not (a unanimity game), and an infinite change
// given to the players that cause it.

#include <optional>
#include <string>
#include <vector>

#include "core/comparison/log10_change.hpp"
#include "core/comparison/shapley_values.hpp"

namespace counterpoise::comparison {

enum class AttributionMethod {
  single,     // one player: its share is the whole change
  exact,      // Shapley values over all coalitions
  sampled,    // Shapley values from seeded random orders (more than kExactShapleyPlayers players)
  joint,      // mixtures not finite or not readable: split equally
  infinite,   // an infinite (or no) change: to the players that cause it
  presence,   // an item added or removed: the whole term
};
std::string method_name(AttributionMethod method);

struct GameShares {
  Log10Change total;                 // v(N) - v(∅)
  std::vector<Log10Change> shares;   // one per player
  AttributionMethod method = AttributionMethod::single;
  std::string note;                  // how the shares were found, when not plainly
};

// The shares of the game of `players` players (0 .. kMaxShapleyPlayers) whose coalition values
// are `value` (NaN: a mixture that cannot be evaluated). Throws std::invalid_argument for more
// players than kMaxShapleyPlayers.
GameShares share_out(int players, const CoalitionValue& value);

// The change from `from` to `to`, or nullopt when either is NaN (a mixture that cannot be evaluated).
std::optional<Log10Change> known_change(double from, double to);

// `change` split into `parts` equal parts (an infinite change stays whole): the share of one of
// several differences that act as one player.
Log10Change part_of(const Log10Change& change, std::size_t parts);

}  // namespace counterpoise::comparison
