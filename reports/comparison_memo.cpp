#include "reports/comparison_memo.hpp"

#include <algorithm>

#include "core/comparison/comparison_text.hpp"
#include "core/numbers/number_text.hpp"
#include "core/platform/today.hpp"
#include "core/validation/display_text.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::reports {

namespace cmp = comparison;
using validation::display_excerpt;
using validation::display_text;

namespace {

// Values quoted in the tables are cut; the full values are in compare's text and JSON output.
constexpr std::size_t kCellLength = 90;

Paragraph body(std::string text) { return Paragraph{std::move(text), Paragraph::Style::body, {}, {}, {}}; }
Paragraph bullet(std::string text) { return Paragraph{std::move(text), Paragraph::Style::bullet, {}, {}, {}}; }
Paragraph note(std::string text) { return Paragraph{std::move(text), Paragraph::Style::note, {}, {}, {}}; }

std::string lr_text(const numbers::LikelihoodRatio& lr) {
  if (!lr.is_finite()) return numbers::lr_for_readers(lr);
  return numbers::lr_for_readers(lr) + " (log10 " + numbers::log10_for_readers(lr.log10()) + ")";
}

// A short form of a change for a table cell: "+infinite" without the explanation.
std::string share_text(const cmp::Log10Change& change) {
  switch (change.state) {
    case cmp::Log10Change::State::plus_infinite: return "+infinite";
    case cmp::Log10Change::State::minus_infinite: return "−infinite";
    case cmp::Log10Change::State::finite: break;
  }
  return cmp::change_for_readers(change);
}

Section versions(const cmp::CaseComparison& c) {
  Section s{"versions", "The two versions", false, {}};
  Table t;
  t.header = {"", "Version", "Combined LR", "Verbal expression"};
  t.widths = {0.3, 2.6, 1.6, 1.8};
  t.no_wrap = {true, false, true, false};
  t.rows.push_back({"A", display_text(c.a.label), lr_text(c.a.combined_lr), cmp::band_words(c.a.verbal)});
  t.rows.push_back({"B", display_text(c.b.label), lr_text(c.b.combined_lr), cmp::band_words(c.b.verbal)});
  s.blocks.push_back(t);
  s.blocks.push_back(note("SHA-256 of A: " + c.a.sha256));
  s.blocks.push_back(note("SHA-256 of B: " + c.b.sha256));
  s.blocks.push_back(body("A: " + c.a.verbal.sentence));
  s.blocks.push_back(body("B: " + c.b.verbal.sentence));
  s.blocks.push_back(body("The combined log10 LR changes by " + cmp::change_for_readers(c.total_change) + " from A to B. " +
                          (c.band_changes() ? "The verbal expression changes from " + cmp::band_words(c.a.verbal) +
                                                  " to " + cmp::band_words(c.b.verbal) + "."
                                            : "The verbal expression is the same in both versions.")));
  s.blocks.push_back(note("Each version is identified by the SHA-256 digest of its canonical JSON; a sealed revision's "
                          "digest is the one its seal records."));
  return s;
}

// Whether any LR of the comparison is in another band in B than in A.
bool any_band_changes(const cmp::CaseComparison& c) {
  const auto& all = c.alternatives;
  return c.band_changes() ||
         std::any_of(all.by_alternative.begin(), all.by_alternative.end(), [](const auto& a) { return a.band_changes(); }) ||
         (all.compound && all.compound->band_changes());
}

// "the combined LR (alone +0.10) and the LR against Hd2 (alone +1.62)"
std::string moved_words(const cmp::CaseComparison& c, std::size_t k) {
  std::vector<std::string> parts;
  for (const auto& m : cmp::conclusions_moved(c, k))
    parts.push_back(m.name + " (alone " + (m.alone ? share_text(*m.alone) : "—") + ")");
  return validation::list_in_words(parts);
}

Section conclusion_movers(const cmp::CaseComparison& c) {
  Section s{"movers", "Changes that move the verbal conclusion", false, {}};
  bool any = false;
  for (std::size_t k : c.movers_first()) {
    if (!c.moves_any_conclusion(k)) break;
    any = true;
    const auto& d = c.differences[k];
    std::string text = display_text(d.place) + ": " + cmp::change_summary(d) +
                       ". Alone, changed from A, it changes the verbal expression of " + moved_words(c, k) + ".";
    if (d.enters_lr()) text += " Its share of the change of the combined log10 LR is " + share_text(c.effects[k].combined_share) + ".";
    s.blocks.push_back(bullet(text));
  }
  const std::string whose = c.alternatives.by_alternative.empty()
                                ? "the combined LR"
                                : "the combined LR, of the LR against any alternative or of the compound LR";
  if (!any)
    s.blocks.push_back(body(any_band_changes(c)
                                ? "No single difference changes a verbal expression by itself: the change comes from "
                                  "several differences together."
                                : "No difference, by itself, changes the verbal expression of " + whose + "."));
  else
    s.blocks.push_back(note("Alone: the difference made by itself from A, the others as in A; the verbal expression "
                            "is B's scale's for the LR that results. The tables below list these differences first."));
  return s;
}

// A table of differences with their share of an LR's change, their effect alone and whether
// that alone moves a verbal band (`moves_header`: whose).
Table effects_table(const std::string& moves_header) {
  Table t;
  t.header = {"Where", "A → B", "Share (log10)", "Alone (log10)", moves_header};
  t.widths = {1.6, 2.7, 0.9, 0.9, 0.9};
  t.no_wrap = {false, false, true, true, false};
  return t;
}

// A row of effects_table: an item added or removed has no effect alone beside its share.
std::vector<std::string> effect_row(const cmp::Difference& d, const cmp::DifferenceEffect& e, std::string moves) {
  const bool presence = d.kind == cmp::DifferenceKind::item_added || d.kind == cmp::DifferenceKind::item_removed;
  return {display_text(d.place), cmp::change_summary(d), share_text(e.combined_share),
          presence ? "" : e.combined_alone ? share_text(*e.combined_alone) : "—", std::move(moves)};
}

Section effects(const cmp::CaseComparison& c) {
  Section s{"effects", "Differences and their effects on the combined LR", false, {}};
  // With alternatives the last column names whose band each moves: the movers come first.
  Table t = effects_table(c.alternatives.by_alternative.empty() ? "Alone moves the band" : "Alone moves the band of");
  for (std::size_t k : c.movers_first())
    if (c.differences[k].enters_lr())
      t.rows.push_back(effect_row(c.differences[k], c.effects[k], cmp::conclusions_moved_cell(c, k)));
  if (t.rows.empty()) {
    s.blocks.push_back(body("No difference enters an LR."));
    return s;
  }
  s.blocks.push_back(t);
  if (c.total_change.is_finite())
    s.blocks.push_back(note("The shares add up to " + cmp::change_for_readers(cmp::Log10Change::finite_change(c.sum_of_shares())) +
                            ", the change of the combined log10 LR. Within an item a share is the Shapley value of the "
                            "change over the item's changed inputs (the average of what it adds over every order of the "
                            "changes); independent items add. Alone: the change made by itself from A; it moves the "
                            "band when, made alone, it puts the LR in another verbal band (or the other direction)." +
                            (c.alternatives.by_alternative.empty()
                                 ? std::string()
                                 : " With several alternatives the last column names whose band: the combined LR's, "
                                   "an alternative's, the weighted set's (the compound LR).")));
  std::vector<std::string> notes;
  for (std::size_t k : c.by_effect())
    if (!c.effects[k].note.empty() && c.differences[k].enters_lr())
      notes.push_back(display_text(c.differences[k].place) + ": " + c.effects[k].note + ".");
  for (auto& n : notes) s.blocks.push_back(note(std::move(n)));
  return s;
}

std::string log10_side(const std::optional<double>& log10) {
  return log10 ? numbers::log10_for_readers(*log10) : std::string("absent");
}

// The verbal expression of an LR against an alternative in each version, for a table cell.
std::string bands_text(const cmp::AlternativeAttribution& against, const std::string& alternative) {
  if (against.verbal_a && against.verbal_b)
    return against.band_changes() ? cmp::band_words(*against.verbal_a, alternative) + " → " +
                                        cmp::band_words(*against.verbal_b, alternative) + " (changes)"
                                  : cmp::band_words(*against.verbal_b, alternative) + " in both";
  if (against.verbal_a) return "in A only: " + cmp::band_words(*against.verbal_a, alternative);
  if (against.verbal_b) return "in B only: " + cmp::band_words(*against.verbal_b, alternative);
  return "—";
}

// The effects on one LR against an alternative (or the weighted set), largest share first.
void add_alternative_effects(const cmp::CaseComparison& c, const cmp::AlternativeAttribution& against,
                             const std::string& name, const std::string& band_name, Section& s) {
  const std::string bands = " " + cmp::alternative_band_sentence(against, band_name);
  if (!against.attributed) {
    s.blocks.push_back(note(name + ": " + against.note + "." + bands));
    return;
  }
  Table t = effects_table("Alone moves the band");
  for (std::size_t k : against.movers_first())  // leaving out what changed only for other alternatives
    if (!cmp::moves_nothing(against.effects[k]))
      t.rows.push_back(effect_row(c.differences[k], against.effects[k], against.moves_conclusion.at(k) ? "yes" : ""));
  if (t.rows.empty()) {
    s.blocks.push_back(body(name + ": no difference moves this LR." + bands));
    return;
  }
  s.blocks.push_back(body(name + ": the log10 LR changes by " + cmp::change_for_readers(against.total_change) +
                          (against.total_change.is_finite()
                               ? "; the shares add up to " +
                                     cmp::change_for_readers(cmp::Log10Change::finite_change(against.sum_of_shares())) + "."
                               : ".") +
                          bands));
  s.blocks.push_back(t);
  if (!against.note.empty()) s.blocks.push_back(note(against.note + "."));
}

Section alternatives(const cmp::CaseComparison& c) {
  Section s{"alternatives", "Effects against each alternative", false, {}};
  const auto& all = c.alternatives;
  Table t;
  t.header = {"Against", "log10 LR in A", "log10 LR in B", "Change", "Verbal expression, A → B"};
  t.widths = {1.3, 0.9, 0.9, 1.0, 2.4};
  t.no_wrap = {false, true, true, true, false};
  for (const auto& against : all.by_alternative)
    t.rows.push_back({display_text(against.id), log10_side(against.log10_lr_a), log10_side(against.log10_lr_b),
                      against.in_a() && against.in_b() ? share_text(against.total_change) : "not attributed",
                      bands_text(against, display_text(against.id))});
  if (all.compound)
    t.rows.push_back({"the weighted set (compound LR)", log10_side(all.compound->log10_lr_a), log10_side(all.compound->log10_lr_b),
                      all.compound->in_a() && all.compound->in_b() ? share_text(all.compound->total_change) : "not attributed",
                      bands_text(*all.compound, cmp::kWeightedSetWords)});
  s.blocks.push_back(body("The combined LR above is Hp against the first alternative. Against each alternative the "
                          "shares are found item by item as for the combined LR; against the weighted set they are "
                          "the Shapley values of the compound LR over every change that enters it, the weights "
                          "included. An alternative that only one version has is listed and not attributed."));
  s.blocks.push_back(t);
  for (const auto& against : all.by_alternative)
    add_alternative_effects(c, against, "Against " + display_text(against.id), display_text(against.id), s);
  if (all.compound) add_alternative_effects(c, *all.compound, "Against the weighted set", cmp::kWeightedSetWords, s);
  return s;
}

Section items(const cmp::CaseComparison& c) {
  Section s{"items", "Items whose LR or inclusion changed", false, {}};
  Table t;
  t.header = {"Item", "log10 LR in A", "log10 LR in B", "Change of its term"};
  t.widths = {1.0, 1.3, 1.3, 1.4};
  t.no_wrap = {false, true, true, true};
  const auto side = [](const std::optional<double>& log10, bool included) -> std::string {
    if (!log10) return "absent";
    return numbers::log10_for_readers(*log10) + (included ? "" : " (left out)");
  };
  for (const auto& item : c.items)
    t.rows.push_back({display_text(item.item_id), side(item.log10_lr_a, item.included_a), side(item.log10_lr_b, item.included_b),
                      share_text(item.combined_change)});
  s.blocks.push_back(t);
  return s;
}

Section wording(const cmp::CaseComparison& c) {
  Section s{"wording", "Changed wording and the reasoning guard", false, {}};
  if (!c.wording.not_checked.empty()) {
    s.blocks.push_back(body("The wording could not be checked: " + validation::display_lines(c.wording.not_checked)));
    return s;
  }
  Table t;
  t.header = {"Where", "Flagged in A", "Flagged in B"};
  t.widths = {1.6, 2.2, 2.2};
  t.no_wrap = {false, false, false};
  const auto flags = [](const std::vector<cmp::WordingFlag>& list) {
    std::string text;
    for (const auto& f : list) {
      if (f.severity == "advice") continue;
      if (!text.empty()) text += "; ";
      text += f.severity + " [" + display_text(f.rule_id) + "] " + display_text(f.family_name) + ": “" +
              display_excerpt(f.matched_text, 60) + "”";
    }
    return text.empty() ? std::string("nothing") : text;
  };
  for (std::size_t k = 0; k < c.differences.size(); ++k)
    if (const auto& review = c.wording.by_difference.at(k))
      t.rows.push_back({display_text(c.differences[k].place), flags(review->a), flags(review->b)});
  if (t.rows.empty()) {
    s.blocks.push_back(body("No wording differs between the two versions."));
    return s;
  }
  s.blocks.push_back(body("Each changed text was checked by the reasoning guard with each version's own rules, mode "
                          "and propositions. Advice is not listed."));
  s.blocks.push_back(t);
  return s;
}

Section all_differences(const cmp::CaseComparison& c) {
  Section s{"differences", "All differences by section", true, {}};
  Table t;
  t.header = {"Where", "What", "A", "B"};
  t.widths = {1.5, 1.2, 2.0, 2.0};
  t.no_wrap = {false, false, false, false};
  for (const auto& d : c.differences) {
    if (d.kind == cmp::DifferenceKind::data_file) {
      t.rows.push_back({display_text(d.place), cmp::kind_words(d.kind), display_excerpt(cmp::change_words(d), 2 * kCellLength), ""});
      continue;
    }
    t.rows.push_back({display_text(d.place), cmp::kind_words(d.kind), display_excerpt(cmp::value_words(d.old_value), kCellLength),
                      display_excerpt(cmp::value_words(d.new_value), kCellLength)});
  }
  if (t.rows.empty()) s.blocks.push_back(body("None: the two versions are the same case."));
  else s.blocks.push_back(t);
  return s;
}

Section cautions(const cmp::CaseComparison& c) {
  Section s{"cautions", "Cautions", false, {}};
  for (const auto& text : cmp::comparison_cautions(c)) s.blocks.push_back(bullet(text));
  s.blocks.push_back(bullet("The comparison uses each version's point LRs; the uncertainty of each is in its own evaluation."));
  return s;
}

}  // namespace

