#pragma once
// The learned reading: a second reader of each sentence beside the rules. It is a multinomial
// logistic regression (Bishop 2006, Pattern Recognition and Machine Learning, §4.3.4, eq. 4.104:
// p(class | x) = exp(w_class · x) / Σ_j exp(w_j · x)) over the features of wording_features.hpp,
// one class for correct wording ("none") and one per error family, trained on the labelled
// development corpora (wording_model_training.hpp). Rules say why a sentence is wrong; the
// learned reading catches wordings no rule was written for, which hand-written rules miss most
// on material they have not seen (docs/reasoning-guard.md gives both figures).
//
// File format (text, UTF-8, one record a line, fields separated by a tab):
//   counterpoise-wording-model<TAB>1
//   threshold<TAB>T          flag a sentence when P(any error) >= T
//   classes<TAB>none<TAB>FAMILY...
//   trained-on<TAB>FILE<TAB>SHA-256          (any number; the corpora it was trained on)
//   settings<TAB>TEXT                        (how it was trained, for the record)
//   w<TAB>FEATURE<TAB>W_1<TAB>...<TAB>W_K    one weight per class, in the order of `classes`

#include <filesystem>
#include <iosfwd>
#include <string>
#include <unordered_map>
#include <vector>

namespace counterpoise::guard {

// What the learned reading says of one sentence.
struct LearnedReading {
  double error_probability = 0;  // 1 − P(none)
  std::string family;            // the most probable error family
  double family_probability = 0;
  // The word features that weighed most towards that family against correct wording, strongest
  // first (at most three, each with a positive weight; a first word without its '^').
  std::vector<std::string> weightiest;
};

class WordingModel {
 public:
  // `classes` starts with "none"; `threshold` in (0, 1]. Throws validation::InvalidValue otherwise.
  WordingModel(std::vector<std::string> classes, double threshold);

  // Sets the weights of one feature, one per class. Throws validation::InvalidValue when the
  // count differs from the classes' or a weight is not finite.
  void set_weights(const std::string& feature, std::vector<double> weights);
  void add_provenance(std::string line) { provenance_.push_back(std::move(line)); }

  const std::vector<std::string>& classes() const noexcept { return classes_; }
  double threshold() const noexcept { return threshold_; }
  const std::unordered_map<std::string, std::vector<double>>& weights() const noexcept { return weights_; }
  const std::vector<std::string>& provenance() const noexcept { return provenance_; }
  // The SHA-256 of the file the model was read from (empty for a model made in memory).
  const std::string& file_sha256() const noexcept { return file_sha256_; }

  // P(class | features) for every class, in the order of classes(); unknown features are ignored.
  std::vector<double> probabilities(const std::vector<std::string>& features) const;
  LearnedReading read(const std::vector<std::string>& features) const;

  // Writes the model in the file format above; weights with 6 significant digits.
  void write(std::ostream& out) const;
  // Reads a model file. Throws validation::FileError when it cannot be read and
  // validation::InvalidValue (item "<path> line N", the field named) for any malformed line.
  static WordingModel read_file(const std::filesystem::path& path);

 private:
  std::vector<std::string> classes_;
  double threshold_;
  std::unordered_map<std::string, std::vector<double>> weights_;
  std::vector<std::string> provenance_;
  std::string file_sha256_;
};

// The model shipped with the program: guard/wording-model.tsv in the shipped data folder.
std::filesystem::path default_wording_model_path();

}  // namespace counterpoise::guard
