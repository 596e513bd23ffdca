#include "core/method_validation/pav.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "core/method_validation/cllr.hpp"

namespace counterpoise::method_validation {

std::vector<ScoreAtom> pooled_atoms(const ValidationSet& set) {
  require_both_truths(set);
  std::vector<ScoreAtom> atoms;
  atoms.reserve(set.size());
  for (double x : set.hp_log10_lr) atoms.push_back({x, 1.0, 0.0});
  for (double x : set.hd_log10_lr) atoms.push_back({x, 0.0, 1.0});
  std::sort(atoms.begin(), atoms.end(), [](const ScoreAtom& a, const ScoreAtom& b) { return a.score < b.score; });
  std::vector<ScoreAtom> pooled;
  for (const ScoreAtom& a : atoms) {
    if (!pooled.empty() && pooled.back().score == a.score) {
      pooled.back().hp_weight += a.hp_weight;
      pooled.back().hd_weight += a.hd_weight;
    } else {
      pooled.push_back(a);
    }
  }
  return pooled;
}

namespace {

// True when block a's proportion of Hp weight is at least b's (cross-multiplied: no division).
bool violates_or_ties(const PavBlock& a, const PavBlock& b) {
  return a.hp_weight * (b.hp_weight + b.hd_weight) >= b.hp_weight * (a.hp_weight + a.hd_weight);
}

double block_log10_lr(const PavBlock& b, double log10_prior_odds) {
  if (b.hp_weight == 0.0) return -INFINITY;
  if (b.hd_weight == 0.0) return INFINITY;
  return std::log10(b.hp_weight) - std::log10(b.hd_weight) - log10_prior_odds;
}

}  // namespace

PavFit fit_pav(std::span<const ScoreAtom> atoms) {
  PavFit fit;
  for (std::size_t i = 0; i < atoms.size(); ++i) {
    if (i > 0 && !(atoms[i - 1].score < atoms[i].score))
      throw std::invalid_argument("fit_pav: atoms must be sorted by increasing, distinct score");
    fit.hp_total += atoms[i].hp_weight;
    fit.hd_total += atoms[i].hd_weight;
  }
  if (!(fit.hp_total > 0.0) || !(fit.hd_total > 0.0))
    throw std::invalid_argument("fit_pav: both truths need a positive total weight");
  for (const ScoreAtom& a : atoms) {
    if (a.hp_weight == 0.0 && a.hd_weight == 0.0) continue;  // not drawn in a bootstrap resample
    fit.blocks.push_back({a.score, a.score, a.hp_weight, a.hd_weight, 0.0});
    while (fit.blocks.size() > 1 && violates_or_ties(fit.blocks[fit.blocks.size() - 2], fit.blocks.back())) {
      PavBlock last = fit.blocks.back();
      fit.blocks.pop_back();
      PavBlock& merged = fit.blocks.back();
      merged.score_high = last.score_high;
      merged.hp_weight += last.hp_weight;
      merged.hd_weight += last.hd_weight;
    }
  }
  const double log10_prior_odds = std::log10(fit.hp_total) - std::log10(fit.hd_total);
  for (PavBlock& b : fit.blocks) b.log10_lr = block_log10_lr(b, log10_prior_odds);
  return fit;
}

double weighted_cllr(const PavFit& fit) {
  double hp_bits = 0.0, hd_bits = 0.0;
  for (const PavBlock& b : fit.blocks) {
    // A block without Hp weight costs Hp nothing (and would give 0 x inf): skip, likewise for Hd.
    if (b.hp_weight > 0.0) hp_bits += b.hp_weight * log2_one_plus_pow10(-b.log10_lr);
    if (b.hd_weight > 0.0) hd_bits += b.hd_weight * log2_one_plus_pow10(b.log10_lr);
  }
  return 0.5 * (hp_bits / fit.hp_total + hd_bits / fit.hd_total);
}

double cllr_min(const ValidationSet& set) {
  const std::vector<ScoreAtom> atoms = pooled_atoms(set);
  return weighted_cllr(fit_pav(atoms));
}

const PavBlock& block_for_score(const PavFit& fit, double score) {
  if (fit.blocks.empty()) throw std::invalid_argument("block_for_score: empty fit");
  auto after = std::upper_bound(fit.blocks.begin(), fit.blocks.end(), score,
                                [](double s, const PavBlock& b) { return s < b.score_low; });
  return after == fit.blocks.begin() ? fit.blocks.front() : *std::prev(after);
}

}  // namespace counterpoise::method_validation
