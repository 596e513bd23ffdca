#pragma once
// Helpers for the DNA mixture tests: reading an item, and items built from allele frequencies.

#include <memory>
#include <string>

#include <nlohmann/json.hpp>

#include "core/models/dna_mixture/dna_mixture_model.hpp"

namespace mixture_test {

inline counterpoise::models::ReadContext context() {
  return counterpoise::models::ReadContext{{}, counterpoise::validation::Location{"M1", ""}};
}

inline std::shared_ptr<const counterpoise::models::dna_mixture::DnaMixtureModel> read(const nlohmann::json& item) {
  auto model = counterpoise::models::dna_mixture::read_dna_mixture_model(item, context());
  return std::dynamic_pointer_cast<const counterpoise::models::dna_mixture::DnaMixtureModel>(model);
}

// An item at one locus, D8S1179, with the frequencies given as an inline table and no minimum
// frequency (so every allele must be listed).
inline nlohmann::json one_locus_item(const nlohmann::json& observed, const nlohmann::json& references,
                                     const nlohmann::json& hp, const nlohmann::json& hd,
                                     const nlohmann::json& table, double theta, double dropout, double dropin) {
  nlohmann::json refs = nlohmann::json::object();
  for (auto it = references.begin(); it != references.end(); ++it) refs[it.key()] = {{"D8S1179", it.value()}};
  return {{"id", "M1"},
          {"model", "dna-mixture"},
          {"theta", theta},
          {"observed", {{"D8S1179", observed}}},
          {"references", refs},
          {"hp", hp},
          {"hd", hd},
          {"dropout", dropout},
          {"dropin", dropin},
          {"min_allele_frequency", "none"},
          {"frequencies", {{"table", {{"D8S1179", table}}}}}};
}

}  // namespace mixture_test
