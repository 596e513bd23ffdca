#include "core/models/network/cpt_row.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/distributions/beta.hpp>

#include "core/numbers/log10_math.hpp"
#include "core/numbers/math_policy.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"
#include "core/validation/checks.hpp"

namespace counterpoise::models::network {

using nlohmann::json;
using numbers::exact_text;
using validation::InconsistentSizes;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr double kMinusInf = -std::numeric_limits<double>::infinity();
constexpr const char* kComplement = "complement";

template <class... Ts>
struct Overloaded : Ts... {
  using Ts::operator()...;
};
template <class... Ts>
Overloaded(Ts...) -> Overloaded<Ts...>;

Location entry_location(const Location& where, std::size_t index) {
  return Location{where.item, where.field + "[" + std::to_string(index) + "]"};
}

void check_row_size(std::size_t found, std::size_t state_count, const Location& where, const std::string& row_label) {
  if (found != state_count)
    throw InconsistentSizes(where, row_label + " has " + std::to_string(found) + " entries; the node has " +
                                       std::to_string(state_count) + " states");
}

// The largest value an assignment can take (its upper support).
double upper_support(const probability::Assignment& a) {
  if (const auto* point = std::get_if<probability::PointValue>(&a)) return point->p;
  if (const auto* interval = std::get_if<probability::IntervalValue>(&a)) return interval->high;
  return 1.0;  // Beta and counts have support up to 1
}

CptRow read_dirichlet(const json& value, std::size_t state_count, const Location& where, const std::string& row_label) {
  if (value.contains("dirichlet")) {
    reading::check_known_members(value, {"dirichlet"}, where);
    const Location at = where.with_field("dirichlet");
    const auto alpha = reading::read_number_array(value.at("dirichlet"), at);
    check_row_size(alpha.size(), state_count, at, row_label);
    for (std::size_t i = 0; i < alpha.size(); ++i) validation::check_positive(entry_location(at, i), alpha[i]);
    return DirichletRow{alpha, std::nullopt, 1.0};
  }
  if (value.contains("counts")) {
    reading::check_known_members(value, {"counts", "prior"}, where);
    const Location at = where.with_field("counts");
    const json& counts_json = value.at("counts");
    if (!counts_json.is_array())
      throw InvalidValue(at, "row counts are an array with one count per state, found " +
                                 reading::json_type_name(counts_json));
    check_row_size(counts_json.size(), state_count, at, row_label);
    DirichletRow row;
    std::vector<std::int64_t> counts;
    for (std::size_t i = 0; i < counts_json.size(); ++i)
      counts.push_back(reading::read_count(counts_json[i], entry_location(at, i)));
    if (const json* prior = reading::find_member(value, "prior"))
      row.prior = validation::check_positive(where.with_field("prior"),
                                             reading::read_number(*prior, where.with_field("prior")));
    for (auto n : counts) row.alpha.push_back(static_cast<double>(n) + row.prior);
    row.counts = counts;
    return row;
  }
  throw InvalidValue(where, row_label + ": a row given as an object needs \"dirichlet\" or \"counts\"");
}

CptRow read_array_row(const json& value, std::size_t state_count, const Location& where, const std::string& row_label) {
  check_row_size(value.size(), state_count, where, row_label);
  const bool all_numbers = std::all_of(value.begin(), value.end(), [](const json& e) { return e.is_number(); });
  if (all_numbers) {
    PointRow row;
    double sum = 0.0;
    for (std::size_t i = 0; i < value.size(); ++i) {
      const Location at = entry_location(where, i);
      row.p.push_back(validation::check_probability(at, reading::read_number(value[i], at)));
      sum += row.p.back();
    }
    if (!(std::fabs(sum - 1.0) <= kRowSumTolerance))
      throw InvalidValue(where, row_label + " sums to " + exact_text(sum) + ", not 1 (tolerance " +
                                    exact_text(kRowSumTolerance) + "); give exact values or one entry \"" +
                                    kComplement + "\"");
    return row;
  }
  ComplementRow row;
  std::optional<std::size_t> complement;
  std::optional<std::size_t> uncertain;
  double largest_sum = 0.0;
  for (std::size_t i = 0; i < value.size(); ++i) {
    const Location at = entry_location(where, i);
    if (value[i].is_string()) {
      if (value[i].get<std::string>() != kComplement)
        throw InvalidValue(at, "the only text allowed as an entry is \"complement\", found \"" +
                                   value[i].get<std::string>() + "\"");
      if (complement)
        throw InvalidValue(at, row_label + " has more than one \"complement\" entry (first at " +
                                   std::to_string(*complement) + ")");
      complement = i;
      row.entries.push_back(probability::PointValue{0.0});
      continue;
    }
    row.entries.push_back(probability::read_assignment(value[i], at));
    if (probability::is_uncertain(row.entries.back())) {
      if (uncertain)
        throw InvalidValue(at, row_label + " has more than one uncertain entry; a row whose entries are all "
                                           "uncertain is given as {\"dirichlet\": [...]} or {\"counts\": [...]}");
      uncertain = i;
    }
    largest_sum += upper_support(row.entries.back());
  }
  if (!complement)
    throw InvalidValue(where, row_label + " has uncertain entries but no \"complement\" entry; mark the entry "
                                          "that takes 1 minus the others as \"complement\", or use the "
                                          "{\"dirichlet\": [...]} form");
  if (largest_sum > 1.0)
    throw InvalidValue(where, row_label + ": the entries other than the complement can sum to " +
                                  exact_text(largest_sum) + ", above 1 (a Beta or counts entry can reach 1, so "
                                                            "the other entries must then be 0)");
  row.complement_index = *complement;
  return row;
}

// Sum of the point entries of a complement row, and the index of its uncertain entry.
struct ComplementParts {
  double point_sum = 0.0;
  std::optional<std::size_t> uncertain;
};
ComplementParts complement_parts(const ComplementRow& row) {
  ComplementParts parts;
  for (std::size_t i = 0; i < row.entries.size(); ++i) {
    if (i == row.complement_index) continue;
    if (probability::is_uncertain(row.entries[i]))
      parts.uncertain = i;
    else
      parts.point_sum += probability::mean(row.entries[i]);
  }
  return parts;
}

double dirichlet_total(const DirichletRow& row) {
  double total = 0.0;
  for (double a : row.alpha) total += a;
  return total;
}

EntryRange relative_range(double x) {
  const double half_width = 0.1 * std::min(x, 1.0 - x);
  return {x - half_width, x + half_width, "±10 % of nearer bound"};
}

EntryRange beta_range(double a, double b, std::string basis) {
  const boost::math::beta_distribution<double, numbers::MathPolicy> dist(a, b);
  return {boost::math::quantile(dist, 0.05), boost::math::quantile(dist, 0.95), std::move(basis)};
}

}  // namespace

