// The report model without any painting: its sections, their order, the sentences and the
// numbers, and how casework and training reports differ.
#include <cmath>
#include <numeric>

#include "core/numbers/number_text.hpp"
#include "core/numbers/posterior.hpp"
#include "core/platform/sha256.hpp"
#include "reports/report_model.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {

ReportModel model_for(const casefile::Case& value, ReportMode mode) {
  return build_report_model(value, evaluation::evaluate_case(value), mode);
}

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

}  // namespace

TEST_CASE("model: sections in reading order, casework puts the prior sensitivity in an appendix at the end") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto model = model_for(value, ReportMode::casework);
  // common practice: case, question, propositions, findings, evaluation, then what supports it.
  // The appendices follow: the recomputation of each item, then the illustration of prior odds.
  CHECK(section_ids(model) == std::vector<std::string>{"case", "question", "propositions", "findings", "evaluation",
                                                       "contribution", "cautions", "recomputation", "sensitivity"});
  const auto* appendix = model.find("sensitivity");
  REQUIRE(appendix);
  CHECK(appendix->appendix);
  CHECK(contains(appendix->heading, "Appendix"));
  CHECK(contains(appendix->heading, "illustration"));
  const std::string text = section_text(model, "sensitivity");
  // DOMAIN (common practice): the prior belongs to the fact-finder; the scientist proposes none.
  CHECK(contains(text, "fact-finder"));
  CHECK(contains(text, "the scientist proposes no prior"));
  CHECK_FALSE(contains(text, "Why P(E|H) and P(H|E) differ"));
}

TEST_CASE("model: training puts the sensitivity in the body with the explanation, using the case's numbers") {
  const auto value = load_case(demo_dir() / "harwick-vale-training-priors.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::training);
  CHECK(section_ids(model) == std::vector<std::string>{"case", "question", "propositions", "findings", "evaluation",
                                                       "sensitivity", "contribution", "cautions", "recomputation"});
  const auto* s = model.find("sensitivity");
  REQUIRE(s);
  CHECK_FALSE(s->appendix);
  CHECK_FALSE(contains(s->heading, "Appendix"));
  const std::string text = section_text(model, "sensitivity");
  CHECK(contains(text, "Why P(E|H) and P(H|E) differ"));
  // Odds form of Bayes' theorem: at prior odds 1/LR the posterior odds are 1, so P(Hp|E) = 0.5.
  const double log10_lr = result.combined.lr.log10();
  CHECK(contains(text, "for prior odds of " + numbers::odds_for_readers(-log10_lr)));
  CHECK(contains(text, "posterior probability for Hp of 0.5"));
  CHECK(contains(text, numbers::lr_for_readers(result.combined.lr)));
}

TEST_CASE("model: the same case differs between modes only where specified") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto casework = model_for(value, ReportMode::casework);
  const auto training = model_for(value, ReportMode::training);
  for (const char* id : {"question", "propositions", "findings", "evaluation", "contribution", "cautions"})
    CHECK(section_text(casework, id) == section_text(training, id));
  CHECK(section_text(casework, "case") != section_text(training, "case"));
  CHECK(contains(section_text(training, "case"), "Training report"));
  CHECK(casework.header.title == "Evaluative report");
  CHECK(contains(training.header.title, "training"));
}

TEST_CASE("model: header carries laboratory, reference, examiner, date, revision and the case digest") {
  const auto path = demo_dir() / "harwick-vale-breakin.json";
  const auto value = load_case(path);
  const auto model = model_for(value, ReportMode::casework);
  CHECK(model.header.laboratory == *value.details.laboratory);
  CHECK(model.header.reference == value.details.reference);
  CHECK(model.header.examiner == *value.details.examiner);
  CHECK(model.header.date == *value.details.date);
  CHECK_FALSE(model.header.revision.empty());
  // The digest is SHA-256 over the canonical text of the file as written (interchange promise:
  // canonical_text(write_case(read(d))) == canonical_text(d)), computed here from the raw file.
  const auto document = nlohmann::json::parse(read_file(path));
  CHECK(model.header.digest == platform::sha256_hex(interchange::canonical_text(document)));
  CHECK(model.header.digest.size() == 64);
  // A different case gives a different digest.
  auto changed = value;
  changed.details.examiner = "Dr Someone Else";
  CHECK(case_digest(changed) != model.header.digest);
  // A store's seal replaces the digest and revision.
  IssueInfo issue{"4 of the case store", "Sealed case state", std::string(64, 'a'), {}, {}};
  const auto sealed = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework, issue);
  CHECK(sealed.header.digest == issue.digest);
  CHECK(sealed.header.revision == issue.revision);
  CHECK(sealed.header.digest_label == issue.digest_label);
}

