#include "core/models/dna_mixture/unknown_genotypes.hpp"

#include <stdexcept>
#include <vector>

namespace counterpoise::models::dna_mixture {

namespace {

struct Enumeration {
  const LocusClasses& locus;
  double theta;
  const GenotypeSetVisitor& visit;
  std::vector<ClassGenotype> genotypes;  // all unordered genotypes (i <= j)
  std::vector<int> counts;               // copies of each class sampled so far (named people first)
  int sampled = 0;                       // alleles sampled so far
  std::vector<ClassGenotype> chosen;
  std::vector<double> factorial{1, 1, 2, 6, 24};

  // The sampling formula for the next allele, then records it.
  double draw(int j) {
    const double p = (counts[j] * theta + (1.0 - theta) * locus.classes[j].frequency) /
                     (1.0 + (sampled - 1) * theta);
    ++counts[j];
    ++sampled;
    return p;
  }
  void undraw(int j) {
    --counts[j];
    --sampled;
  }

  double orderings() const {
    double ways = factorial[chosen.size()];
    std::size_t run = 1;
    for (std::size_t i = 1; i <= chosen.size(); ++i) {
      if (i < chosen.size() && chosen[i] == chosen[i - 1]) {
        ++run;
      } else {
        ways /= factorial[run];
        run = 1;
      }
    }
    return ways;
  }

  void recurse(std::size_t first_genotype, int remaining, double probability) {
    if (remaining == 0) {
      visit(chosen, probability * orderings());
      return;
    }
    for (std::size_t g = first_genotype; g < genotypes.size(); ++g) {
      const ClassGenotype genotype = genotypes[g];
      // Two orders of a heterozygote's alleles.
      double p = draw(genotype.first);
      p *= draw(genotype.second);
      if (!genotype.homozygote()) p *= 2.0;
      chosen.push_back(genotype);
      recurse(g, remaining - 1, probability * p);
      chosen.pop_back();
      undraw(genotype.second);
      undraw(genotype.first);
    }
  }
};

}  // namespace

void for_each_unknown_genotype_set(const LocusClasses& locus, int unknowns, double theta,
                                   const GenotypeSetVisitor& visit) {
  if (unknowns < 0 || unknowns > kMaxContributors)
    throw std::invalid_argument("for_each_unknown_genotype_set: unknowns outside [0, 4]");
  if (!(theta >= 0.0 && theta < 1.0))
    throw std::invalid_argument("for_each_unknown_genotype_set: theta outside [0, 1)");
  Enumeration e{locus, theta, visit, {}, {}, 0, {}};
  const int k = static_cast<int>(locus.classes.size());
  for (int i = 0; i < k; ++i)
    for (int j = i; j < k; ++j) e.genotypes.push_back({i, j});
  for (const auto& c : locus.classes) {
    e.counts.push_back(c.conditioning_copies);
    e.sampled += c.conditioning_copies;
  }
  e.recurse(0, unknowns, 1.0);
}

}  // namespace counterpoise::models::dna_mixture
