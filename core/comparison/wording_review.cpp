#include "core/comparison/wording_review.hpp"

#include "core/guard/case_rules.hpp"
#include "core/guard/proposition_options.hpp"
#include "core/guard/wording_checker.hpp"

namespace counterpoise::comparison {

namespace {

// The texts a value holds: a string, the strings of a list (assumptions), the string members of
// an object (the combination's reasons).
std::vector<std::string> texts_of(const std::optional<nlohmann::json>& value) {
  std::vector<std::string> texts;
  if (!value) return texts;
  if (value->is_string()) texts.push_back(value->get<std::string>());
  if (value->is_array() || value->is_object())
    for (const auto& element : *value)
      if (element.is_string()) texts.push_back(element.get<std::string>());
  return texts;
}

guard::CheckOptions options_for(const casefile::Case& value) {
  return guard::check_options(value.propositions, value.mode_or_default() == casefile::CaseMode::training
                                                      ? guard::CheckMode::training
                                                      : guard::CheckMode::casework);
}

std::vector<WordingFlag> flags_in(const guard::WordingChecker& checker, const guard::CheckOptions& options,
                                  const std::optional<nlohmann::json>& value) {
  std::vector<WordingFlag> flags;
  for (const auto& text : texts_of(value)) {
    std::vector<guard::WordingFinding> findings;
    try {
      findings = checker.check(text, options);
    } catch (const validation::Error&) {
      continue;  // text that is not UTF-8 cannot have been read from a valid case
    }
    for (const auto& f : findings)
      flags.push_back(WordingFlag{f.rule_id, f.family_name, std::string(guard::severity_name(f.severity)),
                                  std::string(guard::assertion_name(f.assertion)), f.matched_text, f.explanation});
  }
  return flags;
}

}  // namespace

WordingReviews review_wording(const CaseVersion& a, const CaseVersion& b, const std::vector<Difference>& differences) {
  WordingReviews reviews;
  reviews.by_difference.resize(differences.size());
  bool any = false;
  for (const auto& d : differences) any = any || d.is_wording();
  if (!any) return reviews;
  std::optional<guard::WordingChecker> checker_a, checker_b;
  try {
    checker_a.emplace(guard::checker_for_case(a.value));
    checker_b.emplace(guard::checker_for_case(b.value));
  } catch (const std::exception& error) {
    reviews.not_checked = error.what();
    return reviews;
  }
  const auto options_a = options_for(a.value), options_b = options_for(b.value);
  for (std::size_t k = 0; k < differences.size(); ++k) {
    if (!differences[k].is_wording()) continue;
    const std::string& field = differences[k].path.field;
    reviews.by_difference[k] =
        WordingReview{flags_in(*checker_a, guard::options_for_field(options_a, field), differences[k].old_value),
                      flags_in(*checker_b, guard::options_for_field(options_b, field), differences[k].new_value)};
  }
  return reviews;
}

std::size_t flagged_count(const std::vector<WordingFlag>& flags) {
  std::size_t n = 0;
  for (const auto& f : flags) n += f.severity != "advice";
  return n;
}

}  // namespace counterpoise::comparison
