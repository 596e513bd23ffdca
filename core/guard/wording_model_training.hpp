#pragma once
// Training the learned reading (wording_model.hpp) on labelled corpora (wording_corpus.hpp):
// stochastic gradient descent on the cross-entropy of the multinomial logistic model with an L2
// penalty (Bishop 2006, Pattern Recognition and Machine Learning, §4.3.4, eq. 4.109 for the
// gradient; Bottou 2012, "Stochastic gradient descent tricks", Neural Networks: Tricks of the
// Trade, LNCS 7700, for the schedule). Deterministic: the same corpora and settings give the
// same weights to the last bit on one build, so the shipped model can be checked against a
// retraining (tests/core/guard/wording_model_test.cpp).

#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "core/guard/wording_corpus.hpp"
#include "core/guard/wording_model.hpp"

namespace counterpoise::guard {

struct TrainingSettings {
  int epochs = 15;
  double learning_rate = 0.2;  // of the first epoch
  double rate_decay = 0.8;     // the rate is multiplied by this after each epoch
  double l2 = 1e-4;
  int min_count = 2;           // a feature seen in fewer training sentences gets no weight
  std::uint64_t seed = 1;      // of the order in which the sentences are visited
  double threshold = 0.9;      // written into the model; see wording_model.hpp
};

// A model with the classes "none" then the families of `rules` (in order of their ids) trained
// on `corpus`, whose labels must each be "none" or one of those families. Throws validation::InvalidValue (item
// "corpus line N", field "label") for another label, and when the corpus is empty.
// The features are read with the word classes of `rules`, and its families are the classes.
WordingModel train_wording_model(const std::vector<CorpusSentence>& corpus, const WordingRuleSet& rules,
                                 const TrainingSettings& settings = {});

// A model trained on every corpus file of `corpus_files` but `left_out`: the fair model for
// scoring `left_out` when the shipped model was trained on it too ("leave one set out").
WordingModel train_wording_model_without(const std::vector<std::filesystem::path>& corpus_files,
                                         const std::filesystem::path& left_out, const WordingRuleSet& rules,
                                         const TrainingSettings& settings = {});

// The features of one corpus sentence as the checker sees them: every token of the line (all
// its sentences) but the quotation marks, in the line's mode.
std::vector<std::string> corpus_features(const CorpusSentence& sentence, const ClassTable& classes);

// "epochs 15 rate 0.2 decay 0.8 l2 0.0001 min-count 2 seed 1": the settings for the model file.
std::string settings_text(const TrainingSettings& settings);

}  // namespace counterpoise::guard
