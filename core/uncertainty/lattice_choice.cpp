#include "core/uncertainty/lattice_choice.hpp"

#include <cmath>
#include <numeric>

namespace counterpoise::uncertainty {

namespace {
constexpr double kBinsAcrossCentre = 500.0;
constexpr double kMaxBins = 200000.0;
}  // namespace

double central_width(const GridPmf& pmf) {
  const double finite = std::accumulate(pmf.mass.begin(), pmf.mass.end(), 0.0);
  if (pmf.mass.size() < 2 || finite <= 0.0) return 0.0;
  // Quantiles of the finite part only: shift the probabilities past the -inf mass.
  const double lo = pmf.quantile(pmf.mass_minus_inf + 0.001 * finite);
  const double hi = pmf.quantile(pmf.mass_minus_inf + 0.999 * finite);
  return std::isfinite(hi - lo) ? hi - lo : 0.0;
}

std::optional<GridPmf> resolved_grid(const models::EvidenceModel& model) {
  double step = 0.05;
  std::optional<GridPmf> grid;
  for (int attempt = 0; attempt < 6; ++attempt) {
    grid = model.log10_lr_grid(step);
    if (!grid) return std::nullopt;
    const double width = central_width(*grid);
    if (width <= 0.0) return grid;  // a point mass (or all mass at ±inf)
    const double bins = width / step;
    if (bins >= 0.5 * kBinsAcrossCentre && bins <= 4.0 * kBinsAcrossCentre) break;
    double next = width / kBinsAcrossCentre;
    // Keep the whole lattice, tails included, within kMaxBins.
    const double total_bins = static_cast<double>(grid->mass.size()) * step / next;
    if (total_bins > kMaxBins) next *= total_bins / kMaxBins;
    if (std::abs(next - step) < 1e-3 * step) break;
    step = next;
  }
  return grid;
}

GridPmf rebin(const GridPmf& pmf, double step) {
  GridPmf out;
  out.step = step;
  out.mass_minus_inf = pmf.mass_minus_inf;
  out.mass_plus_inf = pmf.mass_plus_inf;
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
