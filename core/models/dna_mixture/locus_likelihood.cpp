#include "core/models/dna_mixture/locus_likelihood.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <stdexcept>
#include <unordered_map>

#include "core/models/dna_mixture/unknown_genotypes.hpp"

namespace counterpoise::models::dna_mixture {

namespace {

constexpr int kMaxCopies = 2 * kMaxContributors;

// d^h d2^m from tables of powers (h <= 8, m <= 4).
struct Powers {
  std::array<double, kMaxCopies + 1> d{};
  std::array<double, kMaxContributors + 1> d2{};
  explicit Powers(const Dropout& dropout) {
    d[0] = d2[0] = 1.0;
    for (int i = 1; i <= kMaxCopies; ++i) d[i] = d[i - 1] * dropout.d;
    const double hom = dropout.d2();
    for (int i = 1; i <= kMaxContributors; ++i) d2[i] = d2[i - 1] * hom;
  }
  double all_lost(int heterozygous, int homozygous) const { return d[heterozygous] * d2[homozygous]; }
};

std::uint8_t code_of(const ClassCopies& c) { return static_cast<std::uint8_t>(c.heterozygous * 5 + c.homozygous); }

void add_genotype(std::vector<ClassCopies>& copies, const ClassGenotype& g) {
  if (g.homozygote()) {
    ++copies[g.first].homozygous;
  } else {
    ++copies[g.first].heterozygous;
    ++copies[g.second].heterozygous;
  }
}

double dropin_factor(const LocusClasses& locus, std::span<const ClassCopies> copies, double dropin) {
  int drop_ins = 0;
  double product = 1.0;
  for (std::size_t j = 0; j < copies.size(); ++j) {
    if (!locus.classes[j].observed || copies[j].carried()) continue;
    ++drop_ins;
    product *= dropin * locus.classes[j].frequency;
  }
  return drop_ins == 0 ? 1.0 - dropin : product;
}

}  // namespace

double observation_probability(const LocusClasses& locus, std::span<const ClassCopies> copies, double dropin,
                               const Dropout& dropout) {
  const Powers powers(dropout);
  double p = dropin_factor(locus, copies, dropin);
  for (std::size_t j = 0; j < copies.size(); ++j) {
    if (!copies[j].carried()) continue;
    const double lost = powers.all_lost(copies[j].heterozygous, copies[j].homozygous);
    p *= locus.classes[j].observed ? 1.0 - lost : lost;
  }
  return p;
}

LocusLikelihood::LocusLikelihood(const LocusClasses& locus, const LocusContributors& contributors, double theta,
                                 double dropin) {
  if (contributors.total() > kMaxContributors)
    throw std::invalid_argument("LocusLikelihood: more than 4 contributors");
  if (!(dropin >= 0.0 && dropin <= 1.0)) throw std::invalid_argument("LocusLikelihood: dropin outside [0, 1]");
  const std::size_t k = locus.classes.size();
  std::vector<ClassCopies> known(k);
  for (const auto& g : contributors.known) add_genotype(known, g);

  // Terms are keyed by their drop-out pattern: the sorted (het, hom) codes of the carried
  // observed classes (6 bits each), their number, and the copies that must all drop out.
  std::unordered_map<std::uint64_t, std::size_t> index;
  std::vector<ClassCopies> copies(k);
  for_each_unknown_genotype_set(locus, contributors.unknowns, theta,
                                [&](std::span<const ClassGenotype> unknowns, double probability) {
    copies = known;
    for (const auto& g : unknowns) add_genotype(copies, g);
    const double weight = probability * dropin_factor(locus, copies, dropin);
    if (weight == 0.0) return;
    ++genotype_sets_;
    Term term{};
    for (std::size_t j = 0; j < k; ++j) {
      if (!copies[j].carried()) continue;
      if (locus.classes[j].observed) {
        term.present[term.present_count++] = code_of(copies[j]);
      } else {
        term.dropped_heterozygous = static_cast<std::uint8_t>(term.dropped_heterozygous + copies[j].heterozygous);
        term.dropped_homozygous = static_cast<std::uint8_t>(term.dropped_homozygous + copies[j].homozygous);
      }
    }
    std::sort(term.present, term.present + term.present_count);
    std::uint64_t key = term.present_count;
    key = (key << 4) | term.dropped_heterozygous;
    key = (key << 3) | term.dropped_homozygous;
    for (int i = 0; i < term.present_count; ++i) key = (key << 6) | term.present[i];
    auto [it, inserted] = index.try_emplace(key, terms_.size());
    if (inserted) {
      term.weight = weight;
      terms_.push_back(term);
    } else {
      terms_[it->second].weight += weight;
    }
  });
}

double LocusLikelihood::probability(const Dropout& dropout) const {
  const Powers powers(dropout);
  double sum = 0.0;
  for (const Term& term : terms_) {
    double p = term.weight * powers.all_lost(term.dropped_heterozygous, term.dropped_homozygous);
    for (int i = 0; i < term.present_count; ++i)
      p *= 1.0 - powers.all_lost(term.present[i] / 5, term.present[i] % 5);
    sum += p;
  }
  return sum;
}

}  // namespace counterpoise::models::dna_mixture
