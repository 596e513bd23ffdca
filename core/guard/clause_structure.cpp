#include "core/guard/clause_structure.hpp"

#include <algorithm>

namespace counterpoise::guard {

namespace {

bool is_segment_mark(const Token& t) {
  return t.kind == TokenKind::punctuation &&
         (t.folded == ";" || t.folded == ":" || t.folded == "(" || t.folded == ")" || t.folded == "-" ||
          t.folded == "[" || t.folded == "]");
}

bool is_comma(const Token& t) { return t.kind == TokenKind::punctuation && t.folded == ","; }

// "were he the source", "had the stain come from": an auxiliary that opens a clause and is
// followed by its subject, a conditional without "if".
bool inverted_condition_at(const std::vector<const Token*>& tokens, std::size_t i, std::size_t segment_start) {
  const std::string& w = tokens[i]->folded;
  if (w != "were" && w != "had" && w != "should") return false;
  const bool clause_start = i == segment_start || is_comma(*tokens[i - 1]);
  if (!clause_start || i + 1 >= tokens.size()) return false;
  const Token& next = *tokens[i + 1];
  if (next.kind != TokenKind::word) return false;
  static const std::vector<std::string> subjects = {"he", "she", "they", "it", "the", "this", "that", "mr", "mrs",
                                                    "ms", "dr", "someone", "somebody", "another", "anyone", "a",
                                                    "his", "her", "their", "hp", "hd"};
  return next.capitalised || std::find(subjects.begin(), subjects.end(), next.folded) != subjects.end();
}

// "Were the jury to ask me, I would tell them ...", "if asked, ...": a question put to the
// witness, not a supposition about the case.
bool is_asking(const Token& t) {
  static const std::vector<std::string> words = {"ask", "asks", "asked", "asking"};
  return std::find(words.begin(), words.end(), t.folded) != words.end();
}

FrameTopic topic_of(const std::vector<const Token*>& tokens, std::size_t begin, std::size_t end,
                    const ClassTable& classes, ClassMatchCache& cache) {
  const WordClass* posterior = find_class(classes, "posterior-cue");
  const WordClass* findings_words[] = {find_class(classes, "findings-noun"), find_class(classes, "observe-word"),
                                       find_class(classes, "findings-summary")};
  const WordClass* population = find_class(classes, "population-count");
  bool findings = false;
  for (std::size_t k = begin; k < end; ++k)
    if (is_asking(*tokens[k])) return FrameTopic::question_put;
  for (std::size_t k = begin; k < end; ++k) {
    if (class_match_end(posterior, tokens, k, classes, cache)) return FrameTopic::prior;
    // "If 20 men in the valley have this profile, ...": a head count, not a proposition.
    if (class_match_end(population, tokens, k, classes, cache)) findings = true;
    // "given these findings", "on the basis of the results": the findings are the condition
    // when they come first, before any other noun phrase of the frame.
    if (k < begin + 5)
      for (const WordClass* c : findings_words) findings = findings || class_match_end(c, tokens, k, classes, cache);
  }
  return findings ? FrameTopic::findings : FrameTopic::proposition;
}

// "given the footwear marks", "given the cell-site and handset traces": a frame of "given"
// whose words hold no clause names what was found, however the findings are worded; a
// proposition needs a clause ("given that he was there", "given he left it") or a name of one.
bool names_a_thing(const std::vector<const Token*>& tokens, std::size_t opener, std::size_t begin, std::size_t end,
                   const ClassTable& classes, ClassMatchCache& cache) {
  if (tokens[opener]->folded != "given" || begin >= end) return false;
  const WordClass* clause_words[] = {find_class(classes, "be"), find_class(classes, "hyp-word"),
                                     find_class(classes, "activity-verb"), find_class(classes, "source-phrase"),
                                     find_class(classes, "other-person")};
  static const std::vector<std::string> verbs = {"had", "has", "have", "did", "does", "do", "came", "come", "would",
                                                 "could", "might", "will", "that", "proposition", "hypothesis"};
  for (std::size_t k = begin; k < end; ++k) {
    if (std::find(verbs.begin(), verbs.end(), tokens[k]->folded) != verbs.end()) return false;
    for (const WordClass* c : clause_words)
      if (class_match_end(c, tokens, k, classes, cache)) return false;
  }
  return true;
}

}  // namespace

std::optional<std::size_t> class_match_end(const WordClass* word_class, const std::vector<const Token*>& tokens,
                                           std::size_t pos, const ClassTable& classes, ClassMatchCache& cache) {
  if (!word_class || pos >= tokens.size() || !may_start_with(word_class->first_words, *tokens[pos]) ||
      !cache.class_may_occur(word_class))
    return std::nullopt;
  const auto& ends = cache.ends(word_class, pos, [&] {
    std::vector<std::size_t> out;
    for (const TokenPattern& member : word_class->members)
      match_at(member, tokens, pos, classes, [&](std::size_t end) {
        if (std::find(out.begin(), out.end(), end) == out.end()) out.push_back(end);
        return false;
      }, &cache);
    return out;
  });
  if (ends.empty()) return std::nullopt;
  return *std::max_element(ends.begin(), ends.end());
}

std::optional<std::size_t> class_match_end(std::string_view name, const std::vector<const Token*>& tokens,
                                           std::size_t pos, const ClassTable& classes, ClassMatchCache& cache) {
  const auto it = classes.find(name);
  return class_match_end(it == classes.end() ? nullptr : &it->second, tokens, pos, classes, cache);
}

const WordClass* find_class(const ClassTable& classes, std::string_view name) {
  const auto it = classes.find(name);
  return it == classes.end() ? nullptr : &it->second;
}

ClauseStructure analyse_clauses(const std::vector<const Token*>& tokens, const ClassTable& classes,
                                ClassMatchCache& cache) {
  const WordClass* clause_break = find_class(classes, "clause-break");
  const WordClass* condition_opener = find_class(classes, "condition-opener");
  ClauseStructure s;
  s.segment_of.assign(tokens.size(), 0);
  s.frame_of.assign(tokens.size(), -1);
  std::size_t segment = 0, start = 0;
  s.segment_begin.push_back(0);
  for (std::size_t i = 0; i < tokens.size(); ++i) {
    // A colon between numbers is part of a ratio or a time ("700:1", "02:00"), not a break.
    const bool in_number = tokens[i]->folded == ":" && i > 0 && i + 1 < tokens.size() &&
                           tokens[i - 1]->kind == TokenKind::number && tokens[i + 1]->kind == TokenKind::number;
    // A hyphen inside a word ("near-certain", "cell-site") joins it; one between spaces is a dash.
    const bool joining_hyphen = tokens[i]->folded == "-" && i > 0 && i + 1 < tokens.size() &&
                                tokens[i - 1]->span.byte_end == tokens[i]->span.byte_begin &&
                                tokens[i]->span.byte_end == tokens[i + 1]->span.byte_begin;
    const bool mark = is_segment_mark(*tokens[i]) && !in_number && !joining_hyphen;
    // "anybody but Mr Adeyemo", "nothing but chance": "but" meaning "except" joins a phrase.
    static const std::vector<std::string> except_before = {"anybody", "anyone", "nobody", "someone", "somebody",
                                                           "nothing", "all", "none", "everyone", "everybody"};
    const bool except = tokens[i]->folded == "but" && i > 0 &&
                        std::find(except_before.begin(), except_before.end(), tokens[i - 1]->folded) != except_before.end();
    const bool conjunction =
        i > start && !except && class_match_end(clause_break, tokens, i, classes, cache).has_value();
    if ((mark || conjunction) && i > start) {
      s.segment_end.push_back(i);
      ++segment;
      start = i;
      s.segment_begin.push_back(i);
    }
    s.segment_of[i] = segment;
  }
  s.segment_end.push_back(tokens.size());

  for (std::size_t i = 0; i < tokens.size(); ++i) {
    if (s.frame_of[i] >= 0) continue;
    const std::size_t seg = s.segment_of[i];
    std::optional<std::size_t> opener_end = class_match_end(condition_opener, tokens, i, classes, cache);
    if (!opener_end && inverted_condition_at(tokens, i, s.segment_begin[seg])) opener_end = i + 1;
    if (!opener_end) continue;
    std::size_t end = *opener_end;
    while (end < s.segment_end[seg] && !is_comma(*tokens[end])) ++end;
    const FrameTopic topic = names_a_thing(tokens, i, *opener_end, end, classes, cache)
                                 ? FrameTopic::findings
                                 : topic_of(tokens, *opener_end, end, classes, cache);
    ConditionalFrame frame{i, end, seg, topic};
    for (std::size_t k = i; k < end; ++k) s.frame_of[k] = static_cast<int>(s.frames.size());
    s.frames.push_back(frame);
  }
  return s;
}

}  // namespace counterpoise::guard
