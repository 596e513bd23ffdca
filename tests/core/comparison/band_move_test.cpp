// Whether a difference alone moves an LR's verbal expression: edge cases of the move (none, zero,
// infinite, undefined) and the band edges of a published scale.
#include <cmath>
#include <limits>

#include <catch2/catch.hpp>

#include "core/comparison/band_move.hpp"

using namespace counterpoise::comparison;
using counterpoise::verbal::Favours;
using counterpoise::verbal::VerbalScale;

namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();

}  // namespace

TEST_CASE("a move alone changes the band at the published edges 10^3 and 10^4", "[comparison][verbal]") {
  // ENFSI (2015) guideline, table of verbal equivalents: 100-1000 moderately strong, 1000-10000
  // strong, 10000-1000000 very strong support; each band includes its lower edge (our
  // convention, docs/methods.md); the edges at 10^3 and 10^4 are confirmed in secondary sources
  // (tests/core/verbal/verbal_scale_test.cpp).
  const VerbalScale scale = VerbalScale::enfsi_2015();
  const double from = 2.5;  // LR 316: moderately strong support
  const auto words = words_for_log10(scale, from);
  REQUIRE(words.label == "moderately strong support");
  const auto [change, moves] = GENERATE(table<double, bool>({
      {0.5, true},            // to 10^3, on the edge: strong support
      {0.5 - 1e-9, false},    // just below 10^3 (relative 2.3e-9, beyond the 1e-12 of reaches_edge)
      {1.5, true},            // to 10^4: very strong support
      {-0.5, false},          // to 10^2, on the lower edge: still moderately strong
      {-0.5 - 1e-9, true},    // just below 10^2: moderate support
      {-2.5, true},           // to LR 1: no appreciable support
      {-5.0, true},           // to 10^-2.5: moderately strong support for Hd, the other direction
  }));
  CAPTURE(change);
  CHECK(alone_moves_band(from, words, Log10Change::finite_change(change), scale) == moves);
}

TEST_CASE("the same band in the other direction is a move", "[comparison][verbal]") {
  // LR 500 and 1/500 are both moderately strong support (ENFSI 2015, the same words for 1/LR in
  // favour of the alternative), for Hp and for Hd: the conclusion moves.
  const VerbalScale scale = VerbalScale::enfsi_2015();
  const double from = std::log10(500.0);
  const auto words = words_for_log10(scale, from);
  const auto there = words_for_log10(scale, -from);
  CHECK(there.label == words.label);
  CHECK(there.favours == Favours::hd);
  CHECK(band_differs(words, there));
  CHECK(alone_moves_band(from, words, Log10Change::finite_change(-2.0 * from), scale));
}

TEST_CASE("no effect alone or a change of 0 keeps the band", "[comparison][verbal]") {
  const VerbalScale scale = VerbalScale::enfsi_2015();
  const auto words = words_for_log10(scale, 3.2);
  CHECK_FALSE(alone_moves_band(3.2, words, std::nullopt, scale));
  CHECK_FALSE(alone_moves_band(3.2, words, Log10Change::finite_change(0.0), scale));
  // LR zero or infinite in A, and a finite change: still zero or infinite.
  const auto infinite = words_for_log10(scale, kInfinity);
  CHECK_FALSE(alone_moves_band(kInfinity, infinite, Log10Change::finite_change(-3.0), scale));
}

TEST_CASE("an infinite change away from LR zero or an infinite LR moves the words", "[comparison][verbal]") {
  // Away from an infinite LR (the findings impossible under Hd) or from LR zero (an exclusion):
  // wherever the LR ends, its words are no longer those of an impossibility (common practice).
  const VerbalScale scale = VerbalScale::enfsi_2015();
  const auto infinite = words_for_log10(scale, kInfinity);
  const auto zero = words_for_log10(scale, -kInfinity);
  CHECK(band_differs(infinite, zero));
  CHECK(alone_moves_band(kInfinity, infinite, Log10Change{Log10Change::State::minus_infinite, 0.0}, scale));
  CHECK(alone_moves_band(-kInfinity, zero, Log10Change{Log10Change::State::plus_infinite, 0.0}, scale));
}

TEST_CASE("a move to LR zero or an infinite LR changes the words", "[comparison][verbal]") {
  // LR zero: the findings are impossible under Hp (common practice: an exclusion), never a band.
  const VerbalScale scale = VerbalScale::enfsi_2015();
  const auto words = words_for_log10(scale, 3.2);
  CHECK(words_for_log10(scale, -kInfinity).favours == Favours::hd);
  CHECK(alone_moves_band(3.2, words, Log10Change{Log10Change::State::minus_infinite, 0.0}, scale));
  CHECK(alone_moves_band(3.2, words, Log10Change{Log10Change::State::plus_infinite, 0.0}, scale));
}

TEST_CASE("movers_first keeps each group's order", "[comparison]") {
  const std::vector<std::size_t> order{4, 0, 3, 1, 2};
  const auto moves = [](std::size_t k) { return k == 3 || k == 1; };
  CHECK(movers_first(order, moves) == std::vector<std::size_t>{3, 1, 4, 0, 2});
  CHECK(movers_first({}, moves).empty());
}
