#include "core/guard/alternative_coverage.hpp"

#include <algorithm>

#include "core/guard/text_tokens.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::guard {

namespace {

using Words = std::vector<std::string>;

// A token as compared here: a word case-folded, a number as written (numbers fold to one
// canonical form, and "Hd1" must not equal "Hd2"); punctuation is left out.
Words comparable_words(const std::vector<const Token*>& tokens) {
  Words words;
  for (const Token* t : tokens)
    if (t->kind != TokenKind::punctuation) words.push_back(t->kind == TokenKind::number ? t->text : t->folded);
  return words;
}

Words comparable_words(std::string_view text) {
  const std::vector<Token> tokens = tokenise(text);
  std::vector<const Token*> all;
  for (const Token& t : tokens) all.push_back(&t);
  return comparable_words(all);
}

bool contains(const Words& haystack, const Words& needle) {
  return !needle.empty() && std::search(haystack.begin(), haystack.end(), needle.begin(), needle.end()) != haystack.end();
}

bool contains_any(const Words& haystack, std::initializer_list<Words> needles) {
  return std::any_of(needles.begin(), needles.end(), [&](const Words& n) { return contains(haystack, n); });
}

// "likelihood ratio", "5 times more probable", "more likely if", "supports", "favours".
bool weighs_findings(const Words& w) {
  if (contains_any(w, {{"likelihood", "ratio"}, {"likelihood", "ratios"}, {"lr"}, {"lrs"}, {"times", "more"},
                       {"times", "less"}, {"times", "as"}}))
    return true;
  for (const char* comparative : {"more", "less"})
    for (const char* word : {"probable", "likely"})
      if (contains(w, {comparative, word})) return true;
  return std::any_of(w.begin(), w.end(), [](const std::string& word) {
    return word == "support" || word == "supports" || word == "supporting" || word == "favour" ||
           word == "favours" || word == "favouring" || word == "favor" || word == "favors" || word == "favoring";
  });
}

// "each alternative", "the alternatives", "the weighted set": the whole set.
bool names_the_set(const Words& w) {
  return contains_any(w, {{"alternatives"}, {"each", "alternative"}, {"every", "alternative"}, {"either", "alternative"},
                          {"both", "alternative"}, {"weighted", "set"}, {"compound"}, {"hds"}});
}

// "Hd", "the defence proposition", "the alternative": one alternative, without saying which.
std::string unnamed_alternative(const Words& w, const std::vector<Words>& ids) {
  const bool hd_is_an_id = std::find(ids.begin(), ids.end(), Words{"hd"}) != ids.end();
  if (!hd_is_an_id && contains(w, {"hd"})) return "Hd";
  for (const char* side : {"defence", "defense"})
    for (const char* what : {"proposition", "hypothesis", "alternative", "case"})
      if (contains(w, {side, what})) return std::string("the ") + side + " " + what;
  for (const char* what : {"alternative proposition", "alternative hypothesis", "alternative"}) {
    const Words phrase = comparable_words(what);
    if (contains(w, phrase)) return std::string("the ") + what;
  }
  return {};
}

std::string alternative_list(const std::vector<casefile::Alternative>& alternatives, const std::vector<std::size_t>& which) {
  std::vector<std::string> named;
  for (std::size_t k : which) named.push_back(alternatives[k].id + " (\"" + alternatives[k].text + "\")");
  return validation::list_in_words(named);
}

}  // namespace

AlternativeCoverage alternative_coverage(std::string_view text, const std::vector<casefile::Alternative>& alternatives) {
  std::vector<Words> ids, texts;
  for (const auto& a : alternatives) {
    ids.push_back(comparable_words(a.id));
    texts.push_back(comparable_words(a.text));
  }
  AlternativeCoverage coverage;
  for (const Sentence& sentence : split_sentences(text)) {
    const Words words = comparable_words(visible_tokens(sentence));
    // A weight against an alternative is often spread over sentences ("The likelihood ratio is
    // 10^6 against Hd1. It is 300 against Hd2."), so any sentence of the text may name one.
    bool names_one = false;
    for (std::size_t i = 0; i < alternatives.size(); ++i) {
      if (!contains(words, ids[i]) && !contains(words, texts[i])) continue;
      names_one = true;
      if (std::find(coverage.named.begin(), coverage.named.end(), i) == coverage.named.end()) coverage.named.push_back(i);
    }
    coverage.all = coverage.all || names_the_set(words);
    if (weighs_findings(words)) {
      coverage.weighs = true;
      // "against the alternative Hd2" says which; "against the alternative" alone does not.
      if (coverage.unnamed.empty() && !names_one) coverage.unnamed = unnamed_alternative(words, ids);
    }
  }
  std::sort(coverage.named.begin(), coverage.named.end());
  return coverage;
}

std::string alternative_coverage_problem(const AlternativeCoverage& coverage,
                                         const std::vector<casefile::Alternative>& alternatives) {
  if (alternatives.size() < 2 || !coverage.weighs || coverage.all) return {};
  std::vector<std::size_t> every(alternatives.size());
  for (std::size_t i = 0; i < every.size(); ++i) every[i] = i;
  const std::string weigh_each = "Give the likelihood ratio against each alternative by name, or against the weighted "
                                 "set of alternatives.";
  if (!coverage.unnamed.empty())
    return "it weighs the findings against \"" + coverage.unnamed + "\", but the case has " +
           std::to_string(alternatives.size()) + " alternatives: " + alternative_list(alternatives, every) +
           ". The reader cannot tell which is meant, and the likelihood ratio differs between them. " + weigh_each;
  if (coverage.named.empty())
    return "it weighs the findings without naming an alternative, but the case has " +
           std::to_string(alternatives.size()) + " alternatives: " + alternative_list(alternatives, every) +
           ". A likelihood ratio is a weight for one proposition against another. " + weigh_each;
  if (coverage.named.size() == alternatives.size()) return {};
  std::vector<std::size_t> left_out;
  for (std::size_t i : every)
    if (std::find(coverage.named.begin(), coverage.named.end(), i) == coverage.named.end()) left_out.push_back(i);
  return "it weighs the findings against " + alternative_list(alternatives, coverage.named) + " only; the case also has " +
         alternative_list(alternatives, left_out) + ", against which the likelihood ratio can be very different. " +
         weigh_each;
}

}  // namespace counterpoise::guard
