#include "core/models/dna/str_profile.hpp"

#include "core/models/dna/str_loci.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models::dna {

using nlohmann::json;
using validation::InvalidValue;
using validation::Location;

const std::vector<std::string>* Profile::find(const std::string& locus) const {
  auto it = index.find(locus_key(locus));
  return it == index.end() ? nullptr : &loci[it->second].second;
}

std::vector<std::string> read_allele_list(const json& value, const Location& at, const std::string& what) {
  if (!value.is_array()) throw InvalidValue(at, "expected " + what + ", found " + reading::json_type_name(value));
  std::vector<std::string> alleles;
  for (std::size_t i = 0; i < value.size(); ++i) {
    const Location allele_at{at.item, at.field + "[" + std::to_string(i) + "]"};
    if (!value[i].is_string())
      throw InvalidValue(allele_at, "an allele is written as a string such as \"9.3\", found " +
                                        reading::json_type_name(value[i]));
    std::string allele = value[i].get<std::string>();
    if (allele.empty()) throw InvalidValue(allele_at, "empty allele designation");
    alleles.push_back(std::move(allele));
  }
  return alleles;
}

std::vector<std::string> read_genotype(const json& value, const Location& at) {
  if (value.is_array() && (value.empty() || value.size() > 2))
    throw InvalidValue(at, "a single-source genotype has one or two alleles, found " +
                               std::to_string(value.size()) + (value.size() > 2 ? " (a mixture?)" : ""));
  return read_allele_list(value, at, "an array of one or two alleles");
}

std::pair<std::string, std::string> as_pair(const std::vector<std::string>& genotype) {
  std::string a = genotype[0], b = genotype.size() == 2 ? genotype[1] : genotype[0];
  if (b < a) std::swap(a, b);
  return {a, b};
}

Profile read_profile(const json& value, const Location& at) {
  reading::require_object(value, at);
  Profile profile;
  for (auto it = value.begin(); it != value.end(); ++it) {
    const Location locus_at = at.with_field(it.key());
    const std::string key = locus_key(it.key());
    if (!profile.index.emplace(key, profile.loci.size()).second)
      throw InvalidValue(locus_at, "locus " + key + " is given twice");
    profile.loci.emplace_back(it.key(), read_genotype(it.value(), locus_at));
  }
  return profile;
}

}  // namespace counterpoise::models::dna
