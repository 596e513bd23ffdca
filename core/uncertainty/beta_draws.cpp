#include "core/uncertainty/beta_draws.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <stdexcept>

#include <boost/random/normal_distribution.hpp>

#include "core/numbers/log10_math.hpp"
#include "core/numbers/vector_logarithms.hpp"

namespace counterpoise::uncertainty {

namespace {

constexpr double kLog10e = 0.434294481903251827651128918916605082;  // 1 / ln 10

// A uniform deviate on (0, 1): 53 random bits, offset by half a unit so 0 never occurs.
template <class Engine>
double open_uniform(Engine& rng) {
  return (static_cast<double>(rng() >> 11) + 0.5) * 0x1.0p-53;
}

double checked_shape(double shape) {
  if (!(shape > 0.0) || !std::isfinite(shape)) throw std::invalid_argument("Gamma shape must be positive and finite");
  return shape;
}

}  // namespace

GammaSampler::GammaSampler(double shape) : shape_(checked_shape(shape)) {
  const double boosted = shape_ >= 1.0 ? shape_ : shape_ + 1.0;
  d_ = boosted - 1.0 / 3.0;
  c_ = 1.0 / std::sqrt(9.0 * d_);
  inverse_shape_ = 1.0 / shape_;
}

namespace {

// 256 bits of `rng` into words[0..8).
void take_seed_words(std::mt19937_64& rng, std::uint32_t* words) {
  for (std::size_t i = 0; i < 8; i += 2) {
    const std::uint64_t bits = rng();
    words[i] = static_cast<std::uint32_t>(bits);
    words[i + 1] = static_cast<std::uint32_t>(bits >> 32);
  }
}

}  // namespace

BulkEngine bulk_engine_from(std::mt19937_64& rng) {
  std::uint32_t words[8];
  take_seed_words(rng, words);
  std::seed_seq sequence(std::begin(words), std::end(words));
  return BulkEngine(sequence);
}

BulkEngine bulk_engine_from(std::mt19937_64& rng, std::uint32_t stream) {
  // Two more words than the stream-less engine's seed, so no stream repeats its sequence.
  std::uint32_t words[10];
  take_seed_words(rng, words);
  words[8] = stream;
  words[9] = 0x73747265u;
  std::seed_seq sequence(std::begin(words), std::end(words));
  return BulkEngine(sequence);
}

// Inlined into the Beta loop (two calls per draw): the call's own set-up and tear-down cost
// about a tenth of a draw when it was a function of its own.
template <class Engine>
[[gnu::always_inline]] inline double GammaSampler::draw_linear(Engine& rng) const {
  // Marsaglia & Tsang (2000), ACM TOMS 26:363, the algorithm of their §3 with the squeeze
  // u < 1 - 0.0331 x^4 that accepts most candidates without a logarithm.
  boost::random::normal_distribution<double> normal;
  for (;;) {
    double x, v;
    do {
      x = normal(rng);
      v = 1.0 + c_ * x;
    } while (v <= 0.0);
    v = v * v * v;
    const double u = open_uniform(rng);
    const double x2 = x * x;
    if (u < 1.0 - 0.0331 * x2 * x2) return d_ * v;
    // About one candidate in ten gets here; its two logarithms in one vector call.
    const auto [log_u, log_v] = numbers::log_of_pair(u, v);
    if (log_u < 0.5 * x2 + d_ * (1.0 - v + log_v)) return d_ * v;
  }
}

template <class Engine>
double GammaSampler::draw_log10(Engine& rng) const {
  if (shape_ >= 1.0) return std::log(draw_linear(rng)) * kLog10e;
  // G(a) = G(a + 1) · U^(1/a): draw_linear uses the constants of a + 1.
  const double log_g = std::log(draw_linear(rng));
  return (log_g + std::log(open_uniform(rng)) * inverse_shape_) * kLog10e;
}

BetaSampler::BetaSampler(double a, double b) : a_(a), b_(b), linear_(a >= 1.0 && b >= 1.0) {}

namespace {

// log10(x / (x + y)) = -ln(1 + y/x) / ln 10 for each ratio y/x, in place: exact also when the draw
// is close to 1 (y/x small), with the logarithms taken in vector calls.
void log10_beta_from_ratios(std::span<double> ratios) {
  numbers::log_one_plus_each(ratios, ratios);
  for (double& value : ratios) value *= -kLog10e;
}

}  // namespace

template <class Engine>
double BetaSampler::draw_log10(Engine& rng) const {
  if (linear_) {
    const double x = a_.draw_linear(rng);
    const double y = b_.draw_linear(rng);
    // Through the same function as fill_log10, so a draw is the same one at a time and in bulk.
    double value = y / x;
    log10_beta_from_ratios(std::span<double>(&value, 1));
    return value;
  }
  const double log10_x = a_.draw_log10(rng);
  const double log10_y = b_.draw_log10(rng);
  return log10_x - numbers::log10_add(log10_x, log10_y);
}

template <class Engine>
void BetaSampler::fill_log10(Engine& rng, std::span<double> out) const {
  if (!linear_) {
    for (double& value : out) value = draw_log10(rng);
    return;
  }
  // Two passes: first every draw of the chunk (the engine called in the same order as draw_log10
  // calls it), keeping y / x; then the logarithms of the whole chunk in vector calls, instead of
  // one scalar call inside each branchy rejection loop.
  constexpr std::size_t kChunk = 256;
  for (std::size_t start = 0; start < out.size(); start += kChunk) {
    const auto chunk = out.subspan(start, std::min(kChunk, out.size() - start));
    for (double& value : chunk) {
      const double x = a_.draw_linear(rng);
      const double y = b_.draw_linear(rng);
      value = y / x;
    }
    log10_beta_from_ratios(chunk);
  }
}

template double GammaSampler::draw_log10(std::mt19937_64&) const;
template double GammaSampler::draw_log10(BulkEngine&) const;
template double GammaSampler::draw_linear(std::mt19937_64&) const;
template double GammaSampler::draw_linear(BulkEngine&) const;
template double BetaSampler::draw_log10(std::mt19937_64&) const;
template double BetaSampler::draw_log10(BulkEngine&) const;
template void BetaSampler::fill_log10(std::mt19937_64&, std::span<double>) const;
template void BetaSampler::fill_log10(BulkEngine&, std::span<double>) const;

}  // namespace counterpoise::uncertainty
