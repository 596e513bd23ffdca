#include "core/models/model_registry.hpp"

#include "core/models/assigned/assigned_model.hpp"
#include "core/models/continuous/continuous_model.hpp"
#include "core/models/dna/dna_single_source_model.hpp"
#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/models/network/network_model.hpp"
#include "core/models/reported_lr/reported_lr_model.hpp"
#include "core/models/transfer/transfer_model.hpp"

namespace counterpoise::models {

namespace {
// One row per model. Keep this list in the order docs/methods.md presents the models.
const ModelEntry kModels[] = {
    {"assigned", "P(E|Hp) and P(E|Hd) assigned by the scientist (point, interval, Beta or counts)",
     &read_assigned_model, &read_assigned_alternatives},
    {"reported-lr", "a likelihood ratio computed by another method, with an optional interval",
     &read_reported_lr_model, &read_reported_lr_alternatives},
    {"dna-single-source", "a single-source STR profile matching a reference profile (allele frequencies, theta, relatives)",
     &dna::read_dna_single_source_model, &dna::read_dna_single_source_alternatives},
    {"dna-mixture", "an STR profile from one to four people, named and unknown, with drop-out and drop-in (semi-continuous model)",
     &dna_mixture::read_dna_mixture_model, &dna_mixture::read_dna_mixture_alternatives},
    {"continuous-two-level", "control and recovered measurements compared by the two-level model (normal or kernel population)",
     &continuous::read_continuous_model, &continuous::read_continuous_alternatives},
    {"transfer", "one group of matching items found (or none) at activity level: transfer, persistence and background",
     &transfer::read_transfer_model, &transfer::read_transfer_alternatives},
    {"network", "dependent findings evaluated jointly by a discrete Bayesian network (exact variable elimination)",
     &network::read_network_model, &network::read_network_alternatives},
};
}  // namespace

std::span<const ModelEntry> all_models() { return kModels; }

const ModelEntry* find_model(std::string_view name) {
  for (const auto& entry : kModels)
    if (entry.name == name) return &entry;
  return nullptr;
}

std::string model_names_text() {
  std::string text;
  for (const auto& entry : kModels) text += (text.empty() ? "" : ", ") + std::string(entry.name);
  return text;
}

}  // namespace counterpoise::models
