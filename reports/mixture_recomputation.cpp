#include "reports/mixture_recomputation.hpp"

#include <memory>
#include <string>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::reports {

namespace {

using models::dna_mixture::DnaMixtureModel;
using models::dna_mixture::Side;
using numbers::decimal_for_readers;
using numbers::kWorkingFigures;

Paragraph generated(std::string text) { return Paragraph{std::move(text), Paragraph::Style::body, {}, TextSource{}, {}}; }

std::string working(double x) { return decimal_for_readers(x, kWorkingFigures); }

std::string genotypes_cell(const std::vector<std::string>& genotypes) {
  if (genotypes.empty()) return "none (named people only)";
  std::string text;
  for (const auto& g : genotypes) text += (text.empty() ? "" : "; ") + g;
  return text;
}

// The rows of one locus under one proposition; returns the sum of the products.
double add_side(const DnaMixtureModel& model, std::size_t locus, Side side, double d, Table& table) {
  const std::string& name = model.loci()[locus].locus;
  const std::string under = side == Side::hp ? "Hp" : "Hd";
  const auto terms = model.genotype_set_terms(locus, side, d);
  double sum = 0.0, rest = 0.0;
  for (std::size_t i = 0; i < terms.size(); ++i) {
    const auto& t = terms[i];
    const double product = t.genotype_probability * t.observation_probability;
    sum += product;
    if (i >= kListedGenotypeSets) {
      rest += product;
      continue;
    }
    table.rows.push_back({name, under, genotypes_cell(t.genotypes), working(t.genotype_probability),
                          working(t.observation_probability), working(product)});
  }
  if (terms.size() > kListedGenotypeSets)
    table.rows.push_back({name, under, "the other " + numbers::count_for_readers(static_cast<std::int64_t>(
                                                          terms.size() - kListedGenotypeSets)) + " sets", "", "",
                          working(rest)});
  table.rows.push_back({name, under, "sum: P(alleles observed | " + under + ")", "", "",
                        terms.empty() ? "0" : working(sum)});
  return sum;
}

}  // namespace

std::vector<Block> mixture_recomputation(const casefile::Item& item) {
  const auto model = std::dynamic_pointer_cast<const DnaMixtureModel>(item.model);
  if (!model) return {};
  const double d = model->point_dropout();
  Table table;
  table.header = {"Locus", "Under", "Genotypes of the unknown people", "P(genotypes)", "P(alleles | genotypes)",
                  "Product"};
  table.widths = {0.9, 0.5, 1.8, 1.1, 1.1, 1.1};
  table.no_wrap = {true, true, false, true, true, true};
  for (std::size_t l = 0; l < model->loci().size(); ++l) {
    const double hp = add_side(*model, l, Side::hp, d, table);
    const double hd = add_side(*model, l, Side::hd, d, table);
    const std::string lr = hd > 0.0 ? (hp > 0.0 ? working(hp / hd) : "0") : "infinite";
    table.rows.push_back({model->loci()[l].locus, "", "LR at this locus: the Hp sum over the Hd sum", "", "", lr});
  }
  std::vector<Block> blocks;
  blocks.push_back(generated(
      "Item " + item.id + " at the fixed drop-out probability d = " + decimal_for_readers(d, kWorkingFigures) +
      ": for each locus and proposition, every set of genotypes the unknown contributors could have (each set once, "
      "in any order; Q is any allele not observed and not carried by a named person). P(genotypes) is the "
      "Balding\u2013Nichols sampling formula conditioned on the named people's alleles, counting every order of the "
      "unknowns and both orders of a heterozygote; P(alleles | genotypes) is the drop-out and drop-in model with every "
      "contributor's genotype. The products sum to the probability of the alleles observed at the locus; the ratio of "
      "the two sums is the locus's likelihood ratio, and the loci's likelihood ratios multiply to the likelihood ratio "
      "at this d. Where a locus has more than " + std::to_string(kListedGenotypeSets) +
      " sets under a proposition, the first are listed and the rest summed in one row."));
  blocks.push_back(std::move(table));
  return blocks;
}

}  // namespace counterpoise::reports
