#include "core/evaluation/item_lattice.hpp"

#include <algorithm>
#include <cmath>

#include "core/uncertainty/lattice_choice.hpp"

namespace counterpoise::evaluation {

using uncertainty::GridPmf;

namespace {
constexpr double kFirstStep = 0.05;
constexpr double kBinsAcrossCentre = 500.0;
constexpr double kMaxBins = 200000.0;
// A distribution whose finite mass still sits in one bin is refined by this factor at a time.
constexpr double kNarrowRefinement = 1e-3;
// Below this step relative to the value, lattice edges can no longer be told apart in double
// precision (about 2^-52 ≈ 2.2e-16 relative): what remains in one bin is a point mass.
constexpr double kFinestRelativeStep = 1e-13;
constexpr int kMaxAttempts = 12;

// A value the item's distribution takes, to scale the finest step: the centre of its mass.
double centre_of(const GridPmf& grid) {
  const double mean = grid.finite_mean();
  return std::isfinite(mean) ? mean : 0.0;
}
}  // namespace

std::optional<GridPmf> resolved_grid(const models::EvidenceModel& model) {
  double step = kFirstStep;
  std::optional<GridPmf> grid = model.log10_lr_grid(step);
  for (int attempt = 0; grid && attempt < kMaxAttempts; ++attempt) {
    if (grid->mass.empty()) return grid;  // all mass at LR zero or infinite
    const double width = uncertainty::central_width(*grid);
    double next = 0.0;
    if (width <= 0.0) {
      // All finite mass in one bin: narrower than the step, or a point mass.
      const double finest = kFinestRelativeStep * std::max(1.0, std::abs(centre_of(*grid)));
      if (step <= finest) return grid;
      next = std::max(step * kNarrowRefinement, finest);
    } else {
      const double bins = width / step;
      if (bins >= 0.5 * kBinsAcrossCentre && bins <= 4.0 * kBinsAcrossCentre) return grid;
      next = width / kBinsAcrossCentre;
      // Keep the whole lattice, tails included, within kMaxBins.
      const double total_bins = static_cast<double>(grid->mass.size()) * step / next;
      if (total_bins > kMaxBins) next *= total_bins / kMaxBins;
      if (std::abs(next - step) < 1e-3 * step) return grid;
    }
    step = next;
    grid = model.log10_lr_grid(step);
  }
  return grid;
}

}  // namespace counterpoise::evaluation
