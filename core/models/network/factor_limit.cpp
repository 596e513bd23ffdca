#include "core/models/network/factor_limit.hpp"

#include <cmath>

#include "core/models/network/network_definition.hpp"
#include "core/numbers/number_text.hpp"
#include "core/platform/environment_limit.hpp"

namespace counterpoise::models::network {

namespace {

// At most this many node names in a message; the rest are counted.
constexpr std::size_t kNamesShown = 12;

std::string node_names(const Network& network, const std::vector<std::size_t>& vars) {
  std::string text;
  for (std::size_t i = 0; i < vars.size() && i < kNamesShown; ++i) text += (i ? ", " : "") + network.nodes[vars[i]].name;
  if (vars.size() > kNamesShown) text += " and " + std::to_string(vars.size() - kNamesShown) + " more";
  return text;
}

}  // namespace

std::size_t factor_limit_entries() {
  return static_cast<std::size_t>(platform::mib_limit_from_environment(kFactorLimitVariable, kDefaultFactorLimitBytes) /
                                  sizeof(double));
}

std::string factor_refusal_text(const Network& network, const std::string& lead, const FactorScope& factor,
                                std::size_t limit_entries) {
  const double log10_bytes = factor.log10_entries + std::log10(static_cast<double>(sizeof(double)));
  const double log10_mib = log10_bytes - std::log10(static_cast<double>(platform::kMiB));
  return lead + " over " + std::to_string(factor.vars.size()) + " nodes (" +
         node_names(network, factor.vars) + ") of " + numbers::magnitude_for_readers(factor.log10_entries) +
         " entries (" + numbers::magnitude_for_readers(log10_mib) + " MiB), more than the limit of " +
         numbers::count_for_readers(static_cast<std::int64_t>(limit_entries)) + " entries (" +
         numbers::count_for_readers(static_cast<std::int64_t>(limit_entries * sizeof(double) / platform::kMiB)) +
         " MiB) for one table. Remove arrows or states, or raise the limit with " +
         kFactorLimitVariable + " (in MiB)";
}

}  // namespace counterpoise::models::network
