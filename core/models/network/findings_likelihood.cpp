#include "core/models/network/findings_likelihood.hpp"

#include <algorithm>
#include <limits>

#include "core/numbers/log10_math.hpp"

namespace counterpoise::models::network {

std::optional<double> log10_conditional(std::span<const double> log10_joint, std::span<const double> log10_prior,
                                        std::span<const std::size_t> states) {
  std::vector<double> num, den;
  for (auto s : states) {
    num.push_back(log10_joint[s]);
    den.push_back(log10_prior[s]);
  }
  const double log10_den = numbers::log10_sum(den);
  if (log10_den == -std::numeric_limits<double>::infinity()) return std::nullopt;
  return numbers::log10_sum(num) - log10_den;
}

FindingsLikelihoodPlan::FindingsLikelihoodPlan(Dag dag, std::vector<Finding> findings, std::size_t proposition_node,
                                               std::vector<std::size_t> hp_states, std::vector<std::size_t> hd_states,
                                               std::size_t max_factor_entries)
    : dag_(std::move(dag)),
      hp_(std::move(hp_states)),
      hd_(std::move(hd_states)),
      with_findings_(plan_elimination(dag_, findings, proposition_node, max_factor_entries)),
      prior_(plan_elimination(dag_, {}, proposition_node, max_factor_entries)) {}

FindingsLikelihood FindingsLikelihoodPlan::compute(const Log10Cpts& cpts) const {
  FindingsLikelihood out;
  auto joint = run_elimination(with_findings_, dag_, cpts);
  auto prior = run_elimination(prior_, dag_, cpts);
  out.largest_factor_size = std::max(joint.largest_factor_size, prior.largest_factor_size);
  out.log10_joint = std::move(joint.log10_values);
  out.log10_prior = std::move(prior.log10_values);
  out.log10_p_given_hp = log10_conditional(out.log10_joint, out.log10_prior, hp_);
  out.log10_p_given_hd = log10_conditional(out.log10_joint, out.log10_prior, hd_);
  return out;
}

bool FindingsLikelihoodPlan::is_relevant(std::size_t n) const {
  return std::binary_search(with_findings_.factor_nodes.begin(), with_findings_.factor_nodes.end(), n) ||
         std::binary_search(prior_.factor_nodes.begin(), prior_.factor_nodes.end(), n);
}

}  // namespace counterpoise::models::network
