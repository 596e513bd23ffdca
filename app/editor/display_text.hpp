#pragma once
// Text for numbers on screen, through the core's reader formatting (core/numbers/number_text)
// so the editor and the report write the same number the same way.

#include <QString>

#include <optional>

#include "core/numbers/likelihood_ratio.hpp"
#include "core/uncertainty/spread_summary.hpp"

namespace counterpoise::editor {

// "about 2 300", "1.23 × 10⁹", "0 (exclusion)", "infinite".
QString lr_text(const numbers::LikelihoodRatio& lr, const std::optional<uncertainty::SpreadSummary>& spread);
// "3.36", "−inf" ...
QString log10_text(double log10_value);
// "1 100 to 4 500 (90 %)" or empty.
QString interval_text(const std::optional<uncertainty::SpreadSummary>& spread);
// A probability given as log10, for readers.
QString probability_text(double log10_p);

}  // namespace counterpoise::editor
