// The learned reading of the reasoning guard (core/guard/wording_model.hpp and
// wording_model_training.hpp): the model's arithmetic against the formulas it implements, its
// file format, the shipped model against a retraining, how the checker uses it, and what it adds
// on corpora it was not trained on.
#include <catch2/catch.hpp>
#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/guard/wording_checker.hpp"
#include "core/guard/wording_corpus.hpp"
#include "core/guard/wording_features.hpp"
#include "core/guard/wording_model_training.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"
#include "guard_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::guard;

namespace {

const std::filesystem::path kCorpusDir = std::filesystem::path(COUNTERPOISE_TEST_DATA_DIR) / "guard";

std::filesystem::path temp_file(const std::string& name) {
  return std::filesystem::temp_directory_path() / ("counterpoise-" + name + "-" + std::to_string(::getpid()));
}

WordingModel three_class_model() {
  WordingModel model({"none", "ultimate-issue", "transposed-conditional"}, 0.9);
  model.set_weights("certainly", {0.0, 2.0, 0.5});
  model.set_weights("guilty", {-1.0, 1.5, 0.0});
  model.set_weights("if", {1.0, -0.5, -0.25});
  return model;
}

std::vector<CorpusSentence> corpora(const std::vector<std::string>& names) {
  std::vector<CorpusSentence> all;
  for (const auto& name : names)
    for (auto& s : read_wording_corpus(kCorpusDir / name)) all.push_back(std::move(s));
  return all;
}

std::vector<std::string> families() {
  std::vector<std::string> out;
  for (const auto& [id, family] : default_checker().rules().families()) out.push_back(id);
  return out;
}

}  // namespace

// Bishop 2006, Pattern Recognition and Machine Learning, §4.3.4, eq. 4.104: the probability of
// class k is exp(a_k) / Σ_j exp(a_j), a_k the sum of the present features' weights for k.
TEST_CASE("learned reading: class probabilities are the softmax of the summed weights (Bishop 2006, eq. 4.104)") {
  const WordingModel model = three_class_model();
  const std::vector<double> p = model.probabilities({"certainly", "guilty", "unseen"});
  const double a_none = -1.0, a_ui = 3.5, a_tc = 0.5;  // sums of the weights of "certainly" and "guilty"
  const double z = std::exp(a_none) + std::exp(a_ui) + std::exp(a_tc);
  REQUIRE(p.size() == 3);
  CHECK(p[0] == Approx(std::exp(a_none) / z).epsilon(1e-14));
  CHECK(p[1] == Approx(std::exp(a_ui) / z).epsilon(1e-14));
  CHECK(p[2] == Approx(std::exp(a_tc) / z).epsilon(1e-14));
  // No feature known: every class equally probable.
  for (double q : model.probabilities({"zebra"})) CHECK(q == Approx(1.0 / 3.0).epsilon(1e-15));
}

TEST_CASE("learned reading: very large weights give probabilities, not overflow") {
  WordingModel model({"none", "ultimate-issue"}, 0.9);
  model.set_weights("huge", {0.0, 800.0});  // exp(800) overflows a double
  const std::vector<double> p = model.probabilities({"huge"});
  CHECK(std::isfinite(p[0]));
  CHECK(p[1] == 1.0);
  CHECK(p[0] == Approx(std::exp(-800.0)).margin(1e-300));
}

TEST_CASE("learned reading: the reading names the most probable family and the words that leaned towards it") {
  const LearnedReading r = three_class_model().read({"certainly", "guilty", "if"});
  CHECK(r.family == "ultimate-issue");
  // Leaning towards ultimate-issue against none: certainly +2, guilty +2.5, if −1.5 (left out).
  REQUIRE(r.weightiest == std::vector<std::string>{"guilty", "certainly"});
  const std::vector<double> p = three_class_model().probabilities({"certainly", "guilty", "if"});
  CHECK(r.error_probability == Approx(1.0 - p[0]).epsilon(1e-15));
  CHECK(r.family_probability == p[1]);
}

TEST_CASE("learned reading: the model is refused when its classes or threshold are not usable") {
  CHECK_THROWS_AS(WordingModel({"ultimate-issue", "none"}, 0.9), validation::InvalidValue);
  CHECK_THROWS_AS(WordingModel({"none"}, 0.9), validation::InvalidValue);
  CHECK_THROWS_AS(WordingModel({"none", "ultimate-issue"}, 0.0), validation::InvalidValue);
  WordingModel model({"none", "ultimate-issue"}, 0.5);
  CHECK_THROWS_AS(model.set_weights("x", {1.0}), validation::InvalidValue);
  CHECK_THROWS_AS(model.set_weights("x", {1.0, NAN}), validation::InvalidValue);
}

