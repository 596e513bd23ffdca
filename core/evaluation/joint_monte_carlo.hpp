#pragma once
// The joint Monte Carlo of a case: for each chosen item, the case's number of draws of its
// log10 LR from the item's own seeded generator (item_generator), summed draw by draw. The
// draws of the combined log10 LR are what the cross-check summarises.
//
// The items are summed in two fixed halves (the first half of the chosen items, then the second),
// and the two partial sums are added at the end. The halves run on two threads when the machine
// has two cores, one after the other otherwise; the order of every addition is the same either
// way, so the draws do not depend on the number of threads. Only the running sums and one
// buffer per half are held (4 × draws doubles), whatever the number of items.

#include <cstddef>
#include <span>
#include <vector>

#include "core/casefile/case_model.hpp"

namespace counterpoise::evaluation {

// Draws of the sum of the log10 LRs of value.items[i] for i in `item_indices` (each index
// < value.items.size()). `threads` is 1 or 2 (0: two when std::thread::hardware_concurrency()
// reports at least two). Rethrows whatever a model's draws throw.
std::vector<double> joint_log10_lr_draws(const casefile::Case& value, std::span<const std::size_t> item_indices,
                                         unsigned threads = 0);

}  // namespace counterpoise::evaluation
