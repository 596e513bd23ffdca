#include "app/cli/evaluation_table.hpp"

#include <cmath>
#include <cstdio>
#include <ostream>

#include "core/numbers/reader_format.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

namespace {

std::string fixed(double x, int decimals) {
  if (std::isinf(x)) return x > 0 ? "inf" : "-inf";
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, x);
  return buffer;
}

using validation::display_text;

// The cell shown escaped, padded by the width of what is shown (escapes included).
std::string pad(const std::string& text, std::size_t width) {
  const std::string shown = display_text(text);
  const std::size_t chars = validation::display_width(shown);
  return shown + std::string(chars < width ? width - chars : 1, ' ');
}

std::string interval_text(const std::optional<uncertainty::SpreadSummary>& spread) {
  if (!spread) return "-";
  return "[" + fixed(spread->low_log10, 2) + ", " + fixed(spread->high_log10, 2) + "]";
}

}  // namespace

void print_evaluation_table(const casefile::Case& value, const evaluation::CaseEvaluation& result, std::ostream& out) {
  out << "Case " << display_text(value.details.reference)
      << (value.details.title.empty() ? "" : " — " + display_text(value.details.title)) << "\n";
  out << "Hp: " << display_text(value.propositions.hp) << "\nHd: " << display_text(value.propositions.hd) << "\n";
  out << "Level: " << casefile::level_name(value.propositions.level) << " propositions; mode: "
      << casefile::mode_name(value.mode_or_default()) << "; verbal scale: " << display_text(value.verbal_scale.title()) << "\n\n";
  const int credible = static_cast<int>(std::lround(value.uncertainty_or_default().credible_level_or_default() * 100));
  out << pad("Item", 8) << pad("Model", 22) << pad("LR", 16) << pad("log10 LR", 10)
      << pad("log10 " + std::to_string(credible) + "% interval", 20) << "Verbal\n";
  for (std::size_t i = 0; i < result.items.size(); ++i) {
    const auto& item = result.items[i];
    const int figures = numbers::significant_figures_for(
        item.spread ? std::optional<double>(item.spread->high_log10 - item.spread->low_log10) : std::nullopt);
    out << pad(item.id, 8) << pad(value.items[i].model_name, 22)
        << pad(numbers::lr_for_readers(item.point.lr, figures), 16) << pad(fixed(item.point.lr.log10(), 3), 10)
        << pad(interval_text(item.spread), 20) << display_text(item.verbal.label)
        << (item.included ? "" : "  (left out: " + display_text(item.exclusion_reason) + ")") << "\n";
    for (const auto& note : item.point.notes) out << "        note: " << display_text(note.message) << "\n";
  }
  const auto& c = result.combined;
  const int figures = numbers::significant_figures_for(
      c.spread ? std::optional<double>(c.spread->high_log10 - c.spread->low_log10) : std::nullopt);
  out << "\nCombined (" << c.included_ids.size() << " items, independence assumed as stated): LR "
      << numbers::lr_for_readers(c.lr, figures) << ", log10 LR " << fixed(c.lr.log10(), 3);
  if (c.spread)
    out << ", " << credible << "% interval " << interval_text(c.spread) << ", conservative bound (log10) "
        << fixed(c.spread->conservative_log10, 2);
  out << "\n" << display_text(c.verbal.sentence) << "\n";
  if (c.monte_carlo_check)
    out << "Monte Carlo check: " << interval_text(c.monte_carlo_check) << ", median " << fixed(c.monte_carlo_check->median_log10, 3)
        << " (" << c.monte_carlo_check->method << ")\n";

  out << "\nIllustration only — how this LR would change prior odds held by the fact-finder (the scientist "
         "proposes no prior):\n";
  out << pad("Prior odds", 22) << pad("Posterior P(Hp)", 24) << "Posterior P(Hd)\n";
  for (const auto& row : result.sensitivity.rows) {
    std::string prior = numbers::odds_for_readers(row.prior.log10_prior_odds);
    if (row.prior.one_of_n) prior = "one of " + numbers::magnitude_for_readers(std::log10(*row.prior.one_of_n), 3);
    out << pad(prior, 22) << pad(numbers::posterior_for_readers(row.posterior, 3), 24)
        << numbers::probability_for_readers(row.posterior.log10_complement, 3) << "\n";
  }
  for (const auto& t : result.sensitivity.thresholds)
    out << "Posterior P(Hp) reaches " << t.threshold << " from prior odds of "
        << (std::isinf(t.log10_prior_odds) ? (t.log10_prior_odds > 0 ? "never" : "any")
                                            : numbers::odds_for_readers(t.log10_prior_odds))
        << "\n";
}

}  // namespace counterpoise::cli
