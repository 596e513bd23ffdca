#include "core/guard/case_guard.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>
#include <set>
#include <unordered_map>
#include <utility>

#include "core/guard/alternative_coverage.hpp"
#include "core/guard/proposition_options.hpp"
#include "core/guard/text_tokens.hpp"
#include "core/models/assigned/assigned_model.hpp"
#include "core/models/network/network_model.hpp"
#include "core/numbers/number_text.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::guard {

namespace {

using casefile::Case;
using casefile::Item;

// A sum of 1 within this absolute tolerance counts as "sums to 1": far below any difference an
// expert would assign on purpose, far above the rounding of two doubles near 1.
constexpr double kSumTolerance = 1e-9;
// A number in a text equals an item's value within this relative tolerance (the number as
// written and the value as read are the same decimal, apart from binary rounding).
constexpr double kValueTolerance = 1e-9;

CaseWarning make(std::string item, std::string field, std::string_view rule, Severity severity, std::string message) {
  return {std::move(item), std::move(field), std::string(rule), severity, std::move(message)};
}

std::string in_quotes(std::string_view text) { return "\"" + std::string(text) + "\""; }

std::vector<std::string> word_list(std::string_view text) {
  std::vector<std::string> words;
  for (const Token& t : tokenise(text)) {
    if (t.kind == TokenKind::word) words.push_back(t.folded);
    else if (t.kind == TokenKind::number) words.push_back(fold_text(t.text));
  }
  return words;
}

bool contains_sequence(const std::vector<std::string>& haystack, const std::vector<std::string>& needle) {
  return !needle.empty() && std::search(haystack.begin(), haystack.end(), needle.begin(), needle.end()) != haystack.end();
}

// Whether `needle` occurs in `haystack` in order, not necessarily contiguously.
bool contains_in_order(const std::vector<std::string>& haystack, const std::vector<std::string>& needle) {
  std::size_t next = 0;
  for (const auto& word : haystack)
    if (next < needle.size() && word == needle[next]) ++next;
  return !needle.empty() && next == needle.size();
}

bool is_negation(const std::string& word) {
  static const std::set<std::string, std::less<>> words = {"not", "never", "no", "nobody", "none", "neither", "nor", "without", "cannot"};
  return words.count(word) > 0 || (word.size() > 3 && word.ends_with("n't"));
}

bool has_word(const std::vector<std::string>& words, std::string_view word) {
  return std::find(words.begin(), words.end(), word) != words.end();
}

// The first word of possibility ("may", "might", "possibly", ...) that makes a proposition true
// whatever happened; "could" counts unless negated ("could not have been there" is definite).
std::optional<std::string> possibility_word(const std::vector<std::string>& words) {
  static const std::set<std::string, std::less<>> always = {"may", "might", "possibly", "perhaps", "maybe", "conceivably"};
  for (std::size_t i = 0; i < words.size(); ++i) {
    if (always.count(words[i])) return words[i];
    if (words[i] == "could" && !(i + 1 < words.size() && is_negation(words[i + 1]))) return words[i];
  }
  return std::nullopt;
}

// The wording checker's flagged findings on one text of the case, as warnings.
struct TextChecker {
  const WordingChecker* checker;  // null: the wording is not checked (check_case_setup)
  CheckOptions options;

  // The findings in the text of `field` (a title is read as one: options_for_field).
  std::vector<WordingFinding> flagged(std::string_view text, std::string_view field) const {
    std::vector<WordingFinding> out;
    if (!checker) return out;
    for (auto& f : checker->check(text, options_for_field(options, field)))
      if (f.severity != Severity::advice) out.push_back(std::move(f));
    return out;
  }

  static CaseWarning to_warning(const std::string& item, const std::string& field, const WordingFinding& f) {
    std::string message = f.family_name + ": " + in_quotes(f.matched_text) + ". " + f.explanation;
    if (!f.suggestion.empty()) message += " Instead: " + f.suggestion;
    return make(item, field, "wording:" + f.rule_id, f.severity, std::move(message));
  }

