#pragma once
// The one sentence that tells a reader what the reported likelihood ratio is and what its
// interval describes, so the report and the editor say the same thing. The reading follows
// Taroni, Bozza, Biedermann & Aitken (2016), "Dismissal of the illusion of uncertainty in the
// assessment of a likelihood ratio", Law, Probability and Risk 15:1 (from memory): the value of
// the findings is the ratio of the expected probabilities; the spread of the assigned
// probabilities is a sensitivity of that value, not a second, "true" likelihood ratio.

#include <string>

namespace counterpoise::uncertainty {

// "The reported likelihood ratio is worked out from the best (average) values of the
// probabilities the scientist assigned, ..." — one sentence, ending with a full stop.
const std::string& reported_value_and_interval_sentence();

}  // namespace counterpoise::uncertainty
