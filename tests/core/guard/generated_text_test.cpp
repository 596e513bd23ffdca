// Every sentence Counterpoise writes passes its own wording checker (issue 5, "Generated text"):
// for each demo case, in casework and in training mode, the items' verbal sentences, the models'
// assumptions and notes, the combined verbal sentence, the case guard's warnings, and the full
// output of `counterpoise-cli evaluate` and `validate` (and of `report --text` when the command
// line is built with the reports library), plus the command line's help text.
#include <catch2/catch.hpp>

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/case_guard.hpp"
#include "core/guard/proposition_options.hpp"
#include "core/interchange/case_json.hpp"
#include "core/interchange/evaluation_json.hpp"
#include "guard_test_support.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

// The flagged findings (errors and warnings; advice does not count) of `text`, one per line,
// with the sentence that holds them; empty when the text is clean.
std::string flagged(const std::string& text, const casefile::Case& value) {
  // The options the report's own wording check uses: every alternative's text is a proposition.
  guard::CheckOptions options = guard::check_options(
      value.propositions, value.mode_or_default() == casefile::CaseMode::training ? guard::CheckMode::training
                                                                                 : guard::CheckMode::casework);
  // The program's own text is held to the rules, as the report holds it; the learned reading
  // weighs what people write (docs/reasoning-guard.md, "The learned reading").
  options.learned_reading = false;
  std::string out;
  for (const auto& f : default_checker().check(text, options)) {
    if (f.severity == guard::Severity::advice) continue;
    out += "[" + f.rule_id + "] \"" + f.matched_text + "\" in: " +
           text.substr(f.sentence.byte_begin, f.sentence.byte_end - f.sentence.byte_begin) + "\n";
  }
  return out;
}

CliRun run(const std::string& arguments, const std::filesystem::path& output) { return run_cli(arguments, output, true); }

// A copy of the demo folder (so relative data paths inside the cases still resolve) in which
// each case can be rewritten with another mode.
struct DemoCopy {
  std::filesystem::path dir;
  DemoCopy() : dir(std::filesystem::temp_directory_path() / ("counterpoise-generated-text-" + std::to_string(::getpid()))) {
    std::filesystem::remove_all(dir);
    std::filesystem::copy(COUNTERPOISE_DEMO_DIR, dir, std::filesystem::copy_options::recursive);
  }
  ~DemoCopy() {
    std::error_code ignored;
    std::filesystem::remove_all(dir, ignored);
  }
  DemoCopy(const DemoCopy&) = delete;
  DemoCopy& operator=(const DemoCopy&) = delete;
};

json demo_document(const std::string& name) {
  std::ifstream in(std::filesystem::path(COUNTERPOISE_DEMO_DIR) / name);
  REQUIRE(in);
  return json::parse(in);
}

bool cli_has_report_command(const std::filesystem::path& scratch) {
  return run("--help", scratch / "help.txt").out.find("\n  report ") != std::string::npos;
}

}  // namespace

TEST_CASE("generated text: every sentence Counterpoise writes for the demo cases passes the checker") {
  const DemoCopy copy;
  const bool with_report = cli_has_report_command(copy.dir);
  if (!with_report) WARN("counterpoise-cli was built without the reports library: report text not checked");
  for (const auto& [name, expected] : expected_demo_warnings()) {
    (void)expected;
    for (const char* mode : {"casework", "training"}) {
      json document = demo_document(name);
      document["mode"] = mode;
      const auto path = copy.dir / ("generated-text-" + std::string(mode) + "-" + name);
      std::ofstream(path) << document.dump(2);
      auto read = interchange::read_case(document, copy.dir);
      REQUIRE(read.value);
      const casefile::Case& value = *read.value;
      INFO(name << " in " << mode << " mode");

      const auto result = evaluation::evaluate_case(value);
      for (std::size_t i = 0; i < result.items.size(); ++i) {
        INFO("item " << result.items[i].id);
        CHECK(flagged(result.items[i].verbal.sentence, value).empty());
        CHECK(flagged(value.items[i].model->assumptions(), value) == "");
        for (const auto& note : result.items[i].point.notes) CHECK(flagged(note.message, value) == "");
      }
      CHECK(flagged(result.combined.verbal.sentence, value) == "");
      for (const auto& w : guard::check_case(value, default_checker())) CHECK(flagged(w.message, value) == "");
      const json evaluation = interchange::evaluation_to_json(value, result);
      CHECK(flagged(evaluation.at("sensitivity_note").get<std::string>(), value) == "");

      const CliRun evaluate = run("evaluate '" + path.string() + "'", copy.dir / "evaluate.txt");
      REQUIRE(evaluate.exit_code == 0);
      CHECK(evaluate.out.find("Warnings") != std::string::npos);  // the whole output, warnings included
      CHECK(flagged(evaluate.out, value) == "");
      const CliRun validate = run("validate '" + path.string() + "'", copy.dir / "validate.txt");
      REQUIRE(validate.exit_code == 0);
      CHECK(flagged(validate.out, value) == "");
      if (with_report) {
        const auto text = copy.dir / "report.txt";
        // --force: the second mode replaces the first mode's files, which report refuses without it.
        const CliRun report = run("report '" + path.string() + "' -o '" + (copy.dir / "report.pdf").string() +
                                       "' --mode " + mode + " --text '" + text.string() + "' --force",
                                   copy.dir / "report-run.txt");
        INFO(report.out);
        REQUIRE(report.exit_code == 0);
        std::ifstream in(text);
        std::stringstream report_text;
        report_text << in.rdbuf();
        CHECK(!report_text.str().empty());
        CHECK(flagged(report_text.str(), value) == "");
      }
    }
  }
}

