// The labelled wording corpus (tests/data/guard/wording-corpus.txt): precision and recall of the
// shipped rules per error family, each required to be at least 0.9 (issue 5). A sentence counts
// as flagged for a family when the checker reports an error or warning of that family; advice
// (reported or refuted wording) does not count. Sources of the published sentences are in the file.
#include <catch2/catch.hpp>

#include <fstream>
#include <iomanip>
#include <iostream>
#include <map>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include "core/guard/wording_checker.hpp"

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

std::set<std::string> flagged_families(const WordingChecker& checker, const CorpusLine& c) {
  CheckOptions options;
  options.mode = c.mode == "training" ? CheckMode::training : CheckMode::casework;
  std::set<std::string> out;
  for (const auto& f : checker.check(c.sentence, options))
    if (f.severity != Severity::advice) out.insert(f.family);
  return out;
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

TEST_CASE("corpus: precision and recall per family are at least 0.9") {
  const auto corpus = read_corpus();
  const WordingChecker checker = WordingChecker::load_default();
  struct Counts {
    int true_positive = 0, false_positive = 0, false_negative = 0;
  };
  std::map<std::string, Counts> counts;
  for (const auto& [id, family] : checker.rules().families()) counts[id];
  std::ostringstream misses;
  int held_out = 0, held_out_right = 0;  // sentences written after the rules were fixed
  for (const auto& c : corpus) {
    const auto flagged = flagged_families(checker, c);
    if (c.source.find("held-out") != std::string::npos) {
      ++held_out;
      const bool right = c.label == "none" ? flagged.empty() : (flagged.size() == 1 && flagged.count(c.label) == 1);
      held_out_right += right ? 1 : 0;
    }
    for (auto& [family, n] : counts) {
      const bool labelled = c.label == family, found = flagged.count(family) > 0;
      if (labelled && found) ++n.true_positive;
      if (!labelled && found) ++n.false_positive, misses << "  false positive " << family << " (line " << c.line << "): " << c.sentence << "\n";
      if (labelled && !found) ++n.false_negative, misses << "  missed " << family << " (line " << c.line << "): " << c.sentence << "\n";
    }
  }
  struct Measured {
    std::string family;
    double precision, recall;
  };
  std::vector<Measured> measured;
  std::cout << "wording corpus: " << corpus.size() << " sentences\n"
            << std::left << std::setw(26) << "family" << "  TP  FP  FN  precision  recall\n";
  for (const auto& [family, n] : counts) {
    const double precision = n.true_positive + n.false_positive == 0 ? 1.0 : static_cast<double>(n.true_positive) / (n.true_positive + n.false_positive);
    const double recall = n.true_positive + n.false_negative == 0 ? 1.0 : static_cast<double>(n.true_positive) / (n.true_positive + n.false_negative);
    std::cout << std::left << std::setw(26) << family << std::right << std::setw(4) << n.true_positive << std::setw(4)
              << n.false_positive << std::setw(4) << n.false_negative << std::fixed << std::setprecision(3) << std::setw(11)
              << precision << std::setw(8) << recall << "\n";
    measured.push_back({family, precision, recall});
  }
  std::cout << "held-out sentences classified exactly right: " << held_out_right << " of " << held_out << "\n"
            << misses.str();
  for (const auto& [family, precision, recall] : measured) {
    INFO("family " << family << " (the misses are listed above)");
    CHECK(precision >= 0.9);
    CHECK(recall >= 0.9);
  }
}
