#include "core/guard/text_tokens.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <string>

#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

namespace {

// One decoded code point with its position in the three indexings.
struct CodePoint {
  char32_t value;
  std::size_t byte, index, utf16;
  std::size_t byte_length;
};

// Decodes one well-formed sequence at `i` (Unicode Standard table 3-7); 0 length when ill formed.
std::size_t decode_at(std::string_view text, std::size_t i, char32_t& out) {
  const auto byte = [&](std::size_t k) { return static_cast<unsigned char>(text[k]); };
  const unsigned char b0 = byte(i);
  if (b0 < 0x80) {
    out = b0;
    return 1;
  }
  std::size_t length = 0;
  unsigned char lo = 0x80, hi = 0xBF;
  if (b0 >= 0xC2 && b0 <= 0xDF) {
    length = 2;
  } else if (b0 >= 0xE0 && b0 <= 0xEF) {
    length = 3;
    if (b0 == 0xE0) lo = 0xA0;  // no overlong forms
    if (b0 == 0xED) hi = 0x9F;  // no surrogates
  } else if (b0 >= 0xF0 && b0 <= 0xF4) {
    length = 4;
    if (b0 == 0xF0) lo = 0x90;
    if (b0 == 0xF4) hi = 0x8F;  // nothing above U+10FFFF
  } else {
    return 0;
  }
  if (i + length > text.size()) return 0;
  char32_t value = b0 & (0xFF >> (length + 1));
  for (std::size_t k = 1; k < length; ++k) {
    const unsigned char b = byte(i + k);
    const unsigned char low = k == 1 ? lo : 0x80, high = k == 1 ? hi : 0xBF;
    if (b < low || b > high) return 0;
    value = (value << 6) | (b & 0x3F);
  }
  out = value;
  return length;
}

// Decimal text to double independent of the C locale (a Qt program sets it from the desktop).
double parse_decimal(const std::string& digits) {
  double x = 0;
  std::from_chars(digits.data(), digits.data() + digits.size(), x);
  return x;
}

std::vector<CodePoint> decode(std::string_view text) {
  std::vector<CodePoint> points;
  std::size_t index = 0, utf16 = 0;
  for (std::size_t i = 0; i < text.size();) {
    char32_t c = 0;
    const std::size_t length = decode_at(text, i, c);
    if (length == 0)
      throw validation::InvalidValue({"text", "utf8"},
                                     "the text is not valid UTF-8 (ill-formed byte sequence at byte " +
                                         std::to_string(i) + ")");
    points.push_back({c, i, index, utf16, length});
    i += length;
    ++index;
    utf16 += c >= 0x10000 ? 2 : 1;
  }
  return points;
}

void append_utf8(std::string& out, char32_t c) {
  if (c < 0x80) {
    out += static_cast<char>(c);
  } else if (c < 0x800) {
    out += static_cast<char>(0xC0 | (c >> 6));
    out += static_cast<char>(0x80 | (c & 0x3F));
  } else if (c < 0x10000) {
    out += static_cast<char>(0xE0 | (c >> 12));
    out += static_cast<char>(0x80 | ((c >> 6) & 0x3F));
    out += static_cast<char>(0x80 | (c & 0x3F));
  } else {
    out += static_cast<char>(0xF0 | (c >> 18));
    out += static_cast<char>(0x80 | ((c >> 12) & 0x3F));
    out += static_cast<char>(0x80 | ((c >> 6) & 0x3F));
    out += static_cast<char>(0x80 | (c & 0x3F));
  }
}

bool is_space(char32_t c) {
  return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v' || c == 0xA0 ||
         (c >= 0x2000 && c <= 0x200B) || c == 0x202F || c == 0x205F || c == 0x3000 || c == 0xFEFF;
}
bool is_digit(char32_t c) { return c >= '0' && c <= '9'; }
int superscript_digit(char32_t c) {
  if (c == 0x2070) return 0;
  if (c == 0xB9) return 1;
  if (c == 0xB2) return 2;
  if (c == 0xB3) return 3;
  if (c >= 0x2074 && c <= 0x2079) return static_cast<int>(c - 0x2070);
  return -1;
}
bool is_apostrophe(char32_t c) { return c == '\'' || c == 0x2019; }
bool is_hyphen(char32_t c) { return c == '-' || c == 0x2010 || c == 0x2011; }
bool is_letter(char32_t c) {
  if ((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z')) return true;
  if (c < 0xC0) return c == 0xAA || c == 0xB5 || c == 0xBA;
  if (c == 0xD7 || c == 0xF7) return false;
  if (c >= 0x2000 && c <= 0x2BFF) return false;  // punctuation, symbols, arrows, maths
  if (c >= 0x3000 && c <= 0x303F) return false;
  if (c >= 0xFE30 && c <= 0xFE4F) return false;
  if (c >= 0xFF00 && c <= 0xFF20) return false;
  return superscript_digit(c) < 0;
}
bool is_upper(char32_t c) { return fold_code_point(c) != c; }

// Quotation marks: 'd' double, 'o' opening single, 'c' closing-or-apostrophe single, 's' straight single.
char quote_kind(char32_t c) {
  if (c == '"' || c == 0x201C || c == 0x201D || c == 0x201E || c == 0xAB || c == 0xBB) return 'd';
  if (c == 0x2018) return 'o';
  if (c == 0x2019) return 'c';
  if (c == '\'') return 's';
  return 0;
}

struct Lexeme {
  TokenKind kind;
  std::size_t first, last;  // code point indices, inclusive-exclusive
  std::string folded;
  bool capitalised = false;
  double value = 0;  // numbers
  bool percent = false;
};

// Reads a numeral starting at points[i]: 1,000  0.001  1e6  10^6  10⁶  99.9%.
// Returns the index after it, or i when there is none.
std::size_t read_numeral(const std::vector<CodePoint>& p, std::size_t i, double& value, bool& percent) {
  std::string digits;
  std::size_t k = i;
  while (k < p.size() && is_digit(p[k].value)) digits += static_cast<char>(p[k++].value);
  if (digits.empty()) return i;
  // Thousands groups: ",ddd" not followed by another digit.
  while (k + 3 < p.size() && p[k].value == ',' && is_digit(p[k + 1].value) && is_digit(p[k + 2].value) &&
         is_digit(p[k + 3].value) && (k + 4 >= p.size() || !is_digit(p[k + 4].value))) {
    for (std::size_t g = 1; g <= 3; ++g) digits += static_cast<char>(p[k + g].value);
    k += 4;
  }
  if (k + 1 < p.size() && p[k].value == '.' && is_digit(p[k + 1].value)) {
    digits += '.';
    ++k;
    while (k < p.size() && is_digit(p[k].value)) digits += static_cast<char>(p[k++].value);
  }
  double x = parse_decimal(digits);
  if (k + 1 < p.size() && (p[k].value == 'e' || p[k].value == 'E')) {
    std::size_t e = k + 1;
    std::string exponent;
    if (e < p.size() && p[e].value == '-') exponent += '-';
    if (e < p.size() && (p[e].value == '-' || p[e].value == '+')) ++e;
    const std::size_t first_digit = e;
    while (e < p.size() && is_digit(p[e].value)) exponent += static_cast<char>(p[e++].value);
    if (e > first_digit && (e >= p.size() || !is_letter(p[e].value))) {
      x *= std::pow(10.0, parse_decimal(exponent));
      k = e;
    }
  } else if (k + 1 < p.size() && p[k].value == '^') {
    std::size_t e = k + 1;
    std::string exponent;
    if (e < p.size() && p[e].value == '-') exponent += '-', ++e;
    const std::size_t first_digit = e;
    while (e < p.size() && is_digit(p[e].value)) exponent += static_cast<char>(p[e++].value);
    if (e > first_digit) {
      x = std::pow(x, parse_decimal(exponent));
      k = e;
    }
  } else if (k < p.size() && (superscript_digit(p[k].value) >= 0 || p[k].value == 0x207B)) {
    std::size_t e = k;
    bool negative = false;
    if (p[e].value == 0x207B) negative = true, ++e;
    int exponent = 0, count = 0;
    while (e < p.size() && superscript_digit(p[e].value) >= 0) exponent = exponent * 10 + superscript_digit(p[e++].value), ++count;
    if (count > 0) {
      x = std::pow(x, negative ? -exponent : exponent);
      k = e;
    }
  }
  if (k < p.size() && p[k].value == '%') percent = true, ++k;
  value = x;
  return k;
}

std::vector<Lexeme> lex(const std::vector<CodePoint>& p) {
  std::vector<Lexeme> out;
  for (std::size_t i = 0; i < p.size();) {
    const char32_t c = p[i].value;
    if (is_space(c)) {
      ++i;
      continue;
    }
    // A hyphen joining two word characters separates words ("one-in-a-million") without a token.
    if (is_hyphen(c) && i > 0 && i + 1 < p.size() &&
        (is_letter(p[i - 1].value) || is_digit(p[i - 1].value)) &&
        (is_letter(p[i + 1].value) || is_digit(p[i + 1].value))) {
      ++i;
      continue;
    }
    if (is_digit(c) || (c == '.' && i + 1 < p.size() && is_digit(p[i + 1].value) &&
                        (i == 0 || !is_digit(p[i - 1].value)))) {
      double value = 0;
      bool percent = false;
      std::size_t start = i;
      std::size_t end = c == '.' ? i : read_numeral(p, i, value, percent);
      if (c == '.') {  // ".5"
        std::string digits = "0.";
        end = i + 1;
        while (end < p.size() && is_digit(p[end].value)) digits += static_cast<char>(p[end++].value);
        value = parse_decimal(digits);
        if (end < p.size() && p[end].value == '%') percent = true, ++end;
      }
      // Digits running into letters ("3rd", "2pq", "E1") are a word, not a number.
      if (end < p.size() && is_letter(p[end].value) && !percent) {
        while (end < p.size() && (is_letter(p[end].value) || is_digit(p[end].value))) ++end;
        Lexeme w{TokenKind::word, start, end, {}, false};
        for (std::size_t k = start; k < end; ++k) append_utf8(w.folded, fold_code_point(p[k].value));
        out.push_back(std::move(w));
      } else {
        Lexeme n{TokenKind::number, start, end, "#", false, value, percent};
        out.push_back(std::move(n));
      }
      i = end;
      continue;
    }
    if (is_letter(c)) {
      std::size_t end = i;
      std::string folded;
      while (end < p.size()) {
        const char32_t d = p[end].value;
        if (is_letter(d) || is_digit(d)) {
          append_utf8(folded, fold_code_point(d));
          ++end;
        } else if (is_apostrophe(d) && end + 1 < p.size() && is_letter(p[end + 1].value)) {
          // "'s" after a word is its own token (possessive); other inner apostrophes stay ("don't").
          const bool possessive = (p[end + 1].value == 's' || p[end + 1].value == 'S') &&
                                  (end + 2 >= p.size() || !is_letter(p[end + 2].value));
          if (possessive) break;
          folded += '\'';
          ++end;
        } else {
          break;
        }
      }
      Lexeme w{TokenKind::word, i, end, folded, is_upper(c)};
      out.push_back(std::move(w));
      i = end;
      if (i + 1 < p.size() && is_apostrophe(p[i].value) && (p[i + 1].value == 's' || p[i + 1].value == 'S') &&
          (i + 2 >= p.size() || !is_letter(p[i + 2].value))) {
        out.push_back(Lexeme{TokenKind::word, i, i + 2, "'s", false});
        i += 2;
      }
      continue;
    }
    Lexeme punct{TokenKind::punctuation, i, i + 1, {}, false};
    const char q = quote_kind(c);
    if (q == 'd') punct.folded = "\"";
    else if (q) punct.folded = "'";
    else if (c == 0x2013 || c == 0x2014) punct.folded = "-";
    else if (c == 0x2026) punct.folded = "...";
    else append_utf8(punct.folded, c);
    out.push_back(std::move(punct));
    ++i;
  }
  return out;
}

// Number words and their values; scale words multiply what precedes them.
struct NumberWord {
  std::string_view word;
  double value;
  bool scale;
};
constexpr std::array<NumberWord, 33> kNumberWords{{
    {"zero", 0, false},       {"one", 1, false},        {"two", 2, false},         {"three", 3, false},
    {"four", 4, false},       {"five", 5, false},       {"six", 6, false},         {"seven", 7, false},
    {"eight", 8, false},      {"nine", 9, false},       {"ten", 10, false},        {"eleven", 11, false},
    {"twelve", 12, false},    {"thirteen", 13, false},  {"fourteen", 14, false},   {"fifteen", 15, false},
    {"sixteen", 16, false},   {"seventeen", 17, false}, {"eighteen", 18, false},   {"nineteen", 19, false},
    {"twenty", 20, false},    {"thirty", 30, false},    {"forty", 40, false},      {"fifty", 50, false},
    {"sixty", 60, false},     {"seventy", 70, false},   {"eighty", 80, false},     {"ninety", 90, false},
    {"hundred", 100, true},   {"thousand", 1e3, true},  {"million", 1e6, true},    {"billion", 1e9, true},
    {"trillion", 1e12, true},
}};

const NumberWord* number_word(const Lexeme& l) {
  if (l.kind != TokenKind::word) return nullptr;
  for (const auto& w : kNumberWords)
    if (w.word == l.folded) return &w;
  return nullptr;
}

// A number phrase starting at lexeme i: a numeral or number words, optionally followed by scale
// words ("1.5 million", "a billion", "two hundred and fifty") and "per cent"/"percent".
struct Phrase {
  std::size_t end = 0;  // lexeme index after the phrase
  double value = 0;
  bool percent = false;
  bool only_one = false;  // the single word "one": a word unless part of a larger phrase
};

std::optional<Phrase> read_phrase(const std::vector<Lexeme>& lx, std::size_t i) {
  if (i >= lx.size()) return std::nullopt;
  double total = 0, group = 0;
  std::size_t k = i;
  bool any = false, percent = false;
  std::size_t word_count = 0;
  if (lx[k].kind == TokenKind::number) {
    group = lx[k].value;
    percent = lx[k].percent;
    any = true;
    ++k;
  } else if ((lx[k].folded == "a" || lx[k].folded == "an") && k + 1 < lx.size()) {
    const NumberWord* next = number_word(lx[k + 1]);
    if (!next || !next->scale) return std::nullopt;
    group = 1;
    any = true;
    ++k;
  }
  while (k < lx.size() && !percent) {
    const NumberWord* w = number_word(lx[k]);
    if (!w) {
      // "and" inside a number written in words: "two hundred and fifty".
      if (any && lx[k].folded == "and" && k + 1 < lx.size() && number_word(lx[k + 1]) &&
          !number_word(lx[k + 1])->scale && word_count > 0 && group >= 100)
        ++k;
      else
        break;
      continue;
    }
    if (w->scale) {
      if (!any) return std::nullopt;  // "million" alone is a word
      if (w->value == 100) {
        group *= 100;
      } else {
        total += group * w->value;
        group = 0;
      }
    } else {
      if (lx[i].kind == TokenKind::number) break;  // "5 two" is two numbers
      group += w->value;
    }
    any = true;
    ++word_count;
    ++k;
  }
  if (!any) return std::nullopt;
  Phrase phrase;
  phrase.value = total + group;
  if (!percent && k < lx.size() && lx[k].folded == "percent") percent = true, ++k;
  // "95 %": the sign set apart by a space, as French and SI style write it.
  if (!percent && k < lx.size() && lx[k].kind == TokenKind::punctuation && lx[k].folded == "%") percent = true, ++k;
  if (!percent && k + 1 < lx.size() && lx[k].folded == "per" && lx[k + 1].folded == "cent") percent = true, k += 2;
  phrase.percent = percent;
  phrase.end = k;
  phrase.only_one = k == i + 1 && lx[i].kind == TokenKind::word && lx[i].folded == "one";
  return phrase;
}

TextSpan span_of(const std::vector<CodePoint>& p, std::size_t first, std::size_t last, std::size_t text_bytes) {
  TextSpan s;
  s.byte_begin = p[first].byte;
  s.code_point_begin = p[first].index;
  s.utf16_begin = p[first].utf16;
  if (last < p.size()) {
    s.byte_end = p[last].byte;
    s.code_point_end = p[last].index;
    s.utf16_end = p[last].utf16;
  } else {
    const CodePoint& back = p.back();
    s.byte_end = text_bytes;
    s.code_point_end = back.index + 1;
    s.utf16_end = back.utf16 + (back.value >= 0x10000 ? 2 : 1);
  }
  return s;
}

std::string slice(std::string_view text, const TextSpan& s) {
  return std::string(text.substr(s.byte_begin, s.byte_end - s.byte_begin));
}

// Marks tokens inside quotation marks. Straight double quotes toggle; curly ones open and close;
// a single mark opens only before a letter after a non-letter and closes only when one is open,
// so apostrophes ("Okafor’s", "jurors’") are not taken for quotes. Blank lines reset the state.
void mark_quotes(std::vector<Token>& tokens, std::string_view text) {
  bool in_double = false, in_single = false;
  for (std::size_t t = 0; t < tokens.size(); ++t) {
    Token& tok = tokens[t];
    if (t > 0) {
      const auto gap = text.substr(tokens[t - 1].span.byte_end, tok.span.byte_begin - tokens[t - 1].span.byte_end);
      const auto first_newline = gap.find('\n');
      if (first_newline != std::string_view::npos && gap.find('\n', first_newline + 1) != std::string_view::npos)
        in_double = in_single = false;
    }
    if (is_quote_mark(tok)) {
      const std::string& raw = tok.text;
      const bool space_before = t == 0 || tokens[t - 1].span.byte_end < tok.span.byte_begin ||
                                tokens[t - 1].kind == TokenKind::punctuation;
      const bool word_after = t + 1 < tokens.size() && tokens[t + 1].span.byte_begin == tok.span.byte_end &&
                              tokens[t + 1].kind != TokenKind::punctuation;
      if (tok.folded == "\"") {
        if (raw == "\u201C" || raw == "\u201E" || raw == "\u00AB") in_double = true;
        else if (raw == "\u201D" || raw == "\u00BB") in_double = false;
        else in_double = !in_double;
      } else if (raw == "\u2018") {
        in_single = true;
      } else if (in_single) {
        in_single = false;
      } else if (space_before && word_after) {
        in_single = true;
      }
      tok.quoted = in_double || in_single;
      continue;
    }
    tok.quoted = in_double || in_single;
  }
}

bool is_terminal(const Token& t) {
  return t.kind == TokenKind::punctuation && (t.folded == "." || t.folded == "!" || t.folded == "?" || t.folded == "...");
}

constexpr std::array<std::string_view, 18> kAbbreviations{
    {"mr", "mrs", "ms", "dr", "prof", "st", "no", "nos", "fig", "figs", "vs", "cf", "al", "approx", "ref", "eq", "vol", "pp"}};

}  // namespace

char32_t fold_code_point(char32_t c) {
  if (c >= 'A' && c <= 'Z') return c + 32;
  if (c < 0xC0) return c;
  if (c <= 0xDE) return c == 0xD7 ? c : c + 32;
  if (c >= 0x100 && c <= 0x137) return (c % 2 == 0) ? c + 1 : c;
  if (c >= 0x139 && c <= 0x148) return (c % 2 == 1) ? c + 1 : c;
  if (c >= 0x14A && c <= 0x177) return (c % 2 == 0) ? c + 1 : c;
  if (c == 0x178) return 0xFF;
  if (c >= 0x179 && c <= 0x17E) return (c % 2 == 1) ? c + 1 : c;
  if (c >= 0x391 && c <= 0x3A9 && c != 0x3A2) return c + 32;
  if (c >= 0x410 && c <= 0x42F) return c + 32;
  if (c >= 0x400 && c <= 0x40F) return c + 80;
  return c;
}

std::string fold_text(std::string_view text) {
  std::string out;
  for (const CodePoint& c : decode(text)) append_utf8(out, c.value == 0x2019 ? U'\'' : fold_code_point(c.value));
  return out;
}

std::optional<std::size_t> first_invalid_utf8(std::string_view text) {
  for (std::size_t i = 0; i < text.size();) {
    char32_t c = 0;
    const std::size_t length = decode_at(text, i, c);
    if (length == 0) return i;
    i += length;
  }
  return std::nullopt;
}

std::vector<Token> tokenise(std::string_view text) {
  const std::vector<CodePoint> points = decode(text);
  const std::vector<Lexeme> lx = lex(points);
  std::vector<Token> tokens;
  tokens.reserve(lx.size());
  const auto make = [&](TokenKind kind, std::size_t first_lexeme, std::size_t end_lexeme) {
    Token t;
    t.kind = kind;
    t.span = span_of(points, lx[first_lexeme].first, lx[end_lexeme - 1].last, text.size());
    t.text = slice(text, t.span);
    t.capitalised = lx[first_lexeme].capitalised;
    return t;
  };
  for (std::size_t i = 0; i < lx.size();) {
    std::optional<Phrase> first = read_phrase(lx, i);
    if (first && !first->percent) {
      // Frequencies: "1 in a million", "one in 200", "1 out of 1,000".
      std::size_t k = first->end;
      if (k < lx.size() && lx[k].folded == "in") {
        ++k;
      } else if (k + 1 < lx.size() && lx[k].folded == "out" && lx[k + 1].folded == "of") {
        k += 2;
      } else {
        k = 0;
      }
      std::optional<Phrase> second = k ? read_phrase(lx, k) : std::nullopt;
      if (second && !second->percent && !second->only_one && second->value > 0) {
        Token t = make(TokenKind::number, i, second->end);
        t.folded = "#";
        t.value = first->value / second->value;
        t.form = NumberForm::frequency;
        t.denominator_text = slice(text, span_of(points, lx[k].first, lx[second->end - 1].last, text.size()));
        tokens.push_back(std::move(t));
        i = second->end;
        continue;
      }
    }
    if (first && !first->only_one) {
      Token t = make(TokenKind::number, i, first->end);
      t.folded = "#";
      t.value = first->value;
      t.form = first->percent ? NumberForm::percent : NumberForm::plain;
      tokens.push_back(std::move(t));
      i = first->end;
      continue;
    }
    Token t = make(lx[i].kind, i, i + 1);
    t.folded = lx[i].folded;
    tokens.push_back(std::move(t));
    ++i;
  }
  mark_quotes(tokens, text);
  return tokens;
}

namespace {

// The indentation (spaces and tabs) of the line holding byte `at` of `text`.
std::size_t indentation_of_line(std::string_view text, std::size_t at) {
  const std::size_t newline = text.rfind('\n', at);
  const std::size_t start = newline == std::string_view::npos ? 0 : newline + 1;
  const std::size_t first = text.find_first_not_of(" \t", start);
  return (first == std::string_view::npos ? text.size() : first) - start;
}

// Whether a single line break between `last` and `next` (with `gap` the text between them) ends
// a sentence because the lines are laid out, not wrapped prose: the next line starts a list item
// ("- ", "* ", "• ", "– "), the line before ends with a colon, or the indentation changes (a command's
// description under it in help text, a table's rows). Wrapped prose keeps its sentence.
bool line_break_ends_sentence(std::string_view text, const Token& last, const Token& next, std::string_view gap) {
  // En and em dashes are folded to "-".
  if (next.kind == TokenKind::punctuation && (next.folded == "-" || next.folded == "*" || next.folded == "\u2022" ||
                                              next.folded == "\u00b7"))
    return true;
  if (last.folded == ":") return true;
  const std::size_t next_indent = gap.size() - gap.rfind('\n') - 1;
  return next_indent != indentation_of_line(text, last.span.byte_begin);
}

}  // namespace

std::vector<Sentence> split_sentences(std::string_view text) {
  std::vector<Token> tokens = tokenise(text);
  std::vector<Sentence> sentences;
  Sentence current;
  const auto close = [&]() {
    if (current.tokens.empty()) return;
    current.span.byte_begin = current.tokens.front().span.byte_begin;
    current.span.code_point_begin = current.tokens.front().span.code_point_begin;
    current.span.utf16_begin = current.tokens.front().span.utf16_begin;
    current.span.byte_end = current.tokens.back().span.byte_end;
    current.span.code_point_end = current.tokens.back().span.code_point_end;
    current.span.utf16_end = current.tokens.back().span.utf16_end;
    sentences.push_back(std::move(current));
    current = Sentence{};
  };
  for (std::size_t t = 0; t < tokens.size(); ++t) {
    if (!current.tokens.empty()) {
      const auto gap = text.substr(current.tokens.back().span.byte_end,
                                   tokens[t].span.byte_begin - current.tokens.back().span.byte_end);
      const auto first_newline = gap.find('\n');
      if (first_newline != std::string_view::npos &&
          (gap.find('\n', first_newline + 1) != std::string_view::npos ||
           line_break_ends_sentence(text, current.tokens.back(), tokens[t], gap)))
        close();
    }
    // Tokens are moved into their sentence; only current.tokens and tokens after t are read.
    current.tokens.push_back(std::move(tokens[t]));
    if (!is_terminal(current.tokens.back())) continue;
    // Closing quotation marks and brackets right after the stop belong to this sentence.
    while (t + 1 < tokens.size() && tokens[t + 1].kind == TokenKind::punctuation &&
           (tokens[t + 1].folded == "\"" || tokens[t + 1].folded == "'" || tokens[t + 1].folded == ")") &&
           tokens[t + 1].span.byte_begin == current.tokens.back().span.byte_end)
      current.tokens.push_back(std::move(tokens[++t]));
    if (current.tokens.back().folded == "." && current.tokens.size() >= 2) {
      const Token& stop = current.tokens.back();
      const Token& before = current.tokens[current.tokens.size() - 2];
      bool abbreviation = false;
      for (auto a : kAbbreviations) abbreviation = abbreviation || before.folded == a;
      // "e.g.", "i.e.": a single lower-case letter before the stop.
      abbreviation = abbreviation || (before.kind == TokenKind::word && before.text.size() == 1 && !before.capitalised);
      if (abbreviation && before.span.byte_end == stop.span.byte_begin) continue;
    }
    if (t + 1 < tokens.size()) {
      const Token& next = tokens[t + 1];
      const bool starts_new = next.capitalised || next.kind == TokenKind::number ||
                              (next.kind == TokenKind::punctuation && next.folded != "," && next.folded != ";");
      if (!starts_new) continue;
    }
    close();
  }
  close();
  return sentences;
}

std::vector<const Token*> visible_tokens(const Sentence& sentence) {
  std::vector<const Token*> visible;
  for (const Token& t : sentence.tokens)
    if (!is_quote_mark(t)) visible.push_back(&t);
  return visible;
}

}  // namespace counterpoise::guard
