#pragma once
// Token patterns for the wording rules: a small, data-driven language matched over the
// case-folded tokens of one sentence (common practice in rule-based text checkers; no regular
// expressions over raw text). Syntax, element by element, separated by spaces:
//   word            a literal token, compared case-folded ("probability", "'s", ",")
//   a|b|{c}         any one of the alternatives
//   a+b             (as an alternative) the words a then b: "there+being|finding"
//   {class}         a word class defined in the rule file, or a built-in class:
//                   {number} any number, {frequency} "1 in N" forms, {percent}, {word} any word,
//                   {any} any token, {name} a word written with a capital letter,
//                   {count} a whole number of 2 or more written plainly (a head count: "200")
//   x?              the element is optional
//   ...N  ...M-N    a gap of M (default 0) to N tokens, N at most 20
//   ...N!a|{c}      a gap that must not contain any of the alternatives
// A pattern must not begin or end with a gap and must require at least one token.
// Quotation marks are invisible to patterns (tokens keep their `quoted` flag instead).

#include <cstddef>
#include <functional>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/guard/text_tokens.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

struct TokenPattern;

struct PatternAlternative {
  enum class Kind { literal, word_class, number, frequency, percent, any_word, any_token, name, count, phrase };
  Kind kind = Kind::literal;
  std::string text;  // the folded literal or the class name
  std::shared_ptr<const TokenPattern> phrase;  // for "a+b": the words in sequence
};

struct PatternElement {
  std::vector<PatternAlternative> alternatives;  // empty for a gap
  bool optional = false;
  bool gap = false;
  int gap_min = 0, gap_max = 0;
  std::vector<PatternAlternative> gap_forbidden;
};

struct TokenPattern {
  std::string source;  // as written in the rule file
  std::vector<PatternElement> elements;
};

// Names of the classes built into the matcher.
bool is_builtin_class(std::string_view name);

// The compiled pattern. `known_class` says whether a class name exists. Throws
// validation::InvalidValue at `where` for: an empty pattern, an unknown class, an unclosed or
// empty {}, an empty alternative, a bad gap ("...", "...5-2", more than 12), "?" on a gap,
// a gap at the start or end, or a pattern whose every element is optional.
TokenPattern compile_pattern(std::string_view source, const std::function<bool(std::string_view)>& known_class,
                             const validation::Location& where);

// Class name → its alternative patterns (each a phrase, possibly using other classes).
using ClassTable = std::map<std::string, std::vector<TokenPattern>, std::less<>>;

// One match: tokens [begin, end) of the sequence.
struct PatternMatch {
  std::size_t begin = 0, end = 0;
};

// Calls `on_match` with the end of every way `pattern` matches starting at token `start`;
// stops early when on_match returns true. Returns whether it was stopped.
bool match_at(const TokenPattern& pattern, const std::vector<const Token*>& tokens, std::size_t start,
              const ClassTable& classes, const std::function<bool(std::size_t end)>& on_match);

// The leftmost match (longest at that start) at or after token `from`, if any.
std::optional<PatternMatch> find_first(const TokenPattern& pattern, const std::vector<const Token*>& tokens,
                                       const ClassTable& classes, std::size_t from = 0);

}  // namespace counterpoise::guard
