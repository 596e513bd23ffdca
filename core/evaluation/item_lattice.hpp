#pragma once
// Choosing the lattice an item's distribution of log10 LR is read from: about 500 bins across
// its own central 99.8 %, at every width down to a point mass, without the long log tails of a
// Beta distribution making the lattice huge. The item's interval, median and conservative bound
// are read from this lattice, so they are within one lattice step of the exact quantiles.

#include <optional>

#include "core/models/evidence_model.hpp"
#include "core/uncertainty/grid_pmf.hpp"

namespace counterpoise::evaluation {

// The item's distribution on a lattice resolved for its own spread, or nullopt when the model
// offers no lattice form (then draws are used). A distribution narrower than the first trial
// step is refined until its central part spans hundreds of bins, or until the step reaches the
// resolution of a double at the item's value (a point mass).
std::optional<uncertainty::GridPmf> resolved_grid(const models::EvidenceModel& model);

}  // namespace counterpoise::evaluation
