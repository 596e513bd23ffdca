#pragma once
// The bound on one table (factor) of a network's calculation. A small network file with a dense
// graph can ask variable elimination for a factor of any size (120 nodes in 32 KB once asked for
// 2^29 entries, 4 GiB of values); the plan knows every size before anything is allocated
// (variable_elimination.hpp), and a network that needs more than this is refused, naming the
// limit and how to raise it (docs/file-formats.md, "Limits").

#include <cstddef>
#include <cstdint>
#include <string>

#include "core/models/network/variable_elimination.hpp"

namespace counterpoise::models::network {

struct Network;

// The environment variable that raises (or lowers) the limit on one factor, in MiB of values.
inline constexpr const char* kFactorLimitVariable = "COUNTERPOISE_NETWORK_FACTOR_LIMIT_MIB";

// The default: 128 MiB of values (16 777 216 entries, a factor over 24 binary nodes). The
// networks of the worked examples and demo cases need factors of at most a few hundred entries,
// and a network a person can read and check (tens of nodes of a few states) stays far below
// this; a case that reaches it spends seconds on every evaluation and far longer on its Monte
// Carlo draws and sensitivity runs, while a refused case costs no memory at all.
inline constexpr std::uintmax_t kDefaultFactorLimitBytes = 128ull * 1024 * 1024;

// The limit now in force, in entries (values of 8 bytes): kFactorLimitVariable when set (a whole
// number of MiB, at least 1), else kDefaultFactorLimitBytes. Throws validation::InvalidValue
// naming the variable when it is set to anything else.
std::size_t factor_limit_entries();

// The sentence of a refusal: `lead` (what needs the table, ending before "over"), the factor's
// nodes by name and its size, the limit, and how to raise it.
std::string factor_refusal_text(const Network& network, const std::string& lead, const FactorScope& factor,
                                std::size_t limit_entries);

}  // namespace counterpoise::models::network
