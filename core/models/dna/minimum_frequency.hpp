#pragma once
// The minimum allele frequency: rare and unseen alleles are given a floor frequency, 5/2N for a
// database of N people (NRC II 1996, p. 148, as cited in Butler 2005, "Forensic DNA Typing" 2nd
// ed., ch. 21) or a configured value. Shared by the DNA models so every profile, single-source or
// mixed, floors its alleles the same way.

#include <optional>
#include <string>

#include <nlohmann/json.hpp>

#include "core/models/dna/allele_frequencies.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::models::dna {

// How rare and unseen alleles are floored.
struct MinimumFrequencyRule {
  enum class Kind { automatic, five_over_2n, fixed, none };
  Kind kind = Kind::automatic;  // automatic: 5/2N wherever the database size is known
  double value = 0.0;           // for fixed
};

// The floor in force at one locus (value 0: none).
struct LocusFloor {
  double value = 0.0;
  std::string rule_text;  // "5/2N (2N = 604 alleles)" or "min_allele_frequency"
};

// The frequency an allele is given, with what the table lists.
struct FlooredFrequency {
  double value = 0.0;
  std::optional<double> listed;  // nullopt when the table does not list the allele
  bool floored = false;          // the minimum frequency was used
};

// Reads the item's optional "min_allele_frequency": a number in (0, 1], "5/2N" or "none"
// (absent: automatic). Throws validation::InvalidValue naming the field for anything else.
MinimumFrequencyRule read_minimum_frequency_rule(const nlohmann::json& item, const validation::Location& where);

// The floor at `locus` under `rule`. Throws validation::InvalidValue at the item's
// min_allele_frequency field when the rule is "5/2N" and the locus has no database size.
LocusFloor locus_floor(const LocusFrequencies& locus, const MinimumFrequencyRule& rule,
                       const std::string& locus_name, const validation::Location& where);

// The frequency of `allele` at `locus`: as listed when at least the floor, else the floor.
// Throws validation::InvalidValue at `at` when the allele is missing (or listed below the floor)
// and no floor applies.
FlooredFrequency floored_frequency(const LocusFrequencies& locus, const std::string& allele,
                                   const LocusFloor& floor, const std::string& locus_name,
                                   const validation::Location& at);

}  // namespace counterpoise::models::dna
