#include "core/models/network/network_sensitivity.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "core/numbers/log10_math.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::models::network {

using numbers::LikelihoodRatio;

namespace {

constexpr double kMinusInf = -std::numeric_limits<double>::infinity();

std::optional<LikelihoodRatio> lr_from(std::optional<double> log10_hp, std::optional<double> log10_hd) {
  if (!log10_hp || !log10_hd) return std::nullopt;
  if (*log10_hp == kMinusInf && *log10_hd == kMinusInf) return std::nullopt;
  return LikelihoodRatio::from_log10_probabilities(*log10_hp, *log10_hd);
}

double log10_sum_over(const std::vector<double>& values, const std::vector<std::size_t>& states) {
  std::vector<double> terms;
  for (auto s : states) terms.push_back(values[s]);
  return numbers::log10_sum(terms);
}

// log10 of f(x) = f0 (1 − x) + f1 x from log10 f0 and log10 f1.
double log10_line(double log10_f0, double log10_f1, double x) {
  return numbers::log10_add(log10_f0 + std::log10(1.0 - x), log10_f1 + std::log10(x));
}

// d ln f / dx at x for the line through f0 and f1 (f(x) > 0).
double log_slope(double log10_f0, double log10_f1, double x) {
  const double log10_fx = log10_line(log10_f0, log10_f1, x);
  return std::pow(10.0, log10_f1 - log10_fx) - std::pow(10.0, log10_f0 - log10_fx);
}

// The row with entry `state` at 0 (others renormalised) and at 1 (others 0), as log10.
std::pair<std::vector<double>, std::vector<double>> end_rows(const std::vector<double>& log10_row, std::size_t state) {
  const std::size_t k = log10_row.size();
  std::vector<double> at_zero(k), at_one(k, kMinusInf);
  at_one[state] = 0.0;
  const double log10_rest = numbers::log10_one_minus(log10_row[state]);
  for (std::size_t j = 0; j < k; ++j) {
    if (j == state)
      at_zero[j] = kMinusInf;
    else if (log10_rest == kMinusInf)
      at_zero[j] = -std::log10(static_cast<double>(k - 1));
    else
      at_zero[j] = log10_row[j] - log10_rest;
  }
  return {at_zero, at_one};
}

nlohmann::json lr_json(const std::optional<LikelihoodRatio>& lr) {
  if (!lr) return nullptr;
  if (lr->is_zero()) return "zero";
  if (lr->is_infinite()) return "infinite";
  return lr->log10();
}

}  // namespace

SensitivityLine::SensitivityLine(FindingsLikelihood at_zero, FindingsLikelihood at_one,
                                 std::vector<std::size_t> hp_states, std::vector<std::size_t> hd_states)
    : zero_(std::move(at_zero)), one_(std::move(at_one)), hp_(std::move(hp_states)), hd_(std::move(hd_states)) {}

std::optional<double> SensitivityLine::log10_conditional_at(double x, const std::vector<std::size_t>& states) const {
  std::vector<double> joint, prior;
  for (std::size_t h = 0; h < zero_.log10_joint.size(); ++h) {
    joint.push_back(log10_line(zero_.log10_joint[h], one_.log10_joint[h], x));
    prior.push_back(log10_line(zero_.log10_prior[h], one_.log10_prior[h], x));
  }
  return log10_conditional(joint, prior, states);
}

std::optional<LikelihoodRatio> SensitivityLine::lr_at(double x) const {
  if (!(x >= 0.0 && x <= 1.0)) throw std::domain_error("SensitivityLine::lr_at: x outside [0, 1]");
  return lr_from(log10_conditional_at(x, hp_), log10_conditional_at(x, hd_));
}

std::optional<double> SensitivityLine::derivative_at(double x) const {
  const auto lr = lr_at(x);
  if (!lr || !lr->is_finite()) return std::nullopt;
  double slope = 0.0;
  for (int side = 0; side < 2; ++side) {
    const auto& states = side == 0 ? hp_ : hd_;
    const double sign = side == 0 ? 1.0 : -1.0;
    const double d_joint = log_slope(log10_sum_over(zero_.log10_joint, states), log10_sum_over(one_.log10_joint, states), x);
    const double d_prior = log_slope(log10_sum_over(zero_.log10_prior, states), log10_sum_over(one_.log10_prior, states), x);
    slope += sign * (d_joint - d_prior);
  }
  slope /= numbers::kLn10;
  if (!std::isfinite(slope)) return std::nullopt;
  return slope;
}

