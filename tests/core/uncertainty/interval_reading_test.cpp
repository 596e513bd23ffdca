// The sentence that says what the reported LR is and what its interval describes.
#include <catch2/catch.hpp>

#include "core/guard/wording_checker.hpp"
#include "core/uncertainty/interval_reading.hpp"

using namespace counterpoise;

TEST_CASE("the reading of the interval is one sentence that passes the wording checker") {
  // Taroni, Bozza, Biedermann & Aitken (2016), Law, Probability and Risk 15:1 (from memory): the
  // reported value is the ratio of the expected probabilities; the interval is a sensitivity.
  const std::string& sentence = uncertainty::reported_value_and_interval_sentence();
  CHECK_THAT(sentence, Catch::Contains("average") && Catch::Contains("known exactly") && Catch::Contains("even inside it"));
  CHECK(sentence.back() == '.');
  CHECK(sentence.find(". ") == std::string::npos);  // one sentence
  const auto checker = guard::WordingChecker::load_default();
  guard::CheckOptions options;
  options.mode = guard::CheckMode::casework;
  for (const auto& finding : checker.check(sentence, options)) {
    CAPTURE(finding.rule_id, finding.matched_text);
    CHECK(finding.severity == guard::Severity::advice);
  }
}
