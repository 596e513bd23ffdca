#pragma once
// The wording rules as data: families of reasoning errors (with their published names), word
// classes, reporting cues and rules, read from JSON rule files (format
// "counterpoise-wording-rules", version 1; described in docs/reasoning-guard.md). A second file
// extends the first: rules with a known id replace it, new ids are added, classes are replaced
// or extended, families and cues are added.

#include <filesystem>
#include <map>
#include <string>
#include <string_view>
#include <vector>

#include "core/guard/token_pattern.hpp"

namespace counterpoise::guard {

enum class Severity { advice, warning, error };
enum class CheckMode { casework, training };

// "error", "warning", "advice"; and "casework", "training".
std::string_view severity_name(Severity s);
std::string_view mode_name(CheckMode m);

struct ErrorFamily {
  std::string id;              // "transposed-conditional"
  std::string name;            // "transposed conditional"
  std::string published_name;  // "prosecutor's fallacy" (may be empty)
  std::string source;          // "Thompson & Schumann 1987, Law and Human Behavior 11:167"
};

struct WordingRule {
  std::string id;
  std::string family;
  Severity severity = Severity::error;
  bool in_casework = true, in_training = true;  // the modes in which the rule applies
  TokenPattern pattern;
  std::vector<TokenPattern> requires_patterns;  // each must match somewhere in the sentence
  std::vector<TokenPattern> unless_patterns;    // none may match anywhere in the sentence
  std::string explanation;
  std::string suggestion;  // template with [Hp], [Hd], [N]
  bool enabled = true;
  std::string origin;  // the file the rule came from
};

// The wording of the findings the claim analysis makes (claim_analysis.hpp), one per family:
// the analysis finds the error, this says why and what to write instead.
struct ClaimWording {
  std::string id;  // "CL-SP"
  std::string family;
  Severity severity = Severity::error;
  bool in_casework = true, in_training = true;
  std::string explanation;
  std::string suggestion;  // template with [Hp], [Hd], [N]
  bool enabled = true;
  std::string origin;
};

struct ClassDefinition {
  std::vector<std::string> members;  // as written
};

class WordingRuleSet {
 public:
  // Adds the rules of one rule file's JSON text; `origin` names it in messages. Throws
  // validation::InvalidValue naming the rule (item "rule ID", or "rules[i]" before the id is
  // known; "class NAME"; "family ID"; "reporting_cues"; "refuting_cues"; "endorsing_cues") and the field for: text that is not
  // JSON, an unknown member, a missing or empty id, explanation or pattern, a duplicate id within
  // one file, an unknown family, a severity other than error/warning/advice, modes empty or
  // unknown, a suggestion with an unknown [placeholder], a bad pattern (see compile_pattern),
  // `enabled` not true/false, a class with no members or an invalid name, classes that refer to
  // each other in a cycle. Throws validation::UnsupportedFormat for a missing or different
  // "format" or "version". On a throw the set is left as it was.
  void add_json_text(std::string_view json_text, const std::string& origin);
  // As add_json_text for the file at `path`; throws validation::FileError when it cannot be read.
  void add_file(const std::filesystem::path& path);

  const std::vector<WordingRule>& rules() const noexcept { return rules_; }
  const std::vector<ClaimWording>& claims() const noexcept { return claims_; }
  // The enabled wording for claims of `family`, or nullptr when there is none (the analysis
  // then reports nothing for that family).
  const ClaimWording* claim_wording(std::string_view family) const;
  const std::map<std::string, ErrorFamily, std::less<>>& families() const noexcept { return families_; }
  const ClassTable& classes() const noexcept { return compiled_classes_; }
  const std::vector<TokenPattern>& reporting_cues() const noexcept { return cues_; }
  // Cues after a statement that refute it (", but that statement is wrong").
  const std::vector<TokenPattern>& refuting_cues() const noexcept { return trailing_cues_; }
  // Cues by which the writer adopts a wording they quote or report ("… is fine", "full marks",
  // "I agree with the conclusion that"): the quoted or reported claim is then the writer's own.
  const std::vector<TokenPattern>& endorsing_cues() const noexcept { return endorsing_cues_; }
  // The family with `id`; throws validation::InvalidValue when there is none.
  const ErrorFamily& family(std::string_view id) const;

 private:
  std::map<std::string, ErrorFamily, std::less<>> families_;
  std::map<std::string, ClassDefinition, std::less<>> classes_;
  ClassTable compiled_classes_;
  std::vector<TokenPattern> cues_;
  std::vector<TokenPattern> trailing_cues_;
  std::vector<TokenPattern> endorsing_cues_;
  std::vector<WordingRule> rules_;
  std::vector<ClaimWording> claims_;
};

// The rule file shipped with the program: guard/wording-rules.json in the shipped data folder
// (core/platform/shipped_data.hpp).
std::filesystem::path default_wording_rules_path();

}  // namespace counterpoise::guard
