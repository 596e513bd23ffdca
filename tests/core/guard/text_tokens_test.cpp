// Tokeniser of the wording checker: spans in bytes, code points and UTF-16 units, case folding,
// number phrases, quotation marks and sentence splitting.
// UTF-8 well-formedness: The Unicode Standard, ch. 3, table 3-7 (well-formed byte sequences) and
// D92 (code unit sequences); UTF-16 lengths: ch. 3, D91 (a code point above U+FFFF takes a
// surrogate pair). The malformed sequences below are the classic cases of Markus Kuhn's UTF-8
// decoder capability and stress test (from memory).
#include <catch2/catch.hpp>

#include <string>

#include "core/guard/text_tokens.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::guard;

namespace {
const Token& token_with_text(const std::vector<Token>& tokens, const std::string& text) {
  for (const auto& t : tokens)
    if (t.text == text) return t;
  FAIL("no token '" << text << "'");
  return tokens.front();
}
}  // namespace

TEST_CASE("tokeniser: spans agree in bytes, code points and UTF-16 units") {
  // "é" is 2 bytes / 1 code point / 1 UTF-16 unit; "’" 3/1/1; U+1F600 4/1/2 (Unicode ch. 3, D91).
  const std::string text = "Caf\u00e9 \u2019x\u2019 \U0001F600 source";
  const auto tokens = tokenise(text);
  const Token& source = token_with_text(tokens, "source");
  CHECK(source.span.byte_begin == text.find("source"));
  CHECK(source.span.byte_end == text.size());
  // code points before "source": C a f é ␠ ’ x ’ ␠ 😀 ␠ = 11
  CHECK(source.span.code_point_begin == 11);
  CHECK(source.span.code_point_end == 17);
  CHECK(source.span.utf16_begin == 12);  // the emoji counts twice
  CHECK(source.span.utf16_end == 18);
  const Token& cafe = token_with_text(tokens, "Caf\u00e9");
  CHECK(cafe.span.byte_end == 5);
  CHECK(cafe.span.code_point_end == 4);
  CHECK(cafe.folded == "caf\u00e9");
  for (const auto& t : tokens) CHECK(text.substr(t.span.byte_begin, t.span.byte_end - t.span.byte_begin) == t.text);
}

TEST_CASE("tokeniser: case folding of Latin, Latin-1, Latin Extended-A, Greek and Cyrillic") {
  CHECK(fold_text("PROBABILITY") == "probability");
  CHECK(fold_text("\u00d6KAFOR") == "\u00f6kafor");      // Ö → ö
  CHECK(fold_text("\u0141UKASZ") == "\u0142ukasz");      // Ł → ł (Latin Extended-A)
  CHECK(fold_text("\u0394\u039d\u0391") == "\u03b4\u03bd\u03b1");  // ΔΝΑ → δνα
  CHECK(fold_text("\u0414\u041d\u041a") == "\u0434\u043d\u043a");  // ДНК → днк
  CHECK(fold_text("\u00d7") == "\u00d7");                // the multiplication sign is not a letter
  CHECK(fold_text("Okafor\u2019s") == "okafor's");       // typographic apostrophe folds to '
}

TEST_CASE("tokeniser: number phrases are single number tokens with their value") {
  struct Row {
    const char* text;
    double value;
    NumberForm form;
    const char* denominator;
  };
  // Values are plain arithmetic on the written numbers (common practice).
  const Row rows[] = {
      {"1 in a million", 1e-6, NumberForm::frequency, "a million"},
      {"one in 200", 1.0 / 200, NumberForm::frequency, "200"},
      {"one-in-a-billion", 1e-9, NumberForm::frequency, "a-billion"},
      {"1 out of 1,000", 1e-3, NumberForm::frequency, "1,000"},
      {"3 in 10^6", 3e-6, NumberForm::frequency, "10^6"},
      {"1,000", 1000, NumberForm::plain, ""},
      {"1,000,000", 1e6, NumberForm::plain, ""},
      {"10^6", 1e6, NumberForm::plain, ""},
      {"10\u2076", 1e6, NumberForm::plain, ""},
      {"1e6", 1e6, NumberForm::plain, ""},
      {"2.5E-3", 2.5e-3, NumberForm::plain, ""},
      {"0.001", 0.001, NumberForm::plain, ""},
      {"1.5 million", 1.5e6, NumberForm::plain, ""},
      {"a billion", 1e9, NumberForm::plain, ""},
      {"two hundred and fifty", 250, NumberForm::plain, ""},
      {"twenty thousand", 2e4, NumberForm::plain, ""},
      {"99.9%", 99.9, NumberForm::percent, ""},
      {"99.9 per cent", 99.9, NumberForm::percent, ""},
      {"5 percent", 5, NumberForm::percent, ""},
  };
  for (const auto& row : rows) {
    INFO(row.text);
    const auto tokens = tokenise(row.text);
    REQUIRE(tokens.size() == 1);
    CHECK(tokens[0].kind == TokenKind::number);
    CHECK(tokens[0].folded == "#");
    CHECK(tokens[0].value == Approx(row.value).epsilon(1e-12));  // decimal text → double, one rounding
    CHECK(tokens[0].form == row.form);
    CHECK(tokens[0].denominator_text == row.denominator);
    CHECK(tokens[0].text == row.text);
  }
}

