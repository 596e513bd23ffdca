#include "core/method_validation/score_calibration.hpp"

#include <algorithm>
#include <cmath>

#include "core/numbers/log10_math.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::method_validation {

namespace {

// log(1 + e^z) and 1 / (1 + e^-z) without overflow (common practice).
double softplus(double z) { return std::max(z, 0.0) + std::log1p(std::exp(-std::abs(z))); }
double sigmoid(double z) { return z >= 0 ? 1.0 / (1.0 + std::exp(-z)) : std::exp(z) / (1.0 + std::exp(z)); }

struct Standardised {
  double mean = 0.0;
  double sd = 1.0;
};

Standardised standardise(const ValidationSet& s) {
  double sum = 0.0, n = static_cast<double>(s.size());
  for (double x : s.hp_log10_lr) sum += x;
  for (double x : s.hd_log10_lr) sum += x;
  Standardised st{sum / n, 0.0};
  double ss = 0.0;
  for (double x : s.hp_log10_lr) ss += (x - st.mean) * (x - st.mean);
  for (double x : s.hd_log10_lr) ss += (x - st.mean) * (x - st.mean);
  st.sd = std::sqrt(ss / n);
  return st;
}

// The prior-weighted cross-entropy (in nats) of ln LR = a z + b over standardised scores, with
// its gradient and Hessian.
struct Objective {
  double value = 0.0, ga = 0.0, gb = 0.0, haa = 0.0, hab = 0.0, hbb = 0.0;
};

Objective objective(const ValidationSet& s, const Standardised& st, double a, double b) {
  Objective o;
  const double wp = 0.5 / static_cast<double>(s.hp_log10_lr.size());
  const double wd = 0.5 / static_cast<double>(s.hd_log10_lr.size());
  auto add = [&](double x, double y, double w) {
    const double z = (x - st.mean) / st.sd;
    const double eta = a * z + b;
    o.value += w * (y > 0 ? softplus(-eta) : softplus(eta));
    const double p = sigmoid(eta);
    const double r = w * (p - y);
    o.ga += r * z;
    o.gb += r;
    const double c = w * p * (1.0 - p);
    o.haa += c * z * z;
    o.hab += c * z;
    o.hbb += c;
  };
  for (double x : s.hp_log10_lr) add(x, 1.0, wp);
  for (double x : s.hd_log10_lr) add(x, 0.0, wd);
  return o;
}

void require_finite_scores(const ValidationSet& s) {
  auto finite = [](double x) { return std::isfinite(x); };
  if (!std::all_of(s.hp_log10_lr.begin(), s.hp_log10_lr.end(), finite) ||
      !std::all_of(s.hd_log10_lr.begin(), s.hd_log10_lr.end(), finite))
    throw validation::InvalidValue({"results", "score"}, "linear calibration needs finite scores");
}

}  // namespace

LinearCalibration fit_linear_calibration(const ValidationSet& scores) {
  require_both_truths(scores);
  require_finite_scores(scores);
  const double min_hp = *std::min_element(scores.hp_log10_lr.begin(), scores.hp_log10_lr.end());
  const double max_hp = *std::max_element(scores.hp_log10_lr.begin(), scores.hp_log10_lr.end());
  const double min_hd = *std::min_element(scores.hd_log10_lr.begin(), scores.hd_log10_lr.end());
  const double max_hd = *std::max_element(scores.hd_log10_lr.begin(), scores.hd_log10_lr.end());
  if (max_hd <= min_hp || max_hp <= min_hd)
    throw validation::InvalidValue(
        {"results", "score"},
        "the training scores separate the two truths completely, so linear calibration has no finite "
        "solution (it would give infinite likelihood ratios); use more or harder training comparisons");
  const Standardised st = standardise(scores);
  if (!(st.sd > 0.0))
    throw validation::InvalidValue({"results", "score"}, "every training score is the same; nothing can be calibrated");

  double a = 0.0, b = 0.0;
  LinearCalibration fit;
  for (fit.iterations = 1; fit.iterations <= 100; ++fit.iterations) {
    const Objective o = objective(scores, st, a, b);
    const double det = o.haa * o.hbb - o.hab * o.hab;
    double da = -(o.hbb * o.ga - o.hab * o.gb) / det;
    double db = -(o.haa * o.gb - o.hab * o.ga) / det;
    // Backtracking: Newton's step on a convex objective, halved until the cost does not rise.
    double step = 1.0;
    while (step > 1e-10 && objective(scores, st, a + step * da, b + step * db).value > o.value) step *= 0.5;
    a += step * da;
    b += step * db;
    if (std::abs(step * da) < 1e-13 * (1.0 + std::abs(a)) && std::abs(step * db) < 1e-13 * (1.0 + std::abs(b))) break;
  }
  // ln LR = a (x - mean) / sd + b, in log10 units.
  fit.slope_log10 = a / st.sd / numbers::kLn10;
  fit.offset_log10 = (b - a * st.mean / st.sd) / numbers::kLn10;
  return fit;
}

ValidationSet apply_calibration(const ValidationSet& scores, const std::function<double(double)>& to_log10_lr) {
  ValidationSet out;
  out.hp_log10_lr.reserve(scores.hp_log10_lr.size());
  out.hd_log10_lr.reserve(scores.hd_log10_lr.size());
  for (double s : scores.hp_log10_lr) out.hp_log10_lr.push_back(to_log10_lr(s));
  for (double s : scores.hd_log10_lr) out.hd_log10_lr.push_back(to_log10_lr(s));
  return out;
}

PavCalibration fit_pav_calibration(const ValidationSet& training_scores) {
  const std::vector<ScoreAtom> atoms = pooled_atoms(training_scores);
  return PavCalibration{fit_pav(atoms)};
}

}  // namespace counterpoise::method_validation
