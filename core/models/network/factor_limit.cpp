#include "core/models/network/factor_limit.hpp"

#include <charconv>
#include <cmath>
#include <cstdlib>
#include <string_view>

#include "core/numbers/number_text.hpp"

namespace counterpoise::models::network {

std::size_t max_factor_entries() {
  const char* value = std::getenv(kFactorLimitVariable);
  if (!value) return kDefaultMaxFactorEntries;
  const std::string_view text(value);
  std::size_t limit = 0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), limit);
  if (error != std::errc() || end != text.data() + text.size() || limit == 0) return kDefaultMaxFactorEntries;
  return limit;
}

void check_factor_limit(const EliminationPlan& plan, const validation::Location& where) {
  const std::size_t limit = max_factor_entries();
  if (plan.largest_factor_entries <= static_cast<double>(limit)) return;
  const double gib = plan.largest_factor_entries * sizeof(double) / (1024.0 * 1024.0 * 1024.0);
  throw validation::InvalidValue(
      where, "exact evaluation of this network needs a table of " + numbers::exact_text(plan.largest_factor_entries) +
                 " entries (" + numbers::exact_text(std::ceil(gib * 10) / 10) + " GiB), more than the limit of " +
                 std::to_string(limit) +
                 " entries; give nodes fewer parents or states, or raise the limit for this run with the "
                 "environment variable " + std::string(kFactorLimitVariable));
}

}  // namespace counterpoise::models::network