CptRow read_cpt_row(const json& value, std::size_t state_count, const Location& where, const std::string& row_label) {
  if (value.is_array()) return read_array_row(value, state_count, where, row_label);
  if (value.is_object()) return read_dirichlet(value, state_count, where, row_label);
  throw InvalidValue(where, row_label + " must be an array of entries or a {\"dirichlet\"} / {\"counts\"} object, found " +
                                reading::json_type_name(value));
}

json row_to_json(const CptRow& row) {
  return std::visit(Overloaded{
                        [](const PointRow& r) { return json(r.p); },
                        [](const ComplementRow& r) {
                          json entries = json::array();
                          for (std::size_t i = 0; i < r.entries.size(); ++i)
                            entries.push_back(i == r.complement_index ? json(kComplement)
                                                                      : probability::to_json(r.entries[i]));
                          return entries;
                        },
                        [](const DirichletRow& r) {
                          if (!r.counts) return json{{"dirichlet", r.alpha}};
                          json j = {{"counts", *r.counts}};
                          if (r.prior != 1.0) j["prior"] = r.prior;
                          return j;
                        },
                    },
                    row);
}

std::vector<double> mean_row(const CptRow& row) {
  std::vector<double> means;
  for (double log10_p : mean_log10_row(row)) means.push_back(std::pow(10.0, log10_p));
  return means;
}

std::vector<double> mean_log10_row(const CptRow& row) {
  return std::visit(Overloaded{
                        [](const PointRow& r) {
                          std::vector<double> out;
                          for (double p : r.p) out.push_back(std::log10(p));
                          return out;
                        },
                        [](const ComplementRow& r) {
                          std::vector<double> out;
                          double sum = 0.0;
                          for (std::size_t i = 0; i < r.entries.size(); ++i) {
                            if (i == r.complement_index) {
                              out.push_back(kMinusInf);
                              continue;
                            }
                            out.push_back(probability::log10_mean(r.entries[i]));
                            sum += probability::mean(r.entries[i]);
                          }
                          out[r.complement_index] = std::log10(1.0 - sum);
                          return out;
                        },
                        [](const DirichletRow& r) {
                          std::vector<double> out;
                          const double log10_total = std::log10(dirichlet_total(r));
                          for (double a : r.alpha) out.push_back(std::log10(a) - log10_total);
                          return out;
                        },
                    },
                    row);
}

bool is_uncertain(const CptRow& row) {
  if (std::holds_alternative<DirichletRow>(row)) return true;
  if (const auto* r = std::get_if<ComplementRow>(&row)) return complement_parts(*r).uncertain.has_value();
  return false;
}

