// The wording check of the report: the program's own sentences always pass the reasoning guard;
// flagged user text is refused in casework unless overridden with a reason, kept and listed in
// training; the override is listed in the report.
#include "core/guard/report_readiness.hpp"
#include "reports/report_wording.hpp"
#include "report_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::reports;
using namespace counterpoise::reports::testing;

namespace {

std::shared_ptr<const guard::WordingChecker> checker() {
  static auto shipped = std::make_shared<const guard::WordingChecker>(guard::WordingChecker::load_default());
  return shipped;
}

// A transposed conditional written into an item's notes (the corpus family "transposed-conditional":
// a probability of a proposition given as if it were the scientist's finding).
const char* kFlaggedNote = "There is a 99.9% probability that Mr Brennan broke the window at 14 Mill Lane.";

std::string flagged_case(const std::string& extra = "") {
  return case_text(std::string(R"({"id": "E1", "model": "reported-lr", "lr": 300, "notes": ")") + kFlaggedNote + R"("})",
                   extra);
}

ReportModel checked(const casefile::Case& value, ReportMode mode) {
  auto model = build_report_model(value, evaluation::evaluate_case(value), mode);
  apply_wording_check(model, value, guard_wording_check(checker(), value.propositions), "the shipped rules");
  return model;
}

std::string flagged_rule() {
  const auto value = case_from_json(flagged_case());
  const auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  const auto texts = report_texts(model);
  const auto flags = guard_wording_check(checker(), value.propositions)(texts, ReportMode::casework);
  REQUIRE(flags.size() == 1);
  CHECK(texts[flags[0].text_index].source.item == "E1");
  CHECK(texts[flags[0].text_index].source.field == "notes");
  return flags[0].rule_id;
}

}  // namespace

TEST_CASE("wording: every sentence the program writes passes the reasoning guard, in both modes") {
  // Issue 5, "Generated text": all generated sentences run through the checker.
  for (const auto& path : demo_cases()) {
    const auto value = load_case(path);
    for (const auto mode : {ReportMode::casework, ReportMode::training}) {
      INFO(path << " " << report_mode_name(mode));
      auto model = build_report_model(value, evaluation::evaluate_case(value), mode);
      REQUIRE_NOTHROW(apply_wording_check(model, value, guard_wording_check(checker(), value.propositions), "the shipped rules"));
      const auto texts = report_texts(model);  // now with the wording section itself
      for (const auto& flag : guard_wording_check(checker(), value.propositions)(texts, mode)) {
        INFO("flagged: " << flag.rule_id << ": " << flag.sentence);
        CHECK(texts[flag.text_index].source.from_user);
      }
      const auto* s = model.find("wording");
      REQUIRE(s);
      CHECK(s->heading == "Wording check");
    }
  }
}

TEST_CASE("wording: the generated sentences for unusual states pass too (zero, infinite, Hd-favouring, neutral)") {
  for (const char* item : {R"({"id": "E1", "model": "assigned", "p_given_hp": 0, "p_given_hd": 0.3})",
                           R"({"id": "E1", "model": "assigned", "p_given_hp": 0.4, "p_given_hd": 0})",
                           R"({"id": "E1", "model": "reported-lr", "lr": 0.002, "interval": [0.0005, 0.01]})",
                           R"({"id": "E1", "model": "reported-lr", "lr": 1})"}) {
    const auto value = case_from_json(case_text(item));
    for (const auto mode : {ReportMode::casework, ReportMode::training}) {
      INFO(item << " " << report_mode_name(mode));
      CHECK_NOTHROW(checked(value, mode));
    }
  }
}

TEST_CASE("wording: flagged user text refuses a casework report, naming the item, field and rule") {
  const std::string rule = flagged_rule();
  const auto value = case_from_json(flagged_case());
  try {
    checked(value, ReportMode::casework);
    FAIL("the report was not refused");
  } catch (const ReportRefused& refused) {
    REQUIRE(refused.flags().size() == 1);
    CHECK(refused.flags()[0].rule_id == rule);
    const std::string message = refused.what();
    CHECK(message.find("item E1, field notes") != std::string::npos);
    CHECK(message.find(rule) != std::string::npos);
    CHECK(message.find("wording_overrides") != std::string::npos);
  }
}

TEST_CASE("wording: an override with a reason lets the text stand and is listed in the report") {
  const std::string rule = flagged_rule();
  const std::string reason = "The sentence quotes the officer's request word for word.";
  const auto value = case_from_json(flagged_case(
      R"(, "report": {"wording_overrides": [{"rule": ")" + rule + R"(", "item": "E1", "reason": ")" + reason + R"("}]})"));
  const auto model = checked(value, ReportMode::casework);
  const std::string text = section_text(model, "wording");
  CHECK(text.find(reason) != std::string::npos);
  CHECK(text.find(rule) != std::string::npos);
  // The wording section comes right before the first appendix.
  const auto wording = std::find_if(model.sections.begin(), model.sections.end(), [](const Section& x) { return x.id == "wording"; });
  REQUIRE(wording != model.sections.end());
  REQUIRE(wording + 1 != model.sections.end());
  CHECK((wording + 1)->appendix);
  CHECK_FALSE(wording->appendix);
}

TEST_CASE("wording: an override for another item or another rule does not apply") {
  const std::string rule = flagged_rule();
  for (const std::string& o : {R"({"rule": ")" + rule + R"(", "item": "propositions", "reason": "x"})",
                              std::string(R"({"rule": "some-other-rule", "item": "E1", "reason": "x"})")}) {
    const auto value = case_from_json(flagged_case(R"(, "report": {"wording_overrides": [)" + o + "]}"));
    INFO(o);
    CHECK_THROWS_AS(checked(value, ReportMode::casework), ReportRefused);
  }
  const auto any = case_from_json(flagged_case(R"(, "report": {"wording_overrides": [{"rule": ")" + rule +
                                               R"(", "item": "*", "reason": "x"}]})"));
  CHECK_NOTHROW(checked(any, ReportMode::casework));
}

