// Text from files shown safely: control sequences and invalid UTF-8 are escaped visibly.
// The sequences are those of ECMA-48 (5th ed. 1991), "Control Functions for Coded Character Sets":
// ESC is 0x1B (section 5.2), OSC is ESC ] (8.3.89) ended by BEL 0x07 in common terminal practice,
// ED is CSI 2 J (8.3.39), and CSI is ESC [ or the C1 control 0x9B (5.3). UTF-8 validity follows
// RFC 3629 (Yergeau 2003), section 4; direction controls Unicode UAX #9, section 2; JSON string
// escapes RFC 8259 (Bray 2017), section 7.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "core/validation/display_text.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::validation;

namespace {
const std::string kRetitle = "\x1b]0;owned\x07";  // OSC 0: set the window title, ended by BEL
const std::string kClear = "\x1b[2J";             // CSI 2 J: erase the whole display

bool has_raw_control(const std::string& text) {
  for (unsigned char c : text)
    if (c < 0x20 || c == 0x7F) return true;
  return false;
}
}  // namespace

TEST_CASE("display_text escapes the terminal sequences visibly and keeps the rest") {
  CHECK(display_text("Harwick " + kRetitle + " Vale") == "Harwick \\x1b]0;owned\\x07 Vale");
  CHECK(display_text(kClear) == "\\x1b[2J");
  CHECK(display_text("line\nnext\ttab\r") == "line\\x0anext\\x09tab\\x0d");
  CHECK(display_text(std::string("nul\0byte", 8)) == "nul\\x00byte");
  CHECK(display_text("del\x7f") == "del\\x7f");
  // Plain text, accents and dashes are unchanged.
  CHECK(display_text("Vale Forensic Laboratory — café") == "Vale Forensic Laboratory — café");
}

TEST_CASE("display_text escapes C1 controls and direction overrides as code points") {
  CHECK(display_text("\xc2\x9b" "2J") == "\\u{9b}2J");        // U+009B, the one-byte CSI
  CHECK(display_text("ab\xe2\x80\xae" "cd") == "ab\\u{202e}cd");  // U+202E RIGHT-TO-LEFT OVERRIDE
  CHECK(display_text("\xe2\x81\xa6x") == "\\u{2066}x");          // U+2066 LEFT-TO-RIGHT ISOLATE
}

TEST_CASE("display_text escapes every byte that is not valid UTF-8 (RFC 3629 section 4)") {
  CHECK(display_text("\xff") == "\\xff");                       // never valid
  CHECK(display_text("\xc0\xaf") == "\\xc0\\xaf");               // overlong '/'
  CHECK(display_text("\xed\xa0\x80") == "\\xed\\xa0\\x80");      // a surrogate, U+D800
  CHECK(display_text("\xf4\x90\x80\x80") == "\\xf4\\x90\\x80\\x80");  // above U+10FFFF
  CHECK(display_text("cut \xe2\x80") == "cut \\xe2\\x80");       // truncated sequence
  CHECK(display_text("\xf0\x9f\x94\x8d") == "\xf0\x9f\x94\x8d");  // U+1F50D is kept
}

TEST_CASE("escaping is idempotent, so layers may escape again without doubling") {
  const std::string hostile = "E1" + kRetitle + kClear + "\xff\xc2\x9b\n";
  const std::string once = display_text(hostile);
  CHECK_FALSE(has_raw_control(once));
  CHECK(display_text(once) == once);
  CHECK(display_lines(once) == once);
}

TEST_CASE("display_lines keeps line feeds and tabs and escapes the rest") {
  CHECK(display_lines("a\n\tb" + kClear) == "a\n\tb\\x1b[2J");
  CHECK(display_lines("a\r\n") == "a\\x0d\n");
}

TEST_CASE("display_excerpt cuts long values to a number of code points and marks the cut") {
  CHECK(display_excerpt("short", 40) == "short");
  CHECK(display_excerpt(std::string(1000, 'x'), 5) == "xxxxx…");
  CHECK(display_excerpt("é\x1b" "abc", 2) == "é\\x1b…");
}

TEST_CASE("runs of plain ASCII are kept whole and the escapes between them land where they were") {
  // Long stretches of printable ASCII (copied as one run) around each kind of escape: the result
  // is the stretches unchanged with the ECMA-48 / RFC 3629 escapes of the section above between them.
  const std::string plain(300, 'v');
  const std::string text = plain + kClear + plain + "\xff" + plain + "\xe2\x80\xae" + plain + "\t" + plain;
  CHECK(display_text(text) == plain + "\\x1b[2J" + plain + "\\xff" + plain + "\\u{202e}" + plain + "\\x09" + plain);
  CHECK(display_lines(text) == plain + "\\x1b[2J" + plain + "\\xff" + plain + "\\u{202e}" + plain + "\t" + plain);
  // The cut falls inside a run, counted in code points (one per ASCII byte, one for "é").
  CHECK(display_excerpt("é" + plain, 11) == "é" + std::string(10, 'v') + "…");
  CHECK(display_excerpt(plain + kClear, 300) == plain + "…");
  CHECK(display_excerpt(plain + kClear, 301) == plain + "\\x1b…");
  // display_json keeps the line feeds of the indentation but escapes a raw tab (a valid dump has
  // none; RFC 8259 section 7 forbids unescaped controls inside strings).
  CHECK(display_json("{\n  \"a\": 1\n}") == "{\n  \"a\": 1\n}");
  CHECK(display_json(plain + "\t" + plain) == plain + "\\u0009" + plain);
}

TEST_CASE("display_width counts the code points of what is shown") {
  CHECK(display_width("abc") == 3);
  CHECK(display_width("Vale —") == 6);
  CHECK(display_width(display_text(kClear)) == 7);  // \x1b[2J
}

TEST_CASE("display_json keeps JSON valid and escapes what a terminal would act on") {
  const nlohmann::json document = {{"title", kRetitle + "\xc2\x9b" + "\xe2\x80\xae" + "\x7f"}, {"n", 1}};
  const std::string shown = display_json(document.dump(2, ' ', false));
  std::string without_indentation = shown;
  std::erase(without_indentation, '\n');
  CHECK_FALSE(has_raw_control(without_indentation));
  CHECK(shown.find("\xc2\x9b") == std::string::npos);
  CHECK(shown.find("\xe2\x80\xae") == std::string::npos);
  // RFC 8259 section 7: any code point may be written as \uXXXX; the parse gives back the text.
  CHECK(nlohmann::json::parse(shown) == document);
}

TEST_CASE("describe escapes the item, the field and the message") {
  const Location where{"E1" + kClear, "title" + kRetitle};
  const std::string text = describe(where, "unknown model \"" + kRetitle + "\"\xff");
  CHECK(text == "item E1\\x1b[2J, field title\\x1b]0;owned\\x07: unknown model \"\\x1b]0;owned\\x07\"\\xff");
  CHECK(InvalidValue(where, kClear).what() == describe(where, kClear));
}
