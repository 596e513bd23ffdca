#include "core/method_validation/performance_summary.hpp"

#include <algorithm>
#include <cmath>
#include <random>
#include <vector>

#include "core/method_validation/cllr.hpp"
#include "core/method_validation/pav.hpp"
#include "core/uncertainty/spread_summary.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

PerformanceSummary summarize_performance(const ValidationSet& set) {
  require_both_truths(set);
  PerformanceSummary s;
  s.hp_count = set.hp_log10_lr.size();
  s.hd_count = set.hd_log10_lr.size();
  s.infinite = count_infinite(set);
  s.cllr = cllr(set);
  const std::vector<ScoreAtom> atoms = pooled_atoms(set);
  const PavFit fit = fit_pav(atoms);
  s.cllr_min = weighted_cllr(fit);
  s.cllr_cal = s.cllr - s.cllr_min;
  s.eer = equal_error_rate(fit);
  s.misleading = misleading_rates(set);
  return s;
}

namespace {

// A uniform index below n from one 64-bit draw (multiply-shift: the same on every platform,
// unlike std::uniform_int_distribution, whose algorithm the standard leaves open).
__extension__ typedef unsigned __int128 Unsigned128;  // GCC and Clang; __extension__ keeps -Wpedantic quiet

std::size_t draw_index(std::mt19937_64& generator, std::size_t n) {
  return static_cast<std::size_t>((static_cast<Unsigned128>(generator()) * n) >> 64);
}

// Results in score order with the atom each belongs to, so a resample only re-weights atoms.
struct ResampleFrame {
  std::vector<ScoreAtom> atoms;            // weights zeroed, filled per resample
  std::vector<std::size_t> hp_atom, hd_atom;  // the atom of each result
  std::vector<double> hp_cost, hd_cost;    // each result's Cllr term, in bits
};

ResampleFrame make_frame(const ValidationSet& set) {
  ResampleFrame f;
  f.atoms = pooled_atoms(set);
  auto atom_of = [&](double x) {
    return static_cast<std::size_t>(std::lower_bound(f.atoms.begin(), f.atoms.end(), x,
                                                     [](const ScoreAtom& a, double v) { return a.score < v; }) -
                                    f.atoms.begin());
  };
  for (double x : set.hp_log10_lr) {
    f.hp_atom.push_back(atom_of(x));
    f.hp_cost.push_back(log2_one_plus_pow10(-x));
  }
  for (double x : set.hd_log10_lr) {
    f.hd_atom.push_back(atom_of(x));
    f.hd_cost.push_back(log2_one_plus_pow10(x));
  }
  return f;
}

Interval percentile_interval(std::vector<double>& values, double level) {
  std::sort(values.begin(), values.end());
  const double tail = 0.5 * (1.0 - level);
  return {uncertainty::sorted_quantile(values, tail), uncertainty::sorted_quantile(values, 1.0 - tail)};
}

}  // namespace

BootstrapIntervals bootstrap_intervals(const ValidationSet& set, const BootstrapOptions& options) {
  require_both_truths(set);
  if (options.resamples < 20)
    throw validation::InvalidValue({"options", "bootstrap"}, "at least 20 bootstrap resamples are needed for an interval");
  if (!(options.level > 0.0 && options.level < 1.0))
    throw validation::InvalidValue({"options", "level"}, "the interval level must lie strictly between 0 and 1");
  ResampleFrame frame = make_frame(set);
  std::mt19937_64 generator(options.seed);
  const std::size_t np = set.hp_log10_lr.size(), nd = set.hd_log10_lr.size();
  const double log10_strong = 2.0;  // LR 100, as misleading_rates' default
  std::vector<double> cllr_v, min_v, cal_v, eer_v, mhp_v, mhd_v, shp_v, shd_v;
  for (int r = 0; r < options.resamples; ++r) {
    for (ScoreAtom& a : frame.atoms) a.hp_weight = a.hd_weight = 0.0;
    double hp_bits = 0.0, hd_bits = 0.0;
    std::size_t mhp = 0, mhd = 0, shp = 0, shd = 0;
    for (std::size_t k = 0; k < np; ++k) {
      const std::size_t i = draw_index(generator, np);
      frame.atoms[frame.hp_atom[i]].hp_weight += 1.0;
      hp_bits += frame.hp_cost[i];
      const double x = set.hp_log10_lr[i];
      mhp += x < 0;
      shp += x <= -log10_strong;
    }
    for (std::size_t k = 0; k < nd; ++k) {
      const std::size_t j = draw_index(generator, nd);
      frame.atoms[frame.hd_atom[j]].hd_weight += 1.0;
      hd_bits += frame.hd_cost[j];
      const double x = set.hd_log10_lr[j];
      mhd += x > 0;
      shd += x >= log10_strong;
    }
    const PavFit fit = fit_pav(frame.atoms);
    const double c = 0.5 * (hp_bits / np + hd_bits / nd);
    const double c_min = weighted_cllr(fit);
    cllr_v.push_back(c);
    min_v.push_back(c_min);
    cal_v.push_back(c - c_min);
    eer_v.push_back(equal_error_rate(fit));
    mhp_v.push_back(static_cast<double>(mhp) / np);
    mhd_v.push_back(static_cast<double>(mhd) / nd);
    shp_v.push_back(static_cast<double>(shp) / np);
    shd_v.push_back(static_cast<double>(shd) / nd);
  }
  BootstrapIntervals out;
  out.options = options;
  out.cllr = percentile_interval(cllr_v, options.level);
  out.cllr_min = percentile_interval(min_v, options.level);
  out.cllr_cal = percentile_interval(cal_v, options.level);
  out.eer = percentile_interval(eer_v, options.level);
  out.misleading_hp = percentile_interval(mhp_v, options.level);
  out.misleading_hd = percentile_interval(mhd_v, options.level);
  out.strong_hp = percentile_interval(shp_v, options.level);
  out.strong_hd = percentile_interval(shd_v, options.level);
  return out;
}

}  // namespace counterpoise::method_validation
