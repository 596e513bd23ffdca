#include "core/guard/wording_checker.hpp"

#include "core/guard/claim_analysis.hpp"
#include "core/guard/clause_structure.hpp"

#include <algorithm>
#include <cctype>
#include <optional>

#include "core/guard/wording_features.hpp"
#include "core/numbers/number_text.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::guard {

namespace {

bool any_match(const std::vector<TokenPattern>& patterns, const std::vector<const Token*>& tokens,
               const ClassTable& classes, ClassMatchCache& cache) {
  return std::any_of(patterns.begin(), patterns.end(),
                     [&](const TokenPattern& p) { return find_first(p, tokens, classes, 0, &cache).has_value(); });
}

// Whether a reporting cue ("it would be wrong to say", "does not mean that", ...) ends before
// the match begins, with no ';' between them (a new clause ends the cue's reach).
bool reported_by_cue(const std::vector<TokenPattern>& cues, const std::vector<const Token*>& tokens,
                     std::size_t match_begin, const ClassTable& classes, ClassMatchCache& cache) {
  for (const TokenPattern& cue : cues) {
    for (std::size_t start = 0; start < match_begin; ++start) {
      if (!may_start_with(cue.first_words, *tokens[start])) continue;
      bool found = false;
      match_at(cue, tokens, start, classes, [&](std::size_t end) {
        if (end > match_begin) return false;
        bool clause_break = false;
        for (std::size_t k = end; k < match_begin; ++k) clause_break = clause_break || tokens[k]->folded == ";";
        found = !clause_break;
        return found;
      }, &cache);
      if (found) return true;
    }
  }
  return false;
}

// Whether a refuting cue (", but that statement is wrong") starts after the match ends, with no
// ';' between them.
bool refuted_after(const std::vector<TokenPattern>& cues, const std::vector<const Token*>& tokens,
                   std::size_t match_end, const ClassTable& classes, ClassMatchCache& cache) {
  for (std::size_t start = match_end; start < tokens.size(); ++start) {
    if (tokens[start]->folded == ";") return false;
    for (const TokenPattern& cue : cues)
      if (may_start_with(cue.first_words, *tokens[start]) &&
          match_at(cue, tokens, start, classes, [](std::size_t) { return true; }, &cache))
        return true;
  }
  return false;
}

// Whether the writer adopts what the sentence quotes or reports: an endorsing cue ("… is fine",
// "full marks", "I agree with the conclusion that") in the writer's own words, outside quotation
// marks, with no negation in the three words before it ("is not acceptable" endorses nothing).
bool endorsed(const WordingRuleSet& rules, const std::vector<const Token*>& tokens, const ClassTable& classes,
              ClassMatchCache& cache) {
  const WordClass* negator = find_class(classes, "negator");
  const auto negated_before = [&](std::size_t k) {
    for (std::size_t j = k >= 3 ? k - 3 : 0; j < k; ++j)
      if (class_match_end(negator, tokens, j, classes, cache)) return true;
    return false;
  };
  for (std::size_t start = 0; start < tokens.size(); ++start) {
    if (tokens[start]->quoted) continue;
    for (const TokenPattern& cue : rules.endorsing_cues())
      if (may_start_with(cue.first_words, *tokens[start]) &&
          match_at(cue, tokens, start, classes, [&](std::size_t end) {
            for (std::size_t k = start; k < end; ++k) if (tokens[k]->quoted) return false;
            return true;
          }, &cache) &&
          !negated_before(start))
        return true;
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

// Whether the text before `at` ends a sentence (or is empty), so what follows starts one.
bool starts_sentence(std::string_view text, std::size_t at) {
  const std::size_t last = text.substr(0, at).find_last_not_of(' ');
  return last == std::string_view::npos || text[last] == '.' || text[last] == '!' || text[last] == '?' || text[last] == ':';
}

// A proposition's text without its final stop.
std::string_view without_stop(std::string_view proposition) {
  while (!proposition.empty() && (proposition.back() == ' ' || proposition.back() == '.')) proposition.remove_suffix(1);
  return proposition;
}

// A proposition written to continue a sentence: without its final stop, and with a first word
// that is capitalised only because it began the proposition ("The stain came from Mr Okafor." →
// "the stain came from Mr Okafor") in lower case. Names and other capitalised words keep their
// capital.
std::string continuing(std::string_view proposition) {
  std::string text(without_stop(proposition));
  const std::size_t word_end = std::min(text.find(' '), text.size());
  static const std::vector<std::string_view> lower_words = {
      "The", "A", "An", "This", "That", "These", "Those", "His", "Her", "Their", "Its", "It", "He", "She", "They",
      "Someone", "Somebody", "Another", "Some", "No", "Nobody", "One", "Both", "Either", "Neither", "Each", "Every",
      "All", "Any", "Anyone", "Anybody", "We", "There", "An", "Whoever", "Nothing", "None"};
  if (std::find(lower_words.begin(), lower_words.end(), std::string_view(text).substr(0, word_end)) != lower_words.end())
    text[0] = static_cast<char>(text[0] - 'A' + 'a');
  return text;
}

// Replaces each `placeholder` by `at_start` where it begins a sentence and by `within` elsewhere.
void insert_proposition(std::string& text, std::string_view placeholder, const std::string& at_start,
                        const std::string& within) {
  for (std::size_t at = text.find(placeholder); at != std::string::npos;) {
    const std::string& inserted = starts_sentence(text, at) ? at_start : within;
    text.replace(at, placeholder.size(), inserted);
    at = text.find(placeholder, at + inserted.size());
  }
}

void insert_proposition(std::string& text, std::string_view placeholder, std::string_view proposition) {
  insert_proposition(text, placeholder, std::string(without_stop(proposition)), continuing(proposition));
}

// Every alternative where the rules write "if [Hd]": "A, if B or if C", each continuing the
// sentence.
std::string alternatives_text(const std::vector<std::string>& alternatives) {
  std::string text;
  for (std::size_t i = 0; i < alternatives.size(); ++i) {
    if (i > 0) text += i + 1 == alternatives.size() ? " or if " : ", if ";
    text += continuing(alternatives[i]);
  }
  return text;
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

WordingChecker WordingChecker::load_default() {
  WordingChecker checker = from_file(default_wording_rules_path());
  checker.set_model(std::make_shared<const WordingModel>(WordingModel::read_file(default_wording_model_path())));
  return checker;
}

CheckOptions options_for_field(CheckOptions options, std::string_view field) {
  options.title = field == "title";
  return options;
}

std::string learned_rule_id(std::string_view family) {
  std::string id = "LW-";
  bool starts_word = true;  // the family's first letter, and each letter after a '-'
  for (char c : family) {
    if (starts_word) id += static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
    starts_word = c == '-';
  }
  return id;
}

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
  if (!options.hp.empty()) insert_proposition(text, "[Hp]", options.hp);
  if (!options.alternatives.empty()) {
    const std::string all = alternatives_text(options.alternatives);
    insert_proposition(text, "[Hd]", all, all);
  } else if (!options.hd.empty()) {
    insert_proposition(text, "[Hd]", options.hd);
  }
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
  return check(text, split_sentences(text), options);
}

namespace {

// What a finding is made from: the tokens it covers and the wording that explains it.
struct FindingSource {
  std::size_t begin, end;  // visible tokens [begin, end)
  const std::string& id;
  const std::string& family;
  Severity severity;
  const std::string& explanation;
  const std::string& suggestion;
};

bool overlaps(const TextSpan& a, const TextSpan& b) { return a.byte_begin < b.byte_end && b.byte_begin < a.byte_end; }

// "transposed conditional (prosecutor's fallacy)": the family's name and its published name.
std::string family_display_name(const ErrorFamily& family) {
  return family.published_name.empty() || family.published_name == family.name
             ? family.name
             : family.name + " (" + family.published_name + ")";
}

// A word feature as a reader would write it: numbers, which the features keep by form only, as N.
std::string readable_feature(const std::string& feature) {
  std::string out;
  for (std::size_t at = 0; at < feature.size();) {
    const std::size_t end = std::min(feature.find(' ', at), feature.size());
    const std::string_view word(feature.data() + at, end - at);
    out += out.empty() ? "" : " ";
    out += word == "#" ? "N" : word == "#%" ? "N %" : word == "#in" ? "1 in N" : std::string(word);
    at = end + 1;
  }
  return out;
}

// A finding the author reports, negates, asks or quotes: advice, not an error.
void mark_reported(WordingFinding& f, Assertion how, const std::string& explanation) {
  f.assertion = how;
  f.severity = Severity::advice;
  f.explanation = "This wording is reported, refuted or asked, not asserted, so it is not counted as an error; "
                  "make sure the correct form is stated nearby. " + explanation;
}

// What every finding holds: where it is, the words it covers, its rule and its family.
WordingFinding finding_base(const WordingRuleSet& rules, std::string_view text, const Sentence& sentence,
                            const TextSpan& span, const std::string& rule_id, const std::string& family,
                            Severity severity) {
  WordingFinding f;
  f.span = span;
  f.sentence = sentence.span;
  f.matched_text = std::string(text.substr(span.byte_begin, span.byte_end - span.byte_begin));
  f.rule_id = rule_id;
  f.family = family;
  f.family_name = family_display_name(rules.family(family));
  f.severity = severity;
  return f;
}

WordingFinding make_finding(const WordingRuleSet& rules, std::string_view text, const Sentence& sentence,
                            const std::vector<const Token*>& visible, const FindingSource& from,
                            const CheckOptions& options, ClassMatchCache& cache) {
  const ClassTable& classes = rules.classes();
  WordingFinding f = finding_base(rules, text, sentence, join(visible[from.begin]->span, visible[from.end - 1]->span),
                                  from.id, from.family, from.severity);
  f.explanation = from.explanation;
  const bool all_quoted = std::all_of(visible.begin() + static_cast<std::ptrdiff_t>(from.begin),
                                      visible.begin() + static_cast<std::ptrdiff_t>(from.end),
                                      [](const Token* t) { return t->quoted; });
  const bool refuted = refuted_after(rules.refuting_cues(), visible, from.end, classes, cache);
  if (all_quoted) f.assertion = Assertion::quoted;
  else if (refuted || reported_by_cue(rules.reporting_cues(), visible, from.begin, classes, cache))
    f.assertion = Assertion::negated;
  if (f.assertion != Assertion::asserted && !refuted && endorsed(rules, visible, classes, cache))
    f.assertion = Assertion::asserted;
  if (f.assertion != Assertion::asserted) mark_reported(f, f.assertion, from.explanation);
  const Token* number = number_for(visible, from.begin, from.end);
  f.suggestion = fill_suggestion(from.suggestion, options, number ? likelihood_ratio_text(*number) : std::string());
  return f;
}

// Whether `answer` adopts the question before it: a witness's "yes" ("A: Yes, that follows.",
// "A: That is correct.") or, to a question that asks for a chance ("what is the probability
// that ...?"), a value ("A: Very high, about 99.9 %.", "A: I'd put it at under one per cent.").
// Only a transcript's answer line, opened by "A:", answers.
bool answer_adopts(const Sentence& question, const Sentence& answer) {
  const auto& t = answer.tokens;
  if (t.size() < 3 || t[0].folded != "a" || t[1].folded != ":") return false;
  static const std::vector<std::string> yes = {"yes", "yeah", "correct", "right", "agree", "indeed", "exactly",
                                               "true", "follows", "certainly"};
  static const std::vector<std::string> levels = {"high", "low", "small", "remote", "tiny", "negligible", "likely",
                                                  "unlikely", "certain", "probable", "improbable"};
  static const std::vector<std::string> asking = {"probability", "probabilities", "chance", "chances", "odds",
                                                  "likelihood", "likely", "probable", "certain", "sure"};
  const auto asked = [&](const std::vector<std::string>& words) {
    return std::any_of(question.tokens.begin(), question.tokens.end(), [&](const Token& q) {
      return std::find(words.begin(), words.end(), q.folded) != words.end();
    });
  };
  // "what is the probability ...?", "how likely ...?": a value answers it; a yes/no question
  // answered with a number is usually being corrected.
  const bool asks_value = asked(asking) && asked({"what", "how"});
  for (std::size_t k = 2; k < std::min<std::size_t>(t.size(), 18); ++k) {
    if (t[k].folded == "not" || t[k].folded == "no" || t[k].folded == "cannot") return false;
    if (k < 8 && std::find(yes.begin(), yes.end(), t[k].folded) != yes.end()) return true;
    if (asks_value && (t[k].kind == TokenKind::number || std::find(levels.begin(), levels.end(), t[k].folded) != levels.end()))
      return true;
  }
  return false;
}

// Whether the sentence repeats a proposition of the case, Hp, Hd or any alternative's text (a
// plain attribution that is the proposition itself, quoted as such).
bool names_a_proposition(std::string_view text, const Sentence& sentence, const CheckOptions& options) {
  const std::string_view said = text.substr(sentence.span.byte_begin, sentence.span.byte_end - sentence.span.byte_begin);
  const auto holds = [&](const std::string& proposition) {
    return !proposition.empty() && said.find(proposition) != std::string_view::npos;
  };
  return holds(options.hp) || holds(options.hd) ||
         std::any_of(options.alternatives.begin(), options.alternatives.end(), holds);
}

// A sentence's part read on its own: its tokens and, for each, its index in the sentence.
struct SentencePart {
  std::vector<const Token*> tokens;
  std::vector<std::size_t> position;
};

// The sentence with its bracketed asides set apart, then each aside: "It is not at all likely
// (one in a hundred million) that any other person shares this profile" is one clause around
// its aside, not two.
// A conclusion tag in brackets ("Mr Blakemore (certain)") is not an aside: it qualifies the
// clause before it, so it stays in the sentence with its brackets as clause breaks.
std::vector<SentencePart> split_asides(const std::vector<const Token*>& tokens, const ClassTable& classes,
                                       ClassMatchCache& cache) {
  const WordClass* tag = find_class(classes, "conclusion-tag");
  const auto tag_in_brackets = [&](std::size_t open) {
    const auto end = class_match_end(tag, tokens, open + 1, classes, cache);
    return open > 0 && end && *end < tokens.size() && tokens[*end]->folded == ")";
  };
  std::vector<SentencePart> parts(1);
  std::size_t depth = 0;
  bool inline_tag = false;
  for (std::size_t k = 0; k < tokens.size(); ++k) {
    const std::string& w = tokens[k]->folded;
    if (w == "(" && depth == 0 && tag_in_brackets(k)) inline_tag = true;
    if (w == ")" && inline_tag) inline_tag = false;
    else if (w == "(" && !inline_tag) {
      if (depth++ == 0) parts.emplace_back();
      continue;
    }
    else if (w == ")" && depth > 0) {
      --depth;
      continue;
    }
    SentencePart& part = depth > 0 ? parts.back() : parts.front();
    part.tokens.push_back(tokens[k]);
    part.position.push_back(k);
  }
  return parts;
}

// The claims about propositions in a sentence, by the analysis of each of its parts, with
// their token ranges in the sentence's tokens.
std::vector<Claim> claims_in(const std::vector<const Token*>& visible, const ClassTable& classes, ClassMatchCache& cache,
                             bool affirmed) {
  // Only in prose, ended by a full stop or a question mark: in a table's text or a heading
  // ("Prior odds (Hp to Hd)  Prior probability of Hp ...") the brackets stay breaks.
  const bool prose = visible.back()->is_one_of({".", "?", "!"});
  const bool has_aside = prose && std::any_of(visible.begin(), visible.end(), [](const Token* t) { return t->folded == "("; });
  if (!has_aside) return find_claims(visible, analyse_clauses(visible, classes, cache), classes, cache, affirmed);
  std::vector<Claim> claims;
  for (const SentencePart& part : split_asides(visible, classes, cache)) {
    if (part.tokens.empty()) continue;
    ClassMatchCache part_cache(part.tokens);
    const ClauseStructure structure = analyse_clauses(part.tokens, classes, part_cache);
    for (Claim c : find_claims(part.tokens, structure, classes, part_cache, affirmed)) {
      c.begin = part.position[c.begin];
      c.end = part.position[c.end - 1] + 1;
      claims.push_back(c);
    }
  }
  return claims;
}

// The suggestion of a family's own wording: its claim wording's, else its first rule's.
const std::string* family_suggestion(const WordingRuleSet& rules, const std::string& family) {
  if (const ClaimWording* wording = rules.claim_wording(family)) return &wording->suggestion;
  for (const WordingRule& rule : rules.rules())
    if (rule.family == family && rule.enabled) return &rule.suggestion;
  return nullptr;
}

// Whether a sentence without a final stop is numbered like a section heading: "7. Evaluation of
// ...", "3.2 Findings ...", "(b) Findings ..." (the number before it on its line, or its first
// tokens).
bool numbered_heading(std::string_view text, const Sentence& sentence, const std::vector<const Token*>& visible) {
  const std::size_t begin = sentence.span.byte_begin;
  const std::size_t newline = begin == 0 ? std::string_view::npos : text.rfind('\n', begin - 1);
  const std::size_t line_begin = newline == std::string_view::npos ? 0 : newline + 1;
  const std::string_view before = text.substr(line_begin, begin - line_begin);  // the line before the sentence
  const bool numbered_before = std::any_of(before.begin(), before.end(), [](char c) { return std::isdigit(static_cast<unsigned char>(c)); }) &&
                               before.find_first_not_of("0123456789.() \t") == std::string_view::npos;
  const Token& first = *visible.front();
  const bool opened_by_number = first.kind == TokenKind::number && first.form == NumberForm::plain &&
                                first.text.find('.') != std::string::npos && visible.size() > 1 && visible[1]->capitalised;
  const bool opened_by_letter = visible.size() > 2 && visible[0]->folded == "(" && visible[1]->folded.size() <= 3 &&
                                visible[2]->folded == ")";
  return numbered_before || opened_by_number || opened_by_letter;
}

// Whether the learned reading reads a sentence: prose of at least six words laid out as running
// text, ended by a full stop or an exclamation mark, or by a word or number at the end of a line
// (a headline, a chat message, a case note) unless numbered like a section heading or the text is
// a title (CheckOptions::title). A short heading, a table's row or cell, a title or a usage line
// gives a bag of words too small or too scattered to weigh; a question asserts nothing (its
// answer does); probability notation ("P(E | Hp) = 0.9") is read exactly by the rules; and a
// sentence opened by a proposition's label ("Hp: ...", "Hd2: ...") states that proposition.
bool reads_as_prose(std::string_view text, const Sentence& sentence, const std::vector<const Token*>& visible,
                    const CheckOptions& options) {
  const auto words = std::count_if(visible.begin(), visible.end(), [](const Token* t) { return t->kind == TokenKind::word; });
  const std::string& last = visible.back()->folded;
  const bool stopped = last == "." || last == "!";
  const bool unstopped =
      !options.title && visible.back()->kind != TokenKind::punctuation && !numbered_heading(text, sentence, visible);
  if (words < 6 || !(stopped || unstopped)) return false;
  const std::string_view said = text.substr(sentence.span.byte_begin, sentence.span.byte_end - sentence.span.byte_begin);
  if (said.find('\n') != std::string_view::npos || said.find("  ") != std::string_view::npos) return false;
  if (std::any_of(visible.begin(), visible.end(), [](const Token* t) { return t->folded == "|"; })) return false;
  const std::string& first = visible.front()->folded;
  const bool labelled = visible.size() > 1 && visible[1]->folded == ":" && first.size() <= 4 && first[0] == 'h' &&
                        (first == "hp" || first.rfind("hd", 0) == 0 ||
                         (first.size() > 1 && std::isdigit(static_cast<unsigned char>(first[1]))));
  return !labelled;
}

// The learned reading's finding on a sentence no rule flagged, when its score for an error
// reaches the model's threshold and names a family of these rules.
std::optional<WordingFinding> learned_finding(const WordingModel& model, const WordingRuleSet& rules,
                                              std::string_view text, const Sentence& sentence,
                                              const std::vector<const Token*>& visible,
                                              const std::vector<const Token*>& context, const CheckOptions& options,
                                              ClassMatchCache* cache) {
  const LearnedReading reading = model.read(wording_features(context, options.mode, rules.classes(), cache));
  if (reading.error_probability < model.threshold() || !rules.families().count(reading.family)) return std::nullopt;
  WordingFinding f = finding_base(rules, text, sentence, join(visible.front()->span, visible.back()->span),
                                  learned_rule_id(reading.family), reading.family, Severity::warning);
  std::vector<std::string> quoted;
  for (const std::string& feature : reading.weightiest) quoted.push_back("\u201C" + readable_feature(feature) + "\u201D");
  const std::string words = validation::list_in_words(quoted);
  f.explanation = "No rule matched this sentence, but the guard's learned reading (a statistical model trained on "
                  "labelled wording, docs/reasoning-guard.md) scores it " +
                  (reading.error_probability >= 0.999 ? std::string("above 0.999")
                                                      : numbers::decimal_for_readers(reading.error_probability, 3)) +
                  " for an error, most likely the " +
                  f.family_name + (words.empty() ? "" : ", chiefly on " + words) +
                  ". Read it again as the court would: it should state how probable the findings are under each "
                  "proposition, not how probable a proposition is.";
  if (const std::string* suggestion = family_suggestion(rules, reading.family)) {
    const Token* number = number_for(visible, 0, visible.size());
    f.suggestion = fill_suggestion(*suggestion, options, number ? likelihood_ratio_text(*number) : std::string());
  }
  return f;
}

// The learned reading of sentence `at`. An answer is read with the question it answers, as the
// corpora's exchanges are; when the rules flagged the question (found it adopted by this
// answer), they have said it already.
std::optional<WordingFinding> learned_finding_in_exchange(const WordingModel& model, const WordingRuleSet& rules,
                                                          std::string_view text, const std::vector<Sentence>& sentences,
                                                          std::size_t at, const std::vector<const Token*>& visible,
                                                          const std::vector<WordingFinding>& earlier,
                                                          const CheckOptions& options, ClassMatchCache& cache) {
  const Sentence* question =
      at > 0 && !sentences[at - 1].tokens.empty() && sentences[at - 1].tokens.back().folded == "?" ? &sentences[at - 1]
                                                                                                    : nullptr;
  if (!question) return learned_finding(model, rules, text, sentences[at], visible, visible, options, &cache);
  const bool question_flagged = std::any_of(earlier.begin(), earlier.end(), [&](const WordingFinding& f) {
    return f.sentence.byte_begin == question->span.byte_begin;
  });
  if (question_flagged) return std::nullopt;
  std::vector<const Token*> context = visible_tokens(*question);
  context.insert(context.end(), visible.begin(), visible.end());
  return learned_finding(model, rules, text, sentences[at], visible, context, options, nullptr);
}

}  // namespace

std::vector<WordingFinding> WordingChecker::check(std::string_view text, const std::vector<Sentence>& sentences,
                                                  const CheckOptions& options) const {
  std::vector<WordingFinding> findings;
  const ClassTable& classes = rules_.classes();
  const auto applies = [&](bool in_casework, bool in_training) {
    return options.mode == CheckMode::casework ? in_casework : in_training;
  };
  for (std::size_t at = 0; at < sentences.size(); ++at) {
    const Sentence& sentence = sentences[at];
    const std::vector<const Token*> visible = visible_tokens(sentence);
    if (visible.empty()) continue;
    ClassMatchCache cache(visible);
    std::vector<WordingFinding> in_sentence;
    // One finding per family: an asserted one replaces a reported one.
    const auto keep = [&](WordingFinding f) {
      auto same = std::find_if(in_sentence.begin(), in_sentence.end(),
                               [&](const WordingFinding& g) { return g.family == f.family; });
      if (same == in_sentence.end()) in_sentence.push_back(std::move(f));
      else if (same->assertion != Assertion::asserted && f.assertion == Assertion::asserted) *same = std::move(f);
    };

    // The claims about propositions, from the analysis of the sentence's structure.
    std::vector<WordingFinding> from_claims;
    std::vector<bool> inferred;  // per claim finding: read from a person and what follows only
    if (!rules_.claims().empty()) {
      const bool affirmed = at + 1 < sentences.size() && answer_adopts(sentence, sentences[at + 1]);
      for (Claim claim : claims_in(visible, classes, cache, affirmed)) {
        if (claim.categorical && (options.states_propositions || names_a_proposition(text, sentence, options)))
          continue;
        const std::string family(claim_family(claim, options.mode));
        const ClaimWording* wording = family.empty() ? nullptr : rules_.claim_wording(family);
        if (!wording || !applies(wording->in_casework, wording->in_training)) continue;
        WordingFinding f = make_finding(rules_, text, sentence, visible,
                                        {claim.begin, claim.end, wording->id, wording->family, wording->severity,
                                         wording->explanation, wording->suggestion},
                                        options, cache);
        if (claim.negated && f.assertion == Assertion::asserted) mark_reported(f, Assertion::negated, wording->explanation);
        from_claims.push_back(std::move(f));
        inferred.push_back(claim.inferred);
      }
    }

    // The rules: patterns for the errors that are not claims about a proposition (another
    // match, numerical conversion, the defence fallacy, "consistent with") and a laboratory's own.
    std::vector<WordingFinding> from_rules;
    for (const WordingRule& rule : rules_.rules()) {
      if (!rule.enabled || !applies(rule.in_casework, rule.in_training)) continue;
      const std::optional<PatternMatch> match = find_first(rule.pattern, visible, classes, 0, &cache);
      if (!match) continue;
      const bool required = std::all_of(rule.requires_patterns.begin(), rule.requires_patterns.end(), [&](const TokenPattern& p) {
        return find_first(p, visible, classes, 0, &cache).has_value();
      });
      if (!required || any_match(rule.unless_patterns, visible, classes, cache)) continue;
      from_rules.push_back(make_finding(rules_, text, sentence, visible,
                                        {match->begin, match->end, rule.id, rule.family, rule.severity,
                                         rule.explanation, rule.suggestion},
                                        options, cache));
    }
    // A rule's error of another family on the same words explains them better than a claim
    // read from them ("only a 1 in 200 chance that he is the source", said of 200 people, is
    // the defence fallacy, not a source probability).
    // A claim inferred only from a person and the words after them yields to any rule's
    // finding in the sentence ("Mr Wrenfield must be the only man with this profile" is the
    // numerical conversion, not a claim that he did something).
    for (std::size_t c = 0; c < from_claims.size(); ++c) {
      WordingFinding& claim = from_claims[c];
      const bool explained = std::any_of(from_rules.begin(), from_rules.end(), [&](const WordingFinding& r) {
        return r.family != claim.family && r.assertion == Assertion::asserted &&
               (overlaps(r.span, claim.span) || inferred[c]);
      });
      if (!explained) keep(std::move(claim));
    }
    for (auto& f : from_rules) keep(std::move(f));
    if (model_ && options.learned_reading && !options.states_propositions && in_sentence.empty() &&
        reads_as_prose(text, sentence, visible, options) && !names_a_proposition(text, sentence, options))
      if (auto learned = learned_finding_in_exchange(*model_, rules_, text, sentences, at, visible, findings, options, cache))
        keep(std::move(*learned));
    std::stable_sort(in_sentence.begin(), in_sentence.end(),
                     [](const WordingFinding& a, const WordingFinding& b) { return a.span.byte_begin < b.span.byte_begin; });
    for (auto& f : in_sentence) findings.push_back(std::move(f));
  }
  return findings;
}

}  // namespace counterpoise::guard
