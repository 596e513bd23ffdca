#pragma once
// The interface every evidence model implements. A model turns the data of one item of
// findings into its likelihood ratio: a point value (from the marginal probabilities), an
// uncertainty description (draws, or an exact discretised distribution of log10 LR), the
// detail that explains it, and a paragraph of assumptions for the report.
//
// Adding a model: implement this interface in core/models/<family>/, write a reader with the
// ModelReader signature, and list it in core/models/model_registry.cpp. See DEVELOPERS.md.

#include <filesystem>
#include <memory>
#include <optional>
#include <random>
#include <span>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/models/data_file.hpp"
#include "core/numbers/likelihood_ratio.hpp"
#include "core/uncertainty/grid_pmf.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::models {

// A remark a model makes about its own result (shown in output, kept in the report):
// e.g. "locus TH01 used the minimum allele frequency 0.0047".
struct ModelNote {
  std::string code;     // stable identifier, e.g. "minimum-allele-frequency"
  std::string message;  // plain sentence
};

// The point evaluation of one item.
struct PointResult {
  numbers::LikelihoodRatio lr = numbers::LikelihoodRatio::neutral();
  // The two probabilities of the findings, as log10, when the model has them (not for an LR
  // reported by another method). -inf means a probability of zero.
  std::optional<double> log10_p_given_hp;
  std::optional<double> log10_p_given_hd;
  nlohmann::json detail = nlohmann::json::object();  // "model_detail" in evaluate --json
  std::vector<ModelNote> notes;
};

class EvidenceModel {
 public:
  virtual ~EvidenceModel() = default;

  // The model name used in the case file ("assigned", "reported-lr", ...).
  virtual std::string kind() const = 0;

  // The point LR (from the marginal probabilities) with its detail. Throws validation::Error
  // only for inputs that cannot be checked when the model is read (none of the built-in ones).
  virtual PointResult evaluate() const = 0;

  // True when the inputs carry intervals or distributions, so the LR has a spread.
  virtual bool is_uncertain() const = 0;

  // Fills `out` with independent draws of log10 LR (±inf allowed for zero/infinite draws).
  // Deterministic for a given generator state. The default fills the point value.
  virtual void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const;

  // The distribution of log10 LR discretised on the lattice of spacing `step`, when the model
  // can compute it exactly (by CDF differences); nullopt when only draws are available.
  virtual std::optional<uncertainty::GridPmf> log10_lr_grid(double step) const;

  // One paragraph, in the correct conditional form, stating what the model assumes.
  virtual std::string assumptions() const = 0;

  // The model's own fields as they appear in the case file, so reading and writing round-trip.
  virtual nlohmann::json to_json() const = 0;

  // The data files the model read, with the digest of the bytes it used (none by default).
  virtual std::vector<DataFileUse> data_files() const { return {}; }
};

using EvidenceModelPtr = std::shared_ptr<const EvidenceModel>;

// What a reader needs besides the item's JSON.
struct ReadContext {
  reading::DataAccess files;        // where the item's files may be read from (the case's folder...)
  validation::Location where;       // the item (its id) for messages
};

// Reads the model fields of one item. Throws validation::Error (naming item and field) at the
// first problem; the case reader records it and goes on with the next item.
using ModelReader = EvidenceModelPtr (*)(const nlohmann::json& item, const ReadContext& context);

}  // namespace counterpoise::models
