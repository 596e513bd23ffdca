#include "core/guard/wording_features.hpp"

#include <algorithm>

#include "core/guard/clause_structure.hpp"

namespace counterpoise::guard {

namespace {

// A number stands for its form, not its value: "1 in 200" and "one in a million" read alike.
std::string feature_word(const Token& t) {
  if (t.kind != TokenKind::number) return t.folded;
  switch (t.form) {
    case NumberForm::percent: return "#%";
    case NumberForm::frequency: return "#in";
    case NumberForm::plain: break;
  }
  return "#";
}

// The word classes whose presence is a feature: what the claim analysis reads a sentence by.
constexpr std::string_view kClassFeatures[] = {
    "chance-word",  "person",          "other-person",     "findings-noun",   "source-phrase",
    "activity-verb", "offence-noun",   "guilt-phrase",     "hyp-word",        "certainty-adverb",
    "posterior-cue", "match-noun",     "match-verb",       "profile-noun",    "people-noun",
    "population-count", "negator",     "dismissive",       "uniqueness",      "conclusion-verb",
    "report-verb",  "opinion-frame",   "certainty-adjective", "proof-verb",   "hypothetical",
    "random-selection", "findings-summary", "conclusion-tag"};

std::string_view frame_name(FrameTopic topic) {
  switch (topic) {
    case FrameTopic::proposition: return "frame:proposition";
    case FrameTopic::findings: return "frame:findings";
    case FrameTopic::prior: return "frame:prior";
    case FrameTopic::question_put: return "frame:question";
  }
  return "frame:proposition";
}

void add_structure(const std::vector<const Token*>& tokens, const ClassTable& classes, ClassMatchCache& cache,
                   std::vector<std::string>& features) {
  if (tokens.empty()) return;
  for (std::string_view name : kClassFeatures) {
    const WordClass* word_class = find_class(classes, name);
    if (!word_class) continue;
    for (std::size_t k = 0; k < tokens.size(); ++k)
      if (class_match_end(word_class, tokens, k, classes, cache)) {
        features.push_back("class:" + std::string(name));
        break;
      }
  }
  for (const ConditionalFrame& frame : analyse_clauses(tokens, classes, cache).frames)
    features.emplace_back(frame_name(frame.topic));
}

}  // namespace

std::vector<std::string> wording_features(const std::vector<const Token*>& tokens, CheckMode mode,
                                          const ClassTable& classes, ClassMatchCache* cache) {
  std::vector<std::string> words;
  words.reserve(tokens.size());
  for (const Token* t : tokens) words.push_back(feature_word(*t));
  std::vector<std::string> features;
  features.reserve(2 * words.size() + 2);
  features.push_back("mode:" + std::string(mode_name(mode)));
  if (!words.empty()) features.push_back("^" + words.front());
  if (std::any_of(tokens.begin(), tokens.end(), [](const Token* t) { return t->quoted; })) features.push_back("quoted:yes");
  for (std::size_t k = 0; k < words.size(); ++k) {
    features.push_back(words[k]);
    if (k + 1 < words.size()) features.push_back(words[k] + " " + words[k + 1]);
  }
  if (cache) {
    add_structure(tokens, classes, *cache, features);
  } else {
    ClassMatchCache own(tokens);
    add_structure(tokens, classes, own, features);
  }
  std::sort(features.begin(), features.end());
  features.erase(std::unique(features.begin(), features.end()), features.end());
  return features;
}

}  // namespace counterpoise::guard
