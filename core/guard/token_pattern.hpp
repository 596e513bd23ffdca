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
#include <unordered_map>
#include <unordered_set>
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

// The folded words a pattern or class can start with (numbers as "#"), so that a token that
// starts none is passed over without trying the pattern; nullopt when it can start with any
// word ({word}, {name}, {any}).
using FirstWords = std::optional<std::unordered_set<std::string>>;

struct TokenPattern {
  std::string source;  // as written in the rule file
  std::vector<PatternElement> elements;
  FirstWords first_words;  // filled by index_first_words; nullopt (try everywhere) until then
};

// Names of the classes built into the matcher.
bool is_builtin_class(std::string_view name);

// The compiled pattern. `known_class` says whether a class name exists. Throws
// validation::InvalidValue at `where` for: an empty pattern, an unknown class, an unclosed or
// empty {}, an empty alternative, a bad gap ("...", "...5-2", more than 12), "?" on a gap,
// a gap at the start or end, or a pattern whose every element is optional.
TokenPattern compile_pattern(std::string_view source, const std::function<bool(std::string_view)>& known_class,
                             const validation::Location& where);

// A word class: its alternative patterns (each a phrase, possibly using other classes).
struct WordClass {
  std::vector<TokenPattern> members;
  FirstWords first_words;  // filled by index_first_words
};

// Class name → the class.
using ClassTable = std::map<std::string, WordClass, std::less<>>;

// Fills the first words of every class in `classes` (which must not refer to each other in a
// cycle) and returns those of `pattern` over them.
void index_first_words(ClassTable& classes);
FirstWords first_words_of(const TokenPattern& pattern, const ClassTable& classes);
// Whether `pattern` (or a class with `first`) can start at token `t`.
inline bool may_start_with(const FirstWords& first, const Token& t) { return !first || first->count(t.folded) > 0; }

// One match: tokens [begin, end) of the sequence.
struct PatternMatch {
  std::size_t begin = 0, end = 0;
};

// Where the classes match in one token sequence, remembered so that each class is expanded at
// each token once, however many rules and cues ask (a class matches the same tokens whatever
// surrounds it); and which words the sequence holds, so that a pattern or class none of whose
// first words occurs is not tried at all. Valid for one token sequence and one ClassTable only.
class ClassMatchCache {
 public:
  explicit ClassMatchCache(const std::vector<const Token*>& tokens);
  // The ends of the matches of `word_class` at `pos`, computed by `compute` on the first request.
  const std::vector<std::size_t>& ends(const WordClass* word_class, std::size_t pos,
                                       const std::function<std::vector<std::size_t>()>& compute);
  // Whether a pattern with these first words can match anywhere in the sequence.
  bool may_occur(const FirstWords& first) const;
  // The same for a class, remembered.
  bool class_may_occur(const WordClass* word_class);

 private:
  struct Key {
    const WordClass* word_class;
    std::size_t pos;
    bool operator==(const Key&) const = default;
  };
  struct KeyHash {
    std::size_t operator()(const Key& k) const noexcept {
      return std::hash<const void*>()(k.word_class) * 31u + std::hash<std::size_t>()(k.pos);
    }
  };
  std::size_t token_count_;
  std::unordered_set<std::string_view> words_;
  std::unordered_map<Key, std::vector<std::size_t>, KeyHash> ends_;
  std::unordered_map<const WordClass*, bool> class_occurs_;
};

// Calls `on_match` with the end of every way `pattern` matches starting at token `start`;
// stops early when on_match returns true. Returns whether it was stopped. `cache`, when given,
// must belong to `tokens` and `classes`.
bool match_at(const TokenPattern& pattern, const std::vector<const Token*>& tokens, std::size_t start,
              const ClassTable& classes, const std::function<bool(std::size_t end)>& on_match,
              ClassMatchCache* cache = nullptr);

// The leftmost match (longest at that start) at or after token `from`, if any.
std::optional<PatternMatch> find_first(const TokenPattern& pattern, const std::vector<const Token*>& tokens,
                                       const ClassTable& classes, std::size_t from = 0,
                                       ClassMatchCache* cache = nullptr);

}  // namespace counterpoise::guard
