#pragma once
// A list in running text: "Hd1", "Hd1 and Hd2", "Hd1, Hd2 and Hd3" (no comma before "and", as
// the reports and messages write it). One place for every list a person reads in a sentence.

#include <string>
#include <vector>

namespace counterpoise::validation {

// `items` joined by ", " with " and " before the last; empty for no items.
std::string list_in_words(const std::vector<std::string>& items);

}  // namespace counterpoise::validation