  // The case's alternatives, when it has a list of them (propositions.alternatives).
  const std::vector<casefile::Alternative>* alternatives = nullptr;

  // A text that weighs the findings against one alternative of several (alternative_coverage.hpp);
  // the texts that state the propositions are exempt.
  void check_alternatives(const std::string& item, const std::string& field, const std::string& text,
                          std::vector<CaseWarning>& out) const {
    if (!alternatives || options.states_propositions) return;
    const std::string problem = alternative_coverage_problem(alternative_coverage(text, *alternatives), *alternatives);
    if (!problem.empty())
      out.push_back(make(item, field, case_rules::single_alternative_wording, Severity::warning, problem));
  }

  void check(const std::string& item, const std::string& field, const std::optional<std::string>& text,
             std::vector<CaseWarning>& out) const {
    if (!text) return;
    for (const auto& f : flagged(*text, field)) out.push_back(to_warning(item, field, f));
    check_alternatives(item, field, *text, out);
  }
};

// A value of an item that its text might state, with the name it has in messages.
struct NamedValue {
  double value;
  std::string name;
};

void add_assignment_values(const probability::Assignment& a, const std::string& name, std::vector<NamedValue>& out) {
  out.push_back({probability::mean(a), name});
  if (const auto* point = std::get_if<probability::PointValue>(&a)) out.push_back({point->p, name});
  if (const auto* interval = std::get_if<probability::IntervalValue>(&a)) {
    out.push_back({interval->low, "the lower end of " + name});
    out.push_back({interval->high, "the upper end of " + name});
  }
}

// The values of an item a text could misdescribe: the assigned probabilities (mean, point and
// interval ends) or the model's marginal probabilities, the likelihood ratio and its inverse.
std::vector<NamedValue> item_values(const Item& item) {
  std::vector<NamedValue> values;
  if (!item.model) return values;
  if (const auto* assigned = dynamic_cast<const models::AssignedModel*>(item.model.get())) {
    add_assignment_values(assigned->p_given_hp(), "P(E|Hp)", values);
    add_assignment_values(assigned->p_given_hd(), "P(E|Hd)", values);
  }
  const models::PointResult point = item.model->evaluate();
  if (point.log10_p_given_hp) values.push_back({std::pow(10.0, *point.log10_p_given_hp), "P(E|Hp)"});
  if (point.log10_p_given_hd) values.push_back({std::pow(10.0, *point.log10_p_given_hd), "P(E|Hd)"});
  if (point.lr.is_finite() && !point.lr.is_zero()) {
    values.push_back({point.lr.value(), "the likelihood ratio"});
    values.push_back({1.0 / point.lr.value(), "1 / the likelihood ratio"});
  }
  return values;
}

double number_value(const Token& t) { return t.form == NumberForm::percent ? t.value / 100.0 : t.value; }

bool same_value(double a, double b) {
  return std::isfinite(a) && std::isfinite(b) && a > 0.0 && std::fabs(a - b) <= kValueTolerance * std::max(std::fabs(a), std::fabs(b));
}

void check_item_texts(const Item& item, const TextChecker& texts, std::vector<CaseWarning>& out) {
  const std::pair<const char*, const std::optional<std::string>*> fields[] = {
      {"title", &item.title}, {"description", &item.description}, {"notes", &item.notes}};
  std::optional<std::vector<NamedValue>> values;  // computed only when a text is flagged
  for (const auto& [field, text] : fields) {
    if (!*text) continue;
    for (const auto& f : texts.flagged(**text, field)) {
      out.push_back(TextChecker::to_warning(item.id, field, f));
      if (!values) values = item_values(item);
      const std::string_view sentence =
          std::string_view(**text).substr(f.sentence.byte_begin, f.sentence.byte_end - f.sentence.byte_begin);
      for (const Token& t : tokenise(sentence)) {
        if (t.kind != TokenKind::number) continue;
        const auto match = std::find_if(values->begin(), values->end(),
                                        [&](const NamedValue& v) { return same_value(number_value(t), v.value); });
        if (match == values->end()) continue;
        out.push_back(make(item.id, field, case_rules::value_as_proposition_probability, Severity::error,
                           in_quotes(t.text) + " is " + match->name +
                               " of this item, but the text states it as the probability of a proposition. " +
                               match->name + " is a probability of the findings given a proposition, not of a "
                               "proposition given the findings."));
        break;
      }
    }
    texts.check_alternatives(item.id, field, **text, out);
  }
  if (item.combination) {
    texts.check(item.id, "independence", item.combination->independence, out);
    texts.check(item.id, "exclusion_reason", item.combination->exclusion_reason, out);
  }
}

void check_complementary(const Item& item, std::vector<CaseWarning>& out) {
  const auto* assigned = dynamic_cast<const models::AssignedModel*>(item.model.get());
  if (!assigned) return;
  const double hp = probability::mean(assigned->p_given_hp());
  const double hd = probability::mean(assigned->p_given_hd());
  // With one probability 0 (or 1) the other is commonly 1 (or 0): the sum says nothing then.
  if (hp <= 0.0 || hd <= 0.0 || hp >= 1.0 || hd >= 1.0) return;
  if (std::fabs(hp + hd - 1.0) > kSumTolerance) return;
  out.push_back(make(item.id, "p_given_hp", case_rules::complementary_probabilities, Severity::warning,
                     "P(E|Hp) = " + numbers::exact_text(hp) + " and P(E|Hd) = " + numbers::exact_text(hd) +
                         " sum to 1, as if one were the complement of the other. They are probabilities of the "
                         "same findings under two different propositions and need not sum to 1: check that "
                         "P(E|Hd) was assigned on its own."));
}

void check_level(const Item& item, casefile::PropositionLevel case_level, std::vector<CaseWarning>& out) {
  const auto level = item_level(item);
  if (!level || *level >= case_level) return;
  const std::string item_level_name(casefile::level_name(*level));
  const std::string case_level_name(casefile::level_name(case_level));
  out.push_back(make(item.id, "level", case_rules::lower_level_item, Severity::warning,
                     "item " + item.id + " (" + item.model_name + ") addresses " + item_level_name +
                         " propositions, but the case's propositions are at " + case_level_name +
                         " level: its likelihood ratio does not answer the " + case_level_name +
                         " question. Evaluate the findings at " + case_level_name +
                         " level (for example with a transfer or network model) or leave the item out of the "
                         "combination."));
}

// Items that share one compared field, and which fields: one warning each.
struct SameFindingsGroup {
  std::vector<std::size_t> members;  // positions in the case, ascending
  std::vector<std::string> reasons;  // "the same description", ...
};

// The ids of `members` (case positions, ascending), runs of three or more consecutive items
// written as a range: "A and B", "E1-E3000" (with an en dash), "E1, E4-E9 and E12".
std::string member_list(const Case& value, const std::vector<std::size_t>& members) {
  std::vector<std::string> parts;
  for (std::size_t start = 0; start < members.size();) {
    std::size_t end = start;
    while (end + 1 < members.size() && members[end + 1] == members[end] + 1) ++end;
    if (end - start >= 2) {
      parts.push_back(value.items[members[start]].id + "\u2013" + value.items[members[end]].id);
    } else {
      for (std::size_t i = start; i <= end; ++i) parts.push_back(value.items[members[i]].id);
    }
    start = end + 1;
  }
  return validation::list_in_words(parts);
}

// Items that appear to evaluate the same findings. Each compared field (the normalised
// description, the normalised source data, the model with its inputs) is hashed, so the check
// is linear in the number of items rather than comparing every pair; items sharing a field form
// one group, and groups with the same members are reported once with every shared field.
void check_same_findings(const Case& value, std::vector<CaseWarning>& out) {
  const std::vector<std::string> reason_names = {"the same description", "the same source data", "identical model inputs"};
  std::vector<std::unordered_map<std::string, std::vector<std::size_t>>> by_field(reason_names.size());
  for (std::size_t i = 0; i < value.items.size(); ++i) {
    const Item& item = value.items[i];
    if (!item.included()) continue;
    if (item.description) {
      std::string key = normalised_words(*item.description);
      if (!key.empty()) by_field[0][std::move(key)].push_back(i);
    }
    if (item.source_data) {
      std::string key = normalised_words(*item.source_data);
      if (!key.empty()) by_field[1][std::move(key)].push_back(i);
    }
    if (item.model) by_field[2][item.model_name + '\n' + item.model->to_json().dump()].push_back(i);
  }
  std::map<std::vector<std::size_t>, std::vector<std::string>> groups;  // members -> reasons
  for (std::size_t field = 0; field < by_field.size(); ++field)
    for (auto& [key, members] : by_field[field])
      if (members.size() > 1) groups[members].push_back(reason_names[field]);
  std::vector<SameFindingsGroup> ordered;
  for (auto& [members, reasons] : groups) ordered.push_back({members, std::move(reasons)});
  // In case order of the last member (the item the warning is attached to), then the first.
  std::sort(ordered.begin(), ordered.end(), [](const SameFindingsGroup& a, const SameFindingsGroup& b) {
    return std::pair(a.members.back(), a.members.front()) < std::pair(b.members.back(), b.members.front());
  });
  for (const auto& group : ordered) {
    const bool pair = group.members.size() == 2;
    std::string message = "items " + member_list(value, group.members);
    if (!pair) message += " (" + std::to_string(group.members.size()) + " items)";
    message += " have " + validation::list_in_words(group.reasons) +
               ": they appear to evaluate the same findings, and combining " + (pair ? "both" : "them") +
               " counts them " + (pair ? "twice" : std::to_string(group.members.size()) + " times") + ". " +
               (pair ? "Leave one out of the combination" : "Leave all but one out of the combination") +
               ", or state why they are different findings.";
    out.push_back(make(value.items[group.members.back()].id, "", case_rules::same_findings, Severity::warning,
                       std::move(message)));
  }
}

void check_network_cover(const Case& value, std::vector<CaseWarning>& out) {
  for (const Item& network_item : value.items) {
    if (!network_item.included()) continue;
    const auto* network = dynamic_cast<const models::network::NetworkModel*>(network_item.model.get());
    if (!network) continue;
    for (const std::string& id : network->covers()) {
      const Item* covered = value.find_item(id);
      if (!covered || !covered->included()) continue;
      out.push_back(make(id, "combination", case_rules::covered_by_network, Severity::warning,
                         "item " + id + " is included in the combination, but the network of item " +
                             network_item.id + " already evaluates its findings: combining both counts them "
                             "twice. Leave " + id + " out of the combination."));
    }
  }
}

void check_propositions(const casefile::Propositions& p, std::vector<CaseWarning>& out) {
  const auto hp = word_list(p.hp);
  const auto hd = word_list(p.hd);
  if (hp.empty() || hd.empty()) return;  // a missing proposition is a reader error
  if (hp == hd) {
    out.push_back(make("propositions", "hd", case_rules::propositions_identical, Severity::warning,
                       "Hp and Hd have the same wording: the findings cannot discriminate between a proposition "
                       "and itself. State the alternative the defence puts forward (or the one the scientist "
                       "must assume)."));
    return;
  }
  const auto overlap = [&](const std::vector<std::string>& whole, const std::vector<std::string>& part,
                           const char* whole_name, const char* part_name) {
    const bool alternative = has_word(whole, "or") || has_word(whole, "either");
    const bool negated = std::any_of(whole.begin(), whole.end(), is_negation);
    // The other's words as they stand: with "or" one alternative is the other proposition, and
    // without a negation the one implies the other. "It is not the case that [Hp]" is the plain
    // negation. The other's words in order but apart ("Mr X or another person broke it"): only
    // with "or" and no negation ("not Mr X or his brother" excludes him).
    if (contains_sequence(whole, part)) {
      if (!alternative && negated) return;
    } else if (!(contains_in_order(whole, part) && alternative && !negated)) {
      return;
    }
    out.push_back(make("propositions", whole_name, case_rules::propositions_overlap, Severity::warning,
                       std::string(whole_name == std::string("hd") ? "Hd" : "Hp") + " contains the wording of " +
                           (part_name == std::string("hp") ? "Hp" : "Hd") +
                           (alternative ? " as one of its alternatives" : " without negating it") +
                           ", so both propositions can be true at once: they are not mutually exclusive. Word the "
                           "alternative so that it excludes the other proposition."));
  };
  overlap(hd, hp, "hd", "hp");
  overlap(hp, hd, "hp", "hd");
  for (const auto& [words, name] : {std::pair{&hp, "hp"}, std::pair{&hd, "hd"}}) {
    if (const auto word = possibility_word(*words)) {
      const std::string label = std::string(name) == "hp" ? "Hp" : "Hd";
      out.push_back(make("propositions", name, case_rules::proposition_possibility, Severity::warning,
                         label + " says " + in_quotes(*word) + ": a statement of what is possible stays true "
                             "whichever proposition is true, so the two are not mutually exclusive. State what "
                             "happened (\"... did ...\" or \"... did not ...\")."));
    }
  }
}

bool priors_set(const casefile::PriorSettings& priors) {
  return !priors.odds.empty() || priors.range.has_value() || !priors.one_of_n.empty();
}

}  // namespace

