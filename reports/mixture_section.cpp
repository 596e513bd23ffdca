#include "reports/mixture_section.hpp"

#include <cmath>
#include <memory>
#include <string>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::reports {

namespace {

using nlohmann::json;

// Every fifth point of the model's curve: d = 0, 0.05, ..., 1.
constexpr std::size_t kCurveStride = 5;

Paragraph generated(std::string text, Paragraph::Style style = Paragraph::Style::body) {
  return Paragraph{std::move(text), style, {}, TextSource{}, {}};
}

std::string joined(const json& values, const std::string& separator) {
  std::string text;
  for (const auto& v : values) text += (text.empty() ? "" : separator) + v.get<std::string>();
  return text;
}

// The LR as the detail states it: "0", "infinite", "not defined" or the number for readers.
std::string lr_cell(const json& lr) {
  const std::string state = lr["state"].get<std::string>();
  if (state == "zero") return "0";
  if (state == "infinite") return "infinite";
  if (state == "undefined") return "not defined";
  return numbers::magnitude_for_readers(lr["log10_lr"].get<double>());
}

std::string leading_cell(const json& side) {
  const auto& sets = side["leading_genotype_sets"];
  if (sets.empty()) return "none possible";
  const auto& first = sets[0];
  if (first["unknown_genotypes"].empty()) return "named people only";
  return joined(first["unknown_genotypes"], "; ") + " (" +
         numbers::decimal_for_readers(100.0 * first["share"].get<double>()) + " %)";
}

// "12, 13, 15" with any alleles marked uncertain after them: "12, 13 (uncertain: 9)".
std::string observed_cell(const json& locus) {
  std::string cell = joined(locus["observed"], ", ");
  if (locus.contains("uncertain") && !locus["uncertain"].empty())
    cell += (cell.empty() ? "" : " ") + std::string("(uncertain: ") + joined(locus["uncertain"], ", ") + ")";
  return cell.empty() ? "none" : cell;
}

// "victim 0.02 (a homozygote's allele 0.02 squared)", one per named person with a rate of their own.
std::string own_rates_text(const json& by_contributor) {
  std::string text;
  for (auto it = by_contributor.begin(); it != by_contributor.end(); ++it) {
    const std::string d = numbers::entered_for_readers(it.value()["dropout"].get<double>());
    const json& hom = it.value()["homozygote"];
    text += (text.empty() ? "" : "; ") + it.key() + " " + d + " (a homozygote's allele " +
            (hom.is_number() ? numbers::entered_for_readers(hom.get<double>()) : d + " squared") + ")";
  }
  return text;
}

Table locus_table(const json& detail, const std::string& hd) {
  Table table;
  table.header = {"Locus", "Alleles observed", "Named people", "Sets of unknown genotypes (Hp / " + hd + ")",
                  "Leading set under " + hd + " (share)", "LR at this locus"};
  table.widths = {0.9, 1.3, 2.0, 1.1, 1.6, 1.0};
  table.no_wrap = {true, false, false, true, false, true};
  for (const auto& locus : detail["loci"]) {
    std::string people;
    for (auto it = locus["references"].begin(); it != locus["references"].end(); ++it)
      people += (people.empty() ? "" : "; ") + it.key() + " " + joined(it.value(), ",");
    table.rows.push_back({locus["locus"].get<std::string>(), observed_cell(locus), people,
                          std::to_string(locus["hp"]["genotype_sets"].get<std::size_t>()) + " / " +
                              std::to_string(locus["hd"]["genotype_sets"].get<std::size_t>()),
                          leading_cell(locus["hd"]), lr_cell(locus["lr"])});
  }
  return table;
}

Table curve_table(const json& curve) {
  Table table;
  table.header = {"Drop-out probability d", "LR"};
  table.widths = {1.0, 1.0};
  table.no_wrap = {true, true};
  const auto& points = curve["points"];
  for (std::size_t i = 0; i < points.size(); i += kCurveStride)
    // The grid points are exact multiples of 0.01: written in full, never rounded.
    table.rows.push_back({numbers::entered_for_readers(points[i]["dropout"].get<double>()), lr_cell(points[i]["lr"])});
  return table;
}

// The per-locus table and the curve over d of Hp against one alternative (`hd`: "Hd", "Hd2").
void add_against(const json& detail, const std::string& hd, bool own_rates, std::vector<Block>& blocks) {
  const auto& dropout = detail["dropout"];
  // A mean of a distribution is a result (3 figures); a point value is an input (as entered).
  const std::string point = dropout["integrated"].get<bool>() ? numbers::decimal_for_readers(dropout["point"].get<double>())
                                                               : numbers::entered_for_readers(dropout["point"].get<double>());
  blocks.push_back(generated(
      dropout["integrated"].get<bool>()
          ? "The drop-out probability is uncertain, described by " + dropout["assignment"].get<std::string>() +
                "; the likelihood ratio of the item averages the probability of the findings under each proposition "
                "over d. The values per locus below are at d = " + point + ", the mean of that distribution."
          : "The drop-out probability is " + point + "; the values per locus below are at that value."));
  blocks.push_back(locus_table(detail, hd));
  blocks.push_back(generated("The likelihood ratio over the drop-out probability" +
                                 (hd == "Hd" ? std::string() : ", Hp against " + hd),
                             Paragraph::Style::lead));
  const auto& minimum = detail["dropout_curve"]["minimum"];
  // A curve that prints one value wherever it is defined (the same people under both
  // propositions) has no lowest point to name: the minimiser would stop at a d the table does
  // not show, moved only by the last bits of the arithmetic.
  const std::string lowest = lr_cell(minimum["lr"]);
  bool flat = true;
  for (const auto& point : detail["dropout_curve"]["points"])
    flat = flat && (point["lr"]["state"] == "undefined" || lr_cell(point["lr"]) == lowest);
  blocks.push_back(generated(
      "The whole profile's likelihood ratio, recomputed with d fixed at each value from 0 to 1, shows how far the "
      "evaluation depends on d" +
      std::string(own_rates ? " (the named people's own drop-out probabilities stay as stated)" : "") +
      (flat ? ". It is " + lowest + " wherever it is defined: the evaluation does not depend on d."
            : ". The lowest value is " + lowest + ", at d = " +
                  numbers::decimal_for_readers(minimum["dropout"].get<double>()) + ".")));
  const auto& at_zero = detail["dropout_curve"]["points"][0]["lr"];
  if (at_zero["state"] == "zero")
    blocks.push_back(generated(
        "At d = 0 the findings could not have arisen if Hp were true: alleles of a person Hp names as a contributor "
        "are missing, which only drop-out explains."));
  blocks.push_back(curve_table(detail["dropout_curve"]));
}

}  // namespace

