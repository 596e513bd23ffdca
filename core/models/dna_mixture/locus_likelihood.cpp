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

// Copies of one class carried by the contributors who follow the shared d, and whether anyone
// with an own rate carries it too.
struct ClassCopies {
  int heterozygous = 0;
  int homozygous = 0;
  bool own_rate = false;
  bool carried() const { return heterozygous + homozygous > 0 || own_rate; }
};

void add_genotype(std::vector<ClassCopies>& copies, const TypedContributor& c) {
  const ClassGenotype& g = c.genotype;
  if (c.group != kSharedDropout) {
    copies[g.first].own_rate = copies[g.second].own_rate = true;
  } else if (g.homozygote()) {
    ++copies[g.first].homozygous;
  } else {
    ++copies[g.first].heterozygous;
    ++copies[g.second].heterozygous;
  }
}

void add_unknown(std::vector<ClassCopies>& copies, const ClassGenotype& g) { add_genotype(copies, {g, kSharedDropout}); }

// Observed alleles no contributor carries are drop-ins; uncertain alleles need no explaining.
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

// Per class, the probability that every copy carried by the given contributors drops out.
std::vector<double> loss_by_class(std::size_t classes, std::span<const TypedContributor> contributors,
                                  const Dropout& dropout) {
  std::vector<double> loss(classes, 1.0);
  for (const auto& c : contributors) {
    const DropoutRate rate = dropout.rate(c.group);
    if (c.genotype.homozygote()) {
      loss[c.genotype.first] *= rate.d2();
    } else {
      loss[c.genotype.first] *= rate.d;
      loss[c.genotype.second] *= rate.d;
    }
  }
  return loss;
}

}  // namespace

DropoutRate Dropout::rate(int group) const {
  if (group == kSharedDropout) return {d, homozygote};
  if (group < 1 || static_cast<std::size_t>(group) > own.size())
    throw std::invalid_argument("Dropout::rate: no drop-out rate for group " + std::to_string(group));
  return own[group - 1];
}

double observation_probability(const LocusClasses& locus, std::span<const TypedContributor> contributors,
                               double dropin, const Dropout& dropout) {
  const std::size_t k = locus.classes.size();
  std::vector<ClassCopies> copies(k);
  for (const auto& c : contributors) add_genotype(copies, c);
  const std::vector<double> loss = loss_by_class(k, contributors, dropout);
  double p = dropin_factor(locus, copies, dropin);
  for (std::size_t j = 0; j < k; ++j) {
    if (!copies[j].carried() || locus.classes[j].uncertain) continue;
    p *= locus.classes[j].observed ? 1.0 - loss[j] : loss[j];
  }
  return p;
}

LocusLikelihood::LocusLikelihood(const LocusClasses& locus, const LocusContributors& contributors, double theta,
                                 double dropin) {
  if (contributors.total() > kMaxContributors)
    throw std::invalid_argument("LocusLikelihood: more than 4 contributors");
  if (!(dropin >= 0.0 && dropin <= 1.0)) throw std::invalid_argument("LocusLikelihood: dropin outside [0, 1]");
  const std::size_t k = locus.classes.size();
  for (const auto& c : locus.classes) absent_.push_back(!c.observed && !c.uncertain);
  std::vector<ClassCopies> known(k);
  std::vector<std::uint16_t> own_slot(k, 0);  // 1 + position in own_classes_, 0 for none
  for (const auto& c : contributors.known) {
    add_genotype(known, c);
    if (c.group == kSharedDropout) continue;
    own_rate_contributors_.push_back(c);
    for (int j : {c.genotype.first, c.genotype.second})
      if (own_slot[j] == 0) {
        own_classes_.push_back(j);
        own_slot[j] = static_cast<std::uint16_t>(own_classes_.size());  // at most 8 (4 people, 2 alleles)
      }
  }

  // Terms are keyed by their drop-out pattern: the sorted codes of the carried observed classes
  // (9 bits each), their number, and the shared copies that must all drop out.
  struct Key {
    std::uint64_t high = 0, low = 0;
    bool operator==(const Key&) const = default;
  };
  struct KeyHash {
    std::size_t operator()(const Key& key) const { return std::hash<std::uint64_t>{}(key.high * 0x9e3779b97f4a7c15ULL ^ key.low); }
  };
  std::unordered_map<Key, std::size_t, KeyHash> index;
  std::vector<ClassCopies> copies(k);
  for_each_unknown_genotype_set(locus, contributors.unknowns, theta,
                                [&](std::span<const ClassGenotype> unknowns, double probability) {
    copies = known;
    for (const auto& g : unknowns) add_unknown(copies, g);
    const double weight = probability * dropin_factor(locus, copies, dropin);
    if (weight == 0.0) return;
    ++genotype_sets_;
    Term term{};
    for (std::size_t j = 0; j < k; ++j) {
      if (!copies[j].carried() || locus.classes[j].uncertain) continue;
      if (locus.classes[j].observed) {
        const auto shared = static_cast<std::uint16_t>(copies[j].heterozygous * 5 + copies[j].homozygous);
        term.present[term.present_count++] = static_cast<std::uint16_t>(shared | (own_slot[j] << 5));
      } else {
        term.dropped_heterozygous = static_cast<std::uint8_t>(term.dropped_heterozygous + copies[j].heterozygous);
        term.dropped_homozygous = static_cast<std::uint8_t>(term.dropped_homozygous + copies[j].homozygous);
      }
    }
    std::sort(term.present, term.present + term.present_count);
    Key key;
    key.high = (static_cast<std::uint64_t>(term.present_count) << 7) | (term.dropped_heterozygous << 3) |
               term.dropped_homozygous;
    for (int i = 0; i < term.present_count; ++i) {
      // 9 bits per code: the first seven codes in low, the eighth in high.
      std::uint64_t& word = i < 7 ? key.low : key.high;
      word = (word << 9) | term.present[i];
    }
    auto [it, inserted] = index.try_emplace(key, terms_.size());
    if (inserted) {
      term.weight = weight;
      terms_.push_back(term);
    } else {
      terms_[it->second].weight += weight;
    }
  });
}

std::vector<double> LocusLikelihood::own_loss(const Dropout& dropout) const {
  return loss_by_class(absent_.size(), own_rate_contributors_, dropout);
}

double LocusLikelihood::probability(const Dropout& dropout) const {
  const Powers powers(dropout);
  // The named people with own rates carry the same alleles in every term: their copies of
  // unobserved classes drop out with one constant factor.
  std::array<double, 2 * kMaxContributors + 1> own_by_slot{};
  double own_dropped = 1.0;
  if (!own_rate_contributors_.empty()) {
    const std::vector<double> own = own_loss(dropout);
    for (std::size_t j = 0; j < own.size(); ++j)
      if (absent_[j]) own_dropped *= own[j];
    for (std::size_t s = 0; s < own_classes_.size(); ++s) own_by_slot[s + 1] = own[own_classes_[s]];
  }
  double sum = 0.0;
  for (const Term& term : terms_) {
    double p = term.weight * powers.all_lost(term.dropped_heterozygous, term.dropped_homozygous);
    for (int i = 0; i < term.present_count; ++i) {
      const int shared = term.present[i] & 31, slot = term.present[i] >> 5;
      const double lost = powers.all_lost(shared / 5, shared % 5) * (slot > 0 ? own_by_slot[slot] : 1.0);
      p *= 1.0 - lost;
    }
    sum += p;
  }
  return sum * own_dropped;
}

}  // namespace counterpoise::models::dna_mixture