TEST_CASE("learned reading: a model written to a file reads back with the same probabilities") {
  const auto path = temp_file("model.tsv");
  WordingModel model = three_class_model();
  model.add_provenance("settings\tby hand");
  {
    std::ofstream out(path);
    model.write(out);
  }
  const WordingModel back = WordingModel::read_file(path);
  CHECK(back.classes() == model.classes());
  CHECK(back.threshold() == 0.9);
  CHECK(back.provenance() == model.provenance());
  for (const auto& features : std::vector<std::vector<std::string>>{{"certainly"}, {"guilty", "if"}, {"if"}})
    CHECK(back.probabilities(features) == model.probabilities(features));  // these weights are exact in 6 digits
  std::filesystem::remove(path);
}

TEST_CASE("learned reading: a malformed model file is refused naming its line and field") {
  const auto path = temp_file("bad-model.tsv");
  const auto refused_at = [&](const std::string& content, const std::string& line, const std::string& field) {
    std::ofstream(path) << content;
    try {
      (void)WordingModel::read_file(path);
      FAIL("no error for: " << content);
    } catch (const validation::InvalidValue& e) {
      INFO(e.what());
      CHECK(e.where().item == path.string() + " line " + line);
      CHECK(e.where().field == field);
    }
  };
  const std::string head = "counterpoise-wording-model\t1\nthreshold\t0.9\nclasses\tnone\tultimate-issue\n";
  refused_at("a case file\n{}\n{}\n", "1", "format");
  refused_at("counterpoise-wording-model\t1\nlimit\t0.9\nclasses\tnone\tultimate-issue\n", "2", "threshold");
  refused_at("counterpoise-wording-model\t1\nthreshold\t0.9\nclasses\tnone\n", "3", "classes");
  refused_at(head + "w\tcertainly\t0.5\n", "4", "weights");
  refused_at(head + "w\tcertainly\t0.5\t1.0\nw\tguilty\t0.5\tlots\n", "5", "weights");
  std::ofstream(path) << "counterpoise-wording-model\t1\nthreshold\t1.5\nclasses\tnone\tultimate-issue\n";
  try {
    (void)WordingModel::read_file(path);
    FAIL("no error for a threshold above 1");
  } catch (const validation::InvalidValue& e) {
    CHECK(e.where().field == "threshold");
  }
  std::filesystem::remove(path);
}

// Bishop 2006, §4.3.4, eq. 4.109: the gradient of the cross-entropy for one sentence with
// respect to the weight of a present feature for class j is (p_j − t_j). From zero weights every
// p_j is 1/K, so one step at rate η moves the label's weight by η(1 − 1/K) and every other
// class's by −η/K.
TEST_CASE("learned reading: one training step moves the weights by the cross-entropy gradient (Bishop 2006, eq. 4.109)") {
  CorpusSentence s{1, "ultimate-issue", "casework", "test", "Guilty."};
  TrainingSettings settings;
  settings.epochs = 1;
  settings.min_count = 1;
  settings.l2 = 0;
  settings.learning_rate = 0.3;
  const WordingRuleSet& rules = default_checker().rules();
  const WordingModel model = train_wording_model({s}, rules, settings);
  const double k = static_cast<double>(model.classes().size());
  REQUIRE(k == static_cast<double>(rules.families().size() + 1));
  const std::size_t label = static_cast<std::size_t>(
      std::find(model.classes().begin(), model.classes().end(), "ultimate-issue") - model.classes().begin());
  const auto& w = model.weights().at("guilty");
  for (std::size_t c = 0; c < w.size(); ++c) {
    INFO("class " << model.classes()[c]);
    CHECK(w[c] == Approx(c == label ? 0.3 * (1.0 - 1.0 / k) : -0.3 / k).epsilon(1e-12));
  }
  CHECK(model.weights().size() == corpus_features(s, rules.classes()).size());
}

TEST_CASE("learned reading: training refuses a label that is no family and an empty corpus") {
  CHECK_THROWS_AS(train_wording_model({}, default_checker().rules()), validation::InvalidValue);
  CorpusSentence s{7, "guessing", "casework", "test", "Some words."};
  try {
    (void)train_wording_model({s}, default_checker().rules());
    FAIL("no error");
  } catch (const validation::InvalidValue& e) {
    CHECK(e.where().item == "corpus line 7");
    CHECK(e.where().field == "label");
  }
}

