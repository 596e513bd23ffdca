// The report section of a dna-mixture item: where it stands, the per-locus table against the
// core's detail, and the curve over the drop-out probability.
#include <algorithm>
#include <string>

#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/numbers/number_text.hpp"
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
  for (const auto& item : value.items) CHECK_FALSE(mixture_section(item).has_value());
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
