#pragma once
// The Shapley value of a cooperative game (Shapley 1953, "A value for n-person games", in
// Contributions to the Theory of Games II, Annals of Mathematics Studies 28, pp. 307-317):
//
//   phi_i = sum over S ⊆ N \ {i} of  |S|! (n - |S| - 1)! / n!  ·  (v(S ∪ {i}) - v(S))
//
// the average, over every order in which the players could join, of what player i adds when it
// joins. The values add up to v(N) - v(∅) whatever the game ("efficiency"), which is why the
// comparison of two case versions uses them: the players are the inputs that differ, v(S) is the
// log10 LR with the inputs in S taken from the second version and the rest from the first, and
// the shares of the changes add up exactly to the change of the LR even when the inputs interact.

#include <cstdint>
#include <functional>
#include <vector>

namespace counterpoise::comparison {

// The value of the coalition whose members are the set bits of `mask` (bit i: player i).
using CoalitionValue = std::function<double(std::uint64_t mask)>;

// Up to this many players the values are computed exactly over all 2^n coalitions.
inline constexpr int kExactShapleyPlayers = 12;
// Beyond it: this many seeded random orders, each also taken in reverse (so 2 × this many).
inline constexpr int kSampledShapleyOrders = 1000;
// The most players a game may have (coalitions are 64-bit masks).
inline constexpr int kMaxShapleyPlayers = 64;

struct ShapleyValues {
  std::vector<double> values;  // one per player
  bool exact = true;           // false: the mean over sampled orders
  int orders = 0;              // orders averaged when sampled (each order and its reverse)
};

// The exact Shapley values of the game of `players` players whose coalition values are given for
// every mask 0 .. 2^players - 1 (value_by_mask[mask] = v(mask)). Throws std::invalid_argument
// when players is not 0 .. kExactShapleyPlayers or the table has not 2^players entries.
std::vector<double> exact_shapley_values(int players, const std::vector<double>& value_by_mask);

// The mean of each player's marginal contribution over `orders` random orders of the players
// (std::mt19937_64 from `seed`) and their reverses. Every order's contributions add up to
// v(N) - v(∅), so the means do too: the estimate is exactly efficient, only the split between
// players is estimated (the permutation-sampling estimator of Castro, Gómez & Tejada 2009,
// Computers & Operations Research 36:1726-1730 — from memory). Throws std::invalid_argument when
// players is not 0 .. kMaxShapleyPlayers or orders < 1.
std::vector<double> sampled_shapley_values(int players, const CoalitionValue& value, int orders, std::uint64_t seed);

// Exact for up to kExactShapleyPlayers players, else sampled with kSampledShapleyOrders orders
// and a fixed seed (so the same game gives the same values every time). Throws as above.
ShapleyValues shapley_values(int players, const CoalitionValue& value);

}  // namespace counterpoise::comparison
