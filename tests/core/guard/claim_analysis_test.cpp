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

// The shipped rules alone: these pairs test the claim analysis. The learned reading beside it
// is measured on corpora in wording_model_test.cpp (it flags, for example, the correct
// "The blood on the gate may have come from Mr Tallis." below; docs/reasoning-guard.md).
const WordingChecker& shipped() {
  static const WordingChecker checker(WordingChecker::load_default().rules());
  return checker;
}

// The families the checker flags (errors and warnings) in `text`, joined by spaces.
std::string flagged(const std::string& text, CheckMode mode = CheckMode::casework) {
  CheckOptions options;
  options.mode = mode;
  std::string out;
  for (const auto& f : shipped().check(text, options))
    if (f.severity != Severity::advice) out += (out.empty() ? "" : " ") + f.family;
  return out;
}

}  // namespace

TEST_CASE("claims: a frame of 'given' naming what was found does not condition a claim, a clause does") {
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
  // What a result "means that" is the clause compared, not the result that introduces it.
  CHECK(flagged("My likelihood ratio of 500 means that Mr Tallis's having forced the door is 500 times more likely "
                "than his not having done so.") == "lr-as-odds");
  CHECK(flagged("My likelihood ratio of 500 means that the toolmarks are 500 times more likely if Mr Tallis forced "
                "the door than if another person did.") == "");
}

TEST_CASE("claims: an activity is something a person did, not an event of a thing") {
  CHECK(flagged("The examination report confirms that an entry was written to the device's log at 02:14.") == "");
  CHECK(flagged("The examination report confirms that Mr Tallis wrote the entry to the device's log at 02:14.") ==
        "transposed-conditional");
  CHECK(flagged("The chance that the defendant did not inhale the solvent deliberately is very small.") ==
        "transposed-conditional");
}

