// The review memo of a comparison: its numbers are the comparison's, its sentences pass the
// wording guard, and compare -o writes it as PDF without overwriting a file unasked.
#include <catch2/catch.hpp>

#include "core/comparison/case_comparison.hpp"
#include "core/comparison/comparison_text.hpp"
#include "core/comparison/log10_change.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/interchange/case_json.hpp"
#include "report_test_support.hpp"
#include "reports/comparison_memo.hpp"
#include "reports/report_text.hpp"

using namespace counterpoise;
using namespace counterpoise::reports::testing;

namespace {

const std::filesystem::path kPair = demo_dir() / "comparison";

comparison::CaseVersion demo_version(const std::string& name) {
  auto read = interchange::read_case_file(kPair / name);
  REQUIRE(read.value);
  return comparison::make_version(std::move(*read.value), kPair, name);
}

comparison::CaseComparison demo_comparison() {
  return comparison::compare_cases(demo_version("harwick-vale-grain-store-prosecution.json"),
                                   demo_version("harwick-vale-grain-store-defence.json"));
}

reports::ComparisonMemoInfo memo_info() {
  return {"Vale Forensic Laboratory, Harwick Vale (fictional)", "VFL-2026-0611", "Tanner's Yard grain store",
          "Dr Owen Pryce", "2026-12-03"};
}

}  // namespace

TEST_CASE("the review memo shows the comparison's own numbers, versions by digest") {
  const auto c = demo_comparison();
  const auto model = reports::build_comparison_memo(c, memo_info());
  CHECK(reports::section_ids(model) ==
        std::vector<std::string>{"versions", "movers", "effects", "items", "wording", "cautions", "differences"});
  const std::string text = reports::render_text(model);
  CHECK_THAT(text, Catch::Contains(c.a.sha256));
  CHECK_THAT(text, Catch::Contains(c.b.sha256));
  CHECK_THAT(text, Catch::Contains("changes by " + comparison::change_for_readers(c.total_change)));
  CHECK_THAT(text, Catch::Contains("The verbal expression changes from extremely strong support for Hp to very strong support for Hp"));
  // Every share of the effects table, through the one formatter.
  for (std::size_t k = 0; k < c.differences.size(); ++k)
    if (c.differences[k].enters_lr() && c.effects[k].combined_share.is_finite())
      CHECK_THAT(text, Catch::Contains(comparison::change_for_readers(c.effects[k].combined_share)));
  CHECK_THAT(text, !Catch::Contains("e-0") && !Catch::Contains("nan"));
}

TEST_CASE("the review memo names its reviewer, or says none was given") {
  // A report carries the name of the person who wrote it (common practice); the memo's is the
  // reviewer's, as compare --reviewer gives it.
  const auto c = demo_comparison();
  CHECK_THAT(reports::render_text(reports::build_comparison_memo(c, memo_info())),
             Catch::Contains("Reviewer: Dr Owen Pryce") && !Catch::Contains("Examiner:"));
  auto unnamed = memo_info();
  unnamed.reviewer.clear();
  CHECK_THAT(reports::render_text(reports::build_comparison_memo(c, unnamed)), Catch::Contains("Reviewer: not given"));
}

TEST_CASE("every sentence of the review memo passes the wording guard") {
  const auto model = reports::build_comparison_memo(demo_comparison(), memo_info());
  // The program's own text is held to the rules; the learned reading weighs what people write
  // (docs/reasoning-guard.md, "The learned reading").
  const guard::WordingChecker checker(guard::WordingChecker::load_default().rules());
  const auto findings = checker.check(reports::render_text(model));
  for (const auto& f : findings) {
    CAPTURE(f.matched_text, f.rule_id);
    CHECK(f.severity == guard::Severity::advice);
  }
}

TEST_CASE("compare -o writes the review memo as PDF, and never overwrites without --force") {
  const auto dir = temp_dir("comparison-memo");
  const auto pdf = dir / "memo.pdf";
  const std::string command = std::string("'") + COUNTERPOISE_CLI + "' compare " +
                              quoted(kPair / "harwick-vale-grain-store-prosecution.json") + " " +
                              quoted(kPair / "harwick-vale-grain-store-defence.json") + " --reviewer 'Dr Owen Pryce' -o " +
                              quoted(pdf);
  const auto first = run(command);
  REQUIRE(first.exit_code == 0);
  CHECK_THAT(first.output, Catch::Contains("review memo written"));
  const std::string text = pdf_text(pdf);
  const auto c = demo_comparison();
  CHECK_THAT(text, Catch::Contains("Review memo"));
  CHECK_THAT(text, Catch::Contains(c.b.sha256));
  CHECK_THAT(text, Catch::Contains("Changes that move the verbal conclusion"));
  CHECK_THAT(text, Catch::Contains("Reviewer: Dr Owen Pryce"));
  CHECK_THAT(text, Catch::Contains(as_extracted(comparison::change_for_readers(c.total_change))));
  const auto again = run(command);
  CHECK(again.exit_code == 1);
  CHECK_THAT(again.output, Catch::Contains("already exists"));
  CHECK(run(command + " --force").exit_code == 0);
}

TEST_CASE("with several alternatives the memo shows the change against each and the weighted set") {
  const auto c = comparison::compare_cases(demo_version("harwick-vale-kestrel-street-prosecution.json"),
                                           demo_version("harwick-vale-kestrel-street-defence.json"));
  const auto model = reports::build_comparison_memo(c, memo_info());
  CHECK(reports::section_ids(model) == std::vector<std::string>{"versions", "movers", "effects", "items", "alternatives",
                                                                "wording", "cautions", "differences"});
  const std::string text = reports::render_text(model);
  REQUIRE(c.alternatives.compound);
  for (const auto* against : {&c.alternatives.by_alternative[1], &*c.alternatives.compound}) {
    CAPTURE(against->id);
    CHECK_THAT(text, Catch::Contains("the log10 LR changes by " + comparison::change_for_readers(against->total_change)));
    // Each share against it, through the one formatter.
    for (std::size_t k : against->entering)
      if (!comparison::moves_nothing(against->effects[k]))
        CHECK_THAT(text, Catch::Contains(comparison::change_for_readers(against->effects[k].combined_share)));
  }
  // Hd1 and Hd3 do not move: said, not tabled.
  CHECK_THAT(text, Catch::Contains("Against Hd1: no difference moves this LR."));
  // Each alternative's verbal expression in A and B, and whether it changes, in words.
  CHECK_THAT(text, Catch::Contains("Verbal expression, A → B"));
  for (const auto& against : c.alternatives.by_alternative) {
    CAPTURE(against.id);
    REQUIRE(against.verbal_a);
    REQUIRE(against.verbal_b);
    CHECK_THAT(text, Catch::Contains(comparison::alternative_band_sentence(against, against.id)));
  }
  CHECK_THAT(text, Catch::Contains(comparison::alternative_band_sentence(*c.alternatives.compound,
                                                                        comparison::kWeightedSetWords)));
  CHECK_THAT(text, Catch::Contains("weights Hd1 6, Hd2 3, Hd3 1 → Hd1 4, Hd2 5, Hd3 1"));
  // The program's own text is held to the rules; the learned reading weighs what people write
  // (docs/reasoning-guard.md, "The learned reading").
  const guard::WordingChecker checker(guard::WordingChecker::load_default().rules());
  for (const auto& f : checker.check(text)) {
    CAPTURE(f.matched_text, f.rule_id);
    CHECK(f.severity == guard::Severity::advice);
  }
}
