// The report section of a dna-mixture item: where it stands, the per-locus table against the
// core's detail, and the curve over the drop-out probability.
#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <string>
#include <vector>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/numbers/number_text.hpp"
#include "reports/mixture_recomputation.hpp"
#include "reports/mixture_section.hpp"
#include "reports/report_model.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

bool locus_lr_below_one(const nlohmann::json& detail, const std::string& name) {
  for (const auto& locus : detail["loci"])
    if (locus["locus"] == name) return locus["lr"]["log10_lr"].get<double>() < 0.0;
  return false;
}

const Table* table_at(const Section& section, std::size_t n) {
  for (const auto& block : section.blocks)
    if (const auto* t = std::get_if<Table>(&block))
      if (n-- == 0) return t;
  return nullptr;
}

}  // namespace

TEST_CASE("mixture: the section follows the findings and shows every locus the model used") {
  const auto value = load_case(demo_dir() / "harwick-vale-mixture.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const auto ids = section_ids(model);
  const auto findings = std::find(ids.begin(), ids.end(), "findings");
  REQUIRE(findings != ids.end());
  CHECK(*(findings + 1) == "mixture-M1");
  const Section* section = model.find("mixture-M1");
  REQUIRE(section);

  const auto mixture = std::dynamic_pointer_cast<const models::dna_mixture::DnaMixtureModel>(value.items[0].model);
  REQUIRE(mixture);
  const auto detail = mixture->evaluate().detail;
  const Table* loci = table_at(*section, 0);
  REQUIRE(loci);
  REQUIRE(loci->rows.size() == detail["loci"].size());
  for (std::size_t i = 0; i < loci->rows.size(); ++i) {
    const auto& row = loci->rows[i];
    const auto& locus = detail["loci"][i];
    CHECK(row[0] == locus["locus"].get<std::string>());
    CHECK(row[5] == numbers::magnitude_for_readers(locus["lr"]["log10_lr"].get<double>()));
  }
  // The demo's drop-out at D18S51 and FGA: the suspect's 13 and 24 are missing, so these loci
  // favour Hd at the mean drop-out (LR below 1) while the others favour Hp.
  CHECK(loci->rows[3][0] == "D18S51");
  CHECK(locus_lr_below_one(detail, "D18S51"));
  CHECK(locus_lr_below_one(detail, "FGA"));

  const Table* curve = table_at(*section, 1);
  REQUIRE(curve);
  CHECK(curve->rows.size() == 21);  // d = 0, 0.05, ..., 1
  CHECK(curve->rows.front()[0] == "0");
  CHECK(curve->rows.front()[1] == "0");  // no drop-out: Mr Dray's missing alleles exclude him
  CHECK(curve->rows.back()[0] == "1");
  const std::string text = section_text(model, "mixture-M1");
  CHECK(contains(text, "Beta(2, 14)"));
  CHECK(contains(text, "d = 0.125, the mean of that distribution"));
  CHECK(contains(text, "At d = 0 the findings could not have arisen if Hp were true"));
}

TEST_CASE("mixture: items of other models have no mixture section") {
  const auto value = load_case(demo_dir() / "harwick-vale-dna.json");
  for (const auto& item : value.items) CHECK_FALSE(mixture_section(item, value.propositions).has_value());
}

TEST_CASE("mixture: own drop-out rates and uncertain alleles are stated in the section") {
  // The demo with Ms Venn (the major contributor) given her own drop-out probability and Mr
  // Dray's missing 13 at D18S51 marked as a peak below the threshold.
  auto item_json = nlohmann::json::parse(read_file(demo_dir() / "harwick-vale-mixture.json"));
  auto& item = item_json["items"][0];
  item["dropout_by_contributor"] = {{"Ms Venn", 0.02}};
  item["uncertain"] = {{"D18S51", {"13"}}};
  auto read = interchange::read_case(item_json, demo_dir());  // the frequency file beside the demo
  REQUIRE(read.value);
  const auto& value = *read.value;
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const Section* section = model.find("mixture-M1");
  REQUIRE(section);
  const Table* loci = table_at(*section, 0);
  REQUIRE(loci);
  CHECK(loci->rows[3][0] == "D18S51");
  CHECK(loci->rows[3][1] == "15, 16, 17 (uncertain: 13)");
  const std::string text = section_text(model, "mixture-M1");
  CHECK(contains(text, "Ms Venn 0.02 (a homozygote's allele 0.02 squared)"));
  CHECK(contains(text, "the named people's own drop-out probabilities stay as stated"));
  CHECK(contains(text, "Alleles marked uncertain"));
  // Mr Dray's 13 no longer has to have dropped out: D18S51 no longer favours Hd.
  const auto mixture = std::dynamic_pointer_cast<const models::dna_mixture::DnaMixtureModel>(value.items[0].model);
  REQUIRE(mixture);
  CHECK_FALSE(locus_lr_below_one(mixture->evaluate().detail, "D18S51"));
  CHECK(contains(all_text(model), "every named person without one of their own (Ms Venn's 0.02)"));
}

namespace {

// A number as the report prints it ("0.0123456", "1.23456 × 10⁻⁵", "2 300", "−4") read back.
double printed_number(std::string text) {
  const auto replace_all = [&text](const std::string& from, const std::string& to) {
    for (std::size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
      text.replace(at, from.size(), to);
  };
  replace_all("\u202f", "");
  replace_all("\u2212", "-");
  replace_all("\u207b", "-");
  const char* superscripts[] = {"\u2070", "\u00b9", "\u00b2", "\u00b3", "\u2074",
                                "\u2075", "\u2076", "\u2077", "\u2078", "\u2079"};
  for (int digit = 0; digit < 10; ++digit) replace_all(superscripts[digit], std::string(1, static_cast<char>('0' + digit)));
  replace_all(" \u00d7 10", "e");
  std::size_t used = 0;
  const double value = std::stod(text, &used);
  if (used != text.size()) FAIL("not a printed number: " << text);
  return value;
}

// A second expert's recomputation of one row of the appendix, from the printed genotypes and the
// inputs as used (the frequencies of the inputs appendix, θ, d, the observed alleles and the
// named people's genotypes), written out here on its own:
// - P(genotypes) for one unknown person by the Balding-Nichols sampling formula conditioned on
//   the n = 4 alleles of the two named people: the first allele x with probability
//   [n_x θ + (1 − θ) p_x] / (1 + 3θ), the second y with [n'_y θ + (1 − θ) p_y] / (1 + 4θ)
//   (n'_y counting the first), times 2 for a heterozygote (Balding & Nichols 1994, Forensic Sci.
//   Int. 64:125; Curran et al. 1999, J. Forensic Sci. 44:987 — from memory for the pages);
// - P(alleles | genotypes): each allele copy of a heterozygote lost with d, a homozygote's allele
//   with d², an observed allele carried by several seen unless all its copies are lost, an
//   allele carried and not observed lost by every copy, no drop-in (1 − c) or each drop-in c p
//   (Gill et al. 2012, Forensic Sci. Int. Genet. 6:679).
struct ExpertLocus {
  std::map<std::string, double> p;               // as used; "Q" is every other allele
  std::set<std::string> observed;
  std::vector<std::pair<std::string, std::string>> named_hp, named_hd, everyone;
};

std::pair<std::string, std::string> genotype_of(const std::string& text) {
  const auto comma = text.find(',');
  return {text.substr(0, comma), text.substr(comma + 1)};
}

double expert_genotypes(const ExpertLocus& locus, const std::string& cell, double theta) {
  if (cell == "none (named people only)") return 1.0;
  const auto [x, y] = genotype_of(cell);
  std::map<std::string, int> n;
  for (const auto& [a, b] : locus.everyone) ++n[a], ++n[b];
  const double first = (n[x] * theta + (1 - theta) * locus.p.at(x)) / (1 + 3 * theta);
  ++n[x];
  const double second = (n[y] * theta + (1 - theta) * locus.p.at(y)) / (1 + 4 * theta);
  return first * second * (x == y ? 1.0 : 2.0);
}

double expert_observation(const ExpertLocus& locus, const std::vector<std::pair<std::string, std::string>>& named,
                          const std::string& cell, double d, double c) {
  auto contributors = named;
  if (cell != "none (named people only)") contributors.push_back(genotype_of(cell));
  std::map<std::string, double> lost;  // per allele carried: the chance every copy is lost
  for (const auto& [a, b] : contributors) {
    if (a == b) {
      lost.emplace(a, 1.0).first->second *= d * d;
    } else {
      lost.emplace(a, 1.0).first->second *= d;
      lost.emplace(b, 1.0).first->second *= d;
    }
  }
  double probability = 1.0;
  bool dropped_in = false;
  for (const auto& [allele, loss] : lost) probability *= locus.observed.count(allele) ? 1 - loss : loss;
  for (const auto& allele : locus.observed)
    if (!lost.count(allele)) {
      probability *= c * locus.p.at(allele);
      dropped_in = true;
    }
  return dropped_in ? probability : probability * (1 - c);
}

}  // namespace

TEST_CASE("mixture: a second expert recomputes the LR from the printed recomputation table") {
  const auto value = load_case(demo_dir() / "harwick-vale-mixture.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const Section* section = model.find("recomputation");
  REQUIRE(section);
  const Table* table = nullptr;
  for (const auto& block : section->blocks)
    if (const auto* t = std::get_if<Table>(&block); t && t->header.size() == 6 && t->header[2] == "Genotypes of the unknown people")
      table = t;
  REQUIRE(table);

  // The inputs as used, from the model's detail (what the inputs appendix prints).
  const auto mixture = std::dynamic_pointer_cast<const models::dna_mixture::DnaMixtureModel>(value.items[0].model);
  REQUIRE(mixture);
  const auto detail = mixture->evaluate().detail;
  const double theta = detail["theta"], c = detail["dropin"], d = detail["dropout"]["point"];
  std::map<std::string, ExpertLocus> loci;
  for (const auto& l : detail["loci"]) {
    ExpertLocus& locus = loci[l["locus"].get<std::string>()];
    for (const auto& k : l["classes"]) locus.p[k["allele"].get<std::string>()] = k["frequency"].get<double>();
    for (const auto& a : l["observed"]) locus.observed.insert(a.get<std::string>());
    for (auto it = l["references"].begin(); it != l["references"].end(); ++it) {
      const std::pair<std::string, std::string> g{it.value()[0], it.value().size() > 1 ? it.value()[1] : it.value()[0]};
      locus.everyone.push_back(g);
      (it.key() == "Ms Venn" ? locus.named_hd : locus.named_hp).push_back(g);
    }
    locus.named_hp.insert(locus.named_hp.end(), locus.named_hd.begin(), locus.named_hd.end());  // Hp: both
  }

  std::map<std::string, std::map<std::string, double>> sums;  // locus: Hp/Hd: sum of exact products
  double log10_lr = 0.0;
  std::size_t rows_checked = 0;
  for (const auto& row : table->rows) {
    ExpertLocus& locus = loci.at(row[0]);
    INFO(row[0] << " " << row[1] << " " << row[2]);
    if (row[2].rfind("sum:", 0) == 0) {
      CHECK(printed_number(row[5]) == Approx(sums[row[0]][row[1]]).epsilon(1e-5));
      continue;
    }
    if (row[2].rfind("LR at this locus", 0) == 0) {
      const double lr = sums[row[0]]["Hp"] / sums[row[0]]["Hd"];
      CHECK(printed_number(row[5]) == Approx(lr).epsilon(1e-5));
      log10_lr += std::log10(lr);
      continue;
    }
    const double genotypes = expert_genotypes(locus, row[2], theta);
    const double observation = expert_observation(locus, row[1] == "Hp" ? locus.named_hp : locus.named_hd, row[2], d, c);
    // Six significant figures printed: relative rounding below 5e-6.
    CHECK(printed_number(row[3]) == Approx(genotypes).epsilon(1e-5));
    CHECK(printed_number(row[4]) == Approx(observation).epsilon(1e-5));
    CHECK(printed_number(row[5]) == Approx(genotypes * observation).epsilon(1e-5));
    sums[row[0]][row[1]] += genotypes * observation;
    ++rows_checked;
  }
  CHECK(sums.size() == detail["loci"].size());
  CHECK(rows_checked > 2 * detail["loci"].size());
  // Every set is listed (one unknown): the exact sums are the model's, and the loci multiply to
  // the LR at the mean d that the recomputation paragraph prints.
  CHECK(log10_lr == Approx(detail["lr_at_point_dropout"]["log10_lr"].get<double>()).epsilon(1e-9));
  CHECK(contains(section_text(model, "recomputation"),
                 "likelihood ratios in the section on the DNA mixture multiply to " + numbers::magnitude_for_readers(log10_lr)));
}

TEST_CASE("mixture: a locus with more than 40 genotype sets lists 40 and sums the rest, saying how many") {
  // One locus, observed 11 12 13; victim 11,12 and suspect 13,14 typed; Hd: the victim and two
  // unknown people. The allele classes are 11, 12, 13, 14 and Q (15 and 16 together), so an
  // unknown has one of 5 * 6 / 2 = 15 genotypes and two unknowns one of C(15 + 1, 2) = 120
  // unordered sets (multisets of size 2 from 15; common practice). With d and c above 0 each set
  // can give the findings, so all 120 are summed: 40 listed and "the other 80 sets" in one row.
  const std::string item = R"json({"id": "M1", "model": "dna-mixture", "theta": 0.01,
      "observed": {"D8S1179": ["11", "12", "13"]},
      "references": {"victim": {"D8S1179": ["11", "12"]}, "suspect": {"D8S1179": ["13", "14"]}},
      "hp": {"contributors": ["suspect", "victim"], "unknowns": 1},
      "hd": {"contributors": ["victim"], "unknowns": 2},
      "dropout": 0.1, "dropin": 0.05, "min_allele_frequency": "none",
      "frequencies": {"table": {"D8S1179": {"11": 0.08, "12": 0.15, "13": 0.30, "14": 0.21, "15": 0.16, "16": 0.10}}},
      "combination": {"included": true, "independence": "The only item of findings."}})json";
  const auto value = case_from_json(case_text(item));
  const auto blocks = mixture_recomputation(value.items[0]);
  const Table* table = nullptr;
  std::string paragraph;
  for (const auto& block : blocks) {
    if (const auto* t = std::get_if<Table>(&block)) table = t;
    if (const auto* p = std::get_if<Paragraph>(&block)) paragraph += p->text;
  }
  REQUIRE(table);
  CHECK(contains(paragraph, "more than " + std::to_string(kListedGenotypeSets) + " sets under a proposition"));

  std::size_t listed_hd = 0, listed_hp = 0;
  double listed_hd_sum = 0.0;
  const std::vector<std::string>* rest = nullptr;
  const std::vector<std::string>* hd_sum = nullptr;
  for (const auto& row : table->rows) {
    if (row[1] == "Hp" && row[2].rfind("sum:", 0) != 0) ++listed_hp;
    if (row[1] != "Hd") continue;
    if (row[2].rfind("the other ", 0) == 0) {
      rest = &row;
    } else if (row[2].rfind("sum:", 0) == 0) {
      hd_sum = &row;
    } else {
      ++listed_hd;
      listed_hd_sum += printed_number(row[5]);
    }
  }
  CHECK(listed_hp == 15);  // one unknown: every genotype listed, no row for the rest
  CHECK(listed_hd == kListedGenotypeSets);
  REQUIRE(rest);
  REQUIRE(hd_sum);
  CHECK((*rest)[2] == "the other 80 sets");
  // The rest row holds what the listed rows leave of the sum, and the sum is the model's
  // P(alleles | Hd) at the point d (six figures printed: 1e-5 relative).
  const auto mixture = std::dynamic_pointer_cast<const models::dna_mixture::DnaMixtureModel>(value.items[0].model);
  REQUIRE(mixture);
  const double p_hd = std::pow(10.0, mixture->log10_probability(models::dna_mixture::Side::hd, 0.1));
  CHECK(printed_number((*hd_sum)[5]) == Approx(p_hd).epsilon(1e-5));
  CHECK(printed_number((*rest)[5]) > 0.0);
  CHECK(listed_hd_sum + printed_number((*rest)[5]) == Approx(p_hd).epsilon(1e-5));
}

// With several alternatives each names its own contributors (the handbag demo: under Hd1 Ms Venn
// and one unknown person, under Hd2 Mr Dray and Ms Venn), so the section gives the table per
// locus and the curve over d for Hp against each. Every printed per-locus LR is that
// alternative's own, read back and compared with the model built for it (the model's formulas
// are checked against Gill et al. 2006 and the classical mixture formulas in tests/core/models).
TEST_CASE("mixture: with several alternatives the loci and the curve are given against each alternative") {
  const auto value = load_case(demo_dir() / "harwick-vale-handbag-alternatives.json");
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const Section* section = model.find("mixture-M1");
  REQUIRE(section);
  const auto& item = value.items[0];
  REQUIRE(item.alternative_models.size() == 2);
  for (std::size_t a = 0; a < 2; ++a) {
    const std::string id = value.propositions.alternatives[a].id;
    INFO("alternative " << id);
    const Table* loci = table_at(*section, 2 * a);  // loci, curve, loci, curve
    REQUIRE(loci);
    CHECK(loci->header[3] == "Sets of unknown genotypes (Hp / " + id + ")");
    CHECK(loci->header[4] == "Leading set under " + id + " (share)");
    const auto detail = item.alternative_models[a]->evaluate().detail;
    REQUIRE(loci->rows.size() == detail["loci"].size());
    for (std::size_t r = 0; r < loci->rows.size(); ++r) {
      const auto& lr = detail["loci"][r]["lr"];
      CHECK(loci->rows[r][0] == detail["loci"][r]["locus"].get<std::string>());
      if (lr["state"] == "finite") {
        const double printed = printed_number(loci->rows[r][5]);
        const double exact = std::pow(10.0, lr["log10_lr"].get<double>());
        CHECK(std::abs(printed - exact) <= 5e-3 * exact);
      }
    }
    const Table* curve = table_at(*section, 2 * a + 1);
    REQUIRE(curve);
    CHECK(curve->rows.size() == 21);
  }
  const std::string text = section_text(model, "mixture-M1");
  CHECK(contains(text, "Hp against Hd1"));
  CHECK(contains(text, "Hp against Hd2"));
  // Under Hd2 the same two people are named as under Hp, so the LR is 1 at every d where it is
  // defined (the alleles' probability is the same expression on both sides): the section says
  // the evaluation does not depend on d, and names no lowest point the table does not show.
  CHECK(contains(text, "It is 1 wherever it is defined: the evaluation does not depend on d."));
  CHECK_FALSE(contains(text, "The lowest value is 1,"));
  // Against Hd1 the curve moves, and its lowest point is named.
  CHECK(contains(text, "The lowest value is 0, at d = 0."));
}
