#pragma once
// Changes to the list of alternatives to Hp (propositions.alternatives, docs/case-format.md)
// together with what they do to the items' per-alternative values, so that an editor changes
// a case's alternatives without losing or orphaning any item's value:
// - switching a two-proposition case to several alternatives makes Hd the first alternative
//   and moves each item's value under Hd to that alternative (p_given_hp / p_given_hd become
//   p_given; a reported LR, a DNA relationship, a mixture's hd, a population_hd, the transfer
//   under Hd (t0_hd, tn_hd) or a network's proposition.hd becomes the alternative's entry, an
//   empty entry where the item has none of them);
// - switching back needs exactly one alternative and does the reverse;
// - renaming an alternative renames the keys that name it in every item;
// - removing an alternative removes the values the items hold for it, which values_naming lists
//   first so the user can be told which are lost.
// Items of a model that takes no per-alternative values would be left as they are (the reader
// names them, with the alternatives, in a case with several); every model now takes them.
//
// Each function works on a case document (as read from the interchange file or a case store)
// and returns the new propositions section and the bodies of the items that change.

#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

namespace counterpoise::interchange {

struct AlternativesEdit {
  nlohmann::json propositions;                                 // the whole new propositions section
  std::vector<std::pair<std::string, nlohmann::json>> items;   // (id, new body) of each item that changes
};

// A value an item holds for one alternative: the item, the field it sits in (as the reader names
// it: "p_given.Hd2", "alternatives.Hd2") and the value.
struct AlternativeValue {
  std::string item;
  std::string field;
  nlohmann::json value;
};

// The id the first alternative takes when a two-proposition case gets several.
inline constexpr const char* kFirstAlternativeId = "Hd1";

// A problem of the list in the user's words: "Alternative 2 (Hd1), id: duplicate alternative id
// "Hd1"": the alternative by its place in the list and its id, the field, the reader's message.
std::string alternative_problem_words(const validation::Problem& problem, const nlohmann::json& alternatives);

// An id of the form "Hd<n>" that no alternative in `alternatives` has (the lowest n ≥ size+1).
std::string fresh_alternative_id(const nlohmann::json& alternatives);

// Hd becomes the alternative "Hd1" with Hd's text; items as described above. Throws
// validation::InvalidValue naming propositions.alternatives when the case has them already.
AlternativesEdit to_several_alternatives(const nlohmann::json& document);

// The one alternative becomes Hd (its text kept; its id, weight and mark are dropped); items as
// described above. Throws validation::InvalidValue naming propositions.alternatives when the
// case has no alternatives or more than one (saying how many to remove first).
AlternativesEdit to_two_propositions(const nlohmann::json& document);

// The alternative `from` is called `to` in the list and in every item. Throws
// validation::InvalidValue naming propositions.alternatives.<from> when there is no such
// alternative, and the reader's message when the list with the new id does not read (an empty
// id, "Hp", the id of another alternative).
AlternativesEdit rename_alternative(const nlohmann::json& document, const std::string& from, const std::string& to);

// The values items hold for alternative `id`, in item order.
std::vector<AlternativeValue> values_naming(const nlohmann::json& document, const std::string& id);

// The alternative `id` leaves the list and every item's value for it is removed (those
// values_naming lists). Throws validation::InvalidValue naming propositions.alternatives.<id>
// when there is no such alternative or it is the only one (switch to two propositions instead).
AlternativesEdit remove_alternative(const nlohmann::json& document, const std::string& id);

}  // namespace counterpoise::interchange
