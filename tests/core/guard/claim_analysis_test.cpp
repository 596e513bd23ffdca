// The structure the claim analysis reads from a sentence, each case as a pair: the error and
// the same words made correct by their structure. What makes a statement an error (a
// probability of a proposition not conditioned on one) follows Thompson & Schumann 1987 (Law
// and Human Behavior 11:167) and Koehler 1993 (Jurimetrics 34:21); that a probability of the
// findings given a proposition is the scientist's statement is common practice (the
// evaluative form of ENFSI 2015, Guideline for evaluative reporting in forensic science, §2).
// The sentences are written for these tests in the invented Harwick Vale scenario.
#include <catch2/catch.hpp>

#include <string>

#include "core/guard/wording_checker.hpp"

using namespace counterpoise::guard;

namespace {

const WordingChecker& shipped() {
  static const WordingChecker checker = WordingChecker::load_default();
  return checker;
}

// The families the checker flags (errors and warnings) in `text`, joined by spaces.
std::string flagged(const std::string& text) {
  std::string out;
  for (const auto& f : shipped().check(text))
    if (f.severity != Severity::advice) out += (out.empty() ? "" : " ") + f.family;
  return out;
}

}  // namespace

TEST_CASE("claims: a frame of 'given' naming what was found does not condition a claim; a clause does") {
  // "given the tyre marks" names the findings: the claim about Ms Quarrie is unconditioned.
  CHECK(flagged("There is a 98% probability that Ms Quarrie drove the van into the gate, given the tyre marks.") ==
        "transposed-conditional");
  // "given that she drove the van" is a proposition: the probability is of the findings.
  CHECK(flagged("Given that Ms Quarrie drove the van into the gate, the probability of these tyre marks is 0.6.") == "");
}

TEST_CASE("claims: a question asks, unless the witness's answer adopts it") {
  const std::string question = "Q: So the chance that Mr Tallis handled the crowbar is 99 percent?";
  CHECK(flagged(question) == "");
  CHECK(flagged(question + " A: Yes, that is correct.") == "transposed-conditional");
  CHECK(flagged(question + " A: No, that is not what the figure means.") == "");
}

TEST_CASE("claims: 'anybody but' and a hyphenated word stay inside their clause") {
  CHECK(flagged("The probability of the donor being anybody but Mr Tallis is 1 in 50,000.") == "source-probability");
  CHECK(flagged("It is near-certain that Mr Tallis forced the shed door.") == "transposed-conditional");
}

TEST_CASE("claims: odds stated for a proposition however it is named, not for the findings") {
  CHECK(flagged("The prosecution's version of events is 500 times more probable than the defence's.") == "lr-as-odds");
  CHECK(flagged("The evidence supports the proposition that Mr Tallis forced the door, which is 500 times more "
                "likely than the alternative.") == "lr-as-odds");
  // The findings as subject, the propositions as conditions: the correct form.
  CHECK(flagged("On the proposition that Mr Tallis forced the door, the toolmarks are about 500 times more probable "
                "than on the proposition that another person did.") == "");
  // "Mr Tallis made the toolmark" names who made it; the toolmark is not what the LR makes probable.
  CHECK(flagged("The proposition that Mr Tallis made the toolmark is 500 times more probable than the alternative.") ==
        "lr-as-odds");
}

TEST_CASE("claims: an activity is something a person did, not an event of a thing") {
  CHECK(flagged("The examination report confirms that an entry was written to the device's log at 02:14.") == "");
  CHECK(flagged("The examination report confirms that Mr Tallis wrote the entry to the device's log at 02:14.") ==
        "transposed-conditional");
  CHECK(flagged("The chance that the defendant did not inhale the solvent deliberately is very small.") ==
        "transposed-conditional");
}

TEST_CASE("claims: a participle after a trace does not stop the claim; an observation at its head does") {
  CHECK(flagged("There is no doubt that the fibre recovered from the seat is from Ms Quarrie's scarf.") ==
        "source-probability");
  CHECK(flagged("There is no doubt that recovering fibres from the seat was possible.") == "");
}

TEST_CASE("claims: a leading phrase with priors makes a posterior claim in casework, an example in training") {
  const std::string text =
      "Combining the glass likelihood ratio with the eyewitness evidence, the prosecution proposition is virtually certain.";
  CHECK(flagged(text) == "posterior-in-casework");
  CHECK(shipped().check(text, CheckOptions{CheckMode::training, "", ""}).empty());
}

TEST_CASE("claims: a claim read only from a person yields to the rule that explains the sentence") {
  // The numerical conversion, not a claim that he did something.
  CHECK(flagged("Mr Tallis must be the only man in Harwick Vale with this DNA profile.") == "numerical-conversion");
  // A random-match probability for a relative is not a claim about the relative.
  CHECK(flagged("The conditional match probability for a half-brother of Mr Tallis is about 1 in 8,000.") == "");
}
