#pragma once
// A probability assigned by the scientist: a point value, an interval, a Beta distribution,
// or survey counts "k of n". Counts become Beta(k + a0, n - k + b0); with the default uniform
// prior a0 = b0 = 1 the mean is Laplace's rule of succession (k + 1) / (n + 2)
// (Laplace 1814, Essai philosophique sur les probabilités; e.g. Jaynes 2003, Probability Theory:
// The Logic of Science, eq. 18.15 — from memory for the equation number).
// An interval is uniform on the log10 scale unless `linear` is stated (docs/methods.md).

#include <cstdint>
#include <optional>
#include <random>
#include <span>
#include <string>
#include <variant>

#include <nlohmann/json.hpp>

#include "core/uncertainty/beta_draws.hpp"
#include "core/uncertainty/grid_pmf.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::probability {

struct PointValue {
  double p;
};
struct IntervalValue {
  double low, high;
  bool linear = false;  // uniform on [low, high] itself rather than on log10
};
struct BetaValue {
  double a, b;
};
struct CountsValue {
  std::int64_t k, n;
  double prior_a = 1.0, prior_b = 1.0;  // Beta prior; (1, 1) is Laplace's rule
};

using Assignment = std::variant<PointValue, IntervalValue, BetaValue, CountsValue>;

// Reads a number, {"interval": [lo, hi], "scale": "log"|"linear"}, {"beta": [a, b]} or
// {"counts": {"k": K, "n": N, "prior": [a0, b0]}}. Throws validation::InvalidValue naming `where`
// for: a value outside [0, 1], NaN/infinite, low > high, a log-scale interval with low = 0,
// Beta parameters <= 0, negative counts, k > n, prior parameters <= 0, unknown keys.
Assignment read_assignment(const nlohmann::json& value, const validation::Location& where);
// The JSON form that read_assignment reads back to the same assignment.
nlohmann::json to_json(const Assignment& assignment);

// The mean (the marginal probability used for the point LR).
double mean(const Assignment& assignment);
// log10 of the mean, exact for tiny probabilities (-inf for a point value of 0).
double log10_mean(const Assignment& assignment);
// True unless the assignment is a point value.
bool is_uncertain(const Assignment& assignment);
// One draw of log10 p (log-space Beta draws, so tiny shape parameters do not underflow to 0).
double draw_log10(const Assignment& assignment, std::mt19937_64& rng);
// Independent draws of log10 p into `out`, in bulk (uncertainty::BetaSampler for Beta forms),
// from the faster bulk engine.
void fill_log10(const Assignment& assignment, uncertainty::BulkEngine& rng, std::span<double> out);
// The distribution of log10 p on a lattice of spacing `step` (exact bin masses from the CDF);
// nullopt when the distribution reaches below the smallest double (a Beta with a tiny first
// shape parameter), where only log-space draws can describe it.
std::optional<uncertainty::GridPmf> log10_grid(const Assignment& assignment, double step);
// The p-quantile of log10 p (0 < q < 1), from Boost.Math for Beta forms.
double log10_quantile(const Assignment& assignment, double q);
// Plain text for tables: "0.95", "between 0.01 and 0.05", "Beta(2, 30)", "3 of 412".
std::string describe(const Assignment& assignment);

}  // namespace counterpoise::probability