TEST_CASE("tokeniser: words that look like numbers stay words") {
  const auto tokens = tokenise("one of them, item E1, the 3rd fragment, no one, million");
  for (const char* word : {"one", "E1", "3rd", "million"}) {
    INFO(word);
    CHECK(token_with_text(tokens, word).kind == TokenKind::word);
  }
  // A thousands group needs exactly three digits: "1,00" is 1 then ",00" (common practice).
  const auto odd = tokenise("1,00");
  CHECK(odd.front().value == 1);
}

TEST_CASE("tokeniser: possessives, contractions and quotation marks") {
  const auto tokens = tokenise("Mr Okafor\u2019s jumper; jurors' views; don't; \u201cthe match\u201d and 'a fluke' here");
  CHECK(token_with_text(tokens, "Okafor").folded == "okafor");
  CHECK(token_with_text(tokens, "\u2019s").folded == "'s");
  CHECK(token_with_text(tokens, "don't").kind == TokenKind::word);
  CHECK_FALSE(token_with_text(tokens, "views").quoted);  // jurors' is an apostrophe, not a quote
  CHECK(token_with_text(tokens, "match").quoted);
  CHECK(token_with_text(tokens, "fluke").quoted);
  CHECK_FALSE(token_with_text(tokens, "here").quoted);
  CHECK_FALSE(token_with_text(tokens, "and").quoted);
  const auto straight = tokenise("He wrote \"it is his\" today");
  CHECK(token_with_text(straight, "his").quoted);
  CHECK_FALSE(token_with_text(straight, "today").quoted);
}

TEST_CASE("tokeniser: ill-formed UTF-8 is a validation error naming the byte") {
  struct Row {
    std::string bytes;
    std::size_t offset;
  };
  const Row rows[] = {
      {std::string("ab\xC0\x80", 4), 2},          // overlong NUL
      {std::string("a\xED\xA0\x80", 4), 1},       // UTF-16 surrogate U+D800
      {std::string("xy\xE2\x82", 4), 2},          // truncated 3-byte sequence
      {std::string("\xF5\x80\x80\x80", 4), 0},    // above U+10FFFF
      {std::string("ok\x80", 3), 2},              // lone continuation byte
      {std::string("\xF0\x8F\xBF\xBF", 4), 0},    // overlong 4-byte form
      {std::string("p\xFF", 2), 1},
  };
  for (const auto& row : rows) {
    INFO("offset " << row.offset);
    CHECK(first_invalid_utf8(row.bytes) == row.offset);
    try {
      tokenise(row.bytes);
      FAIL("no throw");
    } catch (const counterpoise::validation::InvalidValue& e) {
      CHECK(e.where().item == "text");
      CHECK(e.where().field == "utf8");
      CHECK(std::string(e.what()).find("byte " + std::to_string(row.offset)) != std::string::npos);
    }
  }
  CHECK_FALSE(first_invalid_utf8("\xF4\x8F\xBF\xBF").has_value());  // U+10FFFF, the last code point
  CHECK_NOTHROW(tokenise("\xEF\xBB\xBFplain"));                      // a byte-order mark is fine
}

TEST_CASE("sentences: split at stops, not at abbreviations, decimals or e.g.") {
  const std::string text =
      "Mr Okafor gave a sample. The LR is 1.5 million, e.g. for the stain! Was it Dr Lee? "
      "He said \"no.\" Then we stopped\n\nA new paragraph without a stop\nstill the same sentence";
  const auto sentences = split_sentences(text);
  REQUIRE(sentences.size() == 6);
  const auto sentence_text = [&](std::size_t i) {
    return text.substr(sentences[i].span.byte_begin, sentences[i].span.byte_end - sentences[i].span.byte_begin);
  };
  CHECK(sentence_text(0) == "Mr Okafor gave a sample.");
  CHECK(sentence_text(1) == "The LR is 1.5 million, e.g. for the stain!");
  CHECK(sentence_text(2) == "Was it Dr Lee?");
  CHECK(sentence_text(3) == "He said \"no.\"");
  CHECK(sentence_text(4) == "Then we stopped");
  CHECK(sentence_text(5) == "A new paragraph without a stop\nstill the same sentence");
  CHECK(split_sentences("").empty());
}

// Layout is not prose (common practice of text layout): a list's items, a heading ended by a
// colon and lines whose indentation changes (help text, a table pasted from a report) are read
// one by one, while wrapped prose keeps its sentence.
TEST_CASE("sentences: a single line break ends a sentence only where the text is laid out") {
  const auto count = [](std::string_view text) { return split_sentences(text).size(); };
  CHECK(count("The findings were as follows\n- three fragments of glass\n- two fibres") == 3);
  CHECK(count("Conclusions:\nthe findings support the proposition") == 2);
  CHECK(count("  evaluate CASE\n      the LR of each item\n  validate CASE\n      check a case") == 4);
  CHECK(count("a paragraph wrapped at a fixed width\nwithout a stop at the end of its line\nkeeps its sentence") == 1);
  CHECK(count("    an indented paragraph wrapped\n    at the same indentation") == 1);
}