// The shipped model must be what tests/tools/train_wording_model makes of the corpora it names,
// as they are now: a changed corpus, feature or training setting without a retrained model fails
// here. Weights are written with 6 significant digits.
TEST_CASE("learned reading: the shipped model is the one its development corpora give") {
  const WordingModel shipped = WordingModel::read_file(default_wording_model_path());
  std::vector<std::string> names;
  for (const std::string& line : shipped.provenance()) {
    if (line.rfind("trained-on\t", 0) != 0) continue;
    const std::size_t tab = line.find('\t', 11);
    const std::string name = line.substr(11, tab - 11);
    INFO(name << ": retrain with tests/tools/train_wording_model (DEVELOPERS.md)");
    CHECK(name.find("heldout") == std::string::npos);  // never trained on a held-out split
    CHECK(line.substr(tab + 1) ==
          platform::sha256_hex(reading::read_text_file(kCorpusDir / name, {name, ""})));
    names.push_back(name);
  }
  REQUIRE(names.size() >= 9);
  const WordingModel retrained = train_wording_model(corpora(names), default_checker().rules());
  CHECK(shipped.threshold() == retrained.threshold());
  CHECK(shipped.classes() == retrained.classes());
  REQUIRE(shipped.weights().size() == retrained.weights().size());
  std::size_t differing = 0;
  for (const auto& [feature, weights] : retrained.weights()) {
    const auto found = shipped.weights().find(feature);
    REQUIRE(found != shipped.weights().end());
    for (std::size_t c = 0; c < weights.size(); ++c)
      if (std::abs(found->second[c] - weights[c]) > 1e-5 * std::abs(weights[c]) + 1e-12) ++differing;
  }
  CHECK(differing == 0);
}

namespace {

// The shipped rules with a model that knows one made-up word: its weight for "none" and for
// transposed-conditional (zero for the other families).
WordingChecker checker_with_word_model(double weight, double none_weight = 0.0) {
  WordingChecker checker(default_checker().rules());
  std::vector<std::string> classes{"none"};
  for (const auto& f : families()) classes.push_back(f);
  auto model = std::make_shared<WordingModel>(classes, 0.9);
  std::vector<double> w(classes.size(), 0.0);
  w[static_cast<std::size_t>(std::find(classes.begin(), classes.end(), "transposed-conditional") - classes.begin())] = weight;
  w[0] = none_weight;
  model->set_weights("zebra", w);
  checker.set_model(model);
  return checker;
}

}  // namespace

TEST_CASE("learned reading: flags as a warning a sentence no rule flags, once the score reaches the threshold") {
  const std::string text = "The zebra findings were examined at the laboratory. Nothing else was found.";
  const auto findings = checker_with_word_model(20.0).check(text);
  REQUIRE(findings.size() == 1);
  const WordingFinding& f = findings.front();
  CHECK(f.rule_id == "LW-TC");
  CHECK(learned_rule_id("posterior-in-casework") == "LW-PIC");
  CHECK(f.family == "transposed-conditional");
  CHECK(f.severity == Severity::warning);
  CHECK(f.matched_text == "The zebra findings were examined at the laboratory.");
  CHECK(f.explanation.find("learned reading") != std::string::npos);
  CHECK(f.explanation.find("\u201Czebra\u201D") != std::string::npos);
  CHECK_FALSE(f.suggestion.empty());
  // Below the threshold: P(error) = 1 − e^3 / (e^3 + e^2 + 8) ≈ 0.434, the eight other families
  // at weight 0.
  CHECK(checker_with_word_model(2.0, 3.0).check(text).empty());
}

TEST_CASE("learned reading: silent on headings, short fragments and questions") {
  const WordingChecker checker = checker_with_word_model(20.0);
  CHECK(checker.check("Zebra findings and their weight").empty());            // a heading: five words, no stop
  CHECK(checker.check("Zebra findings under each proposition:").empty());      // a heading with a colon
  CHECK(checker.check("Were the zebra findings examined at the laboratory?").empty());  // a question
  // Numbered section headings without a stop (common practice in report layout).
  CHECK(checker.check("7. Zebra findings examined at the laboratory under the usual protocol").empty());
  CHECK(checker.check("3.2 Zebra findings examined at the laboratory under the usual protocol").empty());
  CHECK(checker.check("(b) Zebra findings examined at the laboratory under the usual protocol").empty());
  CHECK(checker.check("Zebra findings:  examined  at the laboratory by the usual protocol.").empty());  // a table's layout
  CHECK(checker.check("Hd2: the zebra findings were examined at the laboratory.").empty());  // a proposition's label
  CHECK(checker.check("P(zebra findings | Hp) was examined at the laboratory.").empty());   // notation
}

