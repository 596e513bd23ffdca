// The dna-mixture model with no drop-out and no drop-in (d = c = 0) against the classical
// mixture formulas, and with drop-out against the published single-allele example.
#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

#include "core/models/dna/dna_single_source_model.hpp"
#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "mixture_test_support.hpp"

using namespace counterpoise::models::dna_mixture;
using nlohmann::json;

namespace {

const json kTable = {{"11", 0.08}, {"12", 0.15}, {"13", 0.30}, {"14", 0.21}, {"15", 0.16}, {"16", 0.10}};
const double pA = 0.08, pB = 0.15, pC = 0.30, pD = 0.21;  // alleles 11, 12, 13, 14

json named(std::vector<std::string> people, int unknowns) { return {{"contributors", people}, {"unknowns", unknowns}}; }

double log10_p_hd(const json& item) { return *mixture_test::read(item)->evaluate().log10_p_given_hd; }
double log10_lr(const json& item) { return mixture_test::read(item)->evaluate().lr.log10(); }

// The probability that x unknown people (product rule) carry between them exactly the alleles
// `observed` of which `required` must all appear: the inclusion-exclusion form of Weir et al.
// (1997, "Interpreting DNA mixtures", J. Forensic Sci. 42:213, the function P_x(U) — from memory
// for the symbol): sum over subsets S of `required` of (-1)^|S| (sum of p over observed minus S)^(2x).
double weir_unknowns(const std::vector<double>& observed, const std::vector<int>& required, int x) {
  double total = 0.0;
  for (unsigned mask = 0; mask < (1u << required.size()); ++mask) {
    double sum = 0.0;
    for (std::size_t i = 0; i < observed.size(); ++i) sum += observed[i];
    int removed = 0;
    for (std::size_t r = 0; r < required.size(); ++r)
      if (mask & (1u << r)) {
        sum -= observed[required[r]];
        ++removed;
      }
    total += (removed % 2 ? -1.0 : 1.0) * std::pow(sum, 2 * x);
  }
  return total;
}

}  // namespace

TEST_CASE("two-person mixture, victim known: LR = 1 / (2 pC pD)", "[dna_mixture][classical]") {
  // Weir et al. 1997 (J. Forensic Sci. 42:213), the victim-and-suspect case without drop-out:
  // observed ABCD, victim AB, suspect CD; Hp: victim + suspect, Hd: victim + unknown. The
  // unknown must be CD: P(E|Hd) = 2 pC pD, P(E|Hp) = 1.
  const json item = mixture_test::one_locus_item({"11", "12", "13", "14"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "14"}}},
                                                 named({"suspect", "victim"}, 0), named({"victim"}, 1), kTable, 0.0, 0.0, 0.0);
  CHECK(log10_lr(item) == Approx(-std::log10(2 * pC * pD)).epsilon(1e-13));
}

TEST_CASE("two unknowns against two named people: LR = 1 / (24 pA pB pC pD)", "[dna_mixture][classical]") {
  // Weir et al. 1997: four alleles from two unknown people, P = 24 pA pB pC pD (three ways to
  // pair the alleles, two orders of the people, two orders within each heterozygote pair).
  const json item = mixture_test::one_locus_item({"11", "12", "13", "14"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "14"}}},
                                                 named({"suspect", "victim"}, 0), named({}, 2), kTable, 0.0, 0.0, 0.0);
  CHECK(log10_lr(item) == Approx(-std::log10(24 * pA * pB * pC * pD)).epsilon(1e-13));
}

TEST_CASE("three, two and one observed alleles from two unknowns", "[dna_mixture][classical]") {
  // Weir et al. 1997 closed forms for two unknowns: ABC 12 pA pB pC (pA + pB + pC);
  // AB 2 pA pB (2 pA^2 + 3 pA pB + 2 pB^2); A pA^4 (derived from P_x(U) with x = 2).
  auto hd_two_unknowns = [](json observed, json suspect, json victim) {
    return mixture_test::one_locus_item(observed, {{"victim", victim}, {"suspect", suspect}}, named({"suspect", "victim"}, 0),
                                        named({}, 2), kTable, 0.0, 0.0, 0.0);
  };
  CHECK(log10_p_hd(hd_two_unknowns({"11", "12", "13"}, {"11", "13"}, {"12", "12"})) ==
        Approx(std::log10(12 * pA * pB * pC * (pA + pB + pC))).epsilon(1e-13));
  CHECK(log10_p_hd(hd_two_unknowns({"11", "12"}, {"11", "12"}, {"12", "12"})) ==
        Approx(std::log10(2 * pA * pB * (2 * pA * pA + 3 * pA * pB + 2 * pB * pB))).epsilon(1e-13));
  CHECK(log10_p_hd(hd_two_unknowns({"11"}, {"11"}, {"11"})) == Approx(4 * std::log10(pA)).epsilon(1e-13));
}

