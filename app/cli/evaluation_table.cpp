#include "app/cli/evaluation_table.hpp"

#include <cmath>
#include <cstdio>
#include <ostream>

#include "core/numbers/number_text.hpp"

namespace counterpoise::cli {

namespace {

std::string pad(const std::string& text, std::size_t width) {
  // Width in characters, counting UTF-8 continuation bytes out.
  std::size_t chars = 0;
  for (unsigned char c : text) chars += (c & 0xC0) != 0x80;
  return text + std::string(chars < width ? width - chars : 1, ' ');
}

std::string interval_text(const std::optional<uncertainty::SpreadSummary>& spread) {
  if (!spread) return "-";
  return "[" + numbers::log10_for_readers(spread->low_log10) + ", " + numbers::log10_for_readers(spread->high_log10) + "]";
}

}  // namespace

void print_evaluation_table(const casefile::Case& value, const evaluation::CaseEvaluation& result, std::ostream& out) {
  out << "Case " << value.details.reference << (value.details.title.empty() ? "" : " — " + value.details.title) << "\n";
  out << "Hp: " << value.propositions.hp << "\nHd: " << value.propositions.hd << "\n";
  out << "Level: " << casefile::level_name(value.propositions.level) << " propositions; mode: "
      << casefile::mode_name(value.mode_or_default()) << "; verbal scale: " << value.verbal_scale.title() << "\n\n";
  const int credible = static_cast<int>(std::lround(value.uncertainty_or_default().credible_level_or_default() * 100));
  out << pad("Item", 8) << pad("Model", 22) << pad("LR", 16) << pad("log10 LR", 10)
      << pad("log10 " + std::to_string(credible) + "% interval", 20) << "Verbal\n";
  for (std::size_t i = 0; i < result.items.size(); ++i) {
    const auto& item = result.items[i];
    out << pad(item.id, 8) << pad(value.items[i].model_name, 22)
        << pad(numbers::lr_for_readers(item.point.lr), 16) << pad(numbers::log10_for_readers(item.point.lr.log10()), 10)
        << pad(interval_text(item.spread), 20) << item.verbal.label
        << (item.included ? "" : "  (left out: " + item.exclusion_reason + ")") << "\n";
    for (const auto& note : item.point.notes) out << "        note: " << note.message << "\n";
  }
  const auto& c = result.combined;
  out << "\nCombined (" << c.included_ids.size() << " items, independence assumed as stated): LR "
      << numbers::lr_for_readers(c.lr) << ", log10 LR " << numbers::log10_for_readers(c.lr.log10());
  if (c.spread)
    out << ", " << credible << "% interval " << interval_text(c.spread) << ", conservative bound (log10) "
        << numbers::log10_for_readers(c.spread->conservative_log10);
  out << "\n" << c.verbal.sentence << "\n";
  if (c.monte_carlo_check)
    out << "Monte Carlo check: " << interval_text(c.monte_carlo_check) << ", median " << numbers::log10_for_readers(c.monte_carlo_check->median_log10)
        << " (" << c.monte_carlo_check->method << ")\n";

  out << "\nIllustration only — how this LR would change prior odds held by the fact-finder (the scientist "
         "proposes no prior):\n";
  out << pad("Prior odds", 22) << pad("Posterior P(Hp)", 24) << "Posterior P(Hd)\n";
  for (const auto& row : result.sensitivity.rows) {
    std::string prior = numbers::odds_for_readers(row.prior.log10_prior_odds);
    if (row.prior.one_of_n) prior = "1 in " + numbers::magnitude_for_readers(std::log10(*row.prior.one_of_n));
    out << pad(prior, 22) << pad(numbers::posterior_for_readers(row.posterior), 24)
        << numbers::probability_for_readers(row.posterior.log10_complement) << "\n";
  }
  for (const auto& t : result.sensitivity.thresholds)
    out << "Posterior P(Hp) reaches " << numbers::decimal_for_readers(t.threshold) << " from prior odds of "
        << (std::isinf(t.log10_prior_odds) ? (t.log10_prior_odds > 0 ? "never" : "any")
                                            : numbers::odds_for_readers(t.log10_prior_odds))
        << "\n";
}

}  // namespace counterpoise::cli
