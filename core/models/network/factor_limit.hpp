#pragma once
// The bound on exact inference. Variable elimination forms tables over the neighbours of each
// variable it sums out; their size grows exponentially with the network's tree-width (Koller &
// Friedman 2009, Probabilistic Graphical Models, section 9.4 — from memory for the section
// number), so a small network file with a dense graph can ask for tables of any size. The
// largest table a plan forms is known before any is built (plan_elimination), and a network whose
// plan exceeds the limit is refused with a message naming the limit and how to raise it.
// The limits are documented in docs/file-formats.md ("Limits").

#include <cstddef>

#include "core/models/network/variable_elimination.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::models::network {

// The environment variable that raises (or lowers) the limit, in table entries.
inline constexpr const char* kFactorLimitVariable = "COUNTERPOISE_MAX_FACTOR_ENTRIES";
// 2^24 entries: 128 MiB of doubles per table, a few such tables at once during elimination.
inline constexpr std::size_t kDefaultMaxFactorEntries = std::size_t{1} << 24;
// The most nodes a network may have (the planner's cost grows with the square of the count).
inline constexpr std::size_t kMaxNetworkNodes = 2000;

// The limit in force: kFactorLimitVariable when it holds a whole number >= 1, else the default.
std::size_t max_factor_entries();

// Throws validation::InvalidValue at `where` when `plan` forms a table of more entries than
// max_factor_entries(), naming the size, the limit and kFactorLimitVariable.
void check_factor_limit(const EliminationPlan& plan, const validation::Location& where);

}  // namespace counterpoise::models::network
