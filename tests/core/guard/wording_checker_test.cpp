// The wording checker over the shipped rules: negation and quotation, modes, rewrites, spans,
// one finding per family and sentence. Error wordings follow the families of Thompson &
// Schumann 1987 (Law and Human Behavior 11:167) and Koehler 1993 (Jurimetrics 34:21); the
// correct form of the evaluative statement is as in the RSS Practitioner Guide No 1 (Aitken,
// Roberts & Jackson 2010, ch. 3; from memory).
#include <catch2/catch.hpp>

#include <string>

#include "core/guard/wording_checker.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::guard;

namespace {
const WordingChecker& shipped() {
  static const WordingChecker checker = WordingChecker::load_default();
  return checker;
}
}  // namespace

TEST_CASE("checker: the shipped rule file names the families and their sources") {
  const auto& families = shipped().rules().families();
  CHECK(families.size() == 9);
  CHECK(families.at("transposed-conditional").published_name == "prosecutor's fallacy");
  CHECK(families.at("transposed-conditional").source.find("Thompson & Schumann 1987") != std::string::npos);
  CHECK(families.at("defence-fallacy").source.find("Law and Human Behavior 11:167") != std::string::npos);
  for (const char* id : {"source-probability", "ultimate-issue", "another-match", "numerical-conversion"})
    CHECK(families.at(id).source.find("Koehler 1993, Jurimetrics 34:21") != std::string::npos);
  for (const auto& rule : shipped().rules().rules()) {
    INFO(rule.id);
    CHECK(families.count(rule.family) == 1);
    CHECK_FALSE(rule.explanation.empty());
  }
}

TEST_CASE("checker: an asserted error, the same wording refuted, and the same wording quoted") {
  const auto asserted = shipped().check("The probability that he is the source is 1 in a million.");
  REQUIRE(asserted.size() == 1);
  CHECK(asserted[0].family == "source-probability");
  CHECK(asserted[0].severity == Severity::error);
  CHECK(asserted[0].assertion == Assertion::asserted);

  for (const char* refuted : {"It would be wrong to say the probability that he is the source is 1 in a million.",
                              "This does not mean that the probability that he is the source is 1 in a million.",
                              "The figure must not be read as the probability that he is the source.",
                              "Counsel argued that the probability that he is the source is 1 in a million."}) {
    INFO(refuted);
    const auto findings = shipped().check(refuted);
    REQUIRE(findings.size() == 1);
    CHECK(findings[0].severity == Severity::advice);
    CHECK(findings[0].assertion == Assertion::negated);
    CHECK_FALSE(has_flagged(findings));
  }
  for (const char* quoted : {"Avoid \u201cthe probability that he is the source is 1 in a million\u201d.",
                             "Avoid \"the probability that he is the source is 1 in a million\".",
                             "Avoid 'the probability that he is the source is 1 in a million'."}) {
    INFO(quoted);
    const auto findings = shipped().check(quoted);
    REQUIRE(findings.size() == 1);
    CHECK(findings[0].assertion == Assertion::quoted);
    CHECK(findings[0].severity == Severity::advice);
  }
}

TEST_CASE("checker: a cue's reach ends at a semicolon and does not cover later sentences") {
  const auto after_semicolon =
      shipped().check("It would be wrong to ignore the DNA; the probability that he is the source is 1 in a million.");
  REQUIRE(after_semicolon.size() == 1);
  CHECK(after_semicolon[0].assertion == Assertion::asserted);
  const auto next_sentence =
      shipped().check("It would be wrong to say so. The probability that he is the source is 1 in a million.");
  REQUIRE(next_sentence.size() == 1);
  CHECK(next_sentence[0].assertion == Assertion::asserted);
}

TEST_CASE("checker: a posterior stated by the scientist is an error in casework only") {
  const std::string text = "Taking prior odds of 1 to 1,000, the probability that Mr Okafor is the source is 0.91.";
  CheckOptions casework, training;
  training.mode = CheckMode::training;
  const auto in_casework = shipped().check(text, casework);
  REQUIRE(in_casework.size() == 1);
  CHECK(in_casework[0].family == "posterior-in-casework");
  CHECK(shipped().check(text, training).empty());
  // A transposed conditional is an error in both modes.
  CHECK(shipped().check("The chance that this match is a coincidence is 1 in 200,000.", training).size() == 1);
}

TEST_CASE("checker: the rewrite is filled from the propositions and the number found") {
  CheckOptions options;
  options.hp = "the stain came from Mr Okafor";
  options.hd = "the stain came from an unknown person";
  const auto findings = shipped().check("The chance that someone else left the stain is 1 in a million.", options);
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].suggestion ==
        "The findings are about a million times more probable if the stain came from Mr Okafor than if the stain came "
        "from an unknown person.");
  const auto odds = shipped().check("It is 1,000 times more likely that he was at the scene.");
  REQUIRE(odds.size() == 1);
  CHECK(odds[0].suggestion == "The findings are about 1,000 times more probable if [Hp] than if [Hd].");

  CHECK(fill_suggestion("[N] if [Hp], not [Hd]; [Hp]", options, "") ==
        "[N] if the stain came from Mr Okafor, not the stain came from an unknown person; the stain came from Mr Okafor");
  CHECK(fill_suggestion("[N] times", {}, "200") == "200 times");
}

