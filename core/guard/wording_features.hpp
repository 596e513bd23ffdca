#pragma once
// What the learned reading (wording_model.hpp) sees of a sentence: its words and numbers as
// features. A feature is a folded word ("certainly"), a number by its form ("#", "#%", "#in"),
// two neighbouring tokens ("almost certainly"), the first word ("^given"), whether any word is
// inside quotation marks ("quoted:yes") and the mode the text is checked in ("mode:training").
// The set is sorted and without repeats, so the score of a sentence does not depend on how often
// a word recurs (a binary bag of words and word pairs, the usual representation for short
// texts: Manning, Raghavan & Schütze 2008, Introduction to Information Retrieval, ch. 13).
// With the rule set's word classes it adds what the rules' own analysis sees: each word class
// present ("class:findings-noun") and each conditional frame by what it supposes
// ("frame:proposition", "frame:findings", "frame:prior", "frame:question"), so that the model can
// tell "the findings are more probable if he was there" from "he was more probably there".

#include <string>
#include <vector>

#include "core/guard/text_tokens.hpp"
#include "core/guard/wording_rules.hpp"

namespace counterpoise::guard {

// The features of `tokens` (the sentence's tokens without its quotation marks), read with the
// word classes of `classes`; `cache`, when given, holds the class matches of these same tokens.
std::vector<std::string> wording_features(const std::vector<const Token*>& tokens, CheckMode mode,
                                          const ClassTable& classes, ClassMatchCache* cache = nullptr);

}  // namespace counterpoise::guard
