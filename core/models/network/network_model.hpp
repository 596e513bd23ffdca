#pragma once
// The "network" evidence model: a discrete Bayesian network over dependent findings, with
// LR = P(observed findings | Hp) / P(observed findings | Hd) computed exactly by variable
// elimination (variable_elimination.hpp; Koller & Friedman 2009, Probabilistic Graphical Models,
// ch. 9). The point LR uses the mean of every CPT entry; when entries carry intervals, Beta or
// Dirichlet distributions, draw_log10_lr redraws every uncertain row jointly for each draw.
// An item evaluated by a network lists, in "covers", the ids of other items whose findings the
// network already includes, so the guard can warn when they are also combined on their own.

#include <random>
#include <span>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/evidence_model.hpp"
#include "core/models/per_alternative.hpp"
#include "core/models/network/cpt_table.hpp"
#include "core/models/network/findings_likelihood.hpp"
#include "core/models/network/network_definition.hpp"
#include "core/models/network/network_layout.hpp"
#include "core/models/network/network_sensitivity.hpp"

namespace counterpoise::models::network {

class NetworkModel final : public EvidenceModel {
 public:
  // Throws validation::InvalidValue naming `where` (field "proposition") when a proposition has
  // probability zero in the network, or (field "observed") when the findings are impossible under
  // both propositions at the mean CPTs, or (field "nodes") when exact evaluation needs a factor
  // over the limit (factor_limit.hpp), before any factor is built.
  NetworkModel(Network network, validation::Location where);

  std::string kind() const override { return "network"; }
  // The point LR; detail holds p_given_hp/hd (log10 and value), the elimination order, the
  // largest factor size, the barren nodes left out and the covered item ids. Never throws.
  PointResult evaluate() const override;
  // True when an uncertain CPT row can affect the LR.
  bool is_uncertain() const override;
  // Joint draws of every uncertain row that can affect the LR. Throws validation::InvalidValue
  // if a draw makes the findings impossible under both propositions (zero-probability event).
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override;

  const Network& network() const noexcept { return network_; }
  // Ids of other items whose findings this network already evaluates.
  const std::vector<std::string>& covers() const noexcept { return network_.covers; }
  const FindingsLikelihoodPlan& plan() const noexcept { return plan_; }
  // The layered layout of the graph for drawing. Never throws.
  NetworkLayout layout() const;
  // The CPTs as tables, with affects_lr set from the elimination plan. Never throws.
  std::vector<CptTable> cpt_tables() const;
  // The one-way sensitivity table (network_sensitivity.hpp). Never throws.
  std::vector<EntrySensitivity> sensitivity() const;

 private:
  // Throws (field "nodes") when either elimination plan was refused for a factor over the limit.
  void refuse_factors_over_limit() const;

  Network network_;
  validation::Location where_;
  FindingsLikelihoodPlan plan_;
  Log10Cpts mean_cpts_;
  std::vector<std::pair<std::size_t, std::size_t>> uncertain_rows_;  // (node, row) that can affect the LR
};

// Reads an item with "model": "network" (fields nodes, proposition, observed, covers). Throws
// validation::Error as read_network and NetworkModel's constructor do, and InvalidValue for a
// field that is neither a common item field nor one of these.
EvidenceModelPtr read_network_model(const nlohmann::json& item, const ReadContext& context);

// Reads the item's network against each alternative to Hp: "alternatives": {"<id>": {"hd":
// states}, ...}, each entry's hd the state (or states) of the proposition node that stand for
// that alternative, in place of proposition.hd (which, when given, is the default an entry
// replaces). The nodes, tables, findings and proposition.hp are shared, so P(E|Hp) is the same
// against every alternative. Throws as read_per_alternative and read_network_model; a problem
// with an entry's states (unknown, listed twice, also in hp, probability zero in the network) is
// named "alternatives.<id>.hd".
std::vector<EvidenceModelPtr> read_network_alternatives(const nlohmann::json& item,
                                                        std::span<const std::string> alternative_ids,
                                                        const ReadContext& context);

}  // namespace counterpoise::models::network
