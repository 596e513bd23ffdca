#include "core/models/network/network_model.hpp"

#include <cmath>
#include <limits>

#include "core/models/item_fields.hpp"
#include "core/models/network/factor_limit.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models::network {

using nlohmann::json;
using numbers::LikelihoodRatio;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr double kMinusInf = -std::numeric_limits<double>::infinity();

std::string state_list(const Node& node, const std::vector<std::size_t>& states) {
  std::string text;
  for (std::size_t i = 0; i < states.size(); ++i)
    text += (i ? (i + 1 == states.size() ? " or " : ", ") : "") + node.states[states[i]];
  return text;
}

json names_of(const Network& network, const std::vector<std::size_t>& nodes) {
  json out = json::array();
  for (auto n : nodes) out.push_back(network.nodes[n].name);
  return out;
}

}  // namespace

NetworkModel::NetworkModel(Network network, Location where)
    : network_(std::move(network)),
      where_(std::move(where)),
      plan_(network_.dag(), network_.findings, network_.proposition.node, network_.proposition.hp_states,
            network_.proposition.hd_states, factor_limit_entries()),
      mean_cpts_(network_.mean_log10_cpts()) {
  refuse_factors_over_limit();
  const auto result = plan_.compute(mean_cpts_);
  const Node& pn = network_.nodes[network_.proposition.node];
  if (!result.log10_p_given_hp || !result.log10_p_given_hd)
    throw InvalidValue(where_.with_field("proposition").with_field(!result.log10_p_given_hp ? "hp" : "hd"),
                       "the network gives " + std::string(!result.log10_p_given_hp ? "Hp" : "Hd") + " (" + pn.name + " = " +
                           state_list(pn, !result.log10_p_given_hp ? network_.proposition.hp_states
                                                                   : network_.proposition.hd_states) +
                           ") probability zero, so the probability of the findings given it is undefined");
  if (*result.log10_p_given_hp == kMinusInf && *result.log10_p_given_hd == kMinusInf)
    throw InvalidValue(where_.with_field("observed"),
                       "the observed findings have probability zero under both propositions; check the CPT entries "
                       "that are 0 for the observed states");
  for (std::size_t n = 0; n < network_.nodes.size(); ++n) {
    if (!plan_.is_relevant(n)) continue;
    for (std::size_t r = 0; r < network_.nodes[n].cpt.size(); ++r)
      if (network::is_uncertain(network_.nodes[n].cpt[r])) uncertain_rows_.emplace_back(n, r);
  }
}

void NetworkModel::refuse_factors_over_limit() const {
  const std::string proposition = network_.nodes[network_.proposition.node].name;
  const auto refuse = [&](const EliminationPlan& plan, const std::string& what) {
    if (!plan.refused) return;
    throw InvalidValue(where_.with_field("nodes"),
                       factor_refusal_text(network_, "exact evaluation of this network (" + what + ") needs a table (factor)",
                                           *plan.refused, factor_limit_entries()));
  };
  refuse(plan_.findings_plan(), "the probability of the findings for each state of " + proposition);
  refuse(plan_.prior_plan(), "the probability of each state of " + proposition + " without the findings");
}

PointResult NetworkModel::evaluate() const {
  const auto result = plan_.compute(mean_cpts_);
  PointResult out;
  out.log10_p_given_hp = *result.log10_p_given_hp;
  out.log10_p_given_hd = *result.log10_p_given_hd;
  out.lr = LikelihoodRatio::from_log10_probabilities(*out.log10_p_given_hp, *out.log10_p_given_hd);
  auto probability_json = [](double log10_p) {
    // A zero probability (an exclusion) has no finite log10: null, and value 0.
    return json{{"log10", log10_p == kMinusInf ? json(nullptr) : json(log10_p)}, {"value", std::pow(10.0, log10_p)}};
  };
  const Node& pn = network_.nodes[network_.proposition.node];
  out.detail = {{"p_given_hp", probability_json(*out.log10_p_given_hp)},
                {"p_given_hd", probability_json(*out.log10_p_given_hd)},
                {"proposition_node", pn.name},
                {"elimination_order", names_of(network_, plan_.findings_plan().order)},
                {"prior_elimination_order", names_of(network_, plan_.prior_plan().order)},
                {"largest_factor_size", result.largest_factor_size},
                {"barren_nodes", names_of(network_, plan_.findings_plan().barren_nodes)},
                {"node_count", network_.nodes.size()},
                {"covers", network_.covers}};
  if (!pn.parents.empty() || network_.proposition.hp_states.size() > 1 || network_.proposition.hd_states.size() > 1)
    out.notes.push_back({"network-proposition-prior",
                         "the proposition node " + pn.name +
                             " has parents or groups several states, so its table (its prior distribution given its "
                             "parents) affects the likelihood ratio"});
  for (const auto& [n, r] : uncertain_rows_) {
    (void)r;
    if (network_.nodes[n].cpt_given) {
      out.notes.push_back({"network-point-from-means",
                           "the point likelihood ratio uses the mean of each uncertain table entry"});
      break;
    }
  }
  return out;
}

