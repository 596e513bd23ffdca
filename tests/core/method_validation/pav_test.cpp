// PAV against an independent isotonic regression, and the properties Cllr_min must have.
#include <catch2/catch.hpp>
#include <gsl/gsl_rng.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "core/method_validation/cllr.hpp"
#include "core/method_validation/pav.hpp"
#include "simulated_method.hpp"

using namespace counterpoise::method_validation;

namespace {

// Isotonic regression by the max-min formula, O(n^3): the fitted value at i is
//   max over s <= i of min over t >= i of the weighted mean of y over s..t
// (Robertson, Wright & Dykstra 1988, Order Restricted Statistical Inference, Theorem 1.4.4 —
// from memory). An independent route to what PAV computes.
std::vector<double> isotonic_by_max_min(const std::vector<ScoreAtom>& atoms) {
  const std::size_t n = atoms.size();
  std::vector<double> fitted(n);
  for (std::size_t i = 0; i < n; ++i) {
    double best = -INFINITY;
    for (std::size_t s = 0; s <= i; ++s) {
      double worst = INFINITY;
      for (std::size_t t = i; t < n; ++t) {
        double hp = 0, w = 0;
        for (std::size_t k = s; k <= t; ++k) {
          hp += atoms[k].hp_weight;
          w += atoms[k].hp_weight + atoms[k].hd_weight;
        }
        worst = std::min(worst, hp / w);
      }
      best = std::max(best, worst);
    }
    fitted[i] = best;
  }
  return fitted;
}

ValidationSet random_set(gsl_rng* rng, int n) {
  ValidationSet set;
  set.add(Truth::hp, 0.5);
  set.add(Truth::hd, -0.5);
  for (int i = 0; i < n; ++i) {
    // Scores on a coarse grid so that ties occur, with Hp more likely at high scores.
    const double score = std::round(gsl_rng_uniform(rng) * 8.0) / 2.0 - 2.0;
    const bool hp = gsl_rng_uniform(rng) < 1.0 / (1.0 + std::exp(-score));
    set.add(hp ? Truth::hp : Truth::hd, score);
  }
  return set;
}

}  // namespace

TEST_CASE("PAV gives the isotonic regression of the max-min formula") {
  gsl_rng* rng = gsl_rng_alloc(gsl_rng_mt19937);
  gsl_rng_set(rng, 2024);
  for (int trial = 0; trial < 200; ++trial) {
    const ValidationSet set = random_set(rng, 3 + trial % 40);
    const auto atoms = pooled_atoms(set);
    const PavFit fit = fit_pav(atoms);
    const std::vector<double> expected = isotonic_by_max_min(atoms);
    for (std::size_t i = 0; i < atoms.size(); ++i) {
      const PavBlock& b = block_for_score(fit, atoms[i].score);
      CAPTURE(trial, i, atoms[i].score);
      // Relative 1e-12: both are ratios of sums of the same small integers.
      CHECK(b.hp_weight / (b.hp_weight + b.hd_weight) == Approx(expected[i]).epsilon(1e-12));
    }
  }
  gsl_rng_free(rng);
}

TEST_CASE("PAV output is monotone and ties are pooled") {
  const ValidationSet set{{1.0, 1.0, 3.0}, {1.0, 0.0, 2.0}};
  const auto atoms = pooled_atoms(set);
  REQUIRE(atoms.size() == 4);
  CHECK(atoms[1].score == 1.0);
  CHECK(atoms[1].hp_weight == 2.0);
  CHECK(atoms[1].hd_weight == 1.0);
  const PavFit fit = fit_pav(atoms);
  for (std::size_t i = 1; i < fit.blocks.size(); ++i) CHECK(fit.blocks[i - 1].log10_lr < fit.blocks[i].log10_lr);
}

TEST_CASE("Cllr_min is at most Cllr, and is blind to a monotone change of the scores") {
  // Discrimination does not change when the LRs are re-scaled monotonically (Brümmer & du Preez
  // 2006: Cllr_min depends only on the order of the scores).
  auto m = testing::simulate_gaussian_method(2.0, 2000, 5);
  const double c_min = cllr_min(m.log10_lrs);
  CHECK(c_min <= cllr(m.log10_lrs));
  ValidationSet stretched = m.log10_lrs;
  for (double& x : stretched.hp_log10_lr) x = 3.0 * x + 1.0;
  for (double& x : stretched.hd_log10_lr) x = 3.0 * x + 1.0;
  CHECK(cllr_min(stretched) == Approx(c_min).epsilon(1e-12));
}

TEST_CASE("the extreme cases of Cllr_min") {
  // Completely separated: two pure blocks with LR 0 and +inf, no cost at all.
  CHECK(cllr_min({{3.0, 4.0}, {-1.0, 0.5}}) == 0.0);
  // All scores equal: one block whose LR is exactly 1, so one bit (the neutral reference).
  CHECK(cllr_min({{2.0, 2.0}, {2.0, 2.0, 2.0}}) == Approx(1.0).epsilon(1e-15));
}

TEST_CASE("a PAV block's LR is its posterior odds over the set's prior odds") {
  // One block of 3 Hp and 1 Hd in a set of 4 Hp and 4 Hd: LR = (3/1) / (4/4) = 3.
  const ValidationSet set{{2.0, 1.0, 1.0, 1.0}, {1.0, -1.0, -2.0, -3.0}};
  const auto atoms = pooled_atoms(set);
  const PavFit fit = fit_pav(atoms);
  CHECK(block_for_score(fit, 1.0).log10_lr == Approx(std::log10(3.0)).epsilon(1e-14));
  CHECK(block_for_score(fit, -2.0).log10_lr == -INFINITY);
  CHECK(block_for_score(fit, -99.0).log10_lr == -INFINITY);  // below every score: the first block
}
