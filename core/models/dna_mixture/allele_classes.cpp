#include "core/models/dna_mixture/allele_classes.hpp"

namespace counterpoise::models::dna_mixture {

int LocusClasses::observed_count() const {
  int n = 0;
  for (const auto& c : classes) n += c.observed ? 1 : 0;
  return n;
}

int LocusClasses::conditioning_total() const {
  int n = 0;
  for (const auto& c : classes) n += c.conditioning_copies;
  return n;
}

int LocusClasses::index_of(const std::string& allele) const {
  for (std::size_t i = 0; i < classes.size(); ++i)
    if (!classes[i].other && classes[i].allele == allele) return static_cast<int>(i);
  return -1;
}

}  // namespace counterpoise::models::dna_mixture