// With several alternatives to Hp the LR against the set compares Hp with all of them (Bayes'
// theorem for exclusive propositions; common practice), so a rewrite naming only the first would
// misstate what was compared: it names each, in order.
TEST_CASE("checker: with several alternatives the rewrite names every one") {
  CheckOptions options;
  options.hp = "The glass came from the pharmacy window.";
  options.hd = "The glass came from another window";  // the first alternative, as the case reader sets it
  options.alternatives = {"The glass came from another window.", "The glass came from the workshop at Cooper's Yard",
                          "Nothing is known of the source"};
  CHECK(fill_suggestion("The findings are about [N] times more probable if [Hp] than if [Hd].", options, "200") ==
        "The findings are about 200 times more probable if the glass came from the pharmacy window than if the glass "
        "came from another window, if the glass came from the workshop at Cooper's Yard or if nothing is known of the "
        "source.");
  options.alternatives.resize(1);
  CHECK(fill_suggestion("than if [Hd].", options, "") == "than if the glass came from another window.");
}

TEST_CASE("checker: which numbers give the LR for a rewrite") {
  const auto lr_text = [](const char* number) {
    const auto tokens = tokenise(number);
    REQUIRE(tokens.size() == 1);
    return likelihood_ratio_text(tokens[0]);
  };
  CHECK(lr_text("1 in a million") == "a million");
  CHECK(lr_text("one in 200") == "200");
  CHECK(lr_text("3 in 1,000").empty());  // not 1/N: left for the author
  CHECK(lr_text("10,000") == "10,000");
  CHECK(lr_text("99.9%").empty());
  CHECK(lr_text("0.001").empty());
  CHECK(lr_text("word").empty());
}

TEST_CASE("checker: spans point at the matched words in all three indexings") {
  // Two emoji (2 UTF-16 units each) and an accented name before the error.
  const std::string text = "\U0001F600\U0001F600 M. Ren\u00e9e said so. The chance that this match is a coincidence is 1 in 500.";
  const auto findings = shipped().check(text);
  REQUIRE(findings.size() == 1);
  const auto& f = findings[0];
  CHECK(text.substr(f.span.byte_begin, f.span.byte_end - f.span.byte_begin) == f.matched_text);
  CHECK(f.matched_text.rfind("chance that this match is a coincidence", 0) == 0);
  const std::size_t cp_before = 2 + std::string(" M. Ren\u00e9e said so. The ").size() - 1;  // é is 2 bytes, 1 code point
  CHECK(f.span.code_point_begin == cp_before);
  CHECK(f.span.utf16_begin == cp_before + 2);
  CHECK(f.span.code_point_end - f.span.code_point_begin == f.matched_text.size());  // the match is ASCII
  CHECK(text.substr(f.sentence.byte_begin, f.sentence.byte_end - f.sentence.byte_begin) ==
        "The chance that this match is a coincidence is 1 in 500.");
}

TEST_CASE("checker: findings in text order, one per family and sentence") {
  const auto findings = shipped().check(
      "It is 1,000 times more likely that he was there. The probability that he left the stain, or that he is the "
      "source, is 1 in 1,000. The fibres are consistent with the jumper.");
  REQUIRE(findings.size() == 3);
  CHECK(findings[0].family == "lr-as-odds");
  CHECK(findings[1].family == "source-probability");
  CHECK(findings[2].family == "match-as-evaluation");
  CHECK(findings[2].severity == Severity::warning);
  CHECK(findings[0].span.byte_begin < findings[1].span.byte_begin);
  CHECK(findings[1].span.byte_begin < findings[2].span.byte_begin);
}

TEST_CASE("checker: text without errors, empty text, and ill-formed UTF-8") {
  CHECK(shipped().check("").empty());
  CHECK(shipped().check("The findings are about 1,000 times more probable if Hp is true than if Hd is true.").empty());
  CHECK_THROWS_AS(shipped().check(std::string("The chance \xC3\x28 that")), counterpoise::validation::InvalidValue);
}

TEST_CASE("patterns: gaps, forbidden tokens, optional elements, phrases and built-in classes") {
  ClassTable classes;
  const auto known = [&](std::string_view name) { return classes.count(std::string(name)) > 0; };
  classes["who"].members = {compile_pattern("someone else", known, {}), compile_pattern("he", known, {})};
  const auto matches = [&](const char* pattern, const char* text) {
    const auto tokens = tokenise(text);
    std::vector<const Token*> pointers;
    for (const auto& t : tokens) pointers.push_back(&t);
    return find_first(compile_pattern(pattern, known, {}), pointers, classes).has_value();
  };
  CHECK(matches("chance ...0-2 source", "chance a b source"));
  CHECK_FALSE(matches("chance ...0-2 source", "chance a b c source"));
  CHECK_FALSE(matches("chance ...1-2 source", "chance source"));
  CHECK_FALSE(matches("chance ...0-4!if source", "chance if he is source"));
  CHECK(matches("chance that not? {who} left", "chance that someone else left"));
  CHECK(matches("chance that not? {who} left", "chance that not he left"));
  CHECK(matches("there+being|finding another", "there being another"));
  CHECK_FALSE(matches("there+being|finding another", "there another"));
  CHECK(matches("{frequency} chance", "a 1 in 200 chance"));
  CHECK_FALSE(matches("{frequency} chance", "a 0.005 chance"));
  CHECK(matches("{percent} sure", "99% sure"));
  CHECK(matches("{count} people", "200 people"));
  CHECK_FALSE(matches("{count} people", "1.5 people"));
  CHECK(matches("mr {name}", "Mr Okafor"));
  CHECK_FALSE(matches("mr {name}", "mr okafor"));
}

TEST_CASE("checker: quotation marks around one word do not hide the rest of the sentence") {
  // Scare quotes: the matched words are not all inside the quotation, so the author asserts them.
  const auto findings = shipped().check("The \u201cmatch\u201d proves that he was there.");
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].family == "match-as-evaluation");
  CHECK(findings[0].assertion == Assertion::asserted);
}
