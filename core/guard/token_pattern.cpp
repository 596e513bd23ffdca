#include "core/guard/token_pattern.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <set>
#include <stdexcept>

namespace counterpoise::guard {

namespace {

using validation::InvalidValue;
using Kind = PatternAlternative::Kind;

constexpr int kMaxGap = 20;

struct Builtin {
  std::string_view name;
  Kind kind;
};
constexpr Builtin kBuiltins[] = {{"number", Kind::number},     {"frequency", Kind::frequency},
                                 {"percent", Kind::percent},   {"word", Kind::any_word},
                                 {"any", Kind::any_token},     {"name", Kind::name},
                                 {"count", Kind::count}};

std::vector<std::string_view> split(std::string_view s, char sep) {
  std::vector<std::string_view> parts;
  std::size_t start = 0;
  for (std::size_t i = 0; i <= s.size(); ++i) {
    if (i == s.size() || s[i] == sep) {
      parts.push_back(s.substr(start, i - start));
      start = i + 1;
    }
  }
  return parts;
}

std::vector<std::string_view> split_spaces(std::string_view s) {
  std::vector<std::string_view> parts;
  std::size_t i = 0;
  while (i < s.size()) {
    while (i < s.size() && (s[i] == ' ' || s[i] == '\t' || s[i] == '\n')) ++i;
    const std::size_t start = i;
    while (i < s.size() && s[i] != ' ' && s[i] != '\t' && s[i] != '\n') ++i;
    if (i > start) parts.push_back(s.substr(start, i - start));
  }
  return parts;
}

std::vector<PatternAlternative> compile_alternatives(std::string_view piece, std::string_view source,
                                                     const std::function<bool(std::string_view)>& known_class,
                                                     const validation::Location& where) {
  const std::string quoted = " in pattern \"" + std::string(source) + "\"";
  std::vector<PatternAlternative> out;
  for (std::string_view alt : split(piece, '|')) {
    if (alt.empty()) throw InvalidValue(where, "empty alternative in '" + std::string(piece) + "'" + quoted);
    PatternAlternative a;
    if (alt.size() > 1 && alt.find('+') != std::string_view::npos) {
      std::string words(alt);
      std::replace(words.begin(), words.end(), '+', ' ');
      auto sub = compile_pattern(words, known_class, where);
      for (const auto& e : sub.elements)
        if (e.gap || e.optional || e.alternatives.size() != 1)
          throw InvalidValue(where, "a phrase '" + std::string(alt) + "' holds single words or classes only" + quoted);
      a.kind = Kind::phrase;
      a.text = std::string(alt);
      a.phrase = std::make_shared<const TokenPattern>(std::move(sub));
      out.push_back(std::move(a));
      continue;
    }
    if (alt.front() == '{' || alt.back() == '}') {
      if (alt.size() < 2 || alt.front() != '{' || alt.back() != '}')
        throw InvalidValue(where, "unclosed class braces in '" + std::string(alt) + "'" + quoted);
      const std::string_view name = alt.substr(1, alt.size() - 2);
      if (name.empty()) throw InvalidValue(where, "empty class name {}" + quoted);
      a.kind = Kind::word_class;
      a.text = std::string(name);
      for (const auto& b : kBuiltins)
        if (b.name == name) a.kind = b.kind;
      if (a.kind == Kind::word_class && !known_class(name))
        throw InvalidValue(where, "unknown class {" + std::string(name) + "}" + quoted);
    } else {
      a.kind = Kind::literal;
      if (fold_text(alt) == "'s") {  // the possessive is a token only after a word
        a.text = "'s";
        out.push_back(std::move(a));
        continue;
      }
      const std::vector<Token> tokens = tokenise(alt);
      if (tokens.size() != 1 || tokens.front().kind == TokenKind::number)
        throw InvalidValue(where, "literal '" + std::string(alt) +
                                      "' is not a single word or mark (write each token separately)" + quoted);
      a.kind = Kind::literal;
      a.text = tokens.front().folded;
    }
    out.push_back(std::move(a));
  }
  return out;
}

int read_bound(std::string_view text, std::string_view piece, std::string_view source,
               const validation::Location& where) {
  int value = -1;
  const auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (text.empty() || ec != std::errc() || ptr != text.data() + text.size() || value < 0 || value > kMaxGap)
    throw InvalidValue(where, "gap '" + std::string(piece) + "' needs whole bounds from 0 to " +
                                  std::to_string(kMaxGap) + " in pattern \"" + std::string(source) + "\"");
  return value;
}

bool token_matches_simple(const PatternAlternative& a, const Token& t) {
  switch (a.kind) {
    case Kind::literal: return t.folded == a.text;
    case Kind::number: return t.kind == TokenKind::number;
    case Kind::frequency: return t.kind == TokenKind::number && t.form == NumberForm::frequency;
    case Kind::percent: return t.kind == TokenKind::number && t.form == NumberForm::percent;
    case Kind::any_word: return t.kind == TokenKind::word;
    case Kind::any_token: return true;
    case Kind::name: return t.kind == TokenKind::word && t.capitalised;
    case Kind::count:
      return t.kind == TokenKind::number && t.form == NumberForm::plain && t.value >= 2 && t.value == std::floor(t.value);
    case Kind::word_class:
    case Kind::phrase: return false;
  }
  return false;
}

struct Matcher {
  const std::vector<const Token*>& tokens;
  const ClassTable& classes;
  ClassMatchCache* cache;

