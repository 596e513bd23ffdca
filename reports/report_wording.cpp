#include "reports/report_wording.hpp"

#include <algorithm>
#include <cctype>

#include "core/guard/proposition_options.hpp"

namespace counterpoise::reports {

namespace {

// True when a cell holds words that could carry a reasoning error (not only digits and signs).
bool has_words(const std::string& text) {
  int letters = 0;
  for (unsigned char c : text) letters += std::isalpha(c) ? 1 : 0;
  return letters >= 3;
}

std::string where_text(const CheckedText& text) {
  if (!text.source.from_user) return "the program's own text in section \"" + text.section_id + "\"";
  return guard::user_text_place(text.source.item, text.source.field);
}

guard::CheckMode check_mode(ReportMode mode) {
  return mode == ReportMode::casework ? guard::CheckMode::casework : guard::CheckMode::training;
}

std::string without_quotation_marks(const std::string& text) {
  const std::string open = "\u201c", close = "\u201d";
  if (text.size() >= open.size() + close.size() && text.rfind(open, 0) == 0 &&
      text.compare(text.size() - close.size(), close.size(), close) == 0)
    return text.substr(open.size(), text.size() - open.size() - close.size());
  return text;
}

}  // namespace

ReportRefused::ReportRefused(std::vector<WordingFlag> flags, std::vector<CheckedText> texts, std::string message)
    : validation::InvalidValue(validation::Location{"report", "wording"}, std::move(message)),
      flags_(std::move(flags)),
      texts_(std::move(texts)) {}

WordingCheck guard_wording_check(std::shared_ptr<const guard::WordingChecker> checker,
                                 const casefile::Propositions& propositions) {
  return [checker, propositions](const std::vector<CheckedText>& texts, ReportMode mode) {
    const guard::CheckOptions options = guard::check_options(propositions, check_mode(mode));
    std::vector<WordingFlag> flags;
    for (std::size_t i = 0; i < texts.size(); ++i) {
      // The learned reading weighs what people write; the program's own sentences are fixed
      // wordings held to the rules (docs/reasoning-guard.md, "The learned reading").
      guard::CheckOptions text_options = guard::options_for_field(options, texts[i].source.field);
      text_options.learned_reading = texts[i].source.from_user;
      for (const auto& f : checker->check(texts[i].text, text_options)) {
        if (!guard::counts_against_report(f)) continue;
        WordingFlag flag;
        flag.text_index = i;
        flag.sentence = texts[i].text.substr(f.sentence.byte_begin, f.sentence.byte_end - f.sentence.byte_begin);
        flag.rule_id = f.rule_id;
        flag.family_name = f.family_name;
        flag.severity = std::string(guard::severity_name(f.severity));
        flag.explanation = f.explanation;
        flag.suggestion = f.suggestion;
        flags.push_back(std::move(flag));
      }
    }
    return flags;
  };
}

std::vector<CheckedText> report_texts(const ReportModel& model) {
  std::vector<CheckedText> texts;
  for (const auto& section : model.sections) {
    texts.push_back({section.heading, {}, section.id});
    for (const auto& block : section.blocks) {
      if (const auto* p = std::get_if<Paragraph>(&block)) {
        if (!p->label.empty()) texts.push_back({p->label, {}, section.id});
        if (p->source.quoted) continue;  // someone else's words: annotate_quoted_texts reads them
        texts.push_back({p->text, p->source, section.id});
      } else if (const auto* t = std::get_if<Table>(&block)) {
        for (const auto& h : t->header) texts.push_back({h, {}, section.id});
        for (const auto& row : t->rows)
          for (const auto& cell : row)
            if (has_words(cell)) texts.push_back({cell, {}, section.id});
      } else if (const auto* plot = std::get_if<PosteriorPlot>(&block)) {
        texts.push_back({plot->caption, {}, section.id});
      } else if (const auto* chart = std::get_if<ContributionChart>(&block)) {
        texts.push_back({chart->caption, {}, section.id});
      } else if (const auto* net = std::get_if<NetworkDiagram>(&block)) {
        texts.push_back({net->caption, {}, section.id});
      } else if (const auto* line_chart = std::get_if<LineChart>(&block)) {
        texts.push_back({line_chart->caption, {}, section.id});
      }
    }
  }
  return texts;
}

std::size_t annotate_quoted_texts(ReportModel& model, const WordingCheck& check) {
  std::size_t checked = 0;
  for (auto& section : model.sections) {
    for (std::size_t b = 0; b < section.blocks.size(); ++b) {
      const auto* p = std::get_if<Paragraph>(&section.blocks[b]);
      if (!p || !p->source.quoted || p->source.field != kReviewNoteField) continue;
      ++checked;
      // The note's own words, without the quotation marks the report puts around them: the
      // checker reads a quoted claim as someone else's, and the note is checked as if stated.
      const auto flags = check({CheckedText{without_quotation_marks(p->text), p->source, section.id}}, model.mode);
      std::string words;
      if (flags.empty()) {
        words = "The wording check finds nothing to point out in this note.";
      } else {
        words = "The wording check points out in this note, which the report quotes and does not adopt:";
        for (const auto& f : flags) {
          words += " rule " + f.rule_id + " (" + f.family_name + "), \u201c" + f.sentence + "\u201d";
          if (!f.suggestion.empty()) words += ", suggested wording \u201c" + f.suggestion + "\u201d";
          words += ";";
        }
        words.back() = '.';
      }
      Paragraph findings{std::move(words), Paragraph::Style::note, {}, p->source, {}};
      findings.source.field = "wording check of the note";
      section.blocks.insert(section.blocks.begin() + static_cast<std::ptrdiff_t>(b) + 1, std::move(findings));
      ++b;
    }
  }
  return checked;
}

void apply_wording_check(ReportModel& model, const casefile::Case& value, const WordingCheck& check,
                         const std::string& checker_description) {
  const ReportSettings settings = read_report_settings(value);
  const std::size_t quoted_notes = annotate_quoted_texts(model, check);
  const auto texts = report_texts(model);
  const auto flags = check(texts, model.mode);

  std::vector<WordingFlag> refusing, overridden, kept_for_training;
  std::vector<const WordingOverride*> overrides_used;
  for (const auto& flag : flags) {
    const auto& text = texts[flag.text_index];
    switch (guard::flag_outcome(text.source, flag.rule_id, check_mode(model.mode), settings.wording_overrides)) {
      case guard::FlagOutcome::refuses:
        refusing.push_back(flag);
        break;
      case guard::FlagOutcome::overridden:
        overridden.push_back(flag);
        overrides_used.push_back(guard::matching_override(flag.rule_id, text.source.item, settings.wording_overrides));
        break;
      case guard::FlagOutcome::kept_for_training:
        kept_for_training.push_back(flag);
        break;
    }
  }
  if (!refusing.empty()) {
    std::string message = "the report is refused: " + std::to_string(refusing.size()) +
                          (refusing.size() == 1 ? " statement is" : " statements are") + " flagged by the wording check";
    for (const auto& f : refusing) {
      const auto& text = texts[f.text_index];
      message += "\n  " + guard::describe_refusing_statement(
                               where_text(text), {text.source.item, text.source.field, f.sentence, f.rule_id,
                                                  f.family_name, f.suggestion});
    }
    const bool program_text = std::any_of(refusing.begin(), refusing.end(),
                                          [&](const WordingFlag& f) { return !texts[f.text_index].source.from_user; });
    message += program_text
                   ? "\n  The program's own wording was flagged; this is a defect, please report it."
                   : "\n  " + std::string(guard::kRewordOrOverride);
    throw ReportRefused(refusing, texts, message);
  }

  Section s{"wording", "Wording check", false, {}};
  s.blocks.push_back(Paragraph{"Every heading, sentence and table entry of this report (" + std::to_string(texts.size()) +
                                   " texts) was checked for statements that give the probability of a proposition "
                                   "in place of the probability of the findings, and for related errors of reasoning, "
                                   "with " + checker_description + ".",
                               Paragraph::Style::body, {}, {}, {}});
  if (quoted_notes > 0)
    s.blocks.push_back(Paragraph{"The review notes quoted in this report (" + std::to_string(quoted_notes) +
                                     ") were checked with the same rules. A note is the reviewer's statement, not the "
                                     "evaluation: what the check found is printed beneath each note, and it does not "
                                     "stop the report.",
                                 Paragraph::Style::body, {}, {}, {}});
  if (overridden.empty() && kept_for_training.empty())
    s.blocks.push_back(Paragraph{"No statement was flagged.", Paragraph::Style::body, {}, {}, {}});
  // A listing of flags: where, which rule, and the third column's text for each.
  const auto add_listing = [&](const std::string& intro, const std::string& third_heading,
                               const std::vector<WordingFlag>& listed, const auto& third) {
    if (listed.empty()) return;
    s.blocks.push_back(Paragraph{intro, Paragraph::Style::body, {}, {}, {}});
    Table table;
    table.header = {"Where", "Rule", third_heading};
    table.widths = {1.6, 2.0, 4.4};
    table.no_wrap = {false, false, false};
    for (std::size_t i = 0; i < listed.size(); ++i) {
      const auto& text = texts[listed[i].text_index];
      table.rows.push_back({text.source.item + ", " + text.source.field,
                            listed[i].rule_id + " (" + listed[i].family_name + ")", third(i)});
    }
    s.blocks.push_back(table);
  };
  add_listing("The wording check flagged the statements below; the examiner kept them, for the reasons recorded in "
              "the case file.",
              "Reason recorded for keeping the wording", overridden,
              [&](std::size_t i) { return overrides_used[i]->reason; });
  add_listing("This training report keeps the flagged statements below so that they can be discussed; in a casework "
              "report they would be refused.",
              "Suggested wording", kept_for_training, [&](std::size_t i) {
                const auto& f = kept_for_training[i];
                return f.suggestion.empty() ? f.explanation : f.suggestion;
              });
  const auto appendix = std::find_if(model.sections.begin(), model.sections.end(),
                                     [](const Section& x) { return x.appendix; });
  model.sections.insert(appendix, std::move(s));
}

}  // namespace counterpoise::reports
