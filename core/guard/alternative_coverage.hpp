#pragma once
// Which alternatives a text weighs the findings against. A likelihood ratio is a weight of the
// findings for one proposition relative to another, so an evaluation is only meaningful with the
// alternative it was made against stated (ENFSI 2015, Guideline for Evaluative Reporting in
// Forensic Science, on propositions as pairs; section not checked, from memory). In a case with several alternatives, "the findings strongly support Hp over Hd"
// leaves the reader to guess which alternative is meant, and a text that weighs the findings
// against one alternative only says nothing of the others, although the result against them can
// differ by orders of magnitude (a brother against an unrelated person). The case guard points
// such wording out (case_guard.hpp, rule "single-alternative-wording").

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "core/casefile/case_model.hpp"

namespace counterpoise::guard {

struct AlternativeCoverage {
  // Some sentence weighs the findings: a likelihood ratio, "N times more probable", "more likely
  // if/given", "support(s)" or "favour(s)".
  bool weighs = false;
  // In a weighing sentence: an alternative named without saying which ("Hd", "the defence
  // proposition", "the alternative"), as written; empty when none.
  std::string unnamed;
  // Some sentence names the whole set ("each alternative", "the alternatives", "the weighted
  // set", "both alternatives").
  bool all = false;
  // The alternatives some sentence names by id or by their whole text (a weight is often spread
  // over sentences: "... 10^6 against Hd1. It is 300 against Hd2."), by index in the case's list,
  // in order, each once.
  std::vector<std::size_t> named;
};

// What `text` weighs the findings against, among `alternatives`. Throws as tokenise for
// ill-formed UTF-8.
AlternativeCoverage alternative_coverage(std::string_view text, const std::vector<casefile::Alternative>& alternatives);

// The warning for a text of a case with two or more alternatives, or an empty string: a weighing
// sentence names an alternative without saying which, or the text weighs the findings against
// some of the alternatives and not the others, or against none by name. The message names the
// alternatives left out by id and text.
std::string alternative_coverage_problem(const AlternativeCoverage& coverage,
                                         const std::vector<casefile::Alternative>& alternatives);

}  // namespace counterpoise::guard
