#pragma once
// The probability of the observed findings under each proposition of a network:
// P(E | Hp) = sum_{h in Hp} P(E, H = h) / sum_{h in Hp} P(H = h), likewise for Hd, from two runs of
// variable elimination (one with the findings, one without) that keep the proposition node H.
// When H is a root and Hp, Hd are single states, H's own table cancels (definition of
// conditional probability; e.g. Koller & Friedman 2009, Probabilistic Graphical Models, eq. 2.1
// — from memory for the equation number).

#include <cstddef>
#include <limits>
#include <optional>
#include <span>
#include <vector>

#include "core/models/network/variable_elimination.hpp"

namespace counterpoise::models::network {

struct FindingsLikelihood {
  // log10 P(E | Hp) and log10 P(E | Hd); -inf for a probability of zero; nullopt when the
  // proposition itself has probability zero in the network (the conditional is undefined).
  std::optional<double> log10_p_given_hp;
  std::optional<double> log10_p_given_hd;
  std::vector<double> log10_joint;  // log10 P(E, H = h) for each state h of H
  std::vector<double> log10_prior;  // log10 P(H = h)
  std::size_t largest_factor_size = 0;
};

// log10 of sum_{h in states} joint_h / sum_{h in states} prior_h; nullopt when the denominator is 0.
std::optional<double> log10_conditional(std::span<const double> log10_joint, std::span<const double> log10_prior,
                                        std::span<const std::size_t> states);

// Holds the two elimination plans, so many CPT sets (sensitivity, Monte Carlo) reuse them.
class FindingsLikelihoodPlan {
 public:
  // `dag`, findings and states must be valid for each other (the network reader checks them).
  // Each plan forms no factor of more than `max_factor_entries` entries; a plan that would is
  // `refused` (plan_elimination) and the caller must not compute.
  FindingsLikelihoodPlan(Dag dag, std::vector<Finding> findings, std::size_t proposition_node,
                         std::vector<std::size_t> hp_states, std::vector<std::size_t> hd_states,
                         std::size_t max_factor_entries = std::numeric_limits<std::size_t>::max());

  // The likelihoods for one set of log10 CPTs. Never throws for valid inputs and plans that
  // were not refused.
  FindingsLikelihood compute(const Log10Cpts& cpts) const;

  const Dag& dag() const noexcept { return dag_; }
  const EliminationPlan& findings_plan() const noexcept { return with_findings_; }
  const EliminationPlan& prior_plan() const noexcept { return prior_; }
  const std::vector<std::size_t>& hp_states() const noexcept { return hp_; }
  const std::vector<std::size_t>& hd_states() const noexcept { return hd_; }
  // True when node `n`'s CPT enters either computation (it is not barren).
  bool is_relevant(std::size_t n) const;

 private:
  Dag dag_;
  std::vector<std::size_t> hp_, hd_;
  EliminationPlan with_findings_, prior_;
};

}  // namespace counterpoise::models::network