void draw_log10_row(const CptRow& row, std::mt19937_64& rng, std::span<double> out) {
  if (const auto* r = std::get_if<DirichletRow>(&row)) {
    // Stick-breaking: p_i = B_i · (rest of the stick), B_i ~ Beta(a_i, a_{i+1} + ... + a_k).
    const std::size_t k = r->alpha.size();
    std::vector<double> alpha_after(k, 0.0);  // a_{i+1} + ... + a_k, summed from the end (no subtraction)
    for (std::size_t i = k - 1; i > 0; --i) alpha_after[i - 1] = alpha_after[i] + r->alpha[i];
    double log10_rest = 0.0;
    for (std::size_t i = 0; i + 1 < k; ++i) {
      const double log10_share =
          probability::draw_log10(probability::BetaValue{r->alpha[i], alpha_after[i]}, rng);
      out[i] = log10_rest + log10_share;
      log10_rest += numbers::log10_one_minus(log10_share);
    }
    out[k - 1] = log10_rest;
    return;
  }
  if (const auto* r = std::get_if<ComplementRow>(&row)) {
    const ComplementParts parts = complement_parts(*r);
    for (std::size_t i = 0; i < r->entries.size(); ++i)
      if (i != r->complement_index && i != parts.uncertain) out[i] = probability::log10_mean(r->entries[i]);
    const double log10_free = std::log10(1.0 - parts.point_sum);
    if (!parts.uncertain) {
      out[r->complement_index] = log10_free;
      return;
    }
    const double log10_x = probability::draw_log10(r->entries[*parts.uncertain], rng);
    out[*parts.uncertain] = log10_x;
    // The reader ensured x <= 1 - point_sum; a draw at the upper end may exceed it by rounding only.
    const double excess = log10_x - log10_free;
    out[r->complement_index] = excess >= 0.0 ? kMinusInf : log10_free + numbers::log10_one_minus(excess);
    return;
  }
  const auto means = mean_log10_row(row);
  std::copy(means.begin(), means.end(), out.begin());
}

std::vector<std::string> describe_entries(const CptRow& row) {
  return std::visit(Overloaded{
                        [](const PointRow& r) {
                          std::vector<std::string> out;
                          for (double p : r.p) out.push_back(exact_text(p));
                          return out;
                        },
                        [](const ComplementRow& r) {
                          std::vector<std::string> out;
                          for (std::size_t i = 0; i < r.entries.size(); ++i)
                            out.push_back(i == r.complement_index ? std::string(kComplement)
                                                                  : probability::describe(r.entries[i]));
                          return out;
                        },
                        [](const DirichletRow& r) {
                          std::vector<std::string> out;
                          const double total = dirichlet_total(r);
                          std::int64_t count_total = 0;
                          if (r.counts)
                            for (auto n : *r.counts) count_total += n;
                          for (std::size_t i = 0; i < r.alpha.size(); ++i) {
                            if (r.counts)
                              out.push_back(std::to_string((*r.counts)[i]) + " of " + std::to_string(count_total) +
                                            " (Dirichlet, prior " + exact_text(r.prior) + ")");
                            else
                              out.push_back("Dirichlet(" + exact_text(r.alpha[i]) + " of " + exact_text(total) + ")");
                          }
                          return out;
                        },
                    },
                    row);
}

std::string form_name(const CptRow& row) {
  if (std::holds_alternative<PointRow>(row)) return "point";
  if (std::holds_alternative<ComplementRow>(row)) return "complement";
  return "dirichlet";
}

EntryRange entry_range(const CptRow& row, std::size_t state) {
  if (const auto* r = std::get_if<DirichletRow>(&row)) {
    const double total = dirichlet_total(*r);
    return beta_range(r->alpha[state], total - r->alpha[state], "Dirichlet marginal 5-95 %");
  }
  if (const auto* r = std::get_if<ComplementRow>(&row); r && state != r->complement_index) {
    const auto& entry = r->entries[state];
    if (const auto* interval = std::get_if<probability::IntervalValue>(&entry); interval && interval->low < interval->high)
      return {interval->low, interval->high, "stated interval"};
    if (const auto* beta = std::get_if<probability::BetaValue>(&entry)) return beta_range(beta->a, beta->b, "Beta 5-95 %");
    if (const auto* counts = std::get_if<probability::CountsValue>(&entry))
      return beta_range(static_cast<double>(counts->k) + counts->prior_a,
                        static_cast<double>(counts->n - counts->k) + counts->prior_b, "Beta 5-95 %");
  }
  return relative_range(mean_row(row)[state]);
}

}  // namespace counterpoise::models::network