bool NetworkModel::is_uncertain() const { return !uncertain_rows_.empty(); }

void NetworkModel::draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const {
  if (uncertain_rows_.empty()) {
    EvidenceModel::draw_log10_lr(rng, out);
    return;
  }
  Log10Cpts cpts = mean_cpts_;
  for (double& value : out) {
    for (const auto& [n, r] : uncertain_rows_) {
      const std::size_t k = network_.nodes[n].states.size();
      draw_log10_row(network_.nodes[n].cpt[r], rng, std::span<double>(cpts[n]).subspan(r * k, k));
    }
    const auto result = plan_.compute(cpts);
    if (!result.log10_p_given_hp || !result.log10_p_given_hd ||
        (*result.log10_p_given_hp == kMinusInf && *result.log10_p_given_hd == kMinusInf))
      throw InvalidValue(where_, "a Monte Carlo draw of the tables made the findings impossible under both "
                                 "propositions (or a proposition impossible); check the uncertain entries near 0");
    value = *result.log10_p_given_hp - *result.log10_p_given_hd;
  }
}

std::string NetworkModel::assumptions() const {
  const Node& pn = network_.nodes[network_.proposition.node];
  std::string findings;
  for (std::size_t i = 0; i < network_.findings.size(); ++i) {
    const auto& f = network_.findings[i];
    findings += (i ? "; " : "") + network_.nodes[f.node].name + " = " + network_.nodes[f.node].states[f.state];
  }
  std::string text =
      "The findings (" + findings + ") are evaluated jointly with a Bayesian network of " +
      std::to_string(network_.nodes.size()) + " nodes. The likelihood ratio is the probability of these findings if " +
      pn.name + " = " + state_list(pn, network_.proposition.hp_states) + " (Hp), divided by their probability if " +
      pn.name + " = " + state_list(pn, network_.proposition.hd_states) +
      " (Hd). It assumes that the findings depend on each other only through the arrows of the network, and that "
      "the conditional probability tables are correct; where a table entry is uncertain, the point value uses its mean.";
  if (!network_.covers.empty()) {
    std::string ids;
    for (std::size_t i = 0; i < network_.covers.size(); ++i) ids += (i ? ", " : "") + network_.covers[i];
    text += " The network already includes the findings of items " + ids +
            "; they must not also be combined on their own.";
  }
  return text;
}

json NetworkModel::to_json() const { return network_to_json(network_); }

NetworkLayout NetworkModel::layout() const { return layered_layout(plan_.dag()); }

std::vector<CptTable> NetworkModel::cpt_tables() const {
  auto tables = network::cpt_tables(network_);
  for (std::size_t n = 0; n < tables.size(); ++n) tables[n].affects_lr = plan_.is_relevant(n);
  return tables;
}

std::vector<EntrySensitivity> NetworkModel::sensitivity() const { return one_way_sensitivity(network_, plan_); }

EvidenceModelPtr read_network_model(const json& item, const ReadContext& context) {
  check_model_members(item, {"nodes", "proposition", "observed", "covers"}, context.where);
  return std::make_shared<NetworkModel>(read_network(item, context.where.item, context.where), context.where);
}

std::vector<EvidenceModelPtr> read_network_alternatives(const json& item, std::span<const std::string> alternative_ids,
                                                       const ReadContext& context) {
  // An entry's "hd" goes where the two-proposition reader reads Hd's states, and a problem with
  // it is named back at the entry. A top-level "hd" of the item itself is left for the reader to
  // refuse as an unknown field.
  const bool shared_hd = reading::find_member(item, "hd") != nullptr;
  const auto read = [shared_hd](const json& merged, const ReadContext& merged_context) {
    json own = merged;
    const auto hd = own.find("hd");
    if (shared_hd || hd == own.end() || !own.contains("proposition") || !own["proposition"].is_object())
      return read_network_model(own, merged_context);
    own["proposition"]["hd"] = *hd;
    own.erase("hd");
    try {
      return read_network_model(own, merged_context);
    } catch (const validation::Error& error) {
      const std::string prefix = "proposition.hd";
      const std::string& field = error.where().field;
      if (field.compare(0, prefix.size(), prefix) != 0) throw;
      throw InvalidValue(Location{error.where().item, field.substr(std::string("proposition.").size())},
                         error.bare_message());
    }
  };
  // Without a shared proposition.hd, an entry without states is the entry's problem.
  const json* proposition = reading::find_member(item, "proposition");
  const json* entries = reading::find_member(item, kAlternativesField);
  if (proposition && proposition->is_object() && !reading::find_member(*proposition, "hd") && entries &&
      entries->is_object())
    for (const auto& id : alternative_ids)
      if (const json* entry = reading::find_member(*entries, id); entry && entry->is_object() && !entry->contains("hd"))
        throw InvalidValue(context.where.with_field(kAlternativesField).with_field(id).with_field("hd"),
                           "missing: the state (or states) of the proposition node that stand for this alternative");
  return read_per_alternative(item, alternative_ids, {"hd"}, read, context);
}

}  // namespace counterpoise::models::network
