#include "core/comparison/game_shares.hpp"

#include <cmath>

namespace counterpoise::comparison {

std::string method_name(AttributionMethod method) {
  switch (method) {
    case AttributionMethod::single: return "single";
    case AttributionMethod::exact: return "shapley-exact";
    case AttributionMethod::sampled: return "shapley-sampled";
    case AttributionMethod::joint: return "joint";
    case AttributionMethod::infinite: return "infinite";
    case AttributionMethod::presence: return "presence";
  }
  return "unknown";
}

std::optional<Log10Change> known_change(double from, double to) {
  if (std::isnan(from) || std::isnan(to)) return std::nullopt;
  return Log10Change::between(from, to);
}

Log10Change part_of(const Log10Change& change, std::size_t parts) {
  return change.is_finite() && parts > 1 ? Log10Change::finite_change(change.log10 / static_cast<double>(parts)) : change;
}

GameShares share_out(int players, const CoalitionValue& value) {
  const std::uint64_t all = players == 64 ? ~std::uint64_t{0} : (std::uint64_t{1} << players) - 1;
  const double start = value(0), end = value(all);
  GameShares out;
  out.total = Log10Change::between(start, end);
  out.shares.assign(static_cast<std::size_t>(players), Log10Change{});
  if (players == 0) return out;
  if (std::isfinite(start) && std::isfinite(end)) {
    if (players == 1) {
      out.shares[0] = out.total;
      return out;
    }
    const ShapleyValues shapley = shapley_values(players, value);
    bool finite = true;
    for (double v : shapley.values) finite = finite && std::isfinite(v);
    if (finite) {
      for (int i = 0; i < players; ++i)
        out.shares[static_cast<std::size_t>(i)] = Log10Change::finite_change(shapley.values[static_cast<std::size_t>(i)]);
      out.method = shapley.exact ? AttributionMethod::exact : AttributionMethod::sampled;
      if (!shapley.exact)
        out.note = "Shapley share estimated from " + std::to_string(2 * shapley.orders) + " seeded orders of the changes";
      return out;
    }
    // Some mixture of the two versions has no finite LR, or cannot be read: the changes act
    // only together, and the Shapley value of that (unanimity) game is an equal split.
    for (auto& share : out.shares) share = Log10Change::finite_change(out.total.log10 / players);
    out.method = AttributionMethod::joint;
    out.note =
        "the item cannot be evaluated with only some of these changes (a value outside its own interval, or no "
        "finite LR); they act together and share the change equally";
    return out;
  }
  out.method = AttributionMethod::infinite;
  if (out.total.is_finite()) {
    out.note = std::isinf(start) && start < 0 ? "the LR is zero in both versions" : "the LR is infinite in both versions";
    return out;
  }
  bool any = false;
  for (int i = 0; i < players; ++i) {
    const std::uint64_t bit = std::uint64_t{1} << i;
    const auto alone = known_change(start, value(bit));
    const auto back = known_change(value(all & ~bit), end);
    if ((alone && alone->state == out.total.state) || (back && back->state == out.total.state)) {
      out.shares[static_cast<std::size_t>(i)] = out.total;
      any = true;
    }
  }
  if (!any) {
    for (auto& share : out.shares) share = out.total;
    out.note = "the LR becomes zero or infinite only through these changes together";
  } else {
    out.note = "the change is infinite: it is given to the changes that make the LR zero or infinite by themselves";
  }
  return out;
}

}  // namespace counterpoise::comparison
