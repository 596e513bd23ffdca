#pragma once
// The wording checker: finds statements that turn P(findings | proposition) into
// P(proposition | findings) and their relatives (the families and their sources are in the rule
// file and docs/reasoning-guard.md), sentence by sentence, using the rules of a WordingRuleSet.
// A statement the author reports or refutes ("it would be wrong to say ...", "... , but that
// statement is wrong", or inside quotation marks) is not the author's error: it is reported with
// severity advice only.

#include <filesystem>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include "core/guard/text_tokens.hpp"
#include "core/guard/wording_model.hpp"
#include "core/guard/wording_rules.hpp"

namespace counterpoise::guard {

struct CheckOptions {
  CheckMode mode = CheckMode::casework;
  std::string hp;  // text of the propositions for the suggested rewrite; "[Hp]"/"[Hd]" stay when empty
  std::string hd;
  // A case with several alternatives to Hp: their texts, in order. When given, [Hd] is filled
  // with every one of them ("… than if A, if B or if C") instead of `hd`, so a rewrite never
  // names one alternative as if it were the only one.
  std::vector<std::string> alternatives;

  // The text states propositions or what is assumed (a case's Hp, Hd, conditioning information
  // and assumptions): a trace attributed to its source there is supposed, not asserted.
  bool states_propositions = false;

  // Whether the learned reading (wording_model.hpp) may flag a sentence no rule flagged, when
  // the checker has a model.
  bool learned_reading = true;

  // The text is a title (a case's or an item's): a line of it without a final stop names
  // something, so the learned reading does not read it as it reads a headline or a message.
  bool title = false;
};

// `options` for a text of a case's field `field`: a "title" is a title (CheckOptions::title).
CheckOptions options_for_field(CheckOptions options, std::string_view field);

// Whether a flagged statement is the author's own or one the author reports.
enum class Assertion { asserted, negated, quoted };
std::string_view assertion_name(Assertion a);  // "asserted", "negated", "quoted"

struct WordingFinding {
  TextSpan span;      // the matched words, in bytes, code points and UTF-16 units
  TextSpan sentence;  // the sentence that holds them
  std::string rule_id;
  std::string family;       // family id, e.g. "transposed-conditional"
  std::string family_name;  // e.g. "transposed conditional (prosecutor's fallacy)"
  Severity severity = Severity::error;
  Assertion assertion = Assertion::asserted;
  std::string explanation;
  std::string suggestion;  // the rule's template with [Hp], [Hd] and [N] filled where known
  std::string matched_text;
};

class WordingChecker {
 public:
  explicit WordingChecker(WordingRuleSet rules);
  // The checker with the shipped rule file and the shipped learned reading; throws as
  // WordingRuleSet::add_file and WordingModel::read_file.
  static WordingChecker load_default();
  // The checker with the rules of `path` only (no learned reading); throws as WordingRuleSet::add_file.
  static WordingChecker from_file(const std::filesystem::path& path);
  // Adds or overrides rules from a lab's file; throws as WordingRuleSet::add_file, leaving the
  // checker unchanged.
  void add_rules_from_file(const std::filesystem::path& path);
  void add_rules_from_json_text(std::string_view json_text, const std::string& origin);

  // The findings in `text`, in text order, at most one per family and sentence (the first rule of
  // the family in file order that matches, an asserted finding before a reported one). Throws
  // validation::InvalidValue (item "text", field "utf8") when `text` is not well-formed UTF-8.
  std::vector<WordingFinding> check(std::string_view text, const CheckOptions& options = {}) const;
  // The same for `text` already split (split_sentences(text)); spans are in `text`.
  std::vector<WordingFinding> check(std::string_view text, const std::vector<Sentence>& sentences,
                                    const CheckOptions& options) const;

  const WordingRuleSet& rules() const noexcept { return rules_; }

  // The learned reading that flags, as a warning, a sentence no rule flagged (nullptr: none).
  void set_model(std::shared_ptr<const WordingModel> model) { model_ = std::move(model); }
  const WordingModel* model() const noexcept { return model_.get(); }

 private:
  WordingRuleSet rules_;
  std::shared_ptr<const WordingModel> model_;
};

// The rule id of the learned reading's finding of `family`: "LW-" and the initials of the
// family's words ("transposed-conditional" → "LW-TC").
std::string learned_rule_id(std::string_view family);

// `suggestion` with [Hp] and [Hd] replaced by the options' propositions (when given; where a placeholder
// continues a sentence the proposition loses its final stop and a capital that only began it:
// "if the stain came from Mr Okafor") and [N] by
// `n_text` (when not empty).
std::string fill_suggestion(std::string_view suggestion, const CheckOptions& options, std::string_view n_text);

// The text an LR-form rewrite should use for a number token: the denominator of "1 in N", or a
// plain number as written; empty when the token does not give the LR directly (percentages,
// decimals below 1, frequencies with another numerator).
std::string likelihood_ratio_text(const Token& number);

// True when at least one finding is an error or a warning (advice does not count).
bool has_flagged(const std::vector<WordingFinding>& findings);

}  // namespace counterpoise::guard
