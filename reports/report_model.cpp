#include "reports/report_model.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <limits>
#include <memory>
#include <optional>

#include "core/casefile/item_index.hpp"
#include "core/interchange/case_json.hpp"
#include "core/models/network/network_model.hpp"
#include "core/numbers/log10_math.hpp"
#include "core/numbers/number_text.hpp"
#include "core/numbers/operand_text.hpp"
#include "core/numbers/posterior.hpp"
#include "core/platform/sha256.hpp"
#include "core/store/case_store.hpp"
#include "core/uncertainty/interval_reading.hpp"
#include "reports/item_inputs.hpp"
#include "core/validation/word_list.hpp"
#include "reports/mixture_section.hpp"
#include "reports/seal_section.hpp"

namespace counterpoise::reports {

namespace {

using evaluation::CaseEvaluation;
using numbers::LikelihoodRatio;

std::string log10_text(double log10_x) { return numbers::log10_for_readers(log10_x); }
std::string percent_text(double level) { return numbers::percent_for_readers(level); }
std::string magnitude(double log10_x) { return numbers::magnitude_for_readers(log10_x); }

std::string operand(const std::string& number) { return numbers::operand_for_readers(number); }

// A normalised weight of the court's, with one text wherever the report states it.
std::string weight_text(double weight) { return numbers::decimal_for_readers(weight, numbers::kWorkingFigures); }

Paragraph generated(std::string text, Paragraph::Style style = Paragraph::Style::body, std::string label = {}) {
  return Paragraph{std::move(text), style, std::move(label), TextSource{}, {}};
}

Paragraph from_user(std::string text, std::string item, std::string field, std::string label = {},
                    Paragraph::Style style = Paragraph::Style::body) {
  return Paragraph{std::move(text), style, std::move(label), TextSource{true, std::move(item), std::move(field)}, {}};
}

// The evaluation sentence in the correct conditional form for an LR written as `n_text`.
std::string conditional_sentence(const LikelihoodRatio& lr) {
  if (lr.is_zero())
    return "The findings could not have arisen if Hp were true (the likelihood ratio is zero): they exclude Hp "
           "as stated, and so support Hd rather than Hp.";
  if (lr.is_infinite())
    return "The findings could not have arisen if Hd were true (the likelihood ratio is infinite): they exclude Hd "
           "as stated, and so support Hp rather than Hd.";
  const double log10_lr = lr.log10();
  if (lr.favours_hd()) {
    const std::string n = magnitude(-log10_lr);
    if (n == "1" || n == "1.00") return "The findings are about as probable if Hp is true as if Hd is true.";
    return "The findings are about " + n + " times more probable if Hd is true than if Hp is true.";
  }
  const std::string n = magnitude(log10_lr);
  if (n == "1" || n == "1.00") return "The findings are about as probable if Hp is true as if Hd is true.";
  return "The findings are about " + n + " times more probable if Hp is true than if Hd is true.";
}

std::string lr_with_interval(const LikelihoodRatio& lr, const std::optional<uncertainty::SpreadSummary>& spread) {
  std::string text = numbers::lr_for_readers(lr);
  if (spread) text += " (" + magnitude(spread->low_log10) + " to " + magnitude(spread->high_log10) + ")";
  return text;
}

std::string probability_cell(const std::optional<double>& log10_p) {
  return log10_p ? numbers::probability_for_readers(*log10_p) : "\u2013";  // an en dash: a hyphen reads as a minus sign
}

// The posterior of Hd, so that P(Hd|E) near 1 is written through its complement too.
numbers::Posterior of_hd(const numbers::Posterior& p) {
  return numbers::Posterior{-p.log10_odds, p.log10_complement, p.log10_probability};
}

std::string prior_odds_text(const sensitivity::PriorPoint& prior) {
  return numbers::odds_for_readers(prior.log10_prior_odds);
}

std::string prior_probability_text(const sensitivity::PriorPoint& prior) {
  std::string text = numbers::posterior_for_readers(numbers::posterior_from(prior.log10_prior_odds, LikelihoodRatio::neutral()));
  if (prior.one_of_n) text += " (1 of " + numbers::magnitude_for_readers(std::log10(*prior.one_of_n)) + " possible sources)";
  return text;
}

Section case_section(const casefile::Case& value, ReportMode mode, const IssueInfo& issue) {
  Section s{"case", "Case and examiner", false, {}};
  const auto& d = value.details;
  s.blocks.push_back(from_user(d.title.empty() ? d.reference : d.title, "case", "title", "Case"));
  s.blocks.push_back(from_user(d.reference, "case", "reference", "Case reference"));
  // A detail the case does not record is written by the program ("not recorded").
  const auto detail = [&](const std::optional<std::string>& text, const char* field, const char* label) {
    return text ? from_user(*text, "case", field, label) : generated("not recorded", Paragraph::Style::body, label);
  };
  s.blocks.push_back(detail(d.laboratory, "laboratory", "Laboratory"));
  s.blocks.push_back(detail(d.examiner, "examiner", "Examiner"));
  s.blocks.push_back(detail(d.date, "date", "Date of the evaluation"));
  if (d.requested_by) s.blocks.push_back(from_user(*d.requested_by, "case", "requested_by", "Requested by"));
  s.blocks.push_back(generated(issue.revision.empty() ? "working copy (interchange file, no stored revision)" : issue.revision,
                               Paragraph::Style::body, "Revision"));
  s.blocks.push_back(generated(mode == ReportMode::casework
                                   ? "Casework report."
                                   : "Training report, written to teach the reasoning; it is not a report on a real case.",
                               Paragraph::Style::body, "Kind of report"));
  return s;
}

Section question_section(const casefile::Case& value) {
  Section s{"question", "What the laboratory was asked", false, {}};
  const auto& d = value.details;
  if (d.purpose) s.blocks.push_back(from_user(guard::as_report_sentence(*d.purpose), "case", "purpose"));
  else s.blocks.push_back(generated("The case file does not record the question the laboratory was asked."));
  return s;
}

std::string alternative_list(const casefile::Case& value) { return validation::list_in_words(value.propositions.alternative_ids()); }


Section propositions_section(const casefile::Case& value) {
  Section s{"propositions", "The propositions", false, {}};
  const auto& p = value.propositions;
  if (p.has_alternatives()) {
    s.blocks.push_back(generated(
        "The findings are evaluated against Hp and " + std::to_string(p.alternatives.size()) +
        " alternatives to it, which exclude each other (" + alternative_list(value) + "). The first of them, " +
        p.alternatives.front().id + ", is the Hd of the evaluation below; the section on the alternatives weighs Hp "
        "against each of them:"));
    s.blocks.push_back(from_user(guard::as_report_sentence(p.hp), "propositions", "hp", "Hp"));
    for (std::size_t i = 0; i < p.alternatives.size(); ++i) {
      const auto& a = p.alternatives[i];
      s.blocks.push_back(from_user(guard::as_report_sentence(a.text), "propositions", guard::alternative_text_field(i),
                                   i == 0 ? a.id + " (Hd)" : a.id));
    }
    std::vector<std::string> unspecified;
    for (const auto& a : p.alternatives)
      if (a.is_unspecified()) unspecified.push_back(a.id);
    if (!unspecified.empty())
      s.blocks.push_back(generated(
          validation::list_in_words(unspecified) + (unspecified.size() == 1 ? " is an alternative" : " are alternatives") +
              " about which nothing is known beyond the range of the findings; the section on the alternatives shows "
              "what the value against the set would be without " + (unspecified.size() == 1 ? "it." : "them."),
          Paragraph::Style::note));
  } else {
    s.blocks.push_back(generated("The findings are evaluated against two propositions, considered as alternatives:"));
    s.blocks.push_back(from_user(guard::as_report_sentence(p.hp), "propositions", "hp", "Hp"));
    s.blocks.push_back(from_user(guard::as_report_sentence(p.hd), "propositions", "hd", "Hd"));
  }
  s.blocks.push_back(generated("The propositions are at the " + std::string(casefile::level_name(p.level)) +
                               " level of the hierarchy of propositions (sub-source, source, activity, offence)."));
  for (const auto& item : value.items) {
    if (item.level && *item.level < p.level)
      s.blocks.push_back(generated("Item " + item.id + " addresses the " + std::string(casefile::level_name(*item.level)) +
                                       " level, below the level of the propositions; its likelihood ratio does not by "
                                       "itself answer a question at the " + std::string(casefile::level_name(p.level)) +
                                       " level.",
                                   Paragraph::Style::note));
  }
  if (p.conditioning_information)
    s.blocks.push_back(from_user(guard::as_report_sentence(*p.conditioning_information), "propositions", "conditioning_information",
                                 "Information the evaluation is conditioned on"));
  else
    s.blocks.push_back(generated("The case file records no conditioning information beyond the propositions.",
                                 Paragraph::Style::body, "Information the evaluation is conditioned on"));
  if (!p.assumptions.empty()) {
    s.blocks.push_back(generated("The evaluation makes these assumptions:", Paragraph::Style::body, "Assumptions"));
    for (std::size_t i = 0; i < p.assumptions.size(); ++i)
      s.blocks.push_back(from_user(guard::as_report_sentence(p.assumptions[i]), "propositions",
                                   "assumptions[" + std::to_string(i) + "]", {}, Paragraph::Style::bullet));
  }
  return s;
}

constexpr const char* kInputsAppendix = "inputs";
constexpr const char* kRecomputationAppendix = "recomputation";

// "What the model assumes" for an item. With several alternatives the model may assume
// different things against each (a transfer of its own under Hd2, other contributors): when the
// alternatives' paragraphs differ, one per alternative, naming it; when they are the same, one,
// naming every alternative it stands for.
std::vector<Paragraph> assumption_paragraphs(const casefile::Item& item, const casefile::Propositions& propositions) {
  const auto paragraph = [&](const std::string& text, const std::string& label) {
    Paragraph p = generated(text, Paragraph::Style::body, label);
    p.source.item = item.id;
    p.source.field = "model assumptions";
    return p;
  };
  const std::string label = "What the model assumes";
  if (!propositions.has_alternatives() || item.alternative_models.size() != propositions.alternatives.size())
    return {paragraph(item.model->assumptions(), label)};
  std::vector<std::string> texts;
  for (const auto& model : item.alternative_models) texts.push_back(model->assumptions());
  if (std::all_of(texts.begin(), texts.end(), [&](const std::string& t) { return t == texts.front(); })) {
    return {paragraph(texts.front() + " The same holds with Hd read as each alternative in turn (" +
                          validation::list_in_words(propositions.alternative_ids()) + ").",
                      label)};
  }
  std::vector<Paragraph> out;
  for (std::size_t i = 0; i < texts.size(); ++i) {
    const std::string& id = propositions.alternatives[i].id;
    out.push_back(paragraph(naming_alternative(texts[i], id), label + ", Hp against " + id));
  }
  return out;
}

Section findings_section(const casefile::Case& value, const CaseEvaluation& result, const std::vector<ItemInputs>& inputs) {
  Section s{"findings", "The findings examined", false, {}};
  const std::string level = percent_text(value.uncertainty_or_default().credible_level_or_default());
  s.blocks.push_back(generated(
      "Each item of findings is listed with the model that evaluates it, the probability of the findings if Hp is true, "
      "P(E|Hp), and if Hd is true, P(E|Hd), where the model has them, and the likelihood ratio with its " + level +
      " interval in brackets where the inputs are uncertain. " + numbers::rounding_policy_text() +
      (value.propositions.has_alternatives()
           ? " With several alternatives, the table gives Hp against the first, " + value.propositions.alternatives.front().id +
                 "; each item's inputs against every alternative follow it, and the section on the alternatives gives "
                 "the likelihood ratio against each."
           : std::string())));
  const std::string hd = value.propositions.has_alternatives() ? value.propositions.alternatives.front().id : "Hd";
  Table table;
  table.header = {"Item", "Model", "P(E|Hp)", "P(E|" + hd + ")", "LR (" + level + " interval)", "log10 LR", "Verbal"};
  table.widths = {0.6, 1.3, 0.8, 0.8, 2.5, 0.75, 1.9};
  table.no_wrap = {true, false, true, true, true, true, false};
  for (std::size_t i = 0; i < result.items.size(); ++i) {
    const auto& e = result.items[i];
    const auto& item = value.items[i];
    table.rows.push_back({e.id, model_title(item.model->kind()), probability_cell(e.point.log10_p_given_hp),
                          probability_cell(e.point.log10_p_given_hd), lr_with_interval(e.point.lr, e.spread),
                          log10_text(e.point.lr.log10()), e.verbal.label + (e.included ? "" : " (not combined)")});
  }
  s.blocks.push_back(table);
  for (std::size_t i = 0; i < result.items.size(); ++i) {
    const auto& e = result.items[i];
    const auto& item = value.items[i];
    if (item.title && !item.title->empty())
      s.blocks.push_back(from_user(*item.title, item.id, "title", item.id, Paragraph::Style::lead));
    else
      s.blocks.push_back(generated(item.id, Paragraph::Style::lead, item.id));
    if (item.description) s.blocks.push_back(from_user(guard::as_report_sentence(*item.description), item.id, "description", "Findings"));
    if (item.source_data) s.blocks.push_back(from_user(guard::as_report_sentence(*item.source_data), item.id, "source_data", "Data"));
    for (const auto& block : inputs[i].body) s.blocks.push_back(block);
    for (Paragraph& assumptions : assumption_paragraphs(item, value.propositions)) s.blocks.push_back(std::move(assumptions));
    for (const auto& note : e.point.notes) {
      Paragraph p = generated(guard::as_report_sentence(note.message), Paragraph::Style::note, "Model note");
      p.source.item = item.id;
      p.source.field = "note " + note.code;
      s.blocks.push_back(p);
    }
    if (item.notes) s.blocks.push_back(from_user(guard::as_report_sentence(*item.notes), item.id, "notes", "Notes"));
    if (!e.included)
      s.blocks.push_back(from_user(guard::as_report_sentence(e.exclusion_reason), item.id, "combination.exclusion_reason",
                                   "Left out of the combination"));
  }
  return s;
}

// How the interval was computed, in words for the reader rather than the program's name for it.
// `draws` is the case's number of draws, the number every simulated item is drawn with
// (evaluation::evaluate_case), written with its digits grouped like every other count.
std::string spread_method_words(const std::string& method, std::int64_t draws) {
  const std::string exact =
      "The interval was calculated exactly: the distribution of each item's log10 likelihood ratio, from the spread of "
      "its inputs, was computed on a fine grid and the items' distributions were added";
  if (method.rfind("lattice convolution", 0) == 0)
    return method.find("Monte Carlo") != std::string::npos
               ? exact + " (items whose distribution has no exact form were simulated by random draws of their inputs)."
               : exact + ".";
  if (method.rfind("Monte Carlo", 0) == 0)
    return "The interval was calculated by simulation: the uncertain inputs were drawn at random " +
           numbers::count_for_readers(draws) + " times and the likelihood ratio computed for each draw.";
  return "The interval was calculated by " + method + ".";
}

Section evaluation_section(const casefile::Case& value, const CaseEvaluation& result, const ReportSettings& settings) {
  Section s{"evaluation", "Evaluation", false, {}};
  const auto& c = result.combined;
  const auto u = value.uncertainty_or_default();
  std::vector<std::string> left_out;
  for (const auto& e : result.items)
    if (!e.included) left_out.push_back(e.id);
  std::string combined_text =
      c.included_ids.empty() ? "No item is combined, so the combined likelihood ratio is 1."
      : c.included_ids.size() == 1 ? "The evaluation rests on item " + c.included_ids[0] + "."
                                   : "The evaluation combines items " + validation::list_in_words(c.included_ids) + ".";
  if (!left_out.empty())
    combined_text += " Left out of the combination, for the reasons given with the findings: " + validation::list_in_words(left_out) + ".";
  s.blocks.push_back(generated(combined_text));

  // The value the sentence states: the point LR, or the conservative bound when the settings ask for it.
  const bool conservative = settings.reported_value == ReportedValue::conservative && c.spread &&
                            std::isfinite(c.spread->conservative_log10);
  const LikelihoodRatio stated = conservative ? LikelihoodRatio::from_log10(c.spread->conservative_log10) : c.lr;
  // With several alternatives the evaluation is of Hp against the first, and names it.
  const auto named = [&](const std::string& sentence) {
    return value.propositions.has_alternatives() ? naming_alternative(sentence, value.propositions.alternatives.front().id)
                                                 : sentence;
  };
  s.blocks.push_back(generated(named(conditional_sentence(stated)), Paragraph::Style::lead));
  const auto verbal = value.verbal_scale.express(stated);
  std::string words;
  if (stated.is_zero() || stated.is_infinite() || verbal.favours == verbal::Favours::neither)
    words = "On the verbal scale in use (" + value.verbal_scale.title() + "), this is expressed as: " + verbal.label + ".";
  else
    words = "On the verbal scale in use (" + value.verbal_scale.title() + "), the findings provide " + verbal.label +
            (verbal.favours == verbal::Favours::hp ? " for Hp rather than Hd." : " for Hd rather than Hp.");
  words += " The words follow the number and do not replace it.";
  s.blocks.push_back(generated(named(words)));

  if (c.spread) {
    const auto& sp = *c.spread;
    std::string text = "The likelihood ratio from the mean (marginal) probabilities, the point value, is " +
                       numbers::lr_for_readers(c.lr) + " (log10 " + log10_text(c.lr.log10()) + "). Its " +
                       percent_text(sp.levels.credible) + " interval runs from " + magnitude(sp.low_log10) +
                       " to " + magnitude(sp.high_log10) + " (log10 " + log10_text(sp.low_log10) + " to " +
                       log10_text(sp.high_log10) + "), and the conservative one-sided " +
                       percent_text(sp.levels.conservative) + " bound is " + magnitude(sp.conservative_log10) +
                       " (log10 " + log10_text(sp.conservative_log10) + "), on the side of less support for the favoured proposition. " +
                       spread_method_words(sp.method, u.draws_or_default());
    text += conservative ? " This report states the conservative bound; the point value is given for comparison."
                         : " This report states the point value; the interval and the conservative bound show how well it is known.";
    text += " " + uncertainty::reported_value_and_interval_sentence();
    s.blocks.push_back(generated(text, Paragraph::Style::body, "Uncertainty"));
  } else {
    // A model may take an input as a distribution and average over it (a DNA mixture's drop-out
    // probability): then the inputs are not all single values, and the report must not say so.
    bool averaged = false;
    for (const auto& e : result.items)
      if (e.included && e.point.detail.is_object() && e.point.detail.contains("dropout") &&
          e.point.detail["dropout"].is_object() && e.point.detail["dropout"].value("integrated", false))
        averaged = true;
    const std::string why = averaged ? "the drop-out probability, stated as a distribution, is averaged over within the "
                                       "likelihood ratio itself, and the other inputs are single values"
                                     : "the inputs are stated as single values";
    s.blocks.push_back(generated("No interval is computed for the likelihood ratio of " + numbers::lr_for_readers(c.lr) +
                                     " (log10 " + log10_text(c.lr.log10()) + "): " + why + ". This report states that value.",
                                 Paragraph::Style::body, "Uncertainty"));
  }
  (void)u;

  Paragraph recompute = generated(
      "The formula behind each item's likelihood ratio, with the inputs and intermediate values needed to recompute it "
      "with a calculator, is set out in the appendix on recomputation",
      Paragraph::Style::body, "Recomputation");
  recompute.page_of = kRecomputationAppendix;
  recompute.text += ".";
  s.blocks.push_back(recompute);

  if (c.included_ids.size() > 1) {
    s.blocks.push_back(generated(
        "The likelihood ratios of the combined items are multiplied (their log10 values added). That is right only if "
        "the items are independent given each proposition: the findings on one item would be no more or less "
        "probable for knowing the findings on another. The reasons recorded for each item:",
        Paragraph::Style::body, "Independence"));
    const casefile::ItemIndex index(value);  // one pass, not a scan of the items per id
    for (const auto& id : c.included_ids) {
      const auto* item = index.find(id);
      if (item && item->combination && item->combination->independence)
        s.blocks.push_back(from_user(guard::as_report_sentence(*item->combination->independence), id, "combination.independence", id,
                                     Paragraph::Style::bullet));
      else
        s.blocks.push_back(generated("No reason was recorded for treating this item as independent of the others.",
                                     Paragraph::Style::bullet, id));
    }
  }
  return s;
}

PosteriorPlot posterior_plot(const CaseEvaluation& result, const std::vector<double>& thresholds) {
  PosteriorPlot plot;
  const auto& c = result.combined;
  double from = -6.0, to = 3.0;
  bool any = false;
  const auto widen = [&](double x) {
    if (!std::isfinite(x)) return;
    if (!any) from = to = x, any = true;
    from = std::min(from, x), to = std::max(to, x);
  };
  for (const auto& row : result.sensitivity.rows) widen(row.prior.log10_prior_odds);
  for (const auto& t : result.sensitivity.thresholds) widen(t.log10_prior_odds);
  from = std::floor(from) - 1.0, to = std::ceil(to) + 1.0;
  const bool band = c.spread && std::isfinite(c.spread->low_log10) && std::isfinite(c.spread->high_log10);
  const int points = 241;
  for (int i = 0; i < points; ++i) {
    const double x = from + (to - from) * i / (points - 1);
    plot.log10_prior_odds.push_back(x);
    plot.probability.push_back(numbers::posterior_from(x, c.lr).probability());
    if (band) {
      plot.low.push_back(numbers::posterior_from(x, LikelihoodRatio::from_log10(c.spread->low_log10)).probability());
      plot.high.push_back(numbers::posterior_from(x, LikelihoodRatio::from_log10(c.spread->high_log10)).probability());
    }
  }
  for (std::size_t i = 0; i < thresholds.size() && i < result.sensitivity.thresholds.size(); ++i) {
    const auto& t = result.sensitivity.thresholds[i];
    if (std::isfinite(t.log10_prior_odds) && t.log10_prior_odds >= from && t.log10_prior_odds <= to)
      plot.crossings.push_back({t.threshold, t.log10_prior_odds});
  }
  plot.caption = std::string("Posterior probability of Hp (vertical) against the prior odds of Hp (horizontal, "
                             "logarithmic) at the combined likelihood ratio") +
                 (band ? "; the shaded band spans the LR's interval" : "") +
                 "; dashed lines mark the thresholds and where the curve reaches them.";
  return plot;
}

// The rows of the sensitivity table in one order, by prior odds; a prior that appears twice (as
// odds and as "1 of N", or rounded alike) is listed once, with its "1 of N" origin when it has one.
std::vector<const sensitivity::SensitivityRow*> sorted_rows(const CaseEvaluation& result) {
  std::vector<const sensitivity::SensitivityRow*> rows;
  for (const auto& row : result.sensitivity.rows) rows.push_back(&row);
  std::stable_sort(rows.begin(), rows.end(), [](const auto* a, const auto* b) {
    if (a->prior.log10_prior_odds != b->prior.log10_prior_odds) return a->prior.log10_prior_odds < b->prior.log10_prior_odds;
    return a->prior.one_of_n.has_value() > b->prior.one_of_n.has_value();
  });
  std::vector<const sensitivity::SensitivityRow*> unique;
  for (const auto* row : rows)
    if (unique.empty() || numbers::odds_for_readers(unique.back()->prior.log10_prior_odds) !=
                              numbers::odds_for_readers(row->prior.log10_prior_odds))
      unique.push_back(row);
  return unique;
}

// After a table of posterior probabilities: when any cell is written through its complement
// ("1 − 4.41 × 10⁻⁷"), a note that such precision is the model's alone (both the prior-odds table
// and the table over the alternatives say it, since either can hold such cells).
void add_precision_caveat(const Table& table, Section& s) {
  const bool near_one = std::any_of(table.rows.begin(), table.rows.end(), [](const auto& cells) {
    return std::any_of(cells.begin(), cells.end(), [](const std::string& cell) { return cell.rfind("1 \u2212", 0) == 0; });
  });
  if (near_one)
    s.blocks.push_back(generated(
        "Probabilities written as 1 \u2212 x show how close to 1 the arithmetic comes. Such extreme precision rests "
        "entirely on the model and its assumptions: it leaves out, for example, the chance of an error in handling or "
        "testing, and must not be read as certainty.",
        Paragraph::Style::note));
}

std::string threshold_text(double threshold) { return numbers::decimal_for_readers(threshold); }

void add_training_explanation(Section& s, const casefile::Case& value, const CaseEvaluation& result) {
  const auto& c = result.combined;
  s.blocks.push_back(generated("Why P(E|H) and P(H|E) differ", Paragraph::Style::lead));
  if (!c.lr.is_finite()) {
    s.blocks.push_back(generated(
        "The likelihood ratio here is " + numbers::lr_for_readers(c.lr) +
        ": one proposition cannot explain the findings at all, so any prior odds other than zero lead to the same "
        "conclusion. Such findings are rare; check the assumptions that make one probability exactly zero."));
    return;
  }
  const std::string lr = numbers::lr_for_readers(c.lr);
  s.blocks.push_back(generated(
      "The likelihood ratio of about " + lr + " compares two probabilities of the findings: P(E|Hp), how probable the "
      "findings are if Hp is true, with P(E|Hd), how probable they are if Hd is true. It tells how far the findings "
      "should move the odds on Hp, not how probable Hp is. That probability, P(Hp|E), also depends on how probable Hp was before the findings, the prior odds: "
      "posterior odds = likelihood ratio × prior odds."));
  const double even = -c.lr.log10();
  const auto at_even = numbers::posterior_from(0.0, c.lr);
  const auto at_balance = numbers::posterior_from(even, c.lr);
  s.blocks.push_back(generated(
      "With this case's numbers: for prior odds of " + numbers::odds_for_readers(even) + ", the same findings would give "
      "a posterior probability for Hp of " + numbers::posterior_for_readers(at_balance) +
      ", an even chance, however large the likelihood ratio looks. For prior odds of 1 to 1, they would give " +
      numbers::posterior_for_readers(at_even) + ". The findings are the same in both; only the prior differs."));
  for (std::size_t i = 0; i < result.items.size(); ++i) {
    const auto& e = result.items[i];
    if (!e.included || !e.point.log10_p_given_hd || !std::isfinite(*e.point.log10_p_given_hd)) continue;
    s.blocks.push_back(generated(
        "For item " + e.id + ", P(E|Hd) is about " + numbers::probability_for_readers(*e.point.log10_p_given_hd) +
        ": the probability of those findings if Hd is true. Reading it as the probability that Hd is true is the "
        "transposed conditional, an error; that probability needs the prior odds and all the other findings too."));
    break;
  }
  (void)value;
}

Section sensitivity_section(const casefile::Case& value, const CaseEvaluation& result, ReportMode mode) {
  const bool casework = mode == ReportMode::casework;
  Section s{"sensitivity",
            casework ? "An illustration of how the findings would change different prior odds"
                     : "How the findings would change different prior odds",
            casework, {}};
  const auto& c = result.combined;
  if (casework) {
    s.blocks.push_back(generated(
        "This appendix is an illustration only. The prior odds are for the fact-finder to assess, from all the other "
        "evidence in the case; the scientist proposes no prior and gives no opinion on whether Hp or Hd is true. The "
        "table shows, for a range of prior odds that a fact-finder might hold, what the combined likelihood ratio of "
        "the findings would make of them."));
  } else {
    add_training_explanation(s, value, result);
  }
  const bool band = c.spread && std::isfinite(c.spread->low_log10) && std::isfinite(c.spread->high_log10);
  const std::string level = c.spread ? percent_text(c.spread->levels.credible) : std::string();
  Table table;
  table.header = {"Prior odds (Hp to Hd)", "Prior probability of Hp", "Then P(Hp|E)",
                  band ? "Band from the LR's " + level + " interval" : "Band", "Then P(Hd|E)"};
  table.widths = {1.6, 1.3, 1.5, 2.4, 1.5};
  table.no_wrap = {true, true, true, true, true};
  for (const auto* row : sorted_rows(result)) {
    std::string band_text = "\u2013";
    if (row->at_low && row->at_high)
      band_text = numbers::posterior_for_readers(*row->at_low) + " to " +
                  numbers::posterior_for_readers(*row->at_high);
    table.rows.push_back({prior_odds_text(row->prior), prior_probability_text(row->prior),
                          numbers::posterior_for_readers(row->posterior), band_text,
                          numbers::posterior_for_readers(of_hd(row->posterior))});
  }
  s.blocks.push_back(table);
  add_precision_caveat(table, s);
  const auto thresholds = value.priors ? value.priors->thresholds_or_default()
                                       : casefile::PriorSettings{}.thresholds_or_default();
  for (const auto& t : result.sensitivity.thresholds) {
    std::string text = "P(Hp|E) would reach " + threshold_text(t.threshold) + " ";
    if (std::isinf(t.log10_prior_odds)) {
      text = t.log10_prior_odds > 0 ? "P(Hp|E) could not reach " + threshold_text(t.threshold) +
                                          " from any prior odds, because the findings exclude Hp."
                                    : text + "from any prior odds above zero, because the findings exclude Hd.";
    } else {
      text += "from prior odds of about " + numbers::odds_for_readers(t.log10_prior_odds);
      if (t.log10_prior_odds_low_lr && t.log10_prior_odds_high_lr && std::isfinite(*t.log10_prior_odds_low_lr) &&
          std::isfinite(*t.log10_prior_odds_high_lr))
        text += " (between " + numbers::odds_for_readers(*t.log10_prior_odds_high_lr) + " and " +
                numbers::odds_for_readers(*t.log10_prior_odds_low_lr) + " across the interval of the likelihood ratio)";
      text += ".";
    }
    s.blocks.push_back(generated(text, Paragraph::Style::bullet));
  }
  s.blocks.push_back(posterior_plot(result, thresholds));
  return s;
}

// Hp against each alternative, against the weighted set, and the illustration over the set; only
// for a case with several alternatives.
std::optional<Section> alternatives_section(const casefile::Case& value, const CaseEvaluation& result, ReportMode mode) {
  const auto& p = value.propositions;
  if (!p.has_alternatives()) return std::nullopt;
  const auto& c = result.combined;
  Section s{"alternatives", "Hp against each alternative", false, {}};
  s.blocks.push_back(generated(
      "Each alternative is weighed against Hp on its own: the likelihood ratio compares the probability of the "
      "findings if Hp is true with their probability if that alternative is true. For the combined items, each item's "
      "likelihood ratio against the same alternative is multiplied, as in the evaluation above."));
  for (const auto& a : c.by_alternative) {
    std::string text = naming_alternative(conditional_sentence(a.lr), a.id);
    if (!text.empty() && text.back() == '.') text.pop_back();  // the figures close the sentence
    text += " (likelihood ratio " + lr_with_interval(a.lr, a.spread);
    if (a.spread) text += ", the range being its " + percent_text(a.spread->levels.credible) + " interval";
    text += "; " + a.verbal.label + ").";
    s.blocks.push_back(generated(text, Paragraph::Style::bullet, a.id));
  }
  if (c.compound) {
    std::vector<std::string> each;
    for (std::size_t i = 0; i < c.compound->weights.size(); ++i)
      each.push_back(p.alternatives[i].id + " " + weight_text(c.compound->weights[i]));
    const std::string weights = validation::list_in_words(each);
    std::string interval;
    if (c.compound->spread)
      interval = " (its " + percent_text(c.compound->spread->levels.credible) + " interval " +
                 magnitude(c.compound->spread->low_log10) + " to " + magnitude(c.compound->spread->high_log10) + ")";
    std::string text =
        "The court's relative prior weights for the alternatives, as stated to the laboratory, are " + weights +
        " (normalised to sum to 1). With those weights, the likelihood ratio of Hp against the alternatives taken "
        "together is " + numbers::lr_for_readers(c.compound->lr) + interval + ": " +
        naming_alternative(conditional_sentence(c.compound->lr), "one of the alternatives, in those proportions,") +
        " The weights are the court's, not the scientist's; a different choice gives a different value.";
    s.blocks.push_back(generated(text, Paragraph::Style::body, "Against the set"));
    if (c.compound->without_unspecified)
      s.blocks.push_back(generated(
          "Without the alternatives about which nothing is known, the likelihood ratio against the others, their "
          "weights normalised again, would be " + numbers::lr_for_readers(*c.compound->without_unspecified) + ".",
          Paragraph::Style::note));
    if (c.compound->spread)
      s.blocks.push_back(generated(
          "The interval of the value against the set was calculated by simulation: the uncertain inputs were drawn at "
          "random " + numbers::count_for_readers(value.uncertainty_or_default().draws_or_default()) + " times, an input "
          "the alternatives share (such as the probability of the findings if Hp is true, or allele frequencies) taking the same "
          "value under every alternative in each draw, and the value against the set computed from each draw.",
          Paragraph::Style::note));
    else if (!c.compound->interval_note.empty())
      s.blocks.push_back(generated(
          std::string("No interval is given for the value against the set: ") +
              (c.compound->lr.is_finite() ? "in some draws of the uncertain inputs the items contradict each other."
                                          : "the value is not finite.") +
              " The interval of each alternative's likelihood ratio is given above.",
          Paragraph::Style::note));
  }
  if (!result.over_set.empty()) {
    s.blocks.push_back(generated(
        "Illustration only. The prior odds and the weights are for the fact-finder to assess; the scientist proposes "
        "none and gives no opinion on which proposition is true. The table shows, for prior odds a fact-finder might "
        "hold for Hp against all the alternatives together (shared among them by the court's weights), what the "
        "likelihood ratios of the findings would make of them."));
    Table table;
    table.header = {"Prior odds (Hp to the alternatives)", "Then P(Hp|E)"};
    for (const auto& a : p.alternatives) table.header.push_back("Then P(" + a.id + "|E)");
    table.widths.assign(table.header.size(), 1.0);
    table.widths[0] = 1.6;
    table.no_wrap.assign(table.header.size(), true);
    for (const auto& row : result.over_set) {
      std::vector<std::string> cells{prior_odds_text(row.prior)};
      for (const auto& posterior : row.posteriors) cells.push_back(numbers::posterior_for_readers(posterior));
      table.rows.push_back(std::move(cells));
    }
    s.blocks.push_back(table);
    add_precision_caveat(table, s);
  }
  (void)mode;
  return s;
}

Section contribution_section(const CaseEvaluation& result) {
  Section s{"contribution", "Which findings carry the weight", false, {}};
  ContributionChart chart;
  Table table;
  table.header = {"Item", "log10 LR", "Running total (log10)", "LR so far"};
  table.widths = {0.8, 1.0, 1.6, 1.6};
  table.no_wrap = {true, true, true, true};
  double running = 0.0;
  std::vector<std::string> unbounded;
  for (const auto& e : result.items) {
    if (!e.included) continue;
    const double l = e.point.lr.log10();
    if (!std::isfinite(l)) {
      unbounded.push_back(e.id + " (" + numbers::lr_for_readers(e.point.lr) + ")");
      continue;
    }
    running += l;
    chart.bars.push_back({e.id, l, running});
    table.rows.push_back({e.id, log10_text(l), log10_text(running), magnitude(running)});
  }
  s.blocks.push_back(generated(
      "Each bar is one combined item's log10 likelihood ratio (to the right supports Hp, to the left Hd); the marks "
      "show the running total, so the last one is the combined log10 likelihood ratio."));
  chart.caption = "Contribution of each combined item to the log10 likelihood ratio, in the order of the case.";
  if (!unbounded.empty()) {
    std::string list;
    for (std::size_t i = 0; i < unbounded.size(); ++i) list += (i ? ", " : "") + unbounded[i];
    chart.caption += " Not drawn, because their likelihood ratio is not finite: " + list + ".";
  }
  s.blocks.push_back(chart);
  s.blocks.push_back(table);
  return s;
}

// The review notes of earlier sealed revisions, each quoted as recorded: the reviewer's words,
// not the scientist's evaluation, so they are checked and shown with the check's findings
// (report_wording.cpp) rather than refused.
Section review_notes_section(const std::vector<ReviewNoteEntry>& notes) {
  Section s{"review-notes", "Review notes", false, {}};
  s.blocks.push_back(generated(
      "Declared reviewers recorded these notes on earlier sealed revisions of this case in the case store. Each "
      "note is quoted as the reviewer wrote it: it is the reviewer's statement, not part of the evaluation above. "
      "The wording check read each note, and what it found is given beneath the note."));
  for (const auto& entry : notes) {
    Paragraph heading{entry.reviewer + ", " + entry.at + ": " + entry.verdict + ".", Paragraph::Style::lead,
                      "Revision " + std::to_string(entry.revision), TextSource{}, {}};
    heading.source.item = "review";
    heading.source.field = "reviewer";
    heading.source.quoted = true;
    s.blocks.push_back(std::move(heading));
    if (entry.note.empty()) continue;
    Paragraph quoted{"\u201c" + entry.note + "\u201d", Paragraph::Style::body, {}, TextSource{}, {}};
    quoted.source.item = "review";
    quoted.source.field = kReviewNoteField;
    quoted.source.quoted = true;
    s.blocks.push_back(std::move(quoted));
  }
  return s;
}

Section cautions_section() {
  Section s{"cautions", "Cautions", false, {}};
  const char* cautions[] = {
      "The scientist evaluates the findings under the two propositions; the report gives no opinion on guilt or on "
      "whether either proposition is true.",
      "The figures depend on the propositions, the information and the assumptions stated above; if any of them "
      "changes, the evaluation must be done again and may change.",
      "The verbal scale is a convention for expressing orders of magnitude in words; the numbers are the evaluation.",
      "This report does not replace the judgement of an accredited laboratory working within its quality system; the "
      "law of the place where it is used governs whether and how it may be admitted.",
  };
  for (const char* c : cautions) s.blocks.push_back(generated(c, Paragraph::Style::bullet));
  return s;
}

// --- Networks: the drawing, the one-way sensitivity table and the CPT appendix ---------------

using NetworkModelPtr = std::shared_ptr<const models::network::NetworkModel>;

NetworkModelPtr network_of(const casefile::Item& item) {
  return std::dynamic_pointer_cast<const models::network::NetworkModel>(item.model);
}

// A table entry's value (its mean where it is a distribution): an intermediate value of the
// network's likelihood ratio, so to the working precision.
std::string entry_value_text(double x) { return numbers::decimal_for_readers(x, numbers::kWorkingFigures); }

constexpr std::size_t kSensitivityRows = 15;

NetworkDiagram network_diagram(const models::network::NetworkModel& model) {
  const auto& net = model.network();
  const auto layout = model.layout();
  NetworkDiagram d;
  for (std::size_t i = 0; i < net.nodes.size(); ++i) {
    NetworkDiagram::Node n;
    n.name = net.nodes[i].name;
    n.layer = layout.nodes[i].layer;
    n.position = layout.nodes[i].position;
    n.proposition = i == net.proposition.node;
    d.nodes.push_back(n);
  }
  for (const auto& f : net.findings) d.nodes[f.node].observed_state = net.nodes[f.node].states[f.state];
  for (const auto& e : layout.edges) {
    NetworkDiagram::Edge edge{e.parent, e.child, {}};
    for (const auto& b : e.bends) edge.bends.push_back({b.layer, b.position});
    d.edges.push_back(edge);
  }
  d.layer_widths = layout.layer_widths;
  d.caption = "The network's nodes and arrows (each arrow from a node to a node whose table depends on it). "
              "The node carrying the propositions, " + net.nodes[net.proposition.node].name +
              ", has a heavy outline; observed nodes are shaded and show the state observed.";
  return d;
}

Section network_section(const casefile::Item& item, const models::network::NetworkModel& model) {
  Section s{"network-" + item.id, "The network behind item " + item.id, false, {}};
  const auto& net = model.network();
  Paragraph opening = generated(
      "Item " + item.id + " is evaluated with a network of " + std::to_string(net.nodes.size()) +
      " nodes: each node's probabilities are stated given the states of the nodes it depends on, and the likelihood "
      "ratio is P(observed findings | Hp) / P(observed findings | Hd) computed from them exactly. The tables "
      "themselves are in the appendix on the probability tables of the networks.");
  opening.page_of = kNetworkTablesAppendix;
  s.blocks.push_back(opening);
  s.blocks.push_back(network_diagram(model));

  s.blocks.push_back(generated("How sensitive the network's likelihood ratio is to each table entry", Paragraph::Style::lead));
  auto rows = model.sensitivity();
  models::network::order_by_effect(rows);
  s.blocks.push_back(generated(
      "Each table entry was moved on its own across the range shown, the other entries of its row adjusted in "
      "proportion so the row still sums to one, and the log10 likelihood ratio recomputed at both ends. The entries "
      "that move it most come first."));
  Table table;
  table.header = {"Node", "Given", "State", "Value", "Range tried", "log10 LR at low end", "log10 LR at high end"};
  table.widths = {1.0, 1.6, 1.0, 0.75, 1.9, 0.9, 0.9};
  table.no_wrap = {false, false, false, true, false, true, true};
  for (std::size_t i = 0; i < rows.size() && i < kSensitivityRows; ++i) {
    const auto& e = rows[i];
    const auto& node = net.nodes[e.node];
    table.rows.push_back({node.name, net.row_label(e.node, e.row), node.states[e.state], entry_value_text(e.value),
                          entry_value_text(e.range.low) + " to " + entry_value_text(e.range.high) + " (" + e.range.basis + ")",
                          models::network::sensitivity_end_text(e.lr_at_low), models::network::sensitivity_end_text(e.lr_at_high)});
  }
  s.blocks.push_back(table);
  if (rows.size() > kSensitivityRows)
    s.blocks.push_back(generated(std::to_string(rows.size() - kSensitivityRows) + " of the " + std::to_string(rows.size()) +
                                     " entries, those with smaller effects, are left out of this table.",
                                 Paragraph::Style::note));
  else
    s.blocks.push_back(generated("All " + std::to_string(rows.size()) + " entries that can affect the likelihood ratio are listed.",
                                 Paragraph::Style::note));
  return s;
}

// "Beta(14, 6), mean 0.7", or the number alone when the entry is stated as a number.
std::string cpt_cell(const std::string& entry, double mean) {
  const std::string m = entry_value_text(mean);
  if (entry == m) return entry;
  char* end = nullptr;
  const double stated = std::strtod(entry.c_str(), &end);
  if (end != entry.c_str() && *end == '\0' && stated == mean) return entry;
  return entry + ", mean " + m;
}

// The data files the items were evaluated with, each pinned by the SHA-256 of the bytes read:
// the case names a file by its path, and a path says nothing about what the file held.
std::optional<Section> data_files_section(const casefile::Case& value) {
  Table table;
  table.header = {"Item", "File (as named in the case)", "Bytes", "SHA-256 of the contents"};
  table.widths = {0.7, 2.6, 0.8, 5.0};
  table.no_wrap = {false, false, true, true};
  for (const auto& item : value.items)
    for (const auto& file : item.model->data_files())
      table.rows.push_back({item.id, file.name, std::to_string(file.bytes), file.sha256});
  if (table.rows.empty()) return std::nullopt;
  Section s{"data-files", "Data files used", true, {}};
  s.blocks.push_back(generated(
      "These items were evaluated with data read from files. Each file is identified by the SHA-256 digest of its "
      "contents as the program read them: a copy of the data gives the same digest, and any change to a file changes "
      "it."));
  s.blocks.push_back(std::move(table));
  return s;
}

std::optional<Section> inputs_section(const casefile::Case& value, const std::vector<ItemInputs>& inputs) {
  Section s{kInputsAppendix, "Inputs as used", true, {}};
  s.blocks.push_back(generated(
      "The inputs that are too long to list with the findings, item by item in the order of the case."));
  bool any = false;
  for (std::size_t i = 0; i < value.items.size() && i < inputs.size(); ++i)
    for (const auto& block : inputs[i].appendix) s.blocks.push_back(block), any = true;
  if (!any) return std::nullopt;
  return s;
}

// The value against the weighted set from the combined LR against each alternative, with every
// term a calculator needs: 1 / (w1/LR1 + ... ) = 1 / (t1 + ...) = 1 / sum = LR.
std::string compound_recomputation(const casefile::Case& value, const evaluation::CompoundEvaluation& compound,
                                   const std::vector<evaluation::AlternativeEvaluation>& by_alternative) {
  const auto& alternatives = value.propositions.alternatives;
  std::string weights, ratios, terms;
  double log10_sum = -std::numeric_limits<double>::infinity();
  bool finite = true;
  for (std::size_t i = 0; i < by_alternative.size() && i < compound.weights.size(); ++i) {
    const auto& lr = by_alternative[i].lr;
    const double w = compound.weights[i];
    const std::string separator = i == 0 ? "" : " + ";
    weights += (i == 0 ? "" : (i + 1 == by_alternative.size() ? " and " : ", ")) + alternatives[i].id + " " + weight_text(w);
    // The LR to the working precision, as the terms are, so that w/LR gives the term printed.
    const bool workable = lr.is_finite() && std::abs(lr.log10()) < 300.0;
    ratios += separator + operand(weight_text(w)) + "/" +
              operand(workable ? numbers::decimal_for_readers(lr.value(), numbers::kWorkingFigures) : numbers::lr_for_readers(lr));
    if (!lr.is_finite() || w == 0.0) {
      finite = finite && (w == 0.0 || lr.is_infinite());
      terms += separator + "0";
      continue;
    }
    const double log10_term = std::log10(w) - lr.log10();
    log10_sum = numbers::log10_add(log10_sum, log10_term);
    terms += separator + operand(numbers::decimal_for_readers(std::pow(10.0, log10_term), numbers::kWorkingFigures));
  }
  std::string sum_of_probabilities, sum_of_ratios;
  for (std::size_t i = 0; i < by_alternative.size(); ++i) {
    const std::string k = std::to_string(i + 1), separator = i == 0 ? "" : " + ";
    sum_of_probabilities += separator + "w" + k + " P(E|" + alternatives[i].id + ")";
    sum_of_ratios += separator + "w" + k + "/LR" + k;
  }
  std::string text =
      "The likelihood ratio of Hp against the alternatives taken together is LR = P(E|Hp) / [" + sum_of_probabilities +
      "] = 1 / (" + sum_of_ratios + "), where LRk is the combined likelihood ratio of Hp against the k-th alternative "
      "and wk its weight (Bayes' theorem for exclusive propositions; common practice). The court's weights, "
      "normalised to sum to 1, are " + weights + ". ";
  if (!finite || !compound.lr.is_finite())
    return text + "Here LR = 1 / (" + ratios + ") = " + numbers::lr_for_readers(compound.lr) + ".";
  return text + "LR = 1 / (" + ratios + ") = 1 / (" + terms + ") = 1 / " +
         operand(numbers::decimal_for_readers(std::pow(10.0, log10_sum), numbers::kWorkingFigures)) + " = " +
         numbers::lr_for_readers(compound.lr) + ".";
}

Section recomputation_section(const casefile::Case& value, const CaseEvaluation& result,
                              const std::vector<ItemInputs>& inputs, const std::string& digest) {
  Section s{kRecomputationAppendix, "Recomputation", true, {}};
  s.blocks.push_back(generated(
      "For each item, the formula used (with its published source) and the values that enter it, so that the "
      "likelihood ratio can be recomputed by hand or with a calculator from the inputs as used. " +
      numbers::rounding_policy_text() + " A value recomputed from rounded intermediate values may differ from the "
      "printed result in its last figure."));
  for (std::size_t i = 0; i < value.items.size() && i < inputs.size(); ++i) {
    const auto& item = value.items[i];
    s.blocks.push_back(generated(model_title(item.model->kind()), Paragraph::Style::lead, item.id));
    for (const auto& block : inputs[i].recomputation) s.blocks.push_back(block);
  }
  const auto& c = result.combined;
  std::string combined = c.included_ids.empty()
                             ? "No item is combined, so the combined likelihood ratio is 1."
                             : "The combined likelihood ratio is the product of the likelihood ratios of the combined items "
                               "(the sum of their log10 values): log10 LR = " + log10_text(c.lr.log10()) + ", LR = " +
                                   numbers::lr_for_readers(c.lr) + ".";
  if (c.by_alternative.empty() || c.included_ids.empty()) {
    s.blocks.push_back(generated(combined, Paragraph::Style::body, "Combined"));
  } else {
    for (const auto& a : c.by_alternative)
      s.blocks.push_back(generated(
          "The combined likelihood ratio of Hp against " + a.id + " is the product of the combined items' likelihood "
          "ratios against " + a.id + " (the sum of their log10 values): log10 LR = " + log10_text(a.lr.log10()) +
              ", LR = " + numbers::lr_for_readers(a.lr) + ".",
          Paragraph::Style::body, "Combined, Hp against " + a.id));
  }
  if (c.compound) s.blocks.push_back(generated(compound_recomputation(value, *c.compound, c.by_alternative),
                                               Paragraph::Style::body, "Against the set"));
  s.blocks.push_back(generated(
      "Computed by Counterpoise " COUNTERPOISE_VERSION " from the case whose state has the SHA-256 digest " + digest +
          ". The same program version and case state give the same numbers.",
      Paragraph::Style::body, "Program and case"));
  return s;
}

Section network_tables_section(const casefile::Case& value) {
  Section s{kNetworkTablesAppendix, "Probability tables of the networks", true, {}};
  s.blocks.push_back(generated(
      "For each network, one table per node: a row for each combination of the states of the nodes it depends on, a "
      "column for each of its own states. Entries are as stated in the case file, with the mean that the point "
      "likelihood ratio uses where the entry is a distribution or a complement."));
  for (const auto& item : value.items) {
    const auto model = network_of(item);
    if (!model) continue;
    for (const auto& t : model->cpt_tables()) {
      s.blocks.push_back(generated("Item " + item.id + ", node " + t.node, Paragraph::Style::lead));
      if (!t.stated)
        s.blocks.push_back(generated("No table is stated for this node; its states are taken as equally probable.",
                                     Paragraph::Style::note));
      if (!t.affects_lr)
        s.blocks.push_back(generated("This node's table cannot change the likelihood ratio: nothing observed depends on it.",
                                     Paragraph::Style::note));
      Table table;
      table.header.push_back("Given");
      table.widths.push_back(2.0);
      table.no_wrap.push_back(false);
      for (const auto& state : t.states) {
        table.header.push_back(state);
        table.widths.push_back(1.4);
        table.no_wrap.push_back(false);
      }
      for (const auto& row : t.rows) {
        std::string given;
        for (std::size_t i = 0; i < t.parents.size() && i < row.parent_states.size(); ++i)
          given += (i ? ", " : "") + t.parents[i] + " = " + row.parent_states[i];
        std::vector<std::string> cells{given.empty() ? "no parents" : given};
        for (std::size_t j = 0; j < row.entries.size(); ++j)
          cells.push_back(cpt_cell(row.entries[j], j < row.means.size() ? row.means[j] : 0.0));
        table.rows.push_back(std::move(cells));
      }
      s.blocks.push_back(std::move(table));
    }
  }
  return s;
}

}  // namespace

void letter_appendices(ReportModel& model) {
  char letter = 'A';
  for (auto& section : model.sections)
    if (section.appendix) section.heading = std::string("Appendix ") + letter++ + ": " + section.heading;
}

std::string_view report_mode_name(ReportMode mode) { return mode == ReportMode::casework ? "casework" : "training"; }

const Section* ReportModel::find(std::string_view id) const {
  for (const auto& s : sections)
    if (s.id == id) return &s;
  return nullptr;
}

std::vector<std::string> section_ids(const ReportModel& model) {
  std::vector<std::string> ids;
  for (const auto& s : model.sections) ids.push_back(s.id);
  return ids;
}

IssueInfo issue_info_for_seal(const store::PreparedSeal& prepared, const std::vector<store::ReviewNote>& review_notes) {
  IssueInfo issue;
  issue.revision = std::to_string(prepared.anchor.statement.revision) + " of the case store, sealed when this report was issued";
  issue.digest_label = "Sealed case state (SHA-256 of the canonical case JSON in the store)";
  issue.digest = prepared.anchor.statement.state_sha256;
  issue.seal = prepared.anchor;
  for (const store::ReviewNote& note : review_notes)
    issue.review_notes.push_back({note.revision, note.at, note.reviewer, store::review_verdict_name(note.verdict), note.note});
  return issue;
}

std::string case_digest(const casefile::Case& value) {
  return platform::sha256_hex(interchange::canonical_text(interchange::write_case(value)));
}

ReportModel build_report_model(const casefile::Case& value, const CaseEvaluation& result, ReportMode mode,
                               const IssueInfo& issue) {
  const ReportSettings settings = read_report_settings(value);
  ReportModel model;
  model.mode = mode;
  const auto& d = value.details;
  model.header.title = mode == ReportMode::casework ? "Evaluative report" : "Evaluative report (training)";
  model.header.laboratory = d.laboratory.value_or("Laboratory not recorded");
  model.header.reference = d.reference;
  model.header.case_title = d.title;
  model.header.examiner = d.examiner.value_or("not recorded");
  model.header.date = d.date.value_or("not recorded");
  model.header.revision = issue.revision.empty() ? "working copy (interchange file, no stored revision)" : issue.revision;
  model.header.digest_label = issue.digest_label.empty() ? "Case digest (SHA-256 of the canonical case JSON)" : issue.digest_label;
  model.header.digest = issue.digest.empty() ? case_digest(value) : issue.digest;

  model.sections.push_back(case_section(value, mode, issue));
  model.sections.push_back(question_section(value));
  model.sections.push_back(propositions_section(value));
  std::vector<ItemInputs> inputs;
  for (std::size_t i = 0; i < value.items.size() && i < result.items.size(); ++i)
    inputs.push_back(item_inputs_by_alternative(value.items[i], result.items[i], value.propositions, kInputsAppendix));
  model.sections.push_back(findings_section(value, result, inputs));
  bool any_network = false;
  for (const auto& item : value.items)
    if (const auto network = network_of(item)) {
      model.sections.push_back(network_section(item, *network));
      any_network = true;
    }
  for (const auto& item : value.items)
    if (auto mixture = mixture_section(item, value.propositions)) model.sections.push_back(std::move(*mixture));
  model.sections.push_back(evaluation_section(value, result, settings));
  if (auto alternatives = alternatives_section(value, result, mode)) model.sections.push_back(std::move(*alternatives));
  Section sensitivity = sensitivity_section(value, result, mode);
  if (mode == ReportMode::training) model.sections.push_back(std::move(sensitivity));
  model.sections.push_back(contribution_section(result));
  model.sections.push_back(cautions_section());
  if (!issue.review_notes.empty()) model.sections.push_back(review_notes_section(issue.review_notes));
  if (auto appendix = inputs_section(value, inputs)) model.sections.push_back(std::move(*appendix));
  if (any_network) model.sections.push_back(network_tables_section(value));
  model.sections.push_back(recomputation_section(value, result, inputs, model.header.digest));
  if (auto files = data_files_section(value)) model.sections.push_back(std::move(*files));
  if (mode == ReportMode::casework) model.sections.push_back(std::move(sensitivity));
  if (issue.seal) {
    model.seal = issue.seal;
    model.sections.push_back(seal_section(*issue.seal));
  }
  letter_appendices(model);
  return model;
}

}  // namespace counterpoise::reports
