#include "core/guard/wording_checker.hpp"

#include <algorithm>
#include <optional>

namespace counterpoise::guard {

namespace {

bool is_quote_mark(const Token& t) {
  return t.kind == TokenKind::punctuation && (t.folded == "\"" || t.folded == "'");
}

bool any_match(const std::vector<TokenPattern>& patterns, const std::vector<const Token*>& tokens,
               const ClassTable& classes) {
  return std::any_of(patterns.begin(), patterns.end(),
                     [&](const TokenPattern& p) { return find_first(p, tokens, classes).has_value(); });
}

// Whether a reporting cue ("it would be wrong to say", "does not mean that", ...) ends before
// the match begins, with no ';' between them (a new clause ends the cue's reach).
bool reported_by_cue(const std::vector<TokenPattern>& cues, const std::vector<const Token*>& tokens,
                     std::size_t match_begin, const ClassTable& classes) {
  for (const TokenPattern& cue : cues) {
    for (std::size_t start = 0; start < match_begin; ++start) {
      bool found = false;
      match_at(cue, tokens, start, classes, [&](std::size_t end) {
        if (end > match_begin) return false;
        bool clause_break = false;
        for (std::size_t k = end; k < match_begin; ++k) clause_break = clause_break || tokens[k]->folded == ";";
        found = !clause_break;
        return found;
      });
      if (found) return true;
    }
  }
  return false;
}

// Whether a refuting cue (", but that statement is wrong") starts after the match ends, with no
// ';' between them.
bool refuted_after(const std::vector<TokenPattern>& cues, const std::vector<const Token*>& tokens,
                   std::size_t match_end, const ClassTable& classes) {
  for (std::size_t start = match_end; start < tokens.size(); ++start) {
    if (tokens[start]->folded == ";") return false;
    for (const TokenPattern& cue : cues)
      if (match_at(cue, tokens, start, classes, [](std::size_t) { return true; })) return true;
  }
  return false;
}

const Token* number_for(const std::vector<const Token*>& tokens, std::size_t begin, std::size_t end) {
  for (std::size_t k = begin; k < end; ++k)
    if (tokens[k]->kind == TokenKind::number) return tokens[k];
  const Token* nearest = nullptr;
  std::size_t best = tokens.size() + 1;
  for (std::size_t k = 0; k < tokens.size(); ++k) {
    if (tokens[k]->kind != TokenKind::number) continue;
    const std::size_t distance = k < begin ? begin - k : k - end + 1;
    if (distance < best) best = distance, nearest = tokens[k];
  }
  return nearest;
}

TextSpan join(const TextSpan& a, const TextSpan& b) {
  return {a.byte_begin, b.byte_end, a.code_point_begin, b.code_point_end, a.utf16_begin, b.utf16_end};
}

void replace_all(std::string& text, std::string_view from, std::string_view to) {
  for (std::size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
    text.replace(at, from.size(), to);
}

}  // namespace

std::string_view assertion_name(Assertion a) {
  switch (a) {
    case Assertion::asserted: return "asserted";
    case Assertion::negated: return "negated";
    case Assertion::quoted: return "quoted";
  }
  return "asserted";
}

WordingChecker::WordingChecker(WordingRuleSet rules) : rules_(std::move(rules)) {}

WordingChecker WordingChecker::load_default() { return from_file(default_wording_rules_path()); }

WordingChecker WordingChecker::from_file(const std::filesystem::path& path) {
  WordingRuleSet rules;
  rules.add_file(path);
  return WordingChecker(std::move(rules));
}

void WordingChecker::add_rules_from_file(const std::filesystem::path& path) { rules_.add_file(path); }

void WordingChecker::add_rules_from_json_text(std::string_view json_text, const std::string& origin) {
  rules_.add_json_text(json_text, origin);
}

std::string fill_suggestion(std::string_view suggestion, const CheckOptions& options, std::string_view n_text) {
  std::string text(suggestion);
  if (!options.hp.empty()) replace_all(text, "[Hp]", options.hp);
  if (!options.hd.empty()) replace_all(text, "[Hd]", options.hd);
  if (!n_text.empty()) replace_all(text, "[N]", n_text);
  return text;
}

std::string likelihood_ratio_text(const Token& number) {
  if (number.kind != TokenKind::number) return {};
  if (number.form == NumberForm::frequency) {
    const std::string folded = fold_text(number.text);
    const bool unit_numerator = folded.rfind("1 ", 0) == 0 || folded.rfind("one ", 0) == 0 ||
                                folded.rfind("one in", 0) == 0 || folded.rfind("1 in", 0) == 0;
    return unit_numerator ? number.denominator_text : std::string();
  }
  if (number.form == NumberForm::plain && number.value >= 1) return number.text;
  return {};
}

bool has_flagged(const std::vector<WordingFinding>& findings) {
  return std::any_of(findings.begin(), findings.end(),
                     [](const WordingFinding& f) { return f.severity != Severity::advice; });
}

std::vector<WordingFinding> WordingChecker::check(std::string_view text, const CheckOptions& options) const {
  std::vector<WordingFinding> findings;
  const ClassTable& classes = rules_.classes();
  for (const Sentence& sentence : split_sentences(text)) {
    std::vector<const Token*> visible;
    for (const Token& t : sentence.tokens)
      if (!is_quote_mark(t)) visible.push_back(&t);
    std::vector<WordingFinding> in_sentence;
    for (const WordingRule& rule : rules_.rules()) {
      if (!rule.enabled) continue;
      if (options.mode == CheckMode::casework ? !rule.in_casework : !rule.in_training) continue;
      const std::optional<PatternMatch> match = find_first(rule.pattern, visible, classes);
      if (!match) continue;
      const bool required = std::all_of(rule.requires_patterns.begin(), rule.requires_patterns.end(),
                                        [&](const TokenPattern& p) { return find_first(p, visible, classes).has_value(); });
      if (!required || any_match(rule.unless_patterns, visible, classes)) continue;

      WordingFinding f;
      f.span = join(visible[match->begin]->span, visible[match->end - 1]->span);
      f.sentence = sentence.span;
      f.matched_text = std::string(text.substr(f.span.byte_begin, f.span.byte_end - f.span.byte_begin));
      f.rule_id = rule.id;
      f.family = rule.family;
      const ErrorFamily& family = rules_.family(rule.family);
      f.family_name = family.published_name.empty() || family.published_name == family.name ? family.name : family.name + " (" + family.published_name + ")";
      f.severity = rule.severity;
      f.explanation = rule.explanation;
      const bool all_quoted = std::all_of(visible.begin() + static_cast<std::ptrdiff_t>(match->begin),
                                          visible.begin() + static_cast<std::ptrdiff_t>(match->end),
                                          [](const Token* t) { return t->quoted; });
      if (all_quoted) f.assertion = Assertion::quoted;
      else if (reported_by_cue(rules_.reporting_cues(), visible, match->begin, classes) ||
               refuted_after(rules_.refuting_cues(), visible, match->end, classes))
        f.assertion = Assertion::negated;
      if (f.assertion != Assertion::asserted) {
        f.severity = Severity::advice;
        f.explanation = "This wording is reported or refuted, not asserted, so it is not counted as an error; "
                        "make sure the correct form is stated nearby. " + rule.explanation;
      }
      const Token* number = number_for(visible, match->begin, match->end);
      f.suggestion = fill_suggestion(rule.suggestion, options, number ? likelihood_ratio_text(*number) : std::string());

      auto same = std::find_if(in_sentence.begin(), in_sentence.end(),
                               [&](const WordingFinding& g) { return g.family == f.family; });
      if (same == in_sentence.end()) in_sentence.push_back(std::move(f));
      else if (same->assertion != Assertion::asserted && f.assertion == Assertion::asserted) *same = std::move(f);
    }
    std::stable_sort(in_sentence.begin(), in_sentence.end(),
                     [](const WordingFinding& a, const WordingFinding& b) { return a.span.byte_begin < b.span.byte_begin; });
    for (auto& f : in_sentence) findings.push_back(std::move(f));
  }
  return findings;
}

}  // namespace counterpoise::guard
