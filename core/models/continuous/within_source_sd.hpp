#pragma once
// The within-source standard deviation sigma of the two-level model: given as a fixed value, or
// estimated from replicate groups by the pooled standard deviation
//   s_p^2 = sum_j sum_i (x_ji - mean_j)^2 / nu,   nu = sum_j (n_j - 1)
// (common practice; e.g. Montgomery 2013, Design and Analysis of Experiments, 8th ed., sec. 2.4
// — from memory). With the reference prior p(sigma^2) ∝ 1/sigma^2 the posterior of sigma^2 is
// scaled inverse chi-square: sigma^2 = nu s_p^2 / X with X ~ chi-square(nu) (Gelman et al. 2013,
// Bayesian Data Analysis, 3rd ed., sec. 3.2 — from memory for the section).

#include <optional>
#include <random>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

namespace counterpoise::models::continuous {

class WithinSourceSd {
 public:
  // A fixed value. Throws validation::InvalidValue at `where` unless sd is finite and > 0.
  static WithinSourceSd fixed(double sd, const validation::Location& where);
  // Pooled from replicate groups. Throws validation::InvalidValue at `where` when there are no
  // groups, a group is empty or has a non-finite value, the degrees of freedom are 0 (every
  // group has one value) or the pooled standard deviation is 0 (all groups constant).
  static WithinSourceSd pooled(std::vector<std::vector<double>> groups, const validation::Location& where);

  // The value used for the point LR: the fixed value or the pooled s_p.
  double point() const noexcept { return sd_; }
  // True when estimated from replicates (then sigma has a posterior spread).
  bool is_estimated() const noexcept { return degrees_of_freedom_ > 0; }
  // nu, or 0 for a fixed value.
  int degrees_of_freedom() const noexcept { return degrees_of_freedom_; }
  const std::vector<std::vector<double>>& replicate_groups() const noexcept { return groups_; }

  // One posterior draw of sigma (the fixed value when not estimated).
  double draw(std::mt19937_64& rng) const;

  // {"within_sd": ...} or {"within_replicates": [[...], ...]} as read.
  void write_json(nlohmann::json& item) const;
  // Summary for model_detail: value, how it was obtained, degrees of freedom.
  nlohmann::json detail() const;

 private:
  double sd_ = 0.0;
  int degrees_of_freedom_ = 0;
  std::vector<std::vector<double>> groups_;
};

}  // namespace counterpoise::models::continuous