std::vector<EntrySensitivity> one_way_sensitivity(const Network& network, const FindingsLikelihoodPlan& plan) {
  std::vector<EntrySensitivity> rows;
  const Log10Cpts base = network.mean_log10_cpts();
  for (std::size_t n = 0; n < network.nodes.size(); ++n) {
    const Node& node = network.nodes[n];
    if (!plan.is_relevant(n) || !node.cpt_given) continue;
    const std::size_t k = node.states.size();
    for (std::size_t r = 0; r < node.cpt.size(); ++r) {
      const std::vector<double> log10_row(base[n].begin() + static_cast<std::ptrdiff_t>(r * k),
                                          base[n].begin() + static_cast<std::ptrdiff_t>((r + 1) * k));
      const auto means = mean_row(node.cpt[r]);
      for (std::size_t s = 0; s < k; ++s) {
        auto [row_zero, row_one] = end_rows(log10_row, s);
        Log10Cpts cpts = base;
        std::copy(row_zero.begin(), row_zero.end(), cpts[n].begin() + static_cast<std::ptrdiff_t>(r * k));
        auto at_zero = plan.compute(cpts);
        std::copy(row_one.begin(), row_one.end(), cpts[n].begin() + static_cast<std::ptrdiff_t>(r * k));
        auto at_one = plan.compute(cpts);
        SensitivityLine line(std::move(at_zero), std::move(at_one), plan.hp_states(), plan.hd_states());
        const double value = means[s];
        const EntryRange range = entry_range(node.cpt[r], s);
        rows.push_back(EntrySensitivity{n, r, s, value, range, line.lr_at(value), line.lr_at(range.low),
                                        line.lr_at(range.high), line.derivative_at(value), std::move(line)});
      }
    }
  }
  return rows;
}

double largest_log10_move(const EntrySensitivity& entry) {
  const auto finite = [](const std::optional<LikelihoodRatio>& lr) { return lr && lr->is_finite(); };
  if (!finite(entry.lr_at_value) || !finite(entry.lr_at_low) || !finite(entry.lr_at_high))
    return std::numeric_limits<double>::infinity();
  const double at_value = entry.lr_at_value->log10();
  return std::max(std::abs(entry.lr_at_low->log10() - at_value), std::abs(entry.lr_at_high->log10() - at_value));
}

void order_by_effect(std::vector<EntrySensitivity>& rows) {
  std::stable_sort(rows.begin(), rows.end(), [](const EntrySensitivity& a, const EntrySensitivity& b) {
    return largest_log10_move(a) > largest_log10_move(b);
  });
}

std::string sensitivity_end_text(const std::optional<LikelihoodRatio>& lr) {
  if (!lr) return "undefined";
  if (lr->is_zero()) return "LR zero";
  if (lr->is_infinite()) return "LR infinite";
  return numbers::log10_for_readers(lr->log10());
}

nlohmann::json sensitivity_to_json(const Network& network, const std::vector<EntrySensitivity>& rows) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& e : rows) {
    const Node& node = network.nodes[e.node];
    out.push_back({{"node", node.name},
                   {"row", network.row_label(e.node, e.row)},
                   {"state", node.states[e.state]},
                   {"value", e.value},
                   {"low", e.range.low},
                   {"high", e.range.high},
                   {"basis", e.range.basis},
                   {"log10_lr_at_value", lr_json(e.lr_at_value)},
                   {"log10_lr_at_low", lr_json(e.lr_at_low)},
                   {"log10_lr_at_high", lr_json(e.lr_at_high)},
                   {"derivative_log10_lr", e.derivative_log10_lr ? nlohmann::json(*e.derivative_log10_lr) : nullptr}});
  }
  return out;
}

}  // namespace counterpoise::models::network