TEST_CASE("model: the evaluation sentence is in the conditional form, for each direction and state") {
  // Royal Statistical Society practitioner guide 1 (Aitken, Roberts & Jackson 2010), ch. 3: the
  // findings are N times more probable if Hp than if Hd — never "Hp is N times more likely".
  struct Row {
    const char* item;
    const char* expected;
  };
  const Row rows[] = {
      // "about 2 300": three significant figures, digits grouped by a narrow no-break space.
      {R"({"id": "E1", "model": "reported-lr", "lr": 2300})",
       "The findings are about 2\u202f300 times more probable if Hp is true than if Hd is true."},
      {R"({"id": "E1", "model": "reported-lr", "lr": 0.002})",
       "The findings are about 500 times more probable if Hd is true than if Hp is true."},
      {R"({"id": "E1", "model": "reported-lr", "lr": 1})",
       "The findings are about as probable if Hp is true as if Hd is true."},
      {R"({"id": "E1", "model": "assigned", "p_given_hp": 0, "p_given_hd": 0.3})",
       "The findings could not have arisen if Hp were true (the likelihood ratio is zero)"},
      {R"({"id": "E1", "model": "assigned", "p_given_hp": 0.4, "p_given_hd": 0})",
       "The findings could not have arisen if Hd were true (the likelihood ratio is infinite)"},
      {R"({"id": "E1", "model": "reported-lr", "lr": 1.2e9})",
       "The findings are about 1.2 × 10⁹ times more probable if Hp is true than if Hd is true."},
  };
  for (const auto& row : rows) {
    const auto value = case_from_json(case_text(row.item));
    const std::string text = section_text(model_for(value, ReportMode::casework), "evaluation");
    INFO(row.item);
    CHECK(contains(text, row.expected));
  }
}

TEST_CASE("model: the verbal equivalent follows the number and names the scale") {
  // ENFSI (2015) verbal equivalents: 10^4 to 10^6 "very strong support", 100 to 1000
  // "moderately strong support" (for 1/LR in favour of Hd).
  const auto hp = case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 50000})"));
  const std::string text = section_text(model_for(hp, ReportMode::casework), "evaluation");
  CHECK(contains(text, "On the verbal scale in use (" + hp.verbal_scale.title() + ")"));
  CHECK(contains(text, "very strong support for Hp rather than Hd"));
  CHECK(text.find("times more probable") < text.find("very strong support"));
  const auto hd = case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 0.004})"));
  CHECK(contains(section_text(model_for(hd, ReportMode::casework), "evaluation"),
                 "moderately strong support for Hd rather than Hp"));
}

TEST_CASE("model: interval, conservative bound, and which one the report states") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto result = evaluation::evaluate_case(value);
  const auto& spread = *result.combined.spread;
  const std::string text = section_text(build_report_model(value, result, ReportMode::casework), "evaluation");
  CHECK(contains(text, "90 % interval runs from " + numbers::magnitude_for_readers(spread.low_log10) + " to " +
                           numbers::magnitude_for_readers(spread.high_log10)));
  CHECK(contains(text, "conservative one-sided 95 % bound is " + numbers::magnitude_for_readers(spread.conservative_log10)));
  CHECK(contains(text, "This report states the point value"));
  CHECK(contains(text, "about " + numbers::lr_for_readers(result.combined.lr) + " times more probable if Hp"));

  auto conservative = value;
  conservative.report = nlohmann::json{{"reported_value", "conservative"}};
  const std::string c = section_text(build_report_model(conservative, result, ReportMode::casework), "evaluation");
  CHECK(contains(c, "This report states the conservative bound"));
  CHECK(contains(c, "about " + numbers::magnitude_for_readers(spread.conservative_log10) + " times more probable if Hp"));
}