  std::vector<std::size_t> class_ends(const WordClass& word_class, std::size_t pos) const {
    std::vector<std::size_t> ends;
    for (const TokenPattern& member : word_class.members)
      sequence(member.elements, 0, pos, [&](std::size_t end) {
        if (std::find(ends.begin(), ends.end(), end) == ends.end()) ends.push_back(end);
        return false;
      });
    return ends;
  }

  // Every end of `a` matched at `pos`, handed to `next`; true when `next` asked to stop.
  bool alternative(const PatternAlternative& a, std::size_t pos, const std::function<bool(std::size_t)>& next) const {
    if (a.kind == Kind::phrase) return sequence(a.phrase->elements, 0, pos, next);
    if (a.kind != Kind::word_class) return pos < tokens.size() && token_matches_simple(a, *tokens[pos]) && next(pos + 1);
    const auto it = classes.find(a.text);
    if (it == classes.end() || pos >= tokens.size() || !may_start_with(it->second.first_words, *tokens[pos])) return false;
    if (!cache) {
      for (const TokenPattern& member : it->second.members)
        if (sequence(member.elements, 0, pos, next)) return true;
      return false;
    }
    if (!cache->class_may_occur(&it->second)) return false;
    for (std::size_t end : cache->ends(&it->second, pos, [&] { return class_ends(it->second, pos); }))
      if (next(end)) return true;
    return false;
  }

  bool forbidden(const std::vector<PatternAlternative>& alternatives, std::size_t pos) const {
    for (const auto& a : alternatives)
      if (alternative(a, pos, [](std::size_t) { return true; })) return true;
    return false;
  }

