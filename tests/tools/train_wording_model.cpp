// Trains the learned reading of the reasoning guard on labelled wording corpora and writes the
// model file (format in core/guard/wording_model.hpp). The shipped model is made with
//   build/tests/tools/train_wording_model core/data/guard/wording-model.tsv
//       tests/data/guard/wording-corpus.txt tests/data/guard/wording-corpus-dev*.txt
// (the development corpora only; the held-out corpora are never trained on), and
// tests/core/guard/wording_model_test.cpp checks that the shipped file is what this gives.

#include <fstream>
#include <iostream>

#include "core/guard/wording_checker.hpp"
#include "core/guard/wording_model_training.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"

using namespace counterpoise;

int main(int argc, char** argv) {
  if (argc < 3) {
    std::cerr << "usage: train_wording_model OUT.tsv CORPUS...\n";
    return 2;
  }
  try {
    const guard::WordingChecker checker = guard::WordingChecker::from_file(guard::default_wording_rules_path());
    std::vector<guard::CorpusSentence> corpus;
    std::vector<std::string> provenance;
    for (int i = 2; i < argc; ++i) {
      const std::filesystem::path path(argv[i]);
      for (auto& s : guard::read_wording_corpus(path)) corpus.push_back(std::move(s));
      provenance.push_back("trained-on\t" + path.filename().string() + "\t" +
                           platform::sha256_hex(reading::read_text_file(path, {path.string(), ""})));
    }
    guard::WordingModel model = guard::train_wording_model(corpus, checker.rules());
    for (auto& line : provenance) model.add_provenance(std::move(line));
    std::ofstream out(argv[1], std::ios::binary);
    model.write(out);
    if (!out.flush()) throw validation::FileError({argv[1], ""}, "could not write the model");
    std::cout << "trained on " << corpus.size() << " sentences, " << model.weights().size() << " features\n";
  } catch (const validation::Error& e) {
    std::cerr << e.what() << "\n";
    return 1;
  }
}
