#pragma once
// The table of evidence models known to the case reader: name -> reader.

#include <string>
#include <string_view>
#include <vector>

#include "core/models/evidence_model.hpp"
#include "core/models/per_alternative.hpp"

namespace counterpoise::models {

struct ModelEntry {
  std::string_view name;     // as written in the case file's "model" field
  std::string_view summary;  // one line for --help and docs
  ModelReader read;
  // Reads the item's models in a case with several alternatives to Hp. Every model has one: the
  // case reader and the comparison call it without a check (model_registry_test holds them to it).
  AlternativesReader read_alternatives;
};

// All models, in the order they are documented.
std::span<const ModelEntry> all_models();

// The entry for `name`, or nullptr when no model has that name.
const ModelEntry* find_model(std::string_view name);

// "assigned, reported-lr, ..." for messages.
std::string model_names_text();

}  // namespace counterpoise::models
