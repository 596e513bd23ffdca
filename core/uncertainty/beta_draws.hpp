#pragma once
// Draws of log10 X for X ~ Gamma(shape, 1) and X ~ Beta(a, b), made in bulk for Monte Carlo.
//
// Gamma: Marsaglia & Tsang (2000), "A simple method for generating gamma variables", ACM TOMS
// 26:363, with shape >= 1 directly and shape < 1 through G(a) = G(a + 1) · U^(1/a) (their §6),
// taken in log space so that tiny shapes do not underflow to 0. The normal deviates come from
// Boost.Random's ziggurat (Marsaglia & Tsang 2000, J. Stat. Software 5(8)), one engine call each.
// Beta: X = G(a) / (G(a) + G(b)) (e.g. Devroye 1986, Non-Uniform Random Variate Generation,
// IX.4.1 — from memory for the section); in linear space when both shapes are at least 1 (no
// underflow is possible), in log space otherwise.
//
// The logarithms of the Beta draws (-ln(1 + y/x), x and y the two Gamma draws) and of the rare
// candidates the squeeze does not accept are taken through numbers/vector_logarithms (glibc's
// vector functions), several per call; the engine is called in the same order as one draw at a
// time would call it.
//
// A sampler computes the constants of its distribution once, so a batch of draws costs only
// the draws (no allocation, no per-draw set-up). It works with the models' generator
// (std::mt19937_64) and with BulkEngine, the faster engine for long runs of draws.

#include <cstdint>
#include <ext/random>
#include <random>
#include <span>

namespace counterpoise::uncertainty {

// The engine for long runs of draws: the SIMD-oriented Fast Mersenne Twister with 64-bit output
// (Saito & Matsumoto 2008, "SIMD-oriented Fast Mersenne Twister: a 128-bit pseudorandom number
// generator", Monte Carlo and Quasi-Monte Carlo Methods 2006, pp. 607-622), as libstdc++ ships
// it (<ext/random>). Same period (2^19937 - 1) and equidistribution class as std::mt19937_64 and
// about four times faster on x86-64 (docs/performance.md), because it produces four 32-bit words
// per SSE2 instruction.
using BulkEngine = __gnu_cxx::sfmt19937_64;

// A BulkEngine seeded from 256 bits of `rng` (through std::seed_seq), so a model's draws stay a
// function of its own seeded generator and nothing else.
BulkEngine bulk_engine_from(std::mt19937_64& rng);

// A BulkEngine seeded from 256 bits of `rng` and the number `stream`: engines of different
// streams seeded from the same state of `rng` give independent sequences, and `rng` moves on by
// the same amount whatever the stream (an item's models against several alternatives share the
// draws taken before and after, as evaluation/compound_spread needs).
BulkEngine bulk_engine_from(std::mt19937_64& rng, std::uint32_t stream);

class GammaSampler {
 public:
  // Throws std::invalid_argument unless shape > 0 and finite.
  explicit GammaSampler(double shape);
  // log10 of one draw (finite for any shape > 0).
  template <class Engine>
  double draw_log10(Engine& rng) const;
  // One draw of Gamma(shape, 1) itself; valid for shape >= 1 only (asserted by the Beta sampler).
  template <class Engine>
  double draw_linear(Engine& rng) const;
  double shape() const { return shape_; }

 private:
  double shape_;
  double d_, c_;             // Marsaglia-Tsang constants for max(shape, shape + 1 when shape < 1)
  double inverse_shape_;     // 1 / shape, for U^(1/shape) when shape < 1
};

class BetaSampler {
 public:
  // Throws std::invalid_argument unless a, b > 0 and finite.
  BetaSampler(double a, double b);
  // log10 of one draw of Beta(a, b) (-inf only if a draw underflows a double entirely, which
  // log space prevents for any shapes).
  template <class Engine>
  double draw_log10(Engine& rng) const;
  // Fills `out` with independent draws of log10 X.
  template <class Engine>
  void fill_log10(Engine& rng, std::span<double> out) const;

 private:
  GammaSampler a_, b_;
  bool linear_;  // both shapes >= 1
};

// The engines the samplers are built for (beta_draws.cpp).
extern template double GammaSampler::draw_log10(std::mt19937_64&) const;
extern template double GammaSampler::draw_log10(BulkEngine&) const;
extern template double GammaSampler::draw_linear(std::mt19937_64&) const;
extern template double GammaSampler::draw_linear(BulkEngine&) const;
extern template double BetaSampler::draw_log10(std::mt19937_64&) const;
extern template double BetaSampler::draw_log10(BulkEngine&) const;
extern template void BetaSampler::fill_log10(std::mt19937_64&, std::span<double>) const;
extern template void BetaSampler::fill_log10(BulkEngine&, std::span<double>) const;

}  // namespace counterpoise::uncertainty
