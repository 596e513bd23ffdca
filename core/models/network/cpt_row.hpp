#pragma once
// One row of a conditional probability table (CPT): the distribution of a node's states for one
// combination of its parents' states. Three forms:
//  - a point row: numbers that sum to 1 within kRowSumTolerance (used as given, never rescaled);
//  - a complement row: one entry is "complement" (1 minus the others); the others are assigned
//    probabilities (number, interval, Beta or counts), at most one of them uncertain, and their
//    largest possible sum must not exceed 1, so every draw is a proper distribution;
//  - a Dirichlet row: {"dirichlet": [a1..ak]} or {"counts": [n1..nk], "prior": a0}, the latter
//    Dirichlet(n_i + a0) — the multinomial form of the rule of succession (Gelman et al. 2013,
//    Bayesian Data Analysis, 3rd ed., section 3.4 — from memory for the section number).
// Dirichlet draws use stick-breaking through Beta draws: p1 ~ Beta(a1, a2 + ... + ak), and the
// rest of the stick is split the same way (e.g. Devroye 1986, Non-Uniform Random Variate
// Generation, chapter XI — from memory for the chapter).

#include <cstddef>
#include <cstdint>
#include <optional>
#include <random>
#include <span>
#include <string>
#include <variant>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/probability/probability_assignment.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::models::network {

// A point row must sum to 1 within this absolute tolerance.
inline constexpr double kRowSumTolerance = 1e-9;

struct PointRow {
  std::vector<double> p;
};
struct ComplementRow {
  std::vector<probability::Assignment> entries;  // the complement's own slot is ignored
  std::size_t complement_index = 0;
};
struct DirichletRow {
  std::vector<double> alpha;
  std::optional<std::vector<std::int64_t>> counts;  // set when the row was given as counts
  double prior = 1.0;                               // a0 of the counts form
};
using CptRow = std::variant<PointRow, ComplementRow, DirichletRow>;

// Reads one row over `state_count` states. `row_label` (e.g. "row 2 (H=hd)") goes into messages.
// Throws validation::InconsistentSizes when the row does not have `state_count` entries, and
// validation::InvalidValue for: an entry outside [0, 1] or malformed, a point row whose sum is
// not 1 within kRowSumTolerance, uncertain entries without a "complement" entry, more than one
// "complement" or more than one uncertain entry in a complement row, entries that can sum above 1
// in a complement row, Dirichlet parameters <= 0, negative counts, a prior <= 0, unknown keys.
CptRow read_cpt_row(const nlohmann::json& value, std::size_t state_count, const validation::Location& where,
                    const std::string& row_label);
// The JSON form that read_cpt_row reads back to the same row.
nlohmann::json row_to_json(const CptRow& row);

// The mean of each entry (the marginal probabilities used for the point LR).
std::vector<double> mean_row(const CptRow& row);
// log10 of the mean of each entry (-inf for a zero entry).
std::vector<double> mean_log10_row(const CptRow& row);
// True when some entry carries an interval or a distribution.
bool is_uncertain(const CptRow& row);
// One joint draw of the row as log10 probabilities into `out` (size: the state count).
void draw_log10_row(const CptRow& row, std::mt19937_64& rng, std::span<double> out);
// Plain text of each entry for tables: "0.8", "Beta(2, 8)", "complement", "Dirichlet(3 of 12)".
std::vector<std::string> describe_entries(const CptRow& row);
// "point", "complement" or "dirichlet".
std::string form_name(const CptRow& row);

// The range over which one-way sensitivity varies an entry, and how it was chosen.
struct EntryRange {
  double low = 0.0;
  double high = 0.0;
  std::string basis;  // "stated interval", "Beta 5-95 %", "Dirichlet marginal 5-95 %", "±10 % of nearer bound"
};
// The stated interval, the 5 % and 95 % quantiles of a Beta (or Dirichlet marginal), or, for a
// point entry (and the complement), x ± 0.1·min(x, 1 − x) so the range stays inside [0, 1].
EntryRange entry_range(const CptRow& row, std::size_t state);

}  // namespace counterpoise::models::network
