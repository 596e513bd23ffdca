// The dna-mixture model against a brute-force sum over every genotype of every unknown, built
// from every allele of the frequency table (no "other allele" class, no grouping of unknowns),
// at many random inputs with theta, drop-out and drop-in. The reference code below shares no
// code with the model: genotype probabilities come from the Dirichlet-multinomial form of the
// Balding-Nichols model grouped by allele (Balding & Nichols 1994; Weir 1996, "Genetic Data
// Analysis II" — from memory for the section), and the observation probability is computed
// allele by allele from the contributors' genotypes (Gill et al. 2012, Forensic Sci. Int.
// Genet. 6:679; Balding & Buckleton 2009, Forensic Sci. Int. Genet. 4:1), each contributor with
// their own drop-out probability where one is stated, and an allele marked uncertain taken as
// neither seen nor missing (factor 1; docs/methods.md, "Uncertain alleles").
#include <catch2/catch.hpp>

#include <cmath>
#include <map>
#include <optional>
#include <random>
#include <set>
#include <string>
#include <vector>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "mixture_test_support.hpp"

using namespace counterpoise::models::dna_mixture;
using nlohmann::json;

namespace {

using Genotype = std::pair<int, int>;  // allele indices into the table

struct Scenario {
  std::vector<double> p;                      // the whole table at the locus
  std::set<int> observed;
  std::map<std::string, Genotype> references;
  std::vector<std::string> hp_named, hd_named;
  int hp_unknowns = 0, hd_unknowns = 0;
  double theta = 0.0, d = 0.0, c = 0.0;
  std::optional<double> d2;
  std::map<std::string, double> own_d;  // named people's own drop-out probabilities (d2 = d^2)
  std::set<int> uncertain;              // alleles marked uncertain
};

// A contributor's genotype with the drop-out probabilities of their allele copies.
struct Contributor {
  Genotype genotype;
  double d, d2;
};

// P(the unknowns' ordered genotypes | the named people's alleles): the Dirichlet-multinomial
// probability, allele by allele: prod_a prod_{i<x_a} (g_a + n_a + i) / prod_{i<X} (g + N + i)
// with g_a = p_a (1 - t) / t, times 2 for each heterozygote's two orders; product rule at t = 0.
double genotype_probability(const Scenario& s, const std::vector<Genotype>& unknowns) {
  std::vector<int> prior(s.p.size(), 0), drawn(s.p.size(), 0);
  int n_prior = 0, n_drawn = 0;
  for (const auto& [name, g] : s.references) {
    ++prior[g.first];
    ++prior[g.second];
    n_prior += 2;
  }
  double orders = 1.0;
  for (const auto& g : unknowns) {
    ++drawn[g.first];
    ++drawn[g.second];
    n_drawn += 2;
    if (g.first != g.second) orders *= 2.0;
  }
  double probability = orders;
  if (s.theta == 0.0) {
    for (std::size_t a = 0; a < s.p.size(); ++a) probability *= std::pow(s.p[a], drawn[a]);
    return probability;
  }
  const double scale = (1.0 - s.theta) / s.theta;
  for (std::size_t a = 0; a < s.p.size(); ++a)
    for (int i = 0; i < drawn[a]; ++i) probability *= s.p[a] * scale + prior[a] + i;
  for (int i = 0; i < n_drawn; ++i) probability /= scale + n_prior + i;
  return probability;
}

// P(observed alleles | every contributor's genotype).
double observation(const Scenario& s, const std::vector<Contributor>& contributors) {
  double probability = 1.0;
  int drop_ins = 0;
  for (std::size_t a = 0; a < s.p.size(); ++a) {
    if (s.uncertain.count(static_cast<int>(a))) continue;  // neither seen nor missing
    bool carried = false;
    double all_lost = 1.0;
    for (const auto& [g, d, d2] : contributors) {
      if (g.first == static_cast<int>(a) && g.second == static_cast<int>(a)) {
        carried = true;
        all_lost *= d2;
      } else if (g.first == static_cast<int>(a) || g.second == static_cast<int>(a)) {
        carried = true;
        all_lost *= d;
      }
    }
    const bool seen = s.observed.count(static_cast<int>(a)) > 0;
    if (carried) probability *= seen ? 1.0 - all_lost : all_lost;
    if (!carried && seen) {
      ++drop_ins;
      probability *= s.c * s.p[a];
    }
  }
  return drop_ins == 0 ? probability * (1.0 - s.c) : probability;
}

double brute_force(const Scenario& s, const std::vector<std::string>& named, int unknowns) {
  std::vector<Genotype> all;
  for (int a = 0; a < static_cast<int>(s.p.size()); ++a)
    for (int b = a; b < static_cast<int>(s.p.size()); ++b) all.push_back({a, b});
  const double shared_d2 = s.d2 ? *s.d2 : s.d * s.d;
  std::vector<Contributor> known;
  for (const auto& name : named) {
    const auto own = s.own_d.find(name);
    if (own == s.own_d.end())
      known.push_back({s.references.at(name), s.d, shared_d2});
    else
      known.push_back({s.references.at(name), own->second, own->second * own->second});
  }
  double total = 0.0;
  std::vector<std::size_t> index(unknowns, 0);
  while (true) {
    std::vector<Genotype> chosen;
    std::vector<Contributor> everyone = known;
    for (auto i : index) {
      chosen.push_back(all[i]);
      everyone.push_back({all[i], s.d, shared_d2});
    }
    total += genotype_probability(s, chosen) * observation(s, everyone);
    int position = unknowns - 1;
    while (position >= 0 && ++index[position] == all.size()) index[position--] = 0;
    if (position < 0) break;
  }
  return total;
}

json item_of(const Scenario& s) {
  json table = json::object(), observed = json::array(), references = json::object();
  for (std::size_t a = 0; a < s.p.size(); ++a) table[std::to_string(10 + a)] = s.p[a];
  for (int a : s.observed) observed.push_back(std::to_string(10 + a));
  for (const auto& [name, g] : s.references)
    references[name] = {std::to_string(10 + g.first), std::to_string(10 + g.second)};
  json item = mixture_test::one_locus_item(observed, references, {{"contributors", s.hp_named}, {"unknowns", s.hp_unknowns}},
                                           {{"contributors", s.hd_named}, {"unknowns", s.hd_unknowns}}, table, s.theta, s.d, s.c);
  if (s.d2) item["dropout_homozygote"] = *s.d2;
  for (const auto& [name, d] : s.own_d) item["dropout_by_contributor"][name] = d;
  if (!s.uncertain.empty()) {
    item["uncertain"]["D8S1179"] = json::array();
    for (int a : s.uncertain) item["uncertain"]["D8S1179"].push_back(std::to_string(10 + a));
  }
  return item;
}

// A random scenario: a table of 3 to 6 alleles, one or two named people, contributors drawn so
// the observed alleles are those of a plausible mixture with some drop-out and drop-in.
Scenario random_scenario(std::mt19937_64& rng, bool stated_d2, bool own_rates) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  auto pick = [&rng](int n) { return static_cast<int>(std::uniform_int_distribution<int>(0, n - 1)(rng)); };
  Scenario s;
  const int alleles = 3 + pick(4);
  double sum = 0.0;
  for (int a = 0; a < alleles; ++a) s.p.push_back(0.05 + unit(rng));
  for (double p : s.p) sum += p;
  for (double& p : s.p) p /= sum;
  auto random_genotype = [&] {
    int a = pick(alleles), b = pick(alleles);
    if (a > b) std::swap(a, b);
    return Genotype{a, b};
  };
  s.references["victim"] = random_genotype();
  if (pick(2) == 1) s.references["suspect"] = random_genotype();
  const bool has_suspect = s.references.count("suspect") > 0;
  s.hp_named = has_suspect ? std::vector<std::string>{"suspect", "victim"} : std::vector<std::string>{"victim"};
  s.hd_named = {"victim"};
  s.hp_unknowns = pick(2);
  s.hd_unknowns = static_cast<int>(s.hp_named.size()) - 1 + s.hp_unknowns + pick(2);
  if (s.hd_unknowns == 0) s.hd_unknowns = 1;
  s.theta = pick(3) == 0 ? 0.0 : 0.1 * unit(rng);
  s.d = pick(4) == 0 ? 0.0 : 0.6 * unit(rng);
  s.c = pick(3) == 0 ? 0.0 : 0.2 * unit(rng);
  if (stated_d2) s.d2 = 0.5 * unit(rng) * s.d;
  if (own_rates) {
    // The victim (often the major contributor) with a lower rate, the suspect sometimes with one.
    s.own_d["victim"] = pick(4) == 0 ? 0.0 : 0.3 * unit(rng);
    if (has_suspect && pick(2) == 0) s.own_d["suspect"] = 0.8 * unit(rng);
  }
  // Observed: the Hp contributors' alleles, some dropped, perhaps one drop-in.
  std::vector<Genotype> contributors;
  for (const auto& name : s.hp_named) contributors.push_back(s.references[name]);
  for (int u = 0; u < s.hp_unknowns; ++u) contributors.push_back(random_genotype());
  for (const auto& g : contributors)
    for (int a : {g.first, g.second})
      if (unit(rng) >= s.d) s.observed.insert(a);
  if (s.c > 0.0 && pick(3) == 0) s.observed.insert(pick(alleles));
  if (own_rates && pick(2) == 0) {
    // A peak below the threshold: an allele not called, carried by someone or not.
    const int a = pick(alleles);
    if (!s.observed.count(a)) s.uncertain.insert(a);
  }
  if (stated_d2) {
    // Q is exact with a stated d2 only when it holds at most one allele of the table: keep the
    // table to the observed and reference alleles plus one.
    std::set<int> keep = s.observed;
    keep.insert(s.uncertain.begin(), s.uncertain.end());
    for (const auto& [name, g] : s.references) keep.insert({g.first, g.second});
    for (int a = 0; a < alleles && static_cast<int>(keep.size()) < static_cast<int>(s.p.size()); ++a)
      if (!keep.count(a)) {
        keep.insert(a);
        break;
      }
    std::vector<double> kept(s.p.size(), 0.0);
    double kept_sum = 0.0;
    for (int a : keep) kept_sum += s.p[a];
    for (int a : keep) kept[a] = s.p[a] / kept_sum;
    // Alleles outside `keep` get a frequency too small to matter but must stay listed to keep
    // indices: give them none by moving their mass (they are never observed or typed).
    s.p = kept;
  }
  return s;
}

}  // namespace