TEST_CASE("model: independence reasons of the combined items, exclusions with their reasons") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto model = model_for(value, ReportMode::casework);
  const std::string evaluation = section_text(model, "evaluation");
  const std::string findings = section_text(model, "findings");
  for (const auto& item : value.items) {
    INFO(item.id);
    if (item.included()) {
      REQUIRE(item.combination->independence);
      CHECK(contains(evaluation, *item.combination->independence));
    } else {
      CHECK(contains(findings, *item.combination->exclusion_reason));
      CHECK(contains(evaluation, "Left out of the combination, for the reasons given with the findings: " + item.id));
    }
  }
}

TEST_CASE("model: the findings table and each item's model assumptions") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::casework);
  const auto* findings = model.find("findings");
  REQUIRE(findings);
  const Table* table = nullptr;
  for (const auto& b : findings->blocks)
    if (!table) table = std::get_if<Table>(&b);
  REQUIRE(table);
  REQUIRE(table->rows.size() == value.items.size());
  CHECK(table->header.front() == "Item");
  const std::string text = all_text(model);
  for (std::size_t i = 0; i < value.items.size(); ++i) {
    INFO(value.items[i].id);
    CHECK(table->rows[i][0] == value.items[i].id);
    CHECK(contains(table->rows[i][4], numbers::lr_for_readers(result.items[i].point.lr)));
    CHECK(table->rows[i][6].rfind(result.items[i].verbal.label, 0) == 0);
    CHECK(contains(text, value.items[i].model->assumptions()));
    if (value.items[i].description) CHECK(contains(text, *value.items[i].description));
  }
  // P(E|Hd) of E1 is the Laplace (rule of succession) mean (3+1)/(412+2) = 0.0096618 -> "0.00966".
  CHECK(table->rows[0][3] == "0.00966");
  // A reported LR has no P(E|H) to show.
  CHECK(table->rows[2][2] == "\u2013");  // an en dash, never a hyphen that reads as a minus
}

TEST_CASE("model: contribution chart is each combined item's log10 LR and the running total") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::casework);
  const auto* s = model.find("contribution");
  REQUIRE(s);
  const ContributionChart* chart = nullptr;
  for (const auto& b : s->blocks)
    if (!chart) chart = std::get_if<ContributionChart>(&b);
  REQUIRE(chart);
  double running = 0;
  std::size_t k = 0;
  for (const auto& e : result.items) {
    if (!e.included) continue;
    REQUIRE(k < chart->bars.size());
    running += e.point.lr.log10();
    CHECK(chart->bars[k].id == e.id);
    CHECK(chart->bars[k].log10_lr == Approx(e.point.lr.log10()));
    CHECK(chart->bars[k].running_log10 == Approx(running));
    ++k;
  }
  CHECK(k == chart->bars.size());
  // Combination is the sum of logs: the last running total is the combined log10 LR.
  CHECK(chart->bars.back().running_log10 == Approx(result.combined.lr.log10()).epsilon(1e-12));
}