ReportModel build_comparison_memo(const cmp::CaseComparison& comparison, const ComparisonMemoInfo& info) {
  ReportModel model;
  model.header.title = "Review memo: comparison of two versions of a case";
  model.header.laboratory = display_text(info.laboratory);
  model.header.revision = "version B compared with version A (both identified under \"The two versions\")";
  model.header.reference = display_text(info.reference);
  model.header.case_title = display_text(info.case_title);
  model.header.examiner = display_text(info.reviewer);  // the person making the comparison
  model.header.examiner_label = "Reviewer";
  model.header.date = info.date;
  model.header.digest_label = "Version B (SHA-256)";
  model.header.digest = comparison.b.sha256;
  model.sections.push_back(versions(comparison));
  model.sections.push_back(conclusion_movers(comparison));
  model.sections.push_back(effects(comparison));
  if (!comparison.items.empty()) model.sections.push_back(items(comparison));
  if (!comparison.alternatives.by_alternative.empty()) model.sections.push_back(alternatives(comparison));
  model.sections.push_back(wording(comparison));
  model.sections.push_back(cautions(comparison));
  model.sections.push_back(all_differences(comparison));
  letter_appendices(model);
  return model;
}

}  // namespace counterpoise::reports

namespace counterpoise::reports {

ComparisonMemoInfo comparison_memo_info(const casefile::CaseDetails& second, const std::string& reviewer) {
  return ComparisonMemoInfo{second.laboratory.value_or(""), second.reference, second.title, reviewer,
                            platform::today_iso_date()};
}

PdfResult render_comparison_memo(const cmp::CaseComparison& comparison, const ComparisonMemoInfo& info) {
  return render_pdf(build_comparison_memo(comparison, info));
}

}  // namespace counterpoise::reports
