#pragma once
// Choosing lattice spacings so that an item's distribution of log10 LR is resolved finely
// where its mass is (about 500 bins across its central 99.8 %), without the long log tails
// of a Beta distribution making the lattice huge.

#include <optional>

#include "core/models/evidence_model.hpp"
#include "core/uncertainty/grid_pmf.hpp"

namespace counterpoise::uncertainty {

// The item's distribution on a lattice resolved for its own spread, or nullopt when the model
// offers no lattice form (then draws are used).
std::optional<GridPmf> resolved_grid(const models::EvidenceModel& model);

// Width of the central 99.8 % of the finite part (0 for a point mass).
double central_width(const GridPmf& pmf);

// The same distribution on a coarser lattice `step` (>= pmf.step): each bin's mass moves to the
// coarse bin holding its centre; the continuous shift is folded into the lattice. Tails are kept.
GridPmf rebin(const GridPmf& pmf, double step);

}  // namespace counterpoise::uncertainty