TEST_CASE("the general product-rule formula for one to four unknowns", "[dna_mixture][classical]") {
  // Weir et al. 1997, P_x(U) by inclusion-exclusion: the unknowns must carry the observed alleles
  // the named contributors do not explain, and may carry any observed allele.
  struct Case {
    std::vector<std::string> observed;
    json victim;
    int unknowns;
  };
  const std::vector<Case> cases = {
      {{"11", "12", "13", "14", "15"}, {"11", "12"}, 2},  // unknowns must carry 13, 14, 15
      {{"11", "12", "13"}, {"11", "12"}, 1},
      {{"11", "12", "13", "14"}, {"11", "11"}, 3},
      {{"11", "12", "13", "14", "15", "16"}, {"11", "12"}, 3},
      {{"12", "13", "14"}, {"13", "14"}, 3},
  };
  const std::vector<double> p = {0.08, 0.15, 0.30, 0.21, 0.16, 0.10};
  for (const auto& c : cases) {
    std::vector<double> observed;
    std::vector<int> required;
    for (const auto& allele : c.observed) {
      const int index = std::stoi(allele) - 11;
      observed.push_back(p[index]);
      if (allele != c.victim[0] && allele != c.victim[1]) required.push_back(static_cast<int>(observed.size()) - 1);
    }
    json allele_list = c.observed;
    const json item = mixture_test::one_locus_item(allele_list, {{"victim", c.victim}}, named({"victim"}, c.unknowns),
                                                   named({"victim"}, c.unknowns), kTable, 0.0, 0.0, 0.0);
    INFO("observed " << allele_list.dump() << ", unknowns " << c.unknowns);
    CHECK(log10_p_hd(item) == Approx(std::log10(weir_unknowns(observed, required, c.unknowns))).epsilon(1e-12));
  }
}

TEST_CASE("theta: the unknown conditioned on the four typed alleles", "[dna_mixture][classical]") {
  // Balding & Nichols 1994 sampling formula conditioned on the victim's and suspect's alleles
  // (the form of Curran et al. 1999 for mixtures): observed ABCD, victim AB, suspect CD,
  // Hd: victim + unknown: P = 2 [t + (1-t) pC][t + (1-t) pD] / [(1 + 3t)(1 + 4t)].
  const double t = 0.03;
  const json item = mixture_test::one_locus_item({"11", "12", "13", "14"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "14"}}},
                                                 named({"suspect", "victim"}, 0), named({"victim"}, 1), kTable, t, 0.0, 0.0);
  const double expected = 2 * (t + (1 - t) * pC) * (t + (1 - t) * pD) / ((1 + 3 * t) * (1 + 4 * t));
  CHECK(log10_lr(item) == Approx(-std::log10(expected)).epsilon(1e-13));

  // Observed ABC, victim AB, suspect CC: the unknown is CC, AC or BC.
  const json three = mixture_test::one_locus_item({"11", "12", "13"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "13"}}},
                                                  named({"suspect", "victim"}, 0), named({"victim"}, 1), kTable, t, 0.0, 0.0);
  auto s = [t](double k, double p) { return k * t + (1 - t) * p; };
  const double p_hd = (s(2, pC) * s(3, pC) + 2 * s(1, pA) * s(2, pC) + 2 * s(1, pB) * s(2, pC)) / ((1 + 3 * t) * (1 + 4 * t));
  CHECK(log10_lr(three) == Approx(-std::log10(p_hd)).epsilon(1e-13));
}

