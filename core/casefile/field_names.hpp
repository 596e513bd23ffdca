#pragma once
// The fields of a case in words, for a person reading the history (the editor's History tab and
// the command line's `history`): "P(E|Hp) of E4", not "item E4, p_given_hp". The JSON keys stay
// the file's; only what a person reads changes.

#include <string>
#include <string_view>

namespace counterpoise::casefile {

// One field of an item ("p_given_hp") or of a section ("hp") in words ("P(E|Hp)", "Hp"); a
// nested path keeps its tail in brackets ("profile.TH01" → "questioned profile (TH01)"). A key
// not known here is returned with its underscores as spaces, never dropped.
std::string field_words(std::string_view field);

// Whether field_words knows `field`'s key (rather than falling back to the key with spaces).
bool has_field_words(std::string_view field);

// Where a change was made, in words. `entity` is the audit's entity ("case", "section",
// "item"), `key` the section name or item id, `field` the field path ("" for the whole):
//   ("item", "E4", "p_given_hp")  → "P(E|Hp) of E4"
//   ("item", "E4", "")            → "item E4"
//   ("section", "propositions", "hp") → "Hp (propositions)"
//   ("section", "mode", "")       → "mode (casework or training)"
//   ("case", "", "import")        → "the whole case"
std::string change_place_words(std::string_view entity, std::string_view key, std::string_view field);

// An audit action ("set", "add", "remove", "move", "import", "open-revision", "seal") in words
// ("changed", "added", ...); an unknown action is returned as it is.
std::string action_words(std::string_view action);

}  // namespace counterpoise::casefile
