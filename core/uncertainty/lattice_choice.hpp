#pragma once
// What a lattice spacing is chosen from: the width of a distribution's central part, and
// moving a distribution onto a coarser lattice. (Choosing an item's own spacing, which asks the
// item's model for its lattice form, is evaluation::resolved_grid.)

#include "core/uncertainty/grid_pmf.hpp"

namespace counterpoise::uncertainty {

// Width of the central 99.8 % of the finite part (0 for a point mass).
double central_width(const GridPmf& pmf);

// The same distribution on a coarser lattice `step` (>= pmf.step): each bin's mass moves to the
// coarse bin holding its centre; the continuous shift is folded into the lattice. Tails and
// support are kept.
GridPmf rebin(const GridPmf& pmf, double step);

}  // namespace counterpoise::uncertainty
