#pragma once
// Items of a case with several alternatives to Hp: a model gives its probability of the findings
// under each alternative, and the case holds one model of Hp against each. A model family that
// can do so has an AlternativesReader (model_registry.cpp); one that cannot is refused, naming
// the item and the alternatives.
//
// Two forms of per-alternative input:
// - keyed by proposition id ("p_given": {"Hp": ..., "Hd1": ..., "Hd2": ...}), read by the model;
// - an "alternatives" object with one entry per alternative holding the fields that differ
//   ({"Hd1": {"relationship": "unrelated"}, "Hd2": {"relationship": "full-sibling"}}), read by
//   read_per_alternative below: each entry's fields replace the item's shared ones and the
//   model's own reader reads the result.

#include <functional>
#include <initializer_list>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/evidence_model.hpp"

namespace counterpoise::models {

// Reads the models of one item, one per id of `alternative_ids` and in that order. Throws
// validation::Error naming the item and the field (and the alternative) at the first problem.
using AlternativesReader = std::vector<EvidenceModelPtr> (*)(const nlohmann::json& item,
                                                             std::span<const std::string> alternative_ids,
                                                             const ReadContext& context);

// Reads one item as a two-proposition item (the signature of ModelReader).
using SingleReader = std::function<EvidenceModelPtr(const nlohmann::json& item, const ReadContext& context)>;

// The member that holds per-alternative entries.
inline constexpr const char* kAlternativesField = "alternatives";

// Reads item["alternatives"] as described above. `overridable` lists the fields an entry may
// hold; `read` is the model's single-alternative reader (a ModelReader, or a function that
// prepares the merged item for one before calling it). Throws validation::InvalidValue naming
// "alternatives" when it is missing or not an object, "alternatives.<id>" for an entry missing
// for an alternative, an entry whose id is not an alternative, an entry that is not an object or
// holds a field not in `overridable`; a problem with an entry's field names
// "alternatives.<id>.<field>", as does one with a field an entry may hold that neither the entry
// nor the item gives (a missing field); a problem with a shared field is the model reader's own.
std::vector<EvidenceModelPtr> read_per_alternative(const nlohmann::json& item, std::span<const std::string> alternative_ids,
                                                   std::initializer_list<std::string_view> overridable,
                                                   const SingleReader& read, const ReadContext& context);

// Checks that the object `keyed` (the field `where`) has exactly one member per id: "Hp" first
// when `with_hp`, then each alternative id. Throws validation::InvalidValue naming
// "<field>.<key>" for a key that is no proposition's id, and "<field>.<id>" for a missing one.
void check_proposition_keys(const nlohmann::json& keyed, std::span<const std::string> alternative_ids, bool with_hp,
                            const validation::Location& where);

}  // namespace counterpoise::models
