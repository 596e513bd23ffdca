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

std::string weights_text(const casefile::Case& value, const evaluation::CompoundEvaluation& compound) {
  std::string text;
  for (std::size_t i = 0; i < compound.weights.size(); ++i)
    text += (text.empty() ? "" : ", ") + value.propositions.alternatives[i].id + " " +
            numbers::decimal_for_readers(compound.weights[i], numbers::kWorkingFigures);  // as the report writes them
  return text;
}

void print_propositions(const casefile::Case& value, std::ostream& out) {
  out << "Hp: " << value.propositions.hp << "\n";
  if (!value.propositions.has_alternatives()) {
    out << "Hd: " << value.propositions.hd << "\n";
    return;
  }
  for (const auto& a : value.propositions.alternatives) {
    out << a.id << ": " << a.text;
    if (a.weight) out << " (weight " << numbers::entered_for_readers(*a.weight) << ")";  // as entered, every digit
    if (a.is_unspecified()) out << " (unspecified alternative)";
    out << "\n";
  }
  if (value.propositions.normalised_weights())
    out << "The weights are the fact-finder's relative prior weights among the alternatives, normalised to sum to 1; "
           "they are used only in the compound LR and in illustrations.\n";
}

// One row per alternative (and the weighted set) under an item or the combination.
void print_alternative_rows(const casefile::Case& value, const std::vector<evaluation::AlternativeEvaluation>& list,
                            const std::optional<evaluation::CompoundEvaluation>& compound, const std::string& indent,
                            std::ostream& out) {
  for (const auto& a : list)
    out << indent << pad("against " + a.id, 22) << pad(numbers::lr_for_readers(a.lr), 16)
        << pad(numbers::log10_for_readers(a.lr.log10()), 10) << pad(interval_text(a.spread), 20) << a.verbal.label << "\n";
  if (compound) {
    out << indent << pad("against the set", 22) << pad(numbers::lr_for_readers(compound->lr), 16)
        << pad(numbers::log10_for_readers(compound->lr.log10()), 10) << pad(interval_text(compound->spread), 20)
        << compound->verbal.label
        << "  (weights " << weights_text(value, *compound) << ")\n";
    if (!compound->interval_note.empty()) out << indent << "note: " << compound->interval_note << "\n";
  }
}

}  // namespace

void print_evaluation_table(const casefile::Case& value, const evaluation::CaseEvaluation& result, std::ostream& out) {
  out << "Case " << value.details.reference << (value.details.title.empty() ? "" : " — " + value.details.title) << "\n";
  print_propositions(value, out);
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
    print_alternative_rows(value, item.by_alternative, item.compound, std::string(8, ' '), out);
  }
  const auto& c = result.combined;
  if (value.propositions.has_alternatives()) {
    out << "\nCombined against each alternative (" << c.included_ids.size()
        << (c.included_ids.size() == 1 ? " item" : " items") << ", independence assumed as stated under each proposition):\n";
    print_alternative_rows(value, c.by_alternative, c.compound, "", out);
    for (const auto& a : c.by_alternative) out << a.verbal.sentence << "\n";
    if (c.compound)
      out << "With the weights stated as the fact-finder's: " << c.compound->verbal.sentence << "\n";
    if (c.compound && c.compound->without_unspecified)
      out << "Against the specified alternatives alone (the unspecified ones left out, weights renormalised): LR "
          << numbers::lr_for_readers(*c.compound->without_unspecified) << ", log10 LR "
          << numbers::log10_for_readers(c.compound->without_unspecified->log10()) << "\n";
  }
  out << "\nCombined" << (c.by_alternative.empty() ? "" : " against " + c.by_alternative.front().id) << " ("
      << c.included_ids.size() << (c.included_ids.size() == 1 ? " item" : " items")
      << ", independence assumed as stated): LR "
      << numbers::lr_for_readers(c.lr) << ", log10 LR " << numbers::log10_for_readers(c.lr.log10());
  if (c.spread)
    out << ", " << credible << "% interval " << interval_text(c.spread) << ", conservative bound (log10) "
        << numbers::log10_for_readers(c.spread->conservative_log10);
  out << "\n" << (c.by_alternative.empty() ? c.verbal.sentence : c.by_alternative.front().verbal.sentence) << "\n";
  if (c.monte_carlo_check)
    out << "Monte Carlo check: " << interval_text(c.monte_carlo_check) << ", median " << numbers::log10_for_readers(c.monte_carlo_check->median_log10)
        << " (" << c.monte_carlo_check->method << ")\n";

  if (!result.over_set.empty()) {
    out << "\nIllustration only — how these LRs would change prior odds held by the fact-finder, over the whole set "
           "of propositions (Hp against all the alternatives together, the alternatives sharing the rest by the "
           "fact-finder's weights; the scientist proposes no prior and no weights):\n";
    out << pad("Prior odds", 22) << pad("P(Hp)", 24);
    for (const auto& a : value.propositions.alternatives) out << pad("P(" + a.id + ")", 24);
    out << "\n";
    for (const auto& row : result.over_set) {
      std::string prior = numbers::odds_for_readers(row.prior.log10_prior_odds);
      if (row.prior.one_of_n) prior = "1 in " + numbers::magnitude_for_readers(std::log10(*row.prior.one_of_n));
      out << pad(prior, 22);
      for (const auto& posterior : row.posteriors) out << pad(numbers::posterior_for_readers(posterior), 24);
      out << "\n";
    }
  }

  out << "\nIllustration only — how this LR" << (c.by_alternative.empty() ? "" : " (against " + c.by_alternative.front().id + " alone)")
      << " would change prior odds held by the fact-finder (the scientist proposes no prior):\n";
  out << pad("Prior odds", 22) << pad("Posterior P(Hp)", 24) << "Posterior P("
      << (c.by_alternative.empty() ? std::string("Hd") : c.by_alternative.front().id) << ")\n";
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