TEST_CASE("the model equals a brute-force sum over all genotypes at random inputs", "[dna_mixture][brute-force]") {
  std::mt19937_64 rng(20261203);
  for (auto [stated_d2, own_rates] : {std::pair{false, false}, std::pair{true, false}, std::pair{false, true},
                                      std::pair{true, true}}) {
    int compared = 0;
    for (int trial = 0; trial < 300; ++trial) {
      Scenario s = random_scenario(rng, stated_d2, own_rates);
      // Alleles removed from a table (frequency 0) are not listed.
      json item = item_of(s);
      auto& table = item["frequencies"]["table"]["D8S1179"];
      for (std::size_t a = 0; a < s.p.size(); ++a)
        if (s.p[a] == 0.0) table.erase(std::to_string(10 + a));
      const double hp = brute_force(s, s.hp_named, s.hp_unknowns);
      const double hd = brute_force(s, s.hd_named, s.hd_unknowns);
      if (hp == 0.0 && hd == 0.0) continue;  // the reader rejects such findings (tested elsewhere)
      if (s.c == 0.0 && static_cast<int>(s.observed.size()) > 2 * (static_cast<int>(s.hd_named.size()) + s.hd_unknowns))
        continue;  // too many alleles without drop-in: rejected by the reader (tested elsewhere)
      if (s.c == 0.0 && static_cast<int>(s.observed.size()) > 2 * (static_cast<int>(s.hp_named.size()) + s.hp_unknowns))
        continue;
      const auto model = mixture_test::read(item);
      INFO("trial " << trial << ", stated d2 " << stated_d2 << ", own rates " << own_rates << ": " << item.dump());
      // Sums of at most a few thousand positive terms: agreement to 1e-11 relative is rounding.
      const double model_hp = std::pow(10.0, model->log10_probability(Side::hp, s.d));
      const double model_hd = std::pow(10.0, model->log10_probability(Side::hd, s.d));
      CHECK(model_hp == Approx(hp).epsilon(1e-11).margin(1e-300));
      CHECK(model_hd == Approx(hd).epsilon(1e-11).margin(1e-300));
      ++compared;
    }
    CHECK(compared >= 200);  // most random scenarios are valid findings
  }
}