TEST_CASE("wording: a training report keeps flagged user text and lists it with the suggested wording") {
  const auto value = case_from_json(flagged_case());
  const auto model = checked(value, ReportMode::training);
  const std::string text = section_text(model, "wording");
  CHECK(text.find(flagged_rule()) != std::string::npos);
  CHECK(text.find("in a casework report they would be refused") != std::string::npos);
}

TEST_CASE("wording: the program's own text is never overridden") {
  const auto value = case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 300})",
                                              R"(, "report": {"wording_overrides": [{"rule": "stub", "item": "*", "reason": "x"}]})"));
  auto model = build_report_model(value, evaluation::evaluate_case(value), ReportMode::casework);
  // A stub checker that flags the evaluation sentence, which the program wrote.
  const WordingCheck stub = [](const std::vector<CheckedText>& texts, ReportMode) {
    std::vector<WordingFlag> flags;
    for (std::size_t i = 0; i < texts.size(); ++i)
      if (texts[i].text.find("times more probable") != std::string::npos)
        flags.push_back({i, texts[i].text, "stub", "stub family", "error", "", ""});
    return flags;
  };
  try {
    apply_wording_check(model, value, stub, "a stub");
    FAIL("not refused");
  } catch (const ReportRefused& refused) {
    CHECK(std::string(refused.what()).find("defect") != std::string::npos);
  }
}

// `validate` checks the case's texts that guard::report_user_texts lists, and says the report will
// be refused when one of them would refuse it; that is only true if the report prints exactly
// those texts. Checked on every demo case and on a case that has every kind of user text.
TEST_CASE("wording: the user's texts in the report are exactly those validate checks, in order") {
  std::vector<casefile::Case> cases;
  for (const auto& path : demo_cases()) cases.push_back(load_case(path));
  cases.push_back(case_from_json(R"json({"format": "counterpoise.case", "version": 1,
    "case": {"reference": "HV-TEST-2", "examiner": "Dr Ada Penhallow", "requested_by": "Harwick Vale Police",
             "purpose": "To help address whether the glass came from the window"},
    "propositions": {"level": "source", "hp": "The glass came from the window of 3 Tanner Row",
                     "hd": "The glass came from another source",
                     "conditioning_information": "The coat was seized the next morning",
                     "assumptions": ["The coat was not cleaned", "No other window was broken nearby"]},
    "items": [
      {"id": "E1", "title": "Glass on the coat", "model": "reported-lr", "lr": 300,
       "description": "Twelve fragments on the coat", "source_data": "Glass survey", "notes": "Tape lifted",
       "combination": {"independence": "Separate transfer events"}},
      {"id": "E2", "model": "reported-lr", "lr": 20, "combination": {"independence": "See E1"}},
      {"id": "E3", "title": "Paint", "model": "reported-lr", "lr": 5,
       "combination": {"included": false, "exclusion_reason": "Duplicates E1"}}]})json"));
  for (const auto& value : cases) {
    std::vector<std::string> printed, listed;
    for (const auto mode : {ReportMode::casework, ReportMode::training}) {
      printed.clear();
      const auto model = build_report_model(value, evaluation::evaluate_case(value), mode);
      for (const auto& t : report_texts(model))
        if (t.source.from_user) printed.push_back(t.source.item + "/" + t.source.field + ": " + t.text);
      listed.clear();
      for (const auto& t : guard::report_user_texts(value))
        listed.push_back(t.origin.item + "/" + t.origin.field + ": " + t.text);
      INFO(value.details.reference << " " << report_mode_name(mode));
      CHECK(printed == listed);
    }
  }
}

