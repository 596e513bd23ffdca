// The labelled wording corpora (tests/data/guard/wording-corpus.txt and the development split
// wording-corpus-dev.txt): precision and recall of the shipped rules and claim analysis per error
// family, each required to be at least 0.9, and overall at least 0.95 (issues 5 and 12). These
// figures are of the rules alone: the learned reading is trained on these corpora, so its own
// figures on them say nothing; wording_model_test.cpp measures it on corpora it was not trained on. A sentence counts
// as flagged for a family when the checker reports an error or warning of that family; advice
// (reported or refuted wording) does not count. Sources of the published sentences are in the file.
#include <catch2/catch.hpp>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <iomanip>
#include <iostream>
#include <map>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include "core/guard/wording_corpus.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise::guard;

namespace {

struct CorpusLine {
  int line = 0;
  std::string label, mode, source, sentence;
};

std::string trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t");
  const auto e = s.find_last_not_of(" \t\r");
  return b == std::string::npos ? std::string() : s.substr(b, e - b + 1);
}

std::vector<CorpusLine> read_corpus() {
  std::ifstream in(COUNTERPOISE_TEST_DATA_DIR "/guard/wording-corpus.txt");
  REQUIRE(in);
  std::vector<CorpusLine> lines;
  std::string text;
  int number = 0;
  while (std::getline(in, text)) {
    ++number;
    if (trim(text).empty() || trim(text)[0] == '#') continue;
    CorpusLine c;
    c.line = number;
    std::size_t at = 0;
    std::string* fields[] = {&c.label, &c.mode, &c.source};
    for (std::string* field : fields) {
      const auto bar = text.find(" | ", at);
      REQUIRE(bar != std::string::npos);
      *field = trim(text.substr(at, bar - at));
      at = bar + 3;
    }
    c.sentence = trim(text.substr(at));
    lines.push_back(c);
  }
  return lines;
}

}  // namespace

TEST_CASE("corpus: shape — size, balance, labels, at least 8 positives per family") {
  const auto corpus = read_corpus();
  const WordingChecker checker = WordingChecker::load_default();
  CHECK(corpus.size() >= 240);
  std::map<std::string, int> per_label;
  for (const auto& c : corpus) {
    INFO("line " << c.line);
    CHECK((c.mode == "casework" || c.mode == "training"));
    CHECK_FALSE(c.source.empty());
    if (c.label != "none") CHECK_NOTHROW(checker.rules().family(c.label));
    ++per_label[c.label];
  }
  const double none_share = static_cast<double>(per_label["none"]) / static_cast<double>(corpus.size());
  CHECK(none_share >= 0.4);  // "about half correct statements" (issue 5)
  CHECK(none_share <= 0.6);
  for (const auto& [id, family] : checker.rules().families()) {
    INFO("family " << id);
    CHECK(per_label[id] >= 8);
  }
}

TEST_CASE("corpus: negatives share vocabulary with the errors (near misses, not easy cases)") {
  // Each family's key words must appear in some correct sentence, so that a rule that only
  // looks for a word cannot reach the thresholds.
  const std::map<std::string, std::vector<std::string>> key_words = {
      {"transposed-conditional", {"probability", "coincidence"}},
      {"source-probability", {"source", "came from"}},
      {"ultimate-issue", {"guilty", "innocence"}},
      {"another-match", {"someone else", "profile"}},
      {"numerical-conversion", {"test", "another match"}},
      {"defence-fallacy", {"people in", "irrelevant"}},
      {"lr-as-odds", {"times more", "likely"}},
      {"match-as-evaluation", {"match", "consistent with"}},
      {"posterior-in-casework", {"posterior", "prior"}},
  };
  const auto corpus = read_corpus();
  for (const auto& [family, words] : key_words) {
    for (const auto& word : words) {
      bool in_negative = false;
      for (const auto& c : corpus)
        if (c.label == "none" && fold_text(c.sentence).find(word) != std::string::npos) in_negative = true;
      INFO("family " << family << ", word '" << word << "'");
      CHECK(in_negative);
    }
  }
}