std::optional<Section> mixture_section(const casefile::Item& item, const casefile::Propositions& propositions) {
  const auto model = std::dynamic_pointer_cast<const models::dna_mixture::DnaMixtureModel>(item.model);
  if (!model) return std::nullopt;
  const json detail = model->evaluate().detail;
  const auto& dropout = detail["dropout"];
  Section s{"mixture-" + item.id, "The DNA mixture of item " + item.id, false, {}};
  s.blocks.push_back(generated(
      "Item " + item.id + " is evaluated with the semi-continuous model for DNA mixtures: at each locus the "
      "probability of the alleles observed is summed over the genotypes the unknown contributors could have, each "
      "allele of a contributor dropping out with probability d (a homozygote's with " +
      (dropout["homozygote"].is_number() ? numbers::entered_for_readers(dropout["homozygote"].get<double>())
                                         : std::string("d squared")) +
      ") and an allele dropping in with probability " + numbers::entered_for_readers(detail["dropin"].get<double>()) +
      " times its frequency. Q stands for any allele not observed and not carried by a named person."));
  const bool own_rates = dropout.contains("by_contributor") && !dropout["by_contributor"].empty();
  if (own_rates)
    s.blocks.push_back(generated(
        "Some named people have a drop-out probability of their own, which replaces d for their alleles: " +
        own_rates_text(dropout["by_contributor"]) + ". The unknown contributors and every other named person follow d."));
  bool any_uncertain = false;
  for (const auto& locus : detail["loci"]) any_uncertain = any_uncertain || (locus.contains("uncertain") && !locus["uncertain"].empty());
  if (any_uncertain)
    s.blocks.push_back(generated(
        "Alleles marked uncertain (a peak below the threshold) are taken as neither seen nor missing: a contributor "
        "carrying one needs no drop-out to explain its absence, and none needs a drop-in to explain it."));
  const bool by_alternative =
      propositions.has_alternatives() && item.alternative_models.size() == propositions.alternatives.size();
  if (!by_alternative) {
    add_against(detail, "Hd", own_rates, s.blocks);
    return s;
  }
  // Each alternative names its own contributors: its own sets of unknown genotypes, leading set,
  // LR per locus and curve over d.
  for (std::size_t i = 0; i < propositions.alternatives.size(); ++i) {
    const auto& alternative = propositions.alternatives[i];
    s.blocks.push_back(generated("Hp against " + alternative.id, Paragraph::Style::lead));
    add_against(item.alternative_models[i]->evaluate().detail, alternative.id, own_rates, s.blocks);
  }
  return s;
}

}  // namespace counterpoise::reports