TEST_CASE("learned reading: reads a headline or a chat message without a final stop") {
  // Headlines, chat messages and case notes are often written without a stop; six words or
  // more on a line of their own are read like a sentence, a shorter heading is not.
  const WordingChecker checker = checker_with_word_model(20.0);
  const auto headline = checker.check("Zebra findings examined at the laboratory under the usual protocol");
  REQUIRE(headline.size() == 1);
  CHECK(headline[0].rule_id.rfind("LW-", 0) == 0);
  CHECK(checker.check("chat: zebra findings back from the lab 2 days ago").size() == 1);
  CHECK(checker.check("1 in a million zebra findings like these turn up in casework").size() == 1);  // a number opens it, not a heading
  CHECK(checker.check("Zebra findings and their weight").empty());
  // A case's or an item's title names something: without a stop it is not a headline.
  const CheckOptions title = options_for_field({}, "title");
  CHECK(title.title);
  CHECK_FALSE(options_for_field({}, "notes").title);
  CHECK(checker.check("Zebra findings examined at the laboratory under the usual protocol", title).empty());
  CHECK(checker.check("Zebra findings were examined at the laboratory under the usual protocol.", title).size() == 1);
}

TEST_CASE("learned reading: silent where a rule speaks, in propositions, and when turned off") {
  const WordingChecker checker = checker_with_word_model(20.0);
  // A rule's own finding explains the sentence; the learned reading adds nothing to it.
  const auto ruled = checker.check("The zebra findings prove that the defendant was present at the warehouse.");
  REQUIRE_FALSE(ruled.empty());
  for (const auto& f : ruled) CHECK(f.rule_id.rfind("LW-", 0) != 0);
  CheckOptions propositions;
  propositions.states_propositions = true;
  CHECK(checker.check("The zebra findings were examined at the laboratory.", propositions).empty());
  CheckOptions off;
  off.learned_reading = false;
  CHECK(checker.check("The zebra findings were examined at the laboratory.", off).empty());
  CheckOptions named;
  named.hp = "The zebra findings were examined at the laboratory.";
  CHECK(checker.check("The zebra findings were examined at the laboratory.", named).empty());
}

// What the learned reading adds on wording it was not trained on: trained on every development
// corpus but one, it is scored on that one (the fourth to ninth sets, each written without
// sight of the checker). docs/reasoning-guard.md gives the figures at the time of writing.
TEST_CASE("learned reading: trained without a development set it lifts recall on that set at little cost in precision") {
  const std::vector<std::string> all = {"wording-corpus.txt",      "wording-corpus-dev.txt",  "wording-corpus-dev2.txt",
                                        "wording-corpus-dev3.txt", "wording-corpus-dev4.txt", "wording-corpus-dev5.txt",
                                        "wording-corpus-dev6.txt", "wording-corpus-dev7.txt", "wording-corpus-dev8.txt",
                                        "wording-corpus-dev9.txt"};
  const WordingChecker rules_only(default_checker().rules());
  for (const std::string left_out : {"wording-corpus-dev4.txt", "wording-corpus-dev5.txt", "wording-corpus-dev6.txt",
                                     "wording-corpus-dev7.txt", "wording-corpus-dev8.txt", "wording-corpus-dev9.txt"}) {
    INFO("left out: " << left_out);
    std::vector<std::filesystem::path> files;
    for (const auto& name : all) files.push_back(kCorpusDir / name);
    WordingChecker fresh(default_checker().rules());
    fresh.set_model(std::make_shared<const WordingModel>(
        train_wording_model_without(files, kCorpusDir / left_out, default_checker().rules())));
    const auto corpus = read_wording_corpus(kCorpusDir / left_out);
    const FamilyCounts before = score_corpus(rules_only, corpus).per_family.at("overall");
    const FamilyCounts after = score_corpus(fresh, corpus).per_family.at("overall");
    CHECK(after.recall() >= before.recall() + 0.05);
    CHECK(after.precision() >= before.precision() - 0.04);
  }
}