// The development corpora: the first corpus (issue 5), the development split of the corpus
// written for the claim analysis (issue 12), and a second development set written afterwards
// without sight of the checker (wording-corpus-dev2.txt). Their partners, wording-corpus-heldout.txt
// and wording-corpus-heldout2.txt, are never read by a test: only bench_guard prints their
// aggregate figures, so nothing is tuned on them.
TEST_CASE("corpus: precision and recall per family are at least 0.9, and overall at least 0.95, on the development splits") {
  const WordingChecker checker(WordingChecker::load_default().rules());  // the rules alone
  for (const char* name : {"wording-corpus.txt", "wording-corpus-dev.txt", "wording-corpus-dev2.txt"}) {
    INFO("corpus " << name);
    const auto corpus = read_wording_corpus(std::string(COUNTERPOISE_TEST_DATA_DIR) + "/guard/" + name);
    REQUIRE(corpus.size() >= 300);
    const CorpusScore score = score_corpus(checker, corpus);
    std::cout << name << ": " << score.sentences << " sentences\n"
              << std::left << std::setw(26) << "family" << "  TP  FP  FN  precision  recall\n";
    for (const auto& [family, n] : score.per_family)
      std::cout << std::left << std::setw(26) << family << std::right << std::setw(4) << n.true_positive << std::setw(4)
                << n.false_positive << std::setw(4) << n.false_negative << std::fixed << std::setprecision(3)
                << std::setw(11) << n.precision() << std::setw(8) << n.recall() << "\n";
    for (const auto& line : score.misclassified) std::cout << "  " << line << "\n";
    for (const auto& [family, n] : score.per_family) {
      INFO("family " << family << " (the misclassified sentences are listed above)");
      const double threshold = family == "overall" ? 0.95 : 0.9;
      CHECK(n.precision() >= threshold);
      CHECK(n.recall() >= threshold);
    }
  }
}

namespace {

// Scores one development set written without sight of the checker and checks that it holds the
// figures it has reached (docs/reasoning-guard.md gives them), listing what it misclassifies.
void check_holds(const std::string& name, double precision, double recall) {
  const WordingChecker checker(WordingChecker::load_default().rules());  // the rules alone
  const auto corpus = read_wording_corpus(std::string(COUNTERPOISE_TEST_DATA_DIR) + "/guard/" + name);
  REQUIRE(corpus.size() >= 400);
  const CorpusScore score = score_corpus(checker, corpus);
  for (const auto& line : score.misclassified) std::cout << "  " << line << "\n";
  const auto& overall = score.per_family.at("overall");
  CHECK(overall.precision() >= precision);
  CHECK(overall.recall() >= recall);
}

}  // namespace

// The third to ninth development sets (wording-corpus-dev3.txt to -dev9.txt), written without
// sight of the checker like the second, are below the targets: these hold them at the
// figures they have reached so that a change cannot lose ground on them unnoticed. Their
// partners wording-corpus-heldout3.txt to -heldout9.txt are never read by a test.
TEST_CASE("corpus: the third development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev3.txt", 0.95, 0.85);
}

TEST_CASE("corpus: the fourth development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev4.txt", 0.91, 0.78);
}

TEST_CASE("corpus: the fifth development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev5.txt", 0.92, 0.78);
}

TEST_CASE("corpus: the sixth development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev6.txt", 0.90, 0.78);
}

TEST_CASE("corpus: the seventh development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev7.txt", 0.89, 0.74);
}

// The eighth set was scored fresh, before any change made on it: rules alone 0.868 / 0.596.
TEST_CASE("corpus: the eighth development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev8.txt", 0.88, 0.60);
}

// The ninth set was scored fresh, before any change made on it: rules alone 0.836 / 0.517
// (docs/reasoning-guard.md, "Tenth round").
TEST_CASE("corpus: the ninth development set holds the precision and recall it has reached") {
  check_holds("wording-corpus-dev9.txt", 0.85, 0.55);
}

TEST_CASE("corpus: the reader names the line and field of a malformed corpus line") {
  const auto path = std::filesystem::temp_directory_path() / ("counterpoise-corpus-bad-" + std::to_string(::getpid()) + ".txt");
  std::ofstream(path) << "# comment\nnone | casework | project | Fine.\nnone | court | project | Bad mode.\n";
  try {
    read_wording_corpus(path);
    FAIL("no error");
  } catch (const counterpoise::validation::InvalidValue& e) {
    CHECK(std::string(e.what()).find("line 3") != std::string::npos);
    CHECK(e.where().field == "mode");
  }
  std::ofstream(path) << "none | casework | only three fields\n";
  CHECK_THROWS_AS(read_wording_corpus(path), counterpoise::validation::InvalidValue);
  std::filesystem::remove(path);
}
