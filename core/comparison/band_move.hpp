#pragma once
// Whether a difference moves the verbal conclusion: changed by itself from the first version (its
// effect alone, item_attribution.hpp), would it put an LR — the combined LR, the LR against one
// alternative or the compound LR against the weighted set — in another verbal band, or on the
// other side of LR 1, than the first version's? The moved LR is expressed on the second version's
// scale (where the comparison's conclusion is drawn), the first version's LR on its own.

#include <cstddef>
#include <functional>
#include <optional>
#include <vector>

#include "core/comparison/log10_change.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::comparison {

// The verbal expression of a log10 LR (-inf for LR zero, +inf for an infinite LR) on `scale`.
verbal::VerbalExpression words_for_log10(const verbal::VerbalScale& scale, double log10_lr);

// Whether two expressions say different things: another band, or support for the other proposition.
bool band_differs(const verbal::VerbalExpression& x, const verbal::VerbalExpression& y);

// Whether the LR at `log10_from` (expressed as `words_from`), moved by `alone`, is expressed
// differently on `scale`. No effect alone (nullopt) or a finite change of exactly 0 moves nothing;
// an infinite change away from LR zero or an infinite LR always moves it (their words are their own).
bool alone_moves_band(double log10_from, const verbal::VerbalExpression& words_from,
                      const std::optional<Log10Change>& alone, const verbal::VerbalScale& scale);

// `order` with the indexes for which `moves` holds first; each group keeps its order.
std::vector<std::size_t> movers_first(std::vector<std::size_t> order, const std::function<bool(std::size_t)>& moves);

}  // namespace counterpoise::comparison
