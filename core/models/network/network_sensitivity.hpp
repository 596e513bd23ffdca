#pragma once
// One-way sensitivity of the network's log10 LR to each CPT entry. When entry theta_s of a row
// is set to x, the other entries of that row are co-varied proportionally,
//   theta_j(x) = theta_j · (1 − x) / (1 − theta_s)   (j != s),
// so the row still sums to 1 (proportional co-variation: Laskey 1995, Sensitivity analysis for
// probability assessments in Bayesian networks, IEEE Trans. SMC 25:901; Coupé & van der Gaag
// 2002, Properties of sensitivity analysis of Bayesian belief networks, Annals of Mathematics and
// Artificial Intelligence 36:323 — from memory for the volume and pages). When theta_s = 1 the
// others share 1 − x equally. Under this scheme every P(E, H = h) and P(H = h) is linear in x
// (Coupé & van der Gaag 2002, ibid., the one-way sensitivity function), so two eliminations —
// at x = 0 and x = 1 — give the LR at every x and its exact derivative.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/network/findings_likelihood.hpp"
#include "core/models/network/network_definition.hpp"
#include "core/numbers/likelihood_ratio.hpp"

namespace counterpoise::models::network {

// The exact one-way sensitivity function of one entry: the LR for any value x of the entry.
class SensitivityLine {
 public:
  SensitivityLine(FindingsLikelihood at_zero, FindingsLikelihood at_one, std::vector<std::size_t> hp_states,
                  std::vector<std::size_t> hd_states);
  // The LR with the entry at x (0 <= x <= 1; throws std::domain_error otherwise); nullopt when
  // the findings are impossible under both propositions there, or a proposition is impossible.
  std::optional<numbers::LikelihoodRatio> lr_at(double x) const;
  // d log10 LR / dx at x; nullopt where the LR is zero, infinite or undefined.
  std::optional<double> derivative_at(double x) const;

 private:
  std::optional<double> log10_conditional_at(double x, const std::vector<std::size_t>& states) const;
  FindingsLikelihood zero_, one_;
  std::vector<std::size_t> hp_, hd_;
};

struct EntrySensitivity {
  std::size_t node = 0, row = 0, state = 0;
  double value = 0.0;  // the entry's mean, as the point LR uses it
  EntryRange range;    // the values tried (cpt_row.hpp: entry_range)
  std::optional<numbers::LikelihoodRatio> lr_at_value, lr_at_low, lr_at_high;
  std::optional<double> derivative_log10_lr;  // d log10 LR / d entry at value
  SensitivityLine line;                       // the LR at any other value
};

// A row per entry of every CPT that can affect the LR (barren nodes and a proposition node
// given without a table are left out), in node, row, state order. Never throws for a network
// that read_network accepted.
std::vector<EntrySensitivity> one_way_sensitivity(const Network& network, const FindingsLikelihoodPlan& plan);

// How far the log10 LR moves from its value at the entry's mean, at the farther end of the
// entry's range; infinite when the LR at the mean or at either end is zero, infinite or
// undefined (such an entry can decide the evaluation). Never throws.
double largest_log10_move(const EntrySensitivity& entry);

// Orders `rows` by largest_log10_move, largest first; rows with equal moves keep their node,
// row, state order. Never throws.
void order_by_effect(std::vector<EntrySensitivity>& rows);

// The log10 LR at one end of a row, for readers: the log10 value as numbers::log10_for_readers
// writes it, "LR zero" and "LR infinite" for the explicit states, "undefined" when the findings
// or a proposition become impossible there. Never throws.
std::string sensitivity_end_text(const std::optional<numbers::LikelihoodRatio>& lr);

// The table as JSON rows: node, row (parent states), state, value, low, high, basis,
// log10_lr_at_value / _low / _high (null when undefined; "zero"/"infinite" as strings), derivative.
nlohmann::json sensitivity_to_json(const Network& network, const std::vector<EntrySensitivity>& rows);

}  // namespace counterpoise::models::network