TEST_CASE("an uncertain allele without drop-in is the sum over its being seen and not seen", "[dna_mixture][uncertain]") {
  // What 'uncertain' means: with c = 0, P(E with allele u uncertain) = P(E and u seen) + P(E and
  // u not seen), since every carried copy of u is then either seen (1 - loss) or not (loss), and
  // an uncarried u cannot be seen (the law of total probability; common practice).
  const json table = {{"10", 0.1}, {"11", 0.2}, {"12", 0.3}, {"13", 0.15}, {"14", 0.25}};
  const json refs = {{"suspect", {"11", "13"}}, {"victim", {"10", "12"}}};
  const json hp = {{"contributors", {"suspect", "victim"}}, {"unknowns", 0}};
  const json hd = {{"contributors", {"victim"}}, {"unknowns", 1}};
  for (double theta : {0.0, 0.02})
    for (double d : {0.1, 0.4}) {
      json uncertain = mixture_test::one_locus_item({"10", "11", "12"}, refs, hp, hd, table, theta, d, 0.0);
      uncertain["uncertain"] = {{"D8S1179", {"13"}}};
      uncertain["dropout_by_contributor"] = {{"victim", 0.05}};
      json seen = uncertain, not_seen = uncertain;
      seen.erase("uncertain");
      seen["observed"]["D8S1179"].push_back("13");
      not_seen.erase("uncertain");
      for (Side side : {Side::hp, Side::hd}) {
        INFO("theta " << theta << ", d " << d << ", side " << (side == Side::hp ? "Hp" : "Hd"));
        const double sum = std::pow(10.0, mixture_test::read(seen)->log10_probability(side, d)) +
                           std::pow(10.0, mixture_test::read(not_seen)->log10_probability(side, d));
        CHECK(std::pow(10.0, mixture_test::read(uncertain)->log10_probability(side, d)) == Approx(sum).epsilon(1e-13));
      }
    }
}
