#include "core/uncertainty/lattice_choice.hpp"

#include <cmath>
#include <numeric>

namespace counterpoise::uncertainty {

double central_width(const GridPmf& pmf) {
  const double finite = std::accumulate(pmf.mass.begin(), pmf.mass.end(), 0.0);
  if (pmf.mass.size() < 2 || finite <= 0.0) return 0.0;
  // Quantiles of the finite part only: shift the probabilities past the -inf mass.
  const double lo = pmf.quantile(pmf.mass_minus_inf + 0.001 * finite);
  const double hi = pmf.quantile(pmf.mass_minus_inf + 0.999 * finite);
  return std::isfinite(hi - lo) ? hi - lo : 0.0;
}

GridPmf rebin(const GridPmf& pmf, double step) {
  GridPmf out;
  out.step = step;
  out.mass_minus_inf = pmf.mass_minus_inf;
  out.mass_plus_inf = pmf.mass_plus_inf;
  out.support_low = pmf.support_low;
  out.support_high = pmf.support_high;
  if (pmf.mass.empty()) return out;
  const auto index_of = [&](std::size_t i) {
    return static_cast<std::int64_t>(std::floor(pmf.value_at(i) / step + 0.5));
  };
  // A point mass keeps its exact value through the shift.
  if (pmf.mass.size() == 1) {
    out.shift = pmf.value_at(0);
    out.mass = pmf.mass;
    return out;
  }
  out.offset = index_of(0);
  out.mass.assign(static_cast<std::size_t>(index_of(pmf.mass.size() - 1) - out.offset + 1), 0.0);
  for (std::size_t i = 0; i < pmf.mass.size(); ++i)
    out.mass[static_cast<std::size_t>(index_of(i) - out.offset)] += pmf.mass[i];
  return out;
}

}  // namespace counterpoise::uncertainty
