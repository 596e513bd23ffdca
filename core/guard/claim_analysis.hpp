#pragma once
// The analysis of each expression of belief or chance in a sentence: numbers of chance and
// odds ("the probability that ...", "odds of 1,000 to 1 that ..."), "N times more likely",
// certainty adverbs and adjectives ("almost certainly", "in all probability", "it is highly
// probable that", "95 % certain that") and verbs that assert a proposition ("proves",
// "establishes", "confirms", "shows that"). For each the analysis decides
// - what it is about: the findings (an observation, a profile, "finding these fibres") or a
//   proposition about the source, an activity, the offence, or a named proposition (Hp, "the
//   prosecution case"), or that the match is a coincidence; and
// - what it is conditioned on: a proposition (a conditional frame in its clause: "if ...",
//   "assuming ...", "had the stain come from ..."), prior odds, the findings, or nothing.
// A claim about a proposition that is not conditioned on one is the error; the family follows
// from the target and the form (see claim_family). The words are the rule set's classes
// (docs/reasoning-guard.md lists them), so a laboratory extends them in its rule file.

#include <cstddef>
#include <string_view>
#include <vector>

#include "core/guard/clause_structure.hpp"
#include "core/guard/wording_rules.hpp"

namespace counterpoise::guard {

enum class ClaimForm { chance, odds, times, certainty, proof };
enum class ClaimTarget { source, activity, offence, hypothesis, coincidence, another_match };

struct Claim {
  std::size_t begin = 0, end = 0;  // tokens [begin, end): the expression and the proposition it is about
  ClaimForm form = ClaimForm::chance;
  ClaimTarget target = ClaimTarget::activity;
  bool conditioned_on_proposition = false;  // a frame about a proposition conditions it
  bool conditioned_on_prior = false;        // a frame about prior odds ("if the prior odds were ...")
  bool illustration = false;                // ... and the claim says what would follow ("would be")
  bool posterior_words = false;             // the sentence speaks of priors, posteriors, other evidence
  bool left_to_court = false;               // the sentence leaves the probability to the court
  bool match_as_proof = false;              // a proof verb whose subject is a match
  bool hypothetical = false;                // "would", "could" in its clause
  bool negated = false;                     // a negation or a question holds it ("does not prove", "...?"):
                                            // reported as advice, not as the author's error
  bool population_count = false;            // the sentence counts the people who share the trait
  bool categorical = false;                 // a plain attribution with no expression of belief
                                            // ("The fingermark is Mr X's"); not an error where the
                                            // text states the propositions themselves
  bool inferred = false;                    // the proposition was read from a person and the words
                                            // after them, not from a listed phrase (a weaker reading:
                                            // a rule's finding in the sentence explains it better)
};

// The claims about propositions in one sentence (claims about the findings are not listed).
// A question asks rather than asserts, so its claims are marked negated, unless
// `question_affirmed`: the witness's answer adopts it ("Q: So the odds he was there are 1,000 to
// 1? A: Yes.").
std::vector<Claim> find_claims(const std::vector<const Token*>& tokens, const ClauseStructure& structure,
                               const ClassTable& classes, ClassMatchCache& cache, bool question_affirmed = false);

// The family of the error a claim makes in `mode`, or empty when it makes none:
// conditioned on a proposition or left to the court → none; priors or posteriors in the
// sentence → posterior-in-casework (casework) or none (training); a proof verb on a match →
// match-as-evaluation; a chance of another person with the trait → another-match; a chance for
// a person drawn from a head count ("1 of 20 men, so a 5% chance") → defence-fallacy; odds or
// "N times more likely" → lr-as-odds; otherwise by the target:
// offence → ultimate-issue, source → source-probability, an activity, a named proposition or
// a coincidence → transposed-conditional.
std::string_view claim_family(const Claim& claim, CheckMode mode);

}  // namespace counterpoise::guard
