#pragma once
// A single person's STR profile as a case file writes it: {locus: [allele, allele]}, one allele
// for a homozygote written once. Shared by the DNA models that read reference profiles.

#include <cstddef>
#include <map>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

namespace counterpoise::models::dna {

struct Profile {
  std::vector<std::pair<std::string, std::vector<std::string>>> loci;  // in the JSON object's order
  std::map<std::string, std::size_t> index;                            // by locus key (locus_key)

  // The genotype at the locus whose key equals that of `locus`, or nullptr.
  const std::vector<std::string>* find(const std::string& locus) const;
};

// An array of allele designations, each a non-empty string such as "9.3". Throws
// validation::InvalidValue at `at` for a value that is not an array, and at the allele's index
// for one that is not a string or is empty. `what` names the expected content in the message.
std::vector<std::string> read_allele_list(const nlohmann::json& value, const validation::Location& at,
                                          const std::string& what);

// A genotype: an array of one allele (read as a homozygote) or two, each a non-empty string.
// Throws validation::InvalidValue at `at` (or the allele's index) otherwise.
std::vector<std::string> read_genotype(const nlohmann::json& value, const validation::Location& at);

// A profile object {locus: genotype}. Throws validation::InvalidValue for a value that is not an
// object, a locus given twice (in any spelling) and everything read_genotype throws for.
Profile read_profile(const nlohmann::json& value, const validation::Location& at);

// The genotype as a sorted pair (a homozygote written once gives {a, a}).
std::pair<std::string, std::string> as_pair(const std::vector<std::string>& genotype);

}  // namespace counterpoise::models::dna
