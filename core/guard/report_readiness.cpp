#include "core/guard/report_readiness.hpp"

#include "core/guard/proposition_options.hpp"

namespace counterpoise::guard {

bool counts_against_report(const WordingFinding& finding) {
  return finding.assertion == Assertion::asserted && finding.severity != Severity::advice;
}

FlagOutcome flag_outcome(const TextOrigin& origin, std::string_view rule_id, CheckMode mode,
                         const std::vector<WordingOverride>& overrides) {
  if (!origin.from_user) return FlagOutcome::refuses;  // the program's own wording is never overridden
  if (matching_override(rule_id, origin.item, overrides)) return FlagOutcome::overridden;
  return mode == CheckMode::training ? FlagOutcome::kept_for_training : FlagOutcome::refuses;
}

std::string as_report_sentence(std::string text) {
  while (!text.empty() && (text.back() == ' ' || text.back() == '\n')) text.pop_back();
  if (!text.empty() && text.back() != '.' && text.back() != '?' && text.back() != '!') text += '.';
  return text;
}

std::vector<UserText> report_user_texts(const casefile::Case& value) {
  std::vector<UserText> texts;
  const auto add = [&](const std::string& item, const std::string& field, std::string text) {
    texts.push_back({TextOrigin{true, item, field, false}, std::move(text)});
  };
  const auto& d = value.details;
  add("case", "title", d.title.empty() ? d.reference : d.title);
  add("case", "reference", d.reference);
  if (d.laboratory) add("case", "laboratory", *d.laboratory);
  if (d.examiner) add("case", "examiner", *d.examiner);
  if (d.date) add("case", "date", *d.date);
  if (d.requested_by) add("case", "requested_by", *d.requested_by);
  if (d.purpose) add("case", "purpose", as_report_sentence(*d.purpose));

  const auto& p = value.propositions;
  add("propositions", "hp", as_report_sentence(p.hp));
  if (p.has_alternatives())
    for (std::size_t i = 0; i < p.alternatives.size(); ++i)
      add("propositions", alternative_text_field(i), as_report_sentence(p.alternatives[i].text));
  else
    add("propositions", "hd", as_report_sentence(p.hd));
  if (p.conditioning_information)
    add("propositions", "conditioning_information", as_report_sentence(*p.conditioning_information));
  for (std::size_t i = 0; i < p.assumptions.size(); ++i)
    add("propositions", "assumptions[" + std::to_string(i) + "]", as_report_sentence(p.assumptions[i]));

  std::vector<const casefile::Item*> combined;
  for (const auto& item : value.items) {
    if (item.title && !item.title->empty()) add(item.id, "title", *item.title);
    if (item.description) add(item.id, "description", as_report_sentence(*item.description));
    if (item.source_data) add(item.id, "source_data", as_report_sentence(*item.source_data));
    if (item.notes) add(item.id, "notes", as_report_sentence(*item.notes));
    if (item.included()) combined.push_back(&item);
    else add(item.id, "combination.exclusion_reason", as_report_sentence(item.combination->exclusion_reason.value_or("")));
  }
  // The independence statements are printed only where items are multiplied together.
  if (combined.size() > 1)
    for (const auto* item : combined)
      if (item->combination && item->combination->independence)
        add(item->id, "combination.independence", as_report_sentence(*item->combination->independence));
  return texts;
}

std::string alternative_text_field(std::size_t index) { return "alternatives[" + std::to_string(index) + "].text"; }

std::vector<RefusingStatement> statements_refusing_report(const casefile::Case& value, const WordingChecker& checker,
                                                          CheckMode mode) {
  const auto overrides = read_wording_overrides(value);
  const CheckOptions options = check_options(value.propositions, mode);
  std::vector<RefusingStatement> refusing;
  for (const auto& text : report_user_texts(value)) {
    for (const auto& finding : checker.check(text.text, options_for_field(options, text.origin.field))) {
      if (!counts_against_report(finding)) continue;
      if (flag_outcome(text.origin, finding.rule_id, mode, overrides) != FlagOutcome::refuses) continue;
      refusing.push_back({text.origin.item, text.origin.field,
                          text.text.substr(finding.sentence.byte_begin, finding.sentence.byte_end - finding.sentence.byte_begin),
                          finding.rule_id, finding.family_name, finding.suggestion});
    }
  }
  return refusing;
}

CheckMode default_report_mode(const casefile::Case& value) {
  return value.mode_or_default() == casefile::CaseMode::training ? CheckMode::training : CheckMode::casework;
}

std::string user_text_place(std::string_view item, std::string_view field) {
  return "item " + std::string(item) + ", field " + std::string(field);
}

std::string describe_refusing_statement(std::string_view place, const RefusingStatement& statement) {
  std::string line = std::string(place) + ": rule " + statement.rule_id + " (" + statement.family_name + "): \"" +
                     statement.sentence + "\"";
  if (!statement.suggestion.empty()) line += "\n    suggested: " + statement.suggestion;
  return line;
}

}  // namespace counterpoise::guard
