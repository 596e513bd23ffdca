#include "core/guard/wording_corpus.hpp"

#include <algorithm>
#include <set>

#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

namespace {

std::string trim(std::string_view s) {
  const auto b = s.find_first_not_of(" \t");
  const auto e = s.find_last_not_of(" \t\r");
  return b == std::string_view::npos ? std::string() : std::string(s.substr(b, e - b + 1));
}

double ratio(int numerator, int denominator) {
  return denominator == 0 ? 1.0 : static_cast<double>(numerator) / static_cast<double>(denominator);
}

}  // namespace

double FamilyCounts::precision() const { return ratio(true_positive, true_positive + false_positive); }
double FamilyCounts::recall() const { return ratio(true_positive, true_positive + false_negative); }

std::vector<CorpusSentence> read_wording_corpus(const std::filesystem::path& path) {
  const std::string text = reading::read_text_file(path, {path.string(), ""});
  std::vector<CorpusSentence> out;
  int number = 0;
  for (std::size_t at = 0; at < text.size();) {
    const std::size_t end = std::min(text.find('\n', at), text.size());
    const std::string_view line(text.data() + at, end - at);
    at = end + 1;
    ++number;
    const std::string trimmed = trim(line);
    if (trimmed.empty() || trimmed.front() == '#') continue;
    const validation::Location where{path.string() + " line " + std::to_string(number), ""};
    CorpusSentence c;
    c.line = number;
    std::size_t field_start = 0;
    for (std::string* field : {&c.label, &c.mode, &c.source}) {
      const std::size_t bar = line.find(" | ", field_start);
      if (bar == std::string_view::npos)
        throw validation::InvalidValue(where.with_field("label"), "expected LABEL | MODE | SOURCE | SENTENCE");
      *field = trim(line.substr(field_start, bar - field_start));
      field_start = bar + 3;
    }
    c.sentence = trim(line.substr(field_start));
    if (c.mode != "casework" && c.mode != "training")
      throw validation::InvalidValue(where.with_field("mode"), "'" + c.mode + "' is not casework or training");
    if (c.sentence.empty()) throw validation::InvalidValue(where.with_field("sentence"), "the sentence is empty");
    out.push_back(std::move(c));
  }
  return out;
}

std::vector<std::string> flagged_families(const WordingChecker& checker, const CorpusSentence& sentence) {
  CheckOptions options;
  options.mode = sentence.mode == "training" ? CheckMode::training : CheckMode::casework;
  std::vector<std::string> out;
  for (const auto& f : checker.check(sentence.sentence, options))
    if (f.severity != Severity::advice && std::find(out.begin(), out.end(), f.family) == out.end())
      out.push_back(f.family);
  return out;
}

std::string predicted_column(const std::vector<std::string>& flagged) {
  if (flagged.empty()) return "none";
  return flagged.size() == 1 ? flagged.front() : "several";
}

CorpusScore score_corpus(const WordingChecker& checker, const std::vector<CorpusSentence>& corpus) {
  CorpusScore score;
  for (const auto& [id, family] : checker.rules().families()) score.per_family[id];
  FamilyCounts overall;
  for (const CorpusSentence& c : corpus) {
    ++score.sentences;
    const std::vector<std::string> flagged = flagged_families(checker, c);
    const std::string column = predicted_column(flagged);
    ++score.confusion[c.label][column];
    for (auto& [family, n] : score.per_family) {
      const bool labelled = c.label == family;
      const bool found = std::find(flagged.begin(), flagged.end(), family) != flagged.end();
      if (labelled && found) ++n.true_positive, ++overall.true_positive;
      if (!labelled && found) ++n.false_positive, ++overall.false_positive;
      if (labelled && !found) ++n.false_negative, ++overall.false_negative;
    }
    const bool is_error = c.label != "none";
    if (is_error && !flagged.empty()) ++score.any_error.true_positive;
    if (!is_error && !flagged.empty()) ++score.any_error.false_positive;
    if (is_error && flagged.empty()) ++score.any_error.false_negative;
    if (column != c.label)
      score.misclassified.push_back("line " + std::to_string(c.line) + ": label " + c.label + ", flagged " + column +
                                    ": " + c.sentence);
  }
  score.per_family["overall"] = overall;
  return score;
}

}  // namespace counterpoise::guard
