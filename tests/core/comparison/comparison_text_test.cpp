// The comparison in words: every sentence it writes passes the reasoning guard's wording check
// (DEVELOPERS.md, "User-visible wording"), and the text names the versions and the differences.
#include <catch2/catch.hpp>

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
  const auto checker = guard::WordingChecker::load_default();
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