std::string normalised_words(std::string_view text) {
  std::string out;
  for (const std::string& w : word_list(text)) {
    if (!out.empty()) out += ' ';
    out += w;
  }
  return out;
}

std::optional<casefile::PropositionLevel> item_level(const Item& item) {
  if (item.model_name == "dna-single-source" || item.model_name == "dna-mixture")
    return casefile::PropositionLevel::sub_source;
  if (item.model_name == "transfer") return casefile::PropositionLevel::activity;
  return item.level;
}

namespace {

std::vector<CaseWarning> check_case_with(const Case& value, const WordingChecker* checker) {
  std::vector<CaseWarning> out;
  TextChecker texts{checker, check_options(value.propositions, value.mode_or_default() == casefile::CaseMode::training
                                                                   ? CheckMode::training
                                                                   : CheckMode::casework)};
  if (value.propositions.has_alternatives()) texts.alternatives = &value.propositions.alternatives;

  texts.check("case", "title", value.details.title, out);
  texts.check("case", "purpose", value.details.purpose, out);
  TextChecker supposed = texts;
  supposed.options.states_propositions = true;
  supposed.check("propositions", "hp", value.propositions.hp, out);
  supposed.check("propositions", "hd", value.propositions.hd, out);
  for (std::size_t i = 0; i < value.propositions.alternatives.size(); ++i)
    supposed.check("propositions", "alternatives[" + std::to_string(i) + "].text",
                   value.propositions.alternatives[i].text, out);
  supposed.check("propositions", "conditioning_information", value.propositions.conditioning_information, out);
  for (std::size_t i = 0; i < value.propositions.assumptions.size(); ++i)
    supposed.check("propositions", "assumptions[" + std::to_string(i) + "]", value.propositions.assumptions[i], out);
  check_propositions(value.propositions, out);

  for (const Item& item : value.items) {
    check_item_texts(item, texts, out);
    check_complementary(item, out);
    if (item.included()) check_level(item, value.propositions.level, out);
  }
  check_same_findings(value, out);
  check_network_cover(value, out);

  if (value.mode_or_default() == casefile::CaseMode::casework && value.priors && priors_set(*value.priors))
    out.push_back(make("priors", "", case_rules::prior_in_casework, Severity::warning,
                       "prior odds are set in a casework case. The prior odds are the fact-finder's, not the "
                       "scientist's: leave them out and let the output show its default illustration, or mark "
                       "the case as training."));
  return out;
}

}  // namespace

std::vector<CaseWarning> check_case(const Case& value, const WordingChecker& checker) {
  return check_case_with(value, &checker);
}

std::vector<CaseWarning> check_case_setup(const Case& value) { return check_case_with(value, nullptr); }

}  // namespace counterpoise::guard