TEST_CASE("claims: a participle after a trace does not stop the claim, an observation at its head does") {
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

TEST_CASE("claims: an opinion frame states its proposition, unless it withholds it or holds a finding") {
  CHECK(flagged("In my opinion, on the glass evidence alone, Mr Tallis broke the scullery window.") ==
        "transposed-conditional");
  CHECK(flagged("It is my opinion that Ms Quarrie is the person responsible for the arson at the mill.") ==
        "ultimate-issue");
  // What the opinion is about is the findings: the correct form.
  CHECK(flagged("In my opinion the glass findings are about 200 times more probable if Mr Tallis broke the window "
                "than if he did not.") == "");
  // The opinion withheld.
  CHECK(flagged("In my view it is not possible to say that Mr Tallis broke the window.") == "");
  // An inner expression states the claim once.
  CHECK(flagged("In my opinion Mr Tallis is almost certainly the burglar.") == "ultimate-issue");
}

TEST_CASE("claims: 'I would say' is the speaker's conclusion, not a supposition") {
  CHECK(flagged("Combining the DNA with the eyewitness evidence, I would say Mr Tallis is almost certainly the "
                "source.") == "posterior-in-casework");
  // A supposition about the prior stays an illustration.
  CHECK(flagged("Say the prior odds were 1 to 100: the posterior odds would then be 10 to 1.") == "");
}

TEST_CASE("claims: a yes/no question adopted by the answer asserts what it asks") {
  const std::string question = "Q: So in your view Ms Quarrie is guilty?";
  CHECK(flagged(question + " A: On the paint evidence, yes, I would say so.") == "ultimate-issue");
  CHECK(flagged(question + " A: No. That is a matter for the jury.") == "");
  // A question asking for a value is adopted by a value, not corrected by one.
  CHECK(flagged("Q: What is the probability that Mr Tallis was in the van? A: Very high, about 99 %.") ==
        "transposed-conditional");
  CHECK(flagged("Q: Does the likelihood ratio of 200 mean a 200 to 1 chance that Mr Tallis was in the van? A: It "
                "means the findings are 200 times more probable if he was in the van than if he was not.") == "");
}

TEST_CASE("claims: a condition inside a reason closed before the claim does not condition the claim") {
  CHECK(flagged("Since the fibres would be very improbable if Ms Quarrie had not sat in the car, she very probably "
                "sat in the car.") == "transposed-conditional");
  CHECK(flagged("If Ms Quarrie had not sat in the car, the fibres would be very improbable.") == "");
  // The same holds for what an adopted question asks: its reason is conditioned, its conclusion not.
  CHECK(flagged("Q: Since the fibres would be very improbable if she had not sat in the car, Ms Quarrie sat in the "
                "car? A: Yes.") == "transposed-conditional");
  CHECK(flagged("Q: If Ms Quarrie had not sat in the car, the fibres would be very improbable? A: Yes.") == "");
}

TEST_CASE("claims: a chance said of its subject, and a bracketed aside inside a clause") {
  CHECK(flagged("Another person having the same profile as Mr Tallis is a one-in-ten-million chance.") ==
        "another-match");
  CHECK(flagged("A random person having the same profile as Mr Tallis is a one-in-ten-million chance.") == "");
  CHECK(flagged("It is very unlikely (one in ten million) that the DNA came from someone other than Mr Tallis.") ==
        "source-probability");
  CHECK(flagged("The probability of the findings (the profile at all 20 loci) is one in ten million if the DNA came "
                "from someone other than Mr Tallis.") == "");
}

TEST_CASE("claims: 'N times the probability' compares two chances of propositions") {
  CHECK(flagged("The probability that the hair is Mr Tallis's is 250 times the probability that it is someone "
                "else's.") == "lr-as-odds");
  CHECK(flagged("The probability of the findings if the hair is Mr Tallis's is 250 times the probability of the "
                "findings if it is someone else's.") == "");
}

TEST_CASE("claims: a claim inside a quotation is about what the quotation says") {
  CHECK(flagged("Ms Quarrie is almost certainly the source of the DNA on the pruning saw.") == "source-probability");
  const auto findings = shipped().check(
      "The note in the police summary that \"Ms Quarrie is almost certainly the source of the DNA\" is not a "
      "scientific conclusion.");
  REQUIRE(findings.size() == 1);
  CHECK(findings[0].assertion == Assertion::quoted);
  CHECK(findings[0].matched_text.find("conclusion") == std::string::npos);
}

TEST_CASE("claims: a negation before the 'that' of a clause withholds the clause") {
  CHECK(flagged("I am not in a position to say that the DNA is more likely than not to be Mr Tallis's.") == "");
  CHECK(flagged("I am in a position to say that the DNA is more likely than not to be Mr Tallis's.") ==
        "source-probability");
}

TEST_CASE("claims: 'match probability' names a quantity, not a chance of a proposition") {
  CHECK(flagged("The conditional match probability for another unrelated man from the same community as Mr Tallis "
                "is 1 in 9 million.") == "");
  CHECK(flagged("The probability that another unrelated man from the same community shares Mr Tallis's profile is "
                "1 in 9 million.") == "another-match");
}

TEST_CASE("claims: a proof verb whose phrase holds its own 'that' opens the clause after it") {
  CHECK(flagged("The findings show that the resin came from the block in Mr Tallis's shed.") == "source-probability");
  CHECK(flagged("The findings show that the resin and the block have the same cannabinoid profile.") == "");
}

TEST_CASE("claims: a verb that is itself a verdict, and a passive with an infinitive clause") {
  CHECK(flagged("The cell-site evidence exonerates Ms Quarrie completely.") == "ultimate-issue");
  CHECK(flagged("The cell-site evidence would exonerate Ms Quarrie only if the handset was hers.") == "");
  CHECK(flagged("The burglary is shown by the footwear evidence to have been committed by Mr Tallis.") ==
        "ultimate-issue");
  CHECK(flagged("The footwear marks are shown in Figure 3.") == "");
}

TEST_CASE("claims: a question put to the witness is not a proposition that conditions the answer") {
  CHECK(flagged("Were the jury to ask me, I would tell them that the paint proves Ms Quarrie damaged the car.") ==
        "transposed-conditional");
  CHECK(flagged("Were Ms Quarrie the person who damaged the car, the paint on her coat would be expected.") == "");
}

TEST_CASE("claims: made with a kind of thing is an observation, made with a particular one is a source") {
  CHECK(flagged("The analysis shows that both entries were written with a blue ballpoint ink.") == "");
  CHECK(flagged("The analysis shows that both entries were written with the pen from Mr Tallis's desk.") ==
        "source-probability");
}

TEST_CASE("claims: a verb that ties a person to a place or an offence, said by the findings") {
  CHECK(flagged("The soil on the spade ties Mr Tallis to the burglary at the mill.") == "ultimate-issue");
  CHECK(flagged("The fibres on the seat place Ms Quarrie in the van.") == "transposed-conditional");
  // Said after a comparison, the verb makes the comparison the conclusion.
  CHECK(flagged("The paint flake is a match to the van, which places Mr Tallis at the mill.") == "match-as-evaluation");
  CHECK(flagged("The profile from the cup matches Mr Tallis, linking him to the scene.") == "match-as-evaluation");
  // Negated, reported by a party, hypothetical or conditioned, it asserts nothing.
  CHECK(flagged("The soil on the spade does not tie Mr Tallis to the burglary.") == "");
  CHECK(flagged("The prosecution says the fibres place Ms Quarrie in the van.") == "");
  CHECK(flagged("Fibres of this kind would place Ms Quarrie in the van only if no other source existed.") == "");
  CHECK(flagged("The report puts it beyond doubt that the van was at the mill.") == "");
}

// The numerical conversion error: a frequency read as a count of the people who share the
// characteristic (Koehler 1993, Error and exaggeration in the presentation of DNA evidence at
// trial, Jurimetrics 34:21).
TEST_CASE("rules: a frequency read as uniqueness, however the uniqueness is worded") {
  CHECK(flagged("Because the frequency is 1 in 3 billion, nobody else alive shares this profile.") ==
        "numerical-conversion");
  CHECK(flagged("The rarity is such that this profile exists once in the county, in Mr Tallis.") == "numerical-conversion");
  CHECK(flagged("With a frequency of 1 in 80,000 in a town this size it can only be Mr Tallis.") ==
        "numerical-conversion");
  // Reported, refuted or about those tested, the same words are correct.
  CHECK(flagged("A frequency of 1 in 3 billion does not mean that nobody else shares this profile.") == "");
  CHECK(flagged("Nobody else searched in the database of 2,000 profiles shares this profile.") == "");
  // Uniqueness said of a trait is the same conversion with the frequency left unsaid; said to be
  // likely, it is the chance of another match instead.
  CHECK(flagged("The mark on the sill is one of a kind: no one else could have it.") == "numerical-conversion");
  CHECK(flagged("This profile is unique to Mr Tallis.") == "numerical-conversion");
  CHECK(flagged("No other man in the town is likely to carry this profile.") != "numerical-conversion");
}

// The families' boundary as docs/reasoning-guard.md states it (common practice of the
// hierarchy of propositions: presence and acts are activity level, the offence is the court's).
TEST_CASE("claims: an act that is the offence itself is the ultimate issue, being at its scene is presence") {
  CHECK(flagged("It is extremely likely that Ms Quarrie took part in the robbery.") == "ultimate-issue");
  CHECK(flagged("It is extremely likely that Mr Tallis was one of the burglars.") == "ultimate-issue");
  CHECK(flagged("It is extremely likely that Ms Quarrie was present during the robbery.") == "transposed-conditional");
  CHECK(flagged("It is extremely likely that Ms Quarrie broke the window.") == "transposed-conditional");
}

TEST_CASE("claims: confidence, qualified doubt, 'suggests', 'points to' and 'proof of' state a proposition") {
  CHECK(flagged("We can say with 99.9% confidence that Mr Tallis is the writer of the note.") == "source-probability");
  CHECK(flagged("The marks were, beyond reasonable scientific doubt, made by the chisel from his van.") ==
        "source-probability");
  CHECK(flagged("The fibre findings strongly suggest that Ms Quarrie sat in the van.") == "transposed-conditional");
  CHECK(flagged("The paint points overwhelmingly to Mr Tallis being the one who robbed the mill.") == "ultimate-issue");
  CHECK(flagged("The residue findings are strong proof of Mr Tallis's guilt.") == "ultimate-issue");
  // About the findings, or conditioned on a proposition, the same words are correct.
  CHECK(flagged("We can say with confidence that the two marks share these class characteristics.") == "");
  CHECK(flagged("The findings suggest that further sampling of the van would be useful.") == "");
  CHECK(flagged("If Ms Quarrie sat in the van, the fibre findings would strongly suggest contact with the seat.") == "");
}

TEST_CASE("claims: a chance that anyone but the person is the source, an estimate is the speaker's own") {
  CHECK(flagged("There is just a 0.001% chance that the blood belonged to anyone but Mr Tallis.") ==
        "source-probability");
  CHECK(flagged("I would estimate that the chance of another jacket carrying this dye is under 1 in 1,000.") ==
        "another-match");
  CHECK(flagged("The chance of finding this blood if it came from anyone but Mr Tallis is 1 in a million.") == "");
}

TEST_CASE("claims: 'N times more credible' compares propositions as odds do") {
  CHECK(flagged("The likelihood ratio is 400, so the prosecution case is 400 times more credible than the defence case.") ==
        "lr-as-odds");
  CHECK(flagged("The findings are 400 times more probable if the prosecution case is true than if the defence case is.") ==
        "");
}

TEST_CASE("claims: an 'as' clause with no object of its own says its verb of the main clause") {
  CHECK(flagged("As the second examiner has confirmed, the hair in the van belongs to Ms Quarrie.") ==
        "source-probability");
  CHECK(flagged("As the second examiner has confirmed, the hair was sealed in bag 4 on arrival.") == "");
  CHECK(flagged("As the second examiner has confirmed, the findings are 300 times more probable if the hair "
                "came from Ms Quarrie than if it came from someone else.") == "");
}

TEST_CASE("claims: a certainty with a copula split around it, and the basis of a certainty") {
  // "are, more likely than not, from ...": the commas take the expression out; what is left is
  // a statement of source, whatever the source is.
  CHECK(flagged("The flakes on the gatepost are, more likely than not, from the blue van.") == "source-probability");
  CHECK(flagged("I'd put it at 98 % that Mr Tallis forced the gate.") == "transposed-conditional");
  // "certain from the striations": the certainty rests on the findings; its subject is the claim.
  CHECK(flagged("The ink line was drawn with a ballpoint pen; that much is certain from the striations.") == "");
}

// The defence attorney's fallacy (Thompson & Schumann 1987, Interpreting statistical evidence,
// Law and Human Behavior 11:167): a count of sharers read as making the findings worthless.
TEST_CASE("rules: a count of sharers read as making the findings count for nothing") {
  CHECK(flagged("Thousands of vans carry this paint, so the flakes count for nothing against Mr Tallis.") ==
        "defence-fallacy");
  CHECK(flagged("Hundreds of drivers own this tyre, so the tread mark does not implicate Ms Quarrie.") ==
        "defence-fallacy");
  CHECK(flagged("Hundreds of drivers own this tyre; the likelihood ratio of 40 takes that into account.") == "");
}

// "Match" as the conclusion (ENFSI 2015, Guideline for evaluative reporting in forensic science,
// which asks for the weight of a correspondence rather than the correspondence itself): a trace
// said to match a person or an object, not a reference measurement.
TEST_CASE("rules: a trace said to match a person or an object is offered as the answer") {
  CHECK(flagged("The flakes on the gatepost match the blue van.") == "match-as-evaluation");
  CHECK(flagged("The fingermark on the jar was matched to Mr Tallis's left thumb.") == "match-as-evaluation");
  // Matching a reference or control measurement is a finding; a hypothetical match is not stated.
  CHECK(flagged("The profile from the jar matches the reference profile of Mr Tallis at every locus.") == "");
  CHECK(flagged("A randomly chosen van would match the flakes with a probability of about 1 in 200.") == "");
}

// Cross-examination puts a proposition to the witness as true (common practice: a leading
// question asserts what it asks).
TEST_CASE("claims: a negative or tagged question asserts what it asks") {
  CHECK(flagged("Dr Penrose, isn't it very likely that Mr Tallis forced the gate?") == "transposed-conditional");
  CHECK(flagged("Mr Tallis very probably forced the gate, didn't he?") == "transposed-conditional");
  CHECK(flagged("Is it very likely that Mr Tallis forced the gate?") == "");
}

TEST_CASE("claims: certainty said through a negation ('cannot be doubted', 'not credible that'), 'neither ... nor' negates") {
  CHECK(flagged("It cannot seriously be doubted that Ms Quarrie was at the mill.") == "transposed-conditional");
  CHECK(flagged("It is not credible, on these findings, that Mr Tallis is innocent.") == "ultimate-issue");
  CHECK(flagged("There is little real doubt that Ms Quarrie forced the gate.") == "transposed-conditional");
  CHECK(flagged("The findings neither prove nor disprove that Ms Quarrie forced the gate.") == "");
}

TEST_CASE("claims: a certainty about what two things have in common is an observation") {
  CHECK(flagged("The alleles of the major component are without doubt the same as those in Mr Tallis's reference "
                "profile.") == "");
  CHECK(flagged("The blood on the sleeve is without doubt Mr Tallis's.") == "source-probability");
}

// Arson and drug supply are offences, not acts short of them (common practice of the hierarchy
// of propositions, as docs/reasoning-guard.md draws the families' boundary).
TEST_CASE("claims: setting the fire and supplying the drug are the offence itself") {
  CHECK(flagged("Mr Tallis almost certainly set fire to the barn.") == "ultimate-issue");
  CHECK(flagged("The fingermarks prove that Ms Quarrie was supplying cocaine from the flat.") == "ultimate-issue");
  CHECK(flagged("Mr Tallis almost certainly carried the can into the barn.") == "transposed-conditional");
}

// A list of conclusions tags each proposition with a certainty or a verbal level instead of
// weighing the findings (ENFSI 2015, Guideline for evaluative reporting in forensic science,
// section 2: conclusions are expressed as support for one proposition against another).
TEST_CASE("claims: a conclusion tag after a clause qualifies that clause") {
  CHECK(flagged("Conclusions: (1) Mr Tallis was present at the mill — highly probable.") == "transposed-conditional");
  CHECK(flagged("Source of the fingermark on the gate: Mr Tallis (certain).") == "source-probability");
  CHECK(flagged("Summary: Ms Quarrie forged the cheque (very strong).") == "ultimate-issue");
  // The control was observed; a table's verbal column is not a tag.
  CHECK(flagged("The control sample was analysed twice (confirmed).") == "");
  CHECK(flagged("The findings give very strong support (see section 4) to the proposition that Mr Tallis forced the "
                "gate rather than the proposition that he did not.") == "");
}

// The passive proof verb with its complement: "shown ... to have been committed by", "confirmed as".
TEST_CASE("claims: a passive proof verb with an 'as' phrase or an infinitive after a long subject") {
  CHECK(flagged("The stain on the gate has now been confirmed as Mr Tallis's.") == "source-probability");
  CHECK(flagged("The arson at the Old Mill has been shown by the laboratory to have been committed by Ms Quarrie.") ==
        "ultimate-issue");
  CHECK(flagged("The stain on the gate was confirmed as blood by a presumptive test.") == "");
}

// In casework the posterior belongs to the fact-finder (ENFSI 2015, Guideline for evaluative
// reporting, section 2.4); a posterior stated as a figure is the error whatever it is said of.
TEST_CASE("rules: a posterior stated as a figure in casework") {
  CHECK(flagged("The posterior odds are 1,000 to 1.") == "posterior-in-casework");
  CHECK(flagged("Posterior probability (Hp): 0.993.") == "posterior-in-casework");
  CHECK(flagged("With a prior of one half, the posterior for Mr Tallis being the donor is 0.9999.") ==
        "posterior-in-casework");
  CHECK(flagged("If the court's prior odds were 1 to 100, the posterior odds would be 10 to 1.") == "");
  CHECK(flagged("We give no posterior odds: the prior belongs to the court.") == "");
  CHECK(flagged("The posterior probability that Mr Tallis is the donor is a matter for the court.") == "");
}

// The transposed conditional written in symbols: P(H | E) given a value (Thompson & Schumann
// 1987, Interpreting statistical evidence, Law and Human Behavior 11:167); P(E | H) is the
// scientist's own quantity.
TEST_CASE("rules: P(proposition | findings) written out with a value") {
  CHECK(flagged("P(Mr Tallis forced the gate | glass findings) = 0.98.") == "transposed-conditional");
  CHECK(flagged("P(the glass findings | Mr Tallis forced the gate) = 0.9.") == "");
}

// A categorical source attribution states the source with certainty (ENFSI 2015, Guideline for
// evaluative reporting in forensic science: the findings are weighed given each proposition).
TEST_CASE("claims: a trace attributed to its source as a plain fact") {
  CHECK(flagged("The fingermark on the neck of the jar is Mr Tallis's.") == "source-probability");
  CHECK(flagged("The shoe mark on the mill floor was made by the left trainer seized from Mr Tallis.") ==
        "source-probability");
  CHECK(flagged("Hp: the blood on the gate came from Mr Tallis. Hd: it came from an unknown person.") == "");
  CHECK(flagged("The blood on the gate may have come from Mr Tallis.") == "");
  CHECK(flagged("The reference profile was taken from Mr Tallis.") == "");
}

// Set off by commas, an opinion frame qualifies its clause; a short quoted fragment in a
// headline quotes the expression, not a claim (common practice).
TEST_CASE("claims: a parenthetical opinion frame and a scare-quoted certainty qualify their clause") {
  CHECK(flagged("The glass fragments on the jacket came, in my opinion, from the mill window.") == "source-probability");
  CHECK(flagged("Our combined opinion is that Mr Tallis committed the offence charged.") == "ultimate-issue");
  CHECK(flagged("Experts: '99.9 % certain' paint came from the accused's van.") == "source-probability");
  CHECK(flagged("Mr Tallis's counsel put it to me that he \"must have forced the gate\"; I did not agree.") == "");
}

// A wording the writer quotes or reports and then adopts ("… which is fine", "full marks") is the
// writer's own statement; quoted to reject it, it is not (common practice: the labelling
// convention of the wording corpora, tests/data/guard/wording-corpus-dev7.txt header).
TEST_CASE("claims: a quoted or reported wording the writer endorses is the writer's error") {
  CHECK(flagged("Peer review: the author writes that the pellet \"most likely came from the suspect's air rifle\", "
                "which is fine.") == "source-probability");
  CHECK(flagged("Answer key: \"the DNA probably came from the suspect\" earns full marks.", CheckMode::training) ==
        "source-probability");
  CHECK(flagged("Peer review: the author writes that the pellet \"most likely came from the suspect's air rifle\", "
                "which is not acceptable.") == "");
  CHECK(flagged("The sentence \"the DNA probably came from the suspect\" was struck from the draft.") == "");
  CHECK(flagged("The appeal court held that the expert erred in telling the jury that Mr Tallis was very probably "
                "the donor.") == "");
  // Approval in a reviewer's or trainer's words (common practice in peer review and marking).
  CHECK(flagged("Review comment: happy with \"the DNA probably came from the suspect\" as the conclusion.") ==
        "source-probability");
  CHECK(flagged("Review comment: OK to state \"the DNA probably came from the suspect\".") == "source-probability");
  CHECK(flagged("Review comment: not happy with \"the DNA probably came from the suspect\" as the conclusion.") == "");
}

// Odds laid on a proposition with their value, and "N times surer", read the likelihood ratio as
// odds (Thompson & Schumann 1987, Law and Human Behavior 11:167; Evett 1995, Avoiding the
// transposed conditional, Science & Justice 35:127).
TEST_CASE("claims: odds laid on a proposition and 'N times surer' read the LR as odds") {
  CHECK(flagged("Given an LR of a billion, the odds on Mr Tallis being a contributor are a billion to one.") ==
        "lr-as-odds");
  CHECK(flagged("The soil LR of 300 means we can be 300 times surer that he was at the mill than that he was not.") ==
        "lr-as-odds");
  CHECK(flagged("The likelihood ratio tells how far the findings should move the odds on Hp, not how probable Hp is.") ==
        "");
}