TEST_CASE("wording: the seal appendix, signed and unsigned, passes the reasoning guard") {
  const auto value = load_case(demo_dir() / "harwick-vale-breakin.json");
  for (const bool is_signed : {true, false}) {
    IssueInfo issue;
    store::SealAnchor anchor;
    anchor.statement.case_reference = value.details.reference;
    anchor.statement.revision = 2;
    anchor.statement.sealer = anchor.statement.report_examiner = "Dr Imogen Tarrant";  // invented
    anchor.statement.sealer_role = "examiner";
    anchor.statement.state_sha256 = std::string(64, 'a');
    anchor.statement.chain_head_seq = 7;
    anchor.statement.chain_head_hash = std::string(64, 'b');
    anchor.statement.program = "Counterpoise " COUNTERPOISE_VERSION;
    if (is_signed) {
      // RFC 8032, 7.1, TEST 1's public key, as any valid key would do here.
      anchor.statement.public_key = "d75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a";
      anchor.signature = std::string(128, 'c');
    }
    issue.seal = anchor;
    for (const auto mode : {ReportMode::casework, ReportMode::training}) {
      INFO(is_signed << " " << report_mode_name(mode));
      auto model = build_report_model(value, evaluation::evaluate_case(value), mode, issue);
      REQUIRE(model.find("seal"));
      REQUIRE(model.seal);
      REQUIRE_NOTHROW(apply_wording_check(model, value, guard_wording_check(checker(), value.propositions), "the shipped rules"));
      const auto texts = report_texts(model);
      for (const auto& flag : guard_wording_check(checker(), value.propositions)(texts, mode)) {
        INFO("flagged: " << flag.rule_id << ": " << flag.sentence);
        CHECK(texts[flag.text_index].source.from_user);
      }
      const std::string seal = section_text(model, "seal");
      CHECK((seal.find("This seal is unsigned") != std::string::npos) == !is_signed);
      // The fingerprint is SHA-256 of the raw key (checked against sha256sum in tests/core/platform),
      // printed in groups of four.
      CHECK((seal.find("21fe 31df a154 a261") != std::string::npos) == is_signed);
    }
  }
}

// Review notes are the reviewer's words, quoted: the check reads each one and its findings are
// printed beneath it; a flagged note never refuses the report, in casework or training, while
// the same sentence in the case's own text would (the test above). The flagged sentence is the
// transposed conditional of kFlaggedNote (a probability of a proposition stated as a finding).
TEST_CASE("wording: a review note is quoted with what the check finds, and never refuses the report") {
  const auto value = case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 300})"));
  IssueInfo issue;
  issue.review_notes = {{2, "2026-12-02T10:15:00Z", "Dr Ada Penhallow", "disagree", kFlaggedNote},
                        {2, "2026-12-02T11:00:00Z", "Mr Owen Tull", "agree", ""},
                        {3, "2026-12-03T09:30:00Z", "Mr Owen Tull", "comment",
                         "The findings are about 300 times more probable if Hp is true than if Hd is true."}};
  for (const auto mode : {ReportMode::casework, ReportMode::training}) {
    INFO(report_mode_name(mode));
    auto model = build_report_model(value, evaluation::evaluate_case(value), mode, issue);
    REQUIRE_NOTHROW(apply_wording_check(model, value, guard_wording_check(checker(), value.propositions), "the shipped rules"));
    const std::string text = section_text(model, "review-notes");
    CHECK(text.find("Dr Ada Penhallow, 2026-12-02T10:15:00Z: disagree.") != std::string::npos);
    CHECK(text.find("\u201c" + std::string(kFlaggedNote) + "\u201d") != std::string::npos);
    CHECK(text.find("Mr Owen Tull, 2026-12-02T11:00:00Z: agree.") != std::string::npos);
    // The flagged note: its rule and sentence beneath it; the correct one: nothing to point out.
    const auto flagged_at = text.find(kFlaggedNote);
    const auto finding_at = text.find("The wording check points out in this note");
    REQUIRE(finding_at != std::string::npos);
    CHECK(finding_at > flagged_at);
    CHECK(text.find("rule " + flagged_rule(), finding_at) != std::string::npos);
    CHECK(text.find("The wording check finds nothing to point out in this note.") != std::string::npos);
    // The wording section says the notes were read and do not stop the report.
    CHECK(section_text(model, "wording").find("The review notes quoted in this report (2) were checked") != std::string::npos);
  }
}

TEST_CASE("wording: a report without review notes has no such section") {
  const auto value = case_from_json(case_text(R"({"id": "E1", "model": "reported-lr", "lr": 300})"));
  const auto model = checked(value, ReportMode::casework);
  CHECK_FALSE(model.find("review-notes"));
  CHECK(section_text(model, "wording").find("review notes") == std::string::npos);
}
