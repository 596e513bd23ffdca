// Benchmark of the dna-mixture model on invented 21-locus mixtures: a 3-person mixture (Hp:
// suspect + victim + 1 unknown, Hd: victim + 2 unknowns) and a 4-person mixture (Hp: suspect +
// victim + 2 unknowns, Hd: victim + 3 unknowns), each with d a point value and with d ~ Beta
// (averaged over d), both with the curve over d. Beside it, the alternative the model avoids: a
// blind sum over every ordered genotype tuple of the whole table, timed for one value of d (the
// model evaluates the integral and the 101-point curve from one enumeration).
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <set>
#include <string>
#include <vector>

#include "core/models/dna/str_loci.hpp"
#include "core/models/dna_mixture/dna_mixture_model.hpp"

using namespace counterpoise::models;
using nlohmann::json;
using Clock = std::chrono::steady_clock;

namespace {

constexpr int kLoci = 21;
constexpr int kAlleles = 12;  // per locus: "8" ... "19"
const double kWeights[kAlleles] = {1, 3, 6, 10, 14, 16, 15, 12, 9, 7, 4, 3};

double ms_since(Clock::time_point start) { return std::chrono::duration<double, std::milli>(Clock::now() - start).count(); }

std::string allele(int i) { return std::to_string(8 + i); }

// Genotypes of the true contributors at locus l: victim, suspect, then unknown people.
std::vector<std::pair<int, int>> true_genotypes(int l, int people) {
  std::vector<std::pair<int, int>> g;
  for (int k = 0; k < people; ++k) {
    int a = (l * 7 + k * 5 + 1) % kAlleles, b = (l * 3 + k * 11 + 4) % kAlleles;
    if (a > b) std::swap(a, b);
    g.push_back({a, b});
  }
  return g;
}

json mixture_item(int unknowns_hd, const json& dropout) {
  const int people = 1 + unknowns_hd;  // victim + the Hd unknowns = suspect + victim + Hp unknowns
  json observed = json::object(), table = json::object(), victim = json::object(), suspect = json::object();
  double total = 0.0;
  for (double w : kWeights) total += w;
  int index = 0;
  for (auto name : dna::standard_str_loci()) {
    if (index == kLoci) break;
    const std::string locus(name);
    for (int a = 0; a < kAlleles; ++a) table[locus][allele(a)] = kWeights[a] / total;
    const auto g = true_genotypes(index, people);
    victim[locus] = {allele(g[0].first), allele(g[0].second)};
    suspect[locus] = {allele(g[1].first), allele(g[1].second)};
    std::set<int> seen;
    for (const auto& [a, b] : g) seen.insert({a, b});
    // Drop-out at every third locus: the suspect's larger allele is missing unless another carries it.
    if (index % 3 == 0 && seen.size() > 2) seen.erase(g[1].second);
    json alleles = json::array();
    for (int a : seen) alleles.push_back(allele(a));
    observed[locus] = alleles;
    ++index;
  }
  return {{"id", "B1"}, {"model", "dna-mixture"}, {"theta", 0.01}, {"observed", observed},
          {"references", {{"victim", victim}, {"suspect", suspect}}},
          {"hp", {{"contributors", {"suspect", "victim"}}, {"unknowns", unknowns_hd - 1}}},
          {"hd", {{"contributors", {"victim"}}, {"unknowns", unknowns_hd}}},
          {"dropout", dropout}, {"dropin", 0.05}, {"frequencies", {{"table", table}}}};
}

// The blind alternative at one d: every ordered tuple of genotypes over the whole table,
// product-rule weights, the observation probability computed from scratch for each tuple.
double blind_log10_hd(const json& item, double d) {
  double log10_sum = 0.0;
  const int unknowns = item["hd"]["unknowns"].get<int>();
  std::vector<std::pair<int, int>> all;
  for (int a = 0; a < kAlleles; ++a)
    for (int b = a; b < kAlleles; ++b) all.push_back({a, b});
  for (auto it = item["observed"].begin(); it != item["observed"].end(); ++it) {
    std::vector<double> p(kAlleles);
    std::vector<bool> seen(kAlleles, false);
    for (int a = 0; a < kAlleles; ++a) p[a] = item["frequencies"]["table"][it.key()][allele(a)].get<double>();
    for (const auto& x : it.value()) seen[std::stoi(x.get<std::string>()) - 8] = true;
    const auto& v = item["references"]["victim"][it.key()];
    const std::pair<int, int> victim{std::stoi(v[0].get<std::string>()) - 8, std::stoi(v[1].get<std::string>()) - 8};
    std::vector<std::size_t> index(unknowns, 0);
    double sum = 0.0;
    while (true) {
      std::vector<std::pair<int, int>> people{victim};
      double weight = 1.0;
      for (auto i : index) {
        people.push_back(all[i]);
        weight *= all[i].first == all[i].second ? p[all[i].first] * p[all[i].first] : 2 * p[all[i].first] * p[all[i].second];
      }
      double obs = 1.0;
      int drop_ins = 0;
      for (int a = 0; a < kAlleles; ++a) {
        double lost = 1.0;
        bool carried = false;
        for (const auto& [x, y] : people) {
          if (x == a && y == a) lost *= d * d, carried = true;
          else if (x == a || y == a) lost *= d, carried = true;
        }
        if (carried) obs *= seen[a] ? 1.0 - lost : lost;
        else if (seen[a]) obs *= 0.05 * p[a], ++drop_ins;
      }
      sum += weight * (drop_ins == 0 ? obs * 0.95 : obs);
      int position = unknowns - 1;
      while (position >= 0 && ++index[position] == all.size()) index[position--] = 0;
      if (position < 0) break;
    }
    log10_sum += std::log10(sum);
  }
  return log10_sum;
}

void run(const char* label, int unknowns_hd) {
  const ReadContext context{{}, {"B1", ""}};
  for (const json& dropout : {json(0.1), json{{"beta", {2, 18}}}}) {
    const json item = mixture_item(unknowns_hd, dropout);
    auto start = Clock::now();
    auto model = dna_mixture::read_dna_mixture_model(item, context);
    const double read_ms = ms_since(start);
    start = Clock::now();
    const auto result = model->evaluate();
    const double evaluate_ms = ms_since(start);
    std::printf("%s, d = %s\n", label, dropout.dump().c_str());
    std::printf("  read (enumerate, integrate over d, 101-point curve): %9.1f ms\n", read_ms);
    std::printf("  evaluate (detail JSON):                            %9.1f ms   log10 LR = %.4f\n", evaluate_ms,
                result.lr.log10());
  }
  json item = mixture_item(unknowns_hd, 0.1);
  item["theta"] = 0.0;  // the blind sum uses the product rule
  auto start = Clock::now();
  const double blind = blind_log10_hd(item, 0.1);
  const double blind_ms = ms_since(start);
  const auto model = std::dynamic_pointer_cast<const dna_mixture::DnaMixtureModel>(
      dna_mixture::read_dna_mixture_model(item, context));
  std::printf("  alternative: blind sum over all ordered genotypes of the 12-allele table, Hd only, one d, theta 0:"
              " %.1f ms\n  (log10 P(E|Hd) blind %.10f, model %.10f)\n",
              blind_ms, blind, model->log10_probability(dna_mixture::Side::hd, 0.1));
}

}  // namespace

int main() {
  std::printf("dna-mixture, %d loci, %d alleles per locus in the table, theta 0.01, dropin 0.05\n", kLoci, kAlleles);
  run("3 contributors, 2 unknowns under Hd", 2);
  run("4 contributors, 3 unknowns under Hd", 3);
  return 0;
}