TEST_CASE("generated text: the case guard's own messages pass the checker") {
  // A case that triggers every check on the case; the warnings that quote a flagged wording hold
  // it in quotation marks, so the quoted words are advice only.
  json document = json::parse(R"({ "format": "counterpoise.case", "version": 1, "mode": "casework",
    "case": { "reference": "VFL-GUARD-TEXT", "purpose": "He is almost certainly the donor." },
    "propositions": { "level": "activity", "hp": "Mr Ashby broke the window",
                      "hd": "Mr Ashby broke the window or someone else may have done so" },
    "items": [
      { "id": "A", "model": "assigned", "level": "source", "description": "The probability that he is the source is 0.7.",
        "p_given_hp": 0.7, "p_given_hd": 0.3 },
      { "id": "B", "model": "assigned", "description": "the probability that he is the source is 0.7",
        "p_given_hp": 0.7, "p_given_hd": 0.3 }
    ],
    "priors": { "odds": [0.1] } })");
  auto read = interchange::read_case(document, ".");
  REQUIRE(read.value);
  const auto warnings = guard::check_case(*read.value, default_checker());
  std::vector<std::string> rules;
  for (const auto& w : warnings) rules.push_back(w.rule);
  for (const auto rule : {guard::case_rules::complementary_probabilities, guard::case_rules::value_as_proposition_probability,
                          guard::case_rules::propositions_overlap, guard::case_rules::proposition_possibility,
                          guard::case_rules::lower_level_item, guard::case_rules::same_findings,
                          guard::case_rules::prior_in_casework}) {
    INFO(rule);
    CHECK(std::find(rules.begin(), rules.end(), rule) != rules.end());
  }
  for (const auto& w : warnings) {
    INFO(w.rule << ": " << w.message);
    CHECK(flagged(w.message, *read.value) == "");
  }
  // The two checks the case above cannot trigger at once: identical propositions, and an item
  // a network covers (the network demo with its covered item E1 included).
  document["propositions"]["hd"] = document["propositions"]["hp"];
  read = interchange::read_case(document, ".");
  REQUIRE(read.value);
  json network = demo_document("harwick-vale-network.json");
  for (auto& item : network["items"])
    if (item["id"] == "E1") item["combination"] = {{"included", true}, {"independence", "Stated for the test."}};
  auto network_read = interchange::read_case(network, COUNTERPOISE_DEMO_DIR);
  REQUIRE(network_read.value);
  std::size_t checked = 0;
  for (const auto* value : {&*read.value, &*network_read.value}) {
    for (const auto& w : guard::check_case(*value, default_checker())) {
      if (w.rule != guard::case_rules::propositions_identical && w.rule != guard::case_rules::covered_by_network) continue;
      INFO(w.rule << ": " << w.message);
      CHECK(flagged(w.message, *value) == "");
      ++checked;
    }
  }
  CHECK(checked == 2);
}

TEST_CASE("generated text: the command line's help passes the checker") {
  const DemoCopy copy;
  const CliRun help = run("--help", copy.dir / "help.txt");
  REQUIRE(help.exit_code == 0);
  casefile::Case none;
  CHECK(flagged(help.out, none) == "");
  none.mode = casefile::CaseMode::training;
  CHECK(flagged(help.out, none) == "");
}

TEST_CASE("generated text: every rule's explanation and suggested rewrite passes the checker") {
  // check-wording and the case guard print these; a rule's explanation describes an error by
  // quoting its wording, so only the quoted words match (advice).
  casefile::Case value;
  value.propositions.hp = "the stain came from Mr Ashby";
  value.propositions.hd = "the stain came from an unknown person";
  guard::CheckOptions options;
  options.hp = value.propositions.hp;
  options.hd = value.propositions.hd;
  for (const auto& rule : default_checker().rules().rules()) {
    INFO(rule.id);
    CHECK(flagged(rule.explanation, value) == "");
    CHECK(flagged(guard::fill_suggestion(rule.suggestion, options, "1,000"), value) == "");
  }
}