TEST_CASE("model: posterior plot is monotone in the prior, inside its band, with the threshold crossings") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const auto result = evaluation::evaluate_case(value);
  const auto model = build_report_model(value, result, ReportMode::casework);
  const auto* s = model.find("sensitivity");
  REQUIRE(s);
  const PosteriorPlot* plot = nullptr;
  for (const auto& b : s->blocks)
    if (!plot) plot = std::get_if<PosteriorPlot>(&b);
  REQUIRE(plot);
  REQUIRE(plot->low.size() == plot->probability.size());
  for (std::size_t i = 1; i < plot->probability.size(); ++i) CHECK(plot->probability[i] >= plot->probability[i - 1]);
  for (std::size_t i = 0; i < plot->probability.size(); ++i) {
    CHECK(plot->low[i] <= plot->probability[i]);
    CHECK(plot->probability[i] <= plot->high[i]);
  }
  REQUIRE(plot->crossings.size() == result.sensitivity.thresholds.size());
  for (const auto& c : plot->crossings) {
    // At the crossing the posterior equals the threshold (odds form of Bayes' theorem).
    CHECK(numbers::posterior_from(c.log10_prior_odds, result.combined.lr).probability() == Approx(c.threshold).epsilon(1e-9));
    CHECK(c.log10_prior_odds >= plot->log10_prior_odds.front());
    CHECK(c.log10_prior_odds <= plot->log10_prior_odds.back());
  }
}

TEST_CASE("model: the sensitivity table writes posteriors near 1 as complements, sorted by prior odds") {
  const auto value = load_case(demo_dir() / "harwick-vale-training-priors.json");
  const auto model = model_for(value, ReportMode::training);
  const auto* s = model.find("sensitivity");
  REQUIRE(s);
  const Table* table = nullptr;
  for (const auto& b : s->blocks)
    if (!table) table = std::get_if<Table>(&b);
  REQUIRE(table);
  bool saw_complement = false;
  for (const auto& row : table->rows) {
    CHECK(row[2] != "1");  // never a bare 1 for a posterior short of certainty
    saw_complement = saw_complement || row[2].rfind("1 − ", 0) == 0;
  }
  CHECK(saw_complement);
}

TEST_CASE("model: cautions state what the report does not do") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  const std::string text = section_text(model_for(value, ReportMode::casework), "cautions");
  // The cautions the issue requires (common practice).
  CHECK(contains(text, "no opinion on guilt"));
  CHECK(contains(text, "depend on the propositions, the information and the assumptions"));
  CHECK(contains(text, "verbal scale is a convention"));
  CHECK(contains(text, "accredited laboratory"));
  CHECK(contains(text, "law of the place where it is used"));
}

TEST_CASE("model: an item below the propositions' level is pointed out") {
  // Cook et al. (1998), Science & Justice 38:231: a sub-source LR does not answer a source question.
  const auto value = case_from_json(case_text(R"({"id": "D1", "model": "reported-lr", "lr": 1e6, "level": "sub-source"})"));
  CHECK(contains(section_text(model_for(value, ReportMode::casework), "propositions"),
                 "Item D1 addresses the sub-source level, below the level of the propositions"));
}

TEST_CASE("model: the data files appendix pins each file the items read by its SHA-256") {
  // The DNA demo reads its allele frequencies from a CSV file, for both of its items.
  const auto path = demo_dir() / "dna" / "vale-str-frequencies.csv";
  // GNU coreutils sha256sum (FIPS 180-4), outside the project, gives the expected digest.
  const auto sum = run("sha256sum " + quoted(path));
  REQUIRE(sum.exit_code == 0);
  const std::string expected = sum.output.substr(0, 64);
  const auto model = model_for(load_case(demo_dir() / "harwick-vale-dna.json"), ReportMode::casework);
  const Section* files = model.find("data-files");
  REQUIRE(files);
  CHECK(files->appendix);
  CHECK(model.sections.back().id == "sensitivity");  // the casework illustration of priors comes last
  const Table* table = nullptr;
  for (const auto& block : files->blocks)
    if (const auto* t = std::get_if<Table>(&block)) table = t;
  REQUIRE(table);
  REQUIRE(table->rows.size() == 1);  // D1, read once for each alternative donor: one file
  for (const auto& row : table->rows) {
    CHECK(row[1] == "dna/vale-str-frequencies.csv");
    CHECK(row[2] == std::to_string(std::filesystem::file_size(path)));
    CHECK(row[3] == expected);
  }
  CHECK(table->rows[0][0] == "D1");

  // A case that reads no file has no such appendix.
  CHECK_FALSE(model_for(load_case(demo_dir() / "harwick-vale-breakin.json"), ReportMode::casework).find("data-files"));
}
