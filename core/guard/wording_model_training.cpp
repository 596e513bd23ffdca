#include "core/guard/wording_model_training.hpp"

#include <algorithm>
#include <cmath>
#include <random>
#include <sstream>
#include <unordered_map>

#include "core/guard/wording_features.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

namespace {

struct Example {
  std::vector<std::size_t> features;  // indices into the feature table
  std::size_t label;
};

// Fisher–Yates with the engine's raw output: std::shuffle's use of the engine is not fixed by
// the standard, the engine's sequence is (mt19937_64, [rand.predef]).
void shuffle(std::vector<std::size_t>& order, std::mt19937_64& engine) {
  for (std::size_t i = order.size(); i > 1; --i) std::swap(order[i - 1], order[engine() % i]);
}

}  // namespace

std::vector<std::string> corpus_features(const CorpusSentence& sentence, const ClassTable& classes) {
  const std::vector<Sentence> parts = split_sentences(sentence.sentence);
  std::vector<const Token*> tokens;
  for (const Sentence& part : parts) {
    const std::vector<const Token*> visible = visible_tokens(part);
    tokens.insert(tokens.end(), visible.begin(), visible.end());
  }
  return wording_features(tokens, sentence.mode == "training" ? CheckMode::training : CheckMode::casework, classes);
}

std::string settings_text(const TrainingSettings& s) {
  std::ostringstream out;
  out << "epochs " << s.epochs << " rate " << s.learning_rate << " decay " << s.rate_decay << " l2 " << s.l2
      << " min-count " << s.min_count << " seed " << s.seed;
  return out.str();
}

WordingModel train_wording_model(const std::vector<CorpusSentence>& corpus, const WordingRuleSet& rules,
                                 const TrainingSettings& settings) {
  if (corpus.empty()) throw validation::InvalidValue({"corpus", "sentences"}, "there is nothing to train on");
  std::vector<std::string> classes{"none"};
  for (const auto& [id, family] : rules.families()) classes.push_back(id);
  const std::size_t k = classes.size();

  // Features seen in at least min_count sentences, numbered in order of first appearance.
  std::vector<std::vector<std::string>> sentence_features;
  std::unordered_map<std::string, int> seen;
  for (const CorpusSentence& s : corpus) {
    sentence_features.push_back(corpus_features(s, rules.classes()));
    for (const std::string& f : sentence_features.back()) ++seen[f];
  }
  std::unordered_map<std::string, std::size_t> index;
  std::vector<std::string> names;
  std::vector<Example> examples;
  for (std::size_t i = 0; i < corpus.size(); ++i) {
    const auto label = std::find(classes.begin(), classes.end(), corpus[i].label);
    if (label == classes.end())
      throw validation::InvalidValue({"corpus line " + std::to_string(corpus[i].line), "label"},
                                     "'" + corpus[i].label + "' is neither 'none' nor a family of the rules");
    Example e{{}, static_cast<std::size_t>(label - classes.begin())};
    for (const std::string& f : sentence_features[i]) {
      if (seen[f] < settings.min_count) continue;
      const auto [at, added] = index.emplace(f, names.size());
      if (added) names.push_back(f);
      e.features.push_back(at->second);
    }
    examples.push_back(std::move(e));
  }

  std::vector<double> w(names.size() * k, 0.0);
  std::vector<double> score(k), p(k);
  std::vector<std::size_t> order(examples.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::mt19937_64 engine(settings.seed);
  double rate = settings.learning_rate;
  for (int epoch = 0; epoch < settings.epochs; ++epoch, rate *= settings.rate_decay) {
    shuffle(order, engine);
    for (std::size_t i : order) {
      const Example& e = examples[i];
      std::fill(score.begin(), score.end(), 0.0);
      for (std::size_t f : e.features)
        for (std::size_t c = 0; c < k; ++c) score[c] += w[f * k + c];
      const double top = *std::max_element(score.begin(), score.end());
      double sum = 0;
      for (std::size_t c = 0; c < k; ++c) sum += (p[c] = std::exp(score[c] - top));
      // Gradient of −log p(label) for each weight of a present feature (eq. 4.109), with the
      // L2 penalty applied to the weights the sentence touches.
      for (std::size_t c = 0; c < k; ++c) {
        const double gradient = p[c] / sum - (c == e.label ? 1.0 : 0.0);
        for (std::size_t f : e.features) {
          double& weight = w[f * k + c];
          weight -= rate * (gradient + settings.l2 * weight);
        }
      }
    }
  }

  WordingModel model(classes, settings.threshold);
  model.add_provenance("settings\t" + settings_text(settings));
  for (std::size_t f = 0; f < names.size(); ++f)
    model.set_weights(names[f], std::vector<double>(w.begin() + static_cast<std::ptrdiff_t>(f * k),
                                                    w.begin() + static_cast<std::ptrdiff_t>((f + 1) * k)));
  return model;
}

WordingModel train_wording_model_without(const std::vector<std::filesystem::path>& corpus_files,
                                         const std::filesystem::path& left_out, const WordingRuleSet& rules,
                                         const TrainingSettings& settings) {
  std::vector<CorpusSentence> others;
  for (const auto& file : corpus_files)
    if (file != left_out)
      for (auto& sentence : read_wording_corpus(file)) others.push_back(std::move(sentence));
  return train_wording_model(others, rules, settings);
}

}  // namespace counterpoise::guard
