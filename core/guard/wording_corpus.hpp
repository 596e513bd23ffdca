#pragma once
// A labelled wording corpus and how the checker scores on it. A corpus file holds one sentence a
// line, "LABEL | MODE | SOURCE | SENTENCE": LABEL is the error family the sentence contains or
// "none", MODE is casework or training (the mode the checker runs in for that line), SOURCE
// says where the wording comes from. Blank lines and lines starting with '#' are skipped. A
// laboratory can measure the guard, with its own rules, on its own corpus.

#include <filesystem>
#include <map>
#include <string>
#include <vector>

#include "core/guard/wording_checker.hpp"

namespace counterpoise::guard {

struct CorpusSentence {
  int line = 0;  // 1-based line in the file
  std::string label, mode, source, sentence;
};

// The sentences of the corpus file at `path`. Throws validation::FileError when it cannot be
// read and validation::InvalidValue (item "<path> line N", field "label", "mode" or "sentence")
// for a line without four fields, a mode other than casework/training, or an empty sentence.
std::vector<CorpusSentence> read_wording_corpus(const std::filesystem::path& path);

// The families flagged (errors and warnings; advice does not count) in one corpus sentence,
// checked in the sentence's mode.
std::vector<std::string> flagged_families(const WordingChecker& checker, const CorpusSentence& sentence);

struct FamilyCounts {
  int true_positive = 0, false_positive = 0, false_negative = 0;
  double precision() const;  // 1 when nothing was flagged
  double recall() const;     // 1 when nothing was labelled
};

// The row of the confusion matrix a checked sentence falls in: the single family flagged,
// "none" when nothing was flagged, "several" when more than one family was.
std::string predicted_column(const std::vector<std::string>& flagged);

struct CorpusScore {
  int sentences = 0;
  std::map<std::string, FamilyCounts> per_family;  // every family of the rule set, and "overall"
  // Sentences flagged as an error (any family) against sentences labelled with one: the
  // figure that says how well errors are told from correct wording, whatever the family.
  FamilyCounts any_error;
  std::map<std::string, std::map<std::string, int>> confusion;  // label → predicted column → count
  std::vector<std::string> misclassified;  // "line N: label L, flagged F: sentence"
};

// Scores `checker` on `corpus`: per family (a sentence counts for a family when it is labelled
// with it or flags it), summed over families ("overall", micro-averaged), the error/correct
// split, and the confusion matrix.
CorpusScore score_corpus(const WordingChecker& checker, const std::vector<CorpusSentence>& corpus);

}  // namespace counterpoise::guard