TEST_CASE("one contributor with d = c = 0 gives the single-source model's LR", "[dna_mixture][classical]") {
  // Both models implement NRC II eq. 4.10a/b through different code (a closed form against the
  // sampling formula); agreement to 1e-13 in log10 LR is rounding only.
  const json table = {{"D8S1179", kTable}, {"TH01", {{"6", 0.23}, {"7", 0.19}, {"9.3", 0.35}, {"9", 0.23}}}};
  for (double theta : {0.0, 0.01, 0.05}) {
    const json single = {{"id", "M1"}, {"model", "dna-single-source"}, {"theta", theta},
                         {"profile", {{"D8S1179", {"12", "14"}}, {"TH01", {"9.3"}}}},
                         {"reference_profile", {{"D8S1179", {"12", "14"}}, {"TH01", {"9.3"}}}},
                         {"min_allele_frequency", "none"}, {"frequencies", {{"table", table}}}};
    const json mixture = {{"id", "M1"}, {"model", "dna-mixture"}, {"theta", theta},
                          {"observed", {{"D8S1179", {"12", "14"}}, {"TH01", {"9.3"}}}},
                          {"references", {{"suspect", {{"D8S1179", {"12", "14"}}, {"TH01", {"9.3"}}}}}},
                          {"hp", named({"suspect"}, 0)}, {"hd", named({}, 1)}, {"dropout", 0}, {"dropin", 0},
                          {"min_allele_frequency", "none"}, {"frequencies", {{"table", table}}}};
    const auto single_model = counterpoise::models::dna::read_dna_single_source_model(single, mixture_test::context());
    INFO("theta " << theta);
    CHECK(mixture_test::read(mixture)->evaluate().lr.log10() ==
          Approx(single_model->evaluate().lr.log10()).epsilon(1e-13));
  }
}

TEST_CASE("drop-out: one allele seen of the suspect's two", "[dna_mixture][dropout]") {
  // Gill et al. 2012 (ISFG DNA commission, Forensic Sci. Int. Genet. 6:679), the example of a
  // single allele a from a suspect ab — from memory: P(E|Hp) = d (1 - d); P(E|Hd) = pa^2 (1 - d2)
  // + 2 pa (1 - pa) d (1 - d) for an unknown who is aa or a with another allele that dropped out.
  // With drop-in c, each term is multiplied by 1 - c and an unknown carrying no a (both alleles
  // dropped, d2 = d^2) adds (1 - pa)^2 d^2 c pa (derived from the same model).
  const double d = 0.3, c = 0.05, pa = pC;
  const json no_dropin = mixture_test::one_locus_item({"13"}, {{"suspect", {"13", "14"}}}, named({"suspect"}, 0), named({}, 1),
                                                      kTable, 0.0, d, 0.0);
  const double d2 = d * d;
  const double hd = pa * pa * (1 - d2) + 2 * pa * (1 - pa) * d * (1 - d);
  CHECK(log10_lr(no_dropin) == Approx(std::log10(d * (1 - d) / hd)).epsilon(1e-13));

  json with_dropin = no_dropin;
  with_dropin["dropin"] = c;
  const double hd_c = (1 - c) * hd + (1 - pa) * (1 - pa) * d2 * c * pa;
  CHECK(log10_lr(with_dropin) == Approx(std::log10((1 - c) * d * (1 - d) / hd_c)).epsilon(1e-13));

  // A stated d2 replaces d^2 for the homozygous unknown (aa).
  json stated = no_dropin;
  stated["dropout_homozygote"] = 0.02;
  const double hd_stated = pa * pa * (1 - 0.02) + 2 * pa * (1 - pa) * d * (1 - d);
  CHECK(log10_lr(stated) == Approx(std::log10(d * (1 - d) / hd_stated)).epsilon(1e-13));
}

TEST_CASE("swapping Hp and Hd inverts the LR", "[dna_mixture][identity]") {
  // Common practice: LR(Hd, Hp) = 1 / LR(Hp, Hd).
  json item = mixture_test::one_locus_item({"11", "12", "13"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "15"}}},
                                           named({"suspect", "victim"}, 1), named({"victim"}, 2), kTable, 0.02, 0.2, 0.05);
  const double forward = log10_lr(item);
  std::swap(item["hp"], item["hd"]);
  CHECK(log10_lr(item) == Approx(-forward).epsilon(1e-12));
}

