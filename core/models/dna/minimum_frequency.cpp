#include "core/models/dna/minimum_frequency.hpp"

#include "core/models/dna/str_loci.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"

namespace counterpoise::models::dna {

using numbers::exact_text;
using validation::InvalidValue;
using validation::Location;

MinimumFrequencyRule read_minimum_frequency_rule(const nlohmann::json& item, const Location& where) {
  const nlohmann::json* member = reading::find_member(item, "min_allele_frequency");
  MinimumFrequencyRule rule;
  if (!member) return rule;
  const Location at = where.with_field("min_allele_frequency");
  if (member->is_string()) {
    const std::string text = member->get<std::string>();
    if (text == "5/2N") rule.kind = MinimumFrequencyRule::Kind::five_over_2n;
    else if (text == "none") rule.kind = MinimumFrequencyRule::Kind::none;
    else throw InvalidValue(at, "expected a frequency in (0, 1], \"5/2N\" or \"none\", found '" + text + "'");
    return rule;
  }
  const double value = reading::read_number(*member, at);
  if (!(value > 0.0 && value <= 1.0))
    throw InvalidValue(at, "minimum allele frequency " + exact_text(value) + " is outside (0, 1]");
  rule.kind = MinimumFrequencyRule::Kind::fixed;
  rule.value = value;
  return rule;
}

LocusFloor locus_floor(const LocusFrequencies& locus, const MinimumFrequencyRule& rule,
                       const std::string& locus_name, const Location& where) {
  LocusFloor floor;
  const auto total = locus.allele_total();
  switch (rule.kind) {
    case MinimumFrequencyRule::Kind::fixed:
      floor.value = rule.value;
      floor.rule_text = "min_allele_frequency";
      break;
    case MinimumFrequencyRule::Kind::five_over_2n:
      if (!total)
        throw InvalidValue(Location{where.item, "min_allele_frequency"},
                           "5/2N needs the database size at locus " + locus_key(locus_name));
      [[fallthrough]];
    case MinimumFrequencyRule::Kind::automatic:
      if (total) {
        floor.value = 5.0 / static_cast<double>(*total);
        floor.rule_text = "5/2N (2N = " + std::to_string(*total) + " alleles)";
      }
      break;
    case MinimumFrequencyRule::Kind::none:
      break;
  }
  return floor;
}

FlooredFrequency floored_frequency(const LocusFrequencies& locus, const std::string& allele,
                                   const LocusFloor& floor, const std::string& locus_name, const Location& at) {
  FlooredFrequency result;
  auto it = locus.alleles.find(allele);
  if (it != locus.alleles.end() && it->second.frequency > 0.0) result.listed = it->second.frequency;
  if (result.listed && *result.listed >= floor.value) {
    result.value = *result.listed;
    return result;
  }
  if (floor.value <= 0.0)
    throw InvalidValue(at, "allele " + allele + " at locus " + locus_key(locus_name) +
                               (result.listed ? "" : " is not in the frequency table and") +
                               " has no minimum allele frequency to use (give min_allele_frequency, or the "
                               "database size for 5/2N)");
  result.value = floor.value;
  result.floored = true;
  return result;
}

}  // namespace counterpoise::models::dna
