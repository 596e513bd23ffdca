#pragma once
// Tokens of a UTF-8 text for the wording checker: words (case-folded), numbers (with the value
// read from forms such as "1 in a million", "one in 200", "1,000", "10^6", "1e6", "99.9%"),
// punctuation and quotation marks; and the split into sentences.
// UTF-8 well-formedness follows the Unicode Standard, ch. 3, table 3-7 (well-formed byte sequences).
// Every token carries its span three ways — bytes, code points and UTF-16 code units — so an
// editor using any of these indexings can highlight it.

#include <cstddef>
#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace counterpoise::guard {

// A half-open span [begin, end) in the three indexings.
struct TextSpan {
  std::size_t byte_begin = 0, byte_end = 0;
  std::size_t code_point_begin = 0, code_point_end = 0;
  std::size_t utf16_begin = 0, utf16_end = 0;
};

enum class TokenKind { word, number, punctuation };

// How a number was written; patterns can ask for a kind ({frequency}, {percent}).
enum class NumberForm {
  plain,      // "1,000", "0.001", "1e6", "10^6", "a million", "two hundred"
  percent,    // "99.9%", "99.9 %", "99.9 per cent"
  frequency,  // "1 in a million", "one in 200", "1 out of 1,000" (value = numerator / denominator)
};

struct Token {
  TokenKind kind = TokenKind::word;
  std::string text;    // as written (a multi-word number keeps its words: "1 in a million")
  std::string folded;  // case-folded; for numbers a canonical "#"; apostrophes as '
  TextSpan span;
  bool capitalised = false;  // first letter was upper case in the text
  bool quoted = false;       // inside quotation marks
  // Numbers only: the value (a percent as written, 99.9 for "99.9%"; a frequency as the ratio),
  // the form, and for a frequency the text of the denominator ("a million", "200").
  double value = 0;
  NumberForm form = NumberForm::plain;
  std::string denominator_text;

  // Whether the folded text is one of `words` (words written folded: "is", "that", ".").
  bool is_one_of(std::initializer_list<std::string_view> words) const {
    for (std::string_view w : words)
      if (folded == w) return true;
    return false;
  }
};

struct Sentence {
  TextSpan span;
  std::vector<Token> tokens;
};

// Whether `t` is a quotation mark. The marks themselves carry no words; what they enclose is
// flagged on its tokens (Token::quoted).
inline bool is_quote_mark(const Token& t) {
  return t.kind == TokenKind::punctuation && (t.folded == "\"" || t.folded == "'");
}

// The tokens of `sentence` a reader sees as words and punctuation: all but the quotation marks.
std::vector<const Token*> visible_tokens(const Sentence& sentence);

// Byte offset of the first ill-formed UTF-8 sequence in `text`, or nullopt when well formed.
std::optional<std::size_t> first_invalid_utf8(std::string_view text);

// The tokens of `text`. Throws validation::InvalidValue (item "text", field "utf8") naming the
// byte offset when `text` is not well-formed UTF-8.
std::vector<Token> tokenise(std::string_view text);

// `text` split into sentences at . ! ? (not after common abbreviations such as "Mr" or "e.g.",
// nor inside numbers) and at blank lines; each sentence holds its tokens. Throws as tokenise.
std::vector<Sentence> split_sentences(std::string_view text);

// `text` case-folded code point by code point, with the typographic apostrophe as '.
// Throws as tokenise for ill-formed UTF-8.
std::string fold_text(std::string_view text);

// Lower case of one code point for the scripts the rule files use (ASCII, Latin-1, Latin
// Extended-A, Greek and Cyrillic basic letters); other code points are returned unchanged.
char32_t fold_code_point(char32_t c);

}  // namespace counterpoise::guard