TEST_CASE("loci multiply: the LR is the product of the per-locus LRs", "[dna_mixture][identity]") {
  // Independence of loci (common practice; NRC II 1996 section 4.2): log10 LRs add.
  json item = {{"id", "M1"}, {"model", "dna-mixture"}, {"theta", 0.01},
               {"observed", {{"D8S1179", {"11", "12", "13"}}, {"TH01", {"6", "9.3"}}}},
               {"references", {{"victim", {{"D8S1179", {"11", "12"}}, {"TH01", {"6", "9.3"}}}},
                               {"suspect", {{"D8S1179", {"13", "13"}}, {"TH01", {"7", "9.3"}}}}}},
               {"hp", named({"suspect", "victim"}, 0)}, {"hd", named({"victim"}, 1)}, {"dropout", 0.15}, {"dropin", 0.02},
               {"min_allele_frequency", "none"},
               {"frequencies", {{"table", {{"D8S1179", kTable}, {"TH01", {{"6", 0.23}, {"7", 0.19}, {"9.3", 0.35}, {"9", 0.23}}}}}}}};
  const auto result = mixture_test::read(item)->evaluate();
  double sum = 0.0;
  for (const auto& locus : result.detail["loci"]) sum += locus["lr"]["log10_lr"].get<double>();
  CHECK(result.lr.log10() == Approx(sum).epsilon(1e-13));
  CHECK(result.detail["lr_at_point_dropout"]["log10_lr"].get<double>() == Approx(sum).epsilon(1e-13));
}

TEST_CASE("a drop-out probability of the victim's own", "[dna_mixture][dropout][per-contributor]") {
  // Observed a c d; suspect ab (b missing), victim cd with her own drop-out probability dv (a
  // major contributor drops out less), the suspect and the unknown with d; c = 0, theta = 0.
  // Written out from the model of Gill et al. 2012 (Forensic Sci. Int. Genet. 6:679, each
  // contributor with their own Pr(D)) and Balding & Buckleton 2009 (Forensic Sci. Int. Genet.
  // 4:1) — derived here, not a printed example:
  //   P(E|Hp) = (1 - dv)^2 d (1 - d)
  //   P(E|Hd) = (1 - dv)^2 [pa^2 (1 - d^2) + 2 pa q d (1 - d)] + 2 pa (pc + pd) (1 - d)(1 - dv)(1 - dv d)
  // for an unknown aa, a with an unseen allele (q = 1 - pa - pc - pd), or a with c or d (the
  // shared allele then missing only if both copies drop out, dv d).
  const double pa = pA, pc = pC, pd = pD, q = 1 - pa - pc - pd;
  const json observed = {"11", "13", "14"};
  const json refs = {{"suspect", {"11", "12"}}, {"victim", {"13", "14"}}};
  for (double d : {0.1, 0.35, 0.6})
    for (double dv : {0.0, 0.05, 0.2}) {
      json item = mixture_test::one_locus_item(observed, refs, named({"suspect", "victim"}, 0), named({"victim"}, 1), kTable,
                                               0.0, d, 0.0);
      item["dropout_by_contributor"] = {{"victim", dv}};
      const double hp = (1 - dv) * (1 - dv) * d * (1 - d);
      const double hd = (1 - dv) * (1 - dv) * (pa * pa * (1 - d * d) + 2 * pa * q * d * (1 - d)) +
                        2 * pa * (pc + pd) * (1 - d) * (1 - dv) * (1 - dv * d);
      INFO("d " << d << ", dv " << dv);
      CHECK(log10_lr(item) == Approx(std::log10(hp / hd)).epsilon(1e-13));
    }
}

TEST_CASE("an own rate equal to the shared d changes nothing, the curve moves the shared d only",
          "[dna_mixture][dropout][per-contributor]") {
  // Identity of the model (common practice): naming a rate equal to the shared one is the shared model.
  json item = mixture_test::one_locus_item({"11", "12", "13"}, {{"victim", {"11", "12"}}, {"suspect", {"13", "15"}}},
                                           named({"suspect", "victim"}, 1), named({"victim"}, 2), kTable, 0.02, 0.2, 0.05);
  const double shared = log10_lr(item);
  item["dropout_by_contributor"] = {{"victim", 0.2}, {"suspect", {{"dropout", 0.2}, {"dropout_homozygote", 0.04}}}};
  CHECK(log10_lr(item) == Approx(shared).epsilon(1e-13));
  // With the victim's rate fixed, each point of the curve is the LR of the item with that shared d.
  item["dropout_by_contributor"] = {{"victim", 0.03}};
  const auto model = mixture_test::read(item);
  for (double d : {0.0, 0.3, 0.8}) {
    json at_d = item;
    at_d["dropout"] = d;
    const auto& point = model->curve().points[static_cast<std::size_t>(std::lround(d * (kDropoutCurvePoints - 1)))];
    INFO("d " << d);
    CHECK(*point.log10_lr == Approx(log10_lr(at_d)).epsilon(1e-12));
  }
}
