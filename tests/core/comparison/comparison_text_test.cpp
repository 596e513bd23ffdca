// The comparison in words: every sentence it writes passes the reasoning guard's wording check
// (DEVELOPERS.md, "User-visible wording"), and the text names the versions and the differences.
#include <catch2/catch.hpp>

#include "core/comparison/comparison_json.hpp"
#include "core/comparison/comparison_text.hpp"
#include "core/guard/wording_checker.hpp"
#include "tests/core/comparison/comparison_test_support.hpp"

using namespace counterpoise;

namespace {

std::string joined(const std::vector<std::string>& lines) {
  std::string text;
  for (const auto& line : lines) text += line + "\n";
  return text;
}

// The program's own sentences: the comparison's lines without the values quoted from the cases
// (lines holding "A:" or "B:" values and the quoted changes, which are the cases' words).
std::string own_sentences(const comparison::CaseComparison& c) {
  std::string text;
  for (const auto& line : comparison::comparison_lines(c))
    if (line.rfind("      ", 0) != 0 && line.find(" → ") == std::string::npos) text += line + "\n";
  return text;
}

}  // namespace

TEST_CASE("the comparison's own sentences pass the wording check", "[comparison][guard]") {
  const auto a = comparison_test::demo_version("comparison/harwick-vale-grain-store-prosecution.json");
  const auto b = comparison_test::demo_version("comparison/harwick-vale-grain-store-defence.json");
  const auto c = comparison::compare_cases(a, b);
  // The program's own text is held to the rules; the learned reading weighs what people write
  // (docs/reasoning-guard.md, "The learned reading").
  const guard::WordingChecker checker(guard::WordingChecker::load_default().rules());
  guard::CheckOptions options;
  options.hp = a.value.propositions.hp;
  options.hd = a.value.propositions.hd;
  const std::string text = own_sentences(c);
  std::string flagged;
  for (const auto& f : checker.check(text, options))
    if (f.severity != guard::Severity::advice) flagged += f.rule_id + ": " + f.matched_text + "\n";
  INFO(text);
  CHECK(flagged.empty());
  // The verbal sentences come from the scale, in the conditional form.
  CHECK_THAT(text, Catch::Contains("The findings provide extremely strong support for Hp rather than Hd."));
  CHECK_THAT(joined(comparison::comparison_lines(c)), Catch::Contains("SHA-256 " + a.sha256));
}

TEST_CASE("changed wording gets the reasoning guard's findings on each side", "[comparison][guard]") {
  // A rewording that states the probability of a proposition (a source probability error, Koehler
  // 1993, Jurimetrics 34:21) where the first version stated the LR in the conditional form.
  nlohmann::json first = comparison_test::three_item_case();
  first["items"][0]["description"] = "The findings are about 40 times more probable if Mr Vance forced the door than if he has never been to the shed.";
  nlohmann::json second = first;
  second["items"][0]["description"] = "The probability that the paint came from another door is 1 in 40.";
  const auto a = comparison_test::version_of(first, "A");
  const auto b = comparison_test::version_of(second, "B");
  const auto c = comparison::compare_cases(a, b);
  REQUIRE(c.differences.size() == 1);
  REQUIRE(c.wording.by_difference.at(0));
  const auto& review = *c.wording.by_difference[0];
  // The same findings as the checker gives on each text by itself (it is called, not changed).
  const auto checker = guard::WordingChecker::load_default();
  guard::CheckOptions options;
  options.hp = a.value.propositions.hp;
  options.hd = a.value.propositions.hd;
  const auto direct_a = checker.check(first["items"][0]["description"].get<std::string>(), options);
  const auto direct_b = checker.check(second["items"][0]["description"].get<std::string>(), options);
  CHECK(review.a.size() == direct_a.size());
  REQUIRE(review.b.size() == direct_b.size());
  CHECK(comparison::flagged_count(review.a) == 0);
  CHECK(comparison::flagged_count(review.b) >= 1);
  for (std::size_t i = 0; i < direct_b.size(); ++i) CHECK(review.b[i].rule_id == direct_b[i].rule_id);
  const std::string text = joined(comparison::comparison_lines(c));
  CHECK_THAT(text, Catch::Contains("reasoning guard, A: nothing flagged"));
  CHECK_THAT(text, Catch::Contains("reasoning guard, B: error [" + direct_b.front().rule_id + "]"));
  const auto j = comparison::comparison_to_json(c);
  CHECK(j["differences"][0]["guard"]["b"][0]["rule_id"] == direct_b.front().rule_id);
}