  bool sequence(const std::vector<PatternElement>& elements, std::size_t i, std::size_t pos,
                const std::function<bool(std::size_t)>& on_end) const {
    if (i == elements.size()) return on_end(pos);
    const PatternElement& e = elements[i];
    if (e.gap) {
      for (int n = 0; n <= e.gap_max && pos + n <= tokens.size(); ++n) {
        if (n > 0 && forbidden(e.gap_forbidden, pos + n - 1)) break;
        if (n >= e.gap_min && sequence(elements, i + 1, pos + n, on_end)) return true;
      }
      return false;
    }
    for (const auto& a : e.alternatives)
      if (alternative(a, pos, [&](std::size_t end) { return sequence(elements, i + 1, end, on_end); })) return true;
    return e.optional && sequence(elements, i + 1, pos, on_end);
  }
};

}  // namespace

bool is_builtin_class(std::string_view name) {
  return std::any_of(std::begin(kBuiltins), std::end(kBuiltins), [&](const Builtin& b) { return b.name == name; });
}

TokenPattern compile_pattern(std::string_view source, const std::function<bool(std::string_view)>& known_class,
                             const validation::Location& where) {
  TokenPattern pattern;
  pattern.source = std::string(source);
  const std::string quoted = " in pattern \"" + std::string(source) + "\"";
  for (std::string_view piece : split_spaces(source)) {
    PatternElement e;
    if (piece.substr(0, 3) == "...") {
      if (piece.back() == '?') throw InvalidValue(where, "a gap cannot be optional ('" + std::string(piece) + "')" + quoted);
      std::string_view spec = piece.substr(3);
      const auto bang = spec.find('!');
      std::string_view bounds = spec.substr(0, bang);
      if (bang != std::string_view::npos) {
        const std::string_view forbidden = spec.substr(bang + 1);
        if (forbidden.empty()) throw InvalidValue(where, "gap '" + std::string(piece) + "' has nothing after '!'" + quoted);
        e.gap_forbidden = compile_alternatives(forbidden, source, known_class, where);
      }
      const auto dash = bounds.find('-');
      e.gap = true;
      if (dash == std::string_view::npos) {
        e.gap_max = read_bound(bounds, piece, source, where);
      } else {
        e.gap_min = read_bound(bounds.substr(0, dash), piece, source, where);
        e.gap_max = read_bound(bounds.substr(dash + 1), piece, source, where);
      }
      if (e.gap_min > e.gap_max)
        throw InvalidValue(where, "gap '" + std::string(piece) + "' has its lower bound above the upper" + quoted);
    } else {
      if (piece.size() > 1 && piece.back() == '?') {
        e.optional = true;
        piece.remove_suffix(1);
      }
      e.alternatives = compile_alternatives(piece, source, known_class, where);
    }
    pattern.elements.push_back(std::move(e));
  }
  if (pattern.elements.empty()) throw InvalidValue(where, "empty pattern");
  if (pattern.elements.front().gap || pattern.elements.back().gap)
    throw InvalidValue(where, "a pattern must not begin or end with a gap" + quoted);
  if (std::all_of(pattern.elements.begin(), pattern.elements.end(),
                  [](const PatternElement& e) { return e.optional || e.gap; }))
    throw InvalidValue(where, "every element is optional, so the pattern would match nothing" + quoted);
  return pattern;
}

ClassMatchCache::ClassMatchCache(const std::vector<const Token*>& tokens) : token_count_(tokens.size()) {
  for (const Token* t : tokens) words_.insert(t->folded);
}

bool ClassMatchCache::may_occur(const FirstWords& first) const {
  if (!first) return true;
  if (first->size() < words_.size()) {
    for (const std::string& w : *first)
      if (words_.count(w)) return true;
    return false;
  }
  for (std::string_view w : words_)
    if (first->count(std::string(w))) return true;
  return false;
}

bool ClassMatchCache::class_may_occur(const WordClass* word_class) {
  const auto it = class_occurs_.find(word_class);
  if (it != class_occurs_.end()) return it->second;
  const bool occurs = may_occur(word_class->first_words);
  class_occurs_.emplace(word_class, occurs);
  return occurs;
}

const std::vector<std::size_t>& ClassMatchCache::ends(const WordClass* word_class, std::size_t pos,
                                                       const std::function<std::vector<std::size_t>()>& compute) {
  if (pos > token_count_) throw std::out_of_range("ClassMatchCache: position beyond the tokens");
  const Key key{word_class, pos};
  if (const auto it = ends_.find(key); it != ends_.end()) return it->second;
  std::vector<std::size_t> computed = compute();  // may fill other entries (nested classes)
  return ends_.emplace(key, std::move(computed)).first->second;
}

namespace {

// Adds the first words of the elements from `i` on to `out`; false when any word can start them.
bool add_first_words(const std::vector<PatternElement>& elements, std::size_t i, const ClassTable& classes,
                     std::unordered_set<std::string>& out) {
  for (; i < elements.size(); ++i) {
    const PatternElement& e = elements[i];
    if (e.gap) return false;
    for (const PatternAlternative& a : e.alternatives) {
      switch (a.kind) {
        case Kind::literal: out.insert(a.text); break;
        case Kind::number:
        case Kind::frequency:
        case Kind::percent:
        case Kind::count: out.insert("#"); break;
        case Kind::any_word:
        case Kind::any_token:
        case Kind::name: return false;
        case Kind::phrase:
          if (!add_first_words(a.phrase->elements, 0, classes, out)) return false;
          break;
        case Kind::word_class: {
          const auto it = classes.find(a.text);
          if (it == classes.end()) break;
          if (!it->second.first_words) return false;
          out.insert(it->second.first_words->begin(), it->second.first_words->end());
          break;
        }
      }
    }
    if (!e.optional) return true;
  }
  return true;
}

}  // namespace

FirstWords first_words_of(const TokenPattern& pattern, const ClassTable& classes) {
  std::unordered_set<std::string> out;
  if (!add_first_words(pattern.elements, 0, classes, out)) return std::nullopt;
  return out;
}

void index_first_words(ClassTable& classes) {
  std::set<std::string, std::less<>> done;
  // A class's first words need those of the classes its members start with: visit those first.
  std::function<void(const std::string&)> visit = [&](const std::string& name) {
    if (!done.insert(name).second) return;
    auto& word_class = classes.at(name);
    for (const TokenPattern& member : word_class.members)
      for (const PatternElement& e : member.elements) {
        for (const PatternAlternative& a : e.alternatives) {
          if (a.kind == Kind::word_class && classes.count(a.text)) visit(a.text);
          if (a.kind == Kind::phrase)
            for (const PatternElement& pe : a.phrase->elements)
              for (const PatternAlternative& pa : pe.alternatives)
                if (pa.kind == Kind::word_class && classes.count(pa.text)) visit(pa.text);
        }
        if (!e.optional) break;
      }
    std::unordered_set<std::string> out;
    bool bounded = true;
    for (TokenPattern& member : word_class.members) {
      member.first_words = first_words_of(member, classes);
      if (!member.first_words) bounded = false;
      else out.insert(member.first_words->begin(), member.first_words->end());
    }
    word_class.first_words = bounded ? FirstWords(std::move(out)) : std::nullopt;
  };
  for (const auto& [name, word_class] : classes) visit(name);
}

bool match_at(const TokenPattern& pattern, const std::vector<const Token*>& tokens, std::size_t start,
              const ClassTable& classes, const std::function<bool(std::size_t end)>& on_match,
              ClassMatchCache* cache) {
  const Matcher m{tokens, classes, cache};
  return m.sequence(pattern.elements, 0, start, on_match);
}

std::optional<PatternMatch> find_first(const TokenPattern& pattern, const std::vector<const Token*>& tokens,
                                       const ClassTable& classes, std::size_t from, ClassMatchCache* cache) {
  if (cache && !cache->may_occur(pattern.first_words)) return std::nullopt;
  for (std::size_t start = from; start < tokens.size(); ++start) {
    if (!may_start_with(pattern.first_words, *tokens[start])) continue;
    std::optional<std::size_t> longest;
    match_at(pattern, tokens, start, classes, [&](std::size_t end) {
      if (end > start && (!longest || end > *longest)) longest = end;
      return false;
    }, cache);
    if (longest) return PatternMatch{start, *longest};
  }
  return std::nullopt;
}

}  // namespace counterpoise::guard
