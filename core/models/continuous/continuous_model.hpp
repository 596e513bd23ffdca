#pragma once
// The `continuous-two-level` evidence model: control and recovered measurements of a continuous
// property (glass refractive index, fibre diameter, ...) compared through the univariate
// two-level model (within-source normal, between-source normal or kernel density estimate).
// Formulas and sources: core/models/continuous/two_level_lr.hpp and docs/methods.md,
// "Continuous measurements, two-level model".

#include <memory>
#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "core/models/continuous/kernel_density.hpp"
#include "core/models/continuous/two_level_lr.hpp"
#include "core/models/continuous/within_source_sd.hpp"
#include "core/models/evidence_model.hpp"
#include "core/models/per_alternative.hpp"

namespace counterpoise::models::continuous {

struct NormalPopulation {
  double mean = 0.0;
  double sd = 1.0;  // tau, the between-source standard deviation
};

struct KdePopulation {
  std::string file;                 // as written in the case (relative to the case file)
  std::string column;
  std::optional<double> bandwidth;  // as given; absent: Silverman's rule
  std::optional<KdeMethod> method;  // as given; absent: fast
  std::shared_ptr<const KernelDensity> density;  // built with the bandwidth in use
  std::optional<DataFileUse> file_use;           // the background file as read, with its digest
};

using Population = std::variant<NormalPopulation, KdePopulation>;

enum class NormalForm { exact, approximate };

struct ContinuousInputs {
  std::vector<double> control;
  std::vector<double> recovered;
  WithinSourceSd within;
  Population population;
  // The population the recovered material's source comes from if Hd is true, when it is not the
  // one the control's source comes from (the glass from another kind of object); the numerator
  // and the control's term of the denominator keep `population`.
  std::optional<Population> population_hd;
  std::optional<NormalForm> form;  // normal population only; absent: exact
};

class ContinuousTwoLevelModel final : public EvidenceModel {
 public:
  // Takes validated inputs (see read_continuous_model). `as_written`, when not null, is what
  // to_json returns (the item's model fields exactly as read).
  explicit ContinuousTwoLevelModel(ContinuousInputs inputs, nlohmann::json as_written = nullptr);

  std::string kind() const override { return "continuous-two-level"; }
  PointResult evaluate() const override;
  bool is_uncertain() const override { return inputs_.within.is_estimated(); }
  // Draws sigma from its posterior and recomputes the LR with it (population held fixed).
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override;

  // log10 LR with within-source standard deviation `sigma` (the form in use).
  double log10_lr_with_sd(double sigma) const;
  const ContinuousInputs& inputs() const noexcept { return inputs_; }
  std::vector<DataFileUse> data_files() const override;

 private:
  GroupSummary summary(double sigma) const;
  TwoLevelDensities densities(const GroupSummary& g) const;

  ContinuousInputs inputs_;
  double control_mean_, recovered_mean_;
  nlohmann::json as_written_;
};

// Reads control, recovered, within_sd | within_replicates, population and form. Throws
// validation::InvalidValue naming the item and field for: a missing or empty measurement array,
// a non-finite measurement, both or neither of within_sd and within_replicates, within_sd <= 0,
// bad replicate groups (see WithinSourceSd::pooled), a population that is not exactly one of
// normal / kde, a normal sd <= 0, a bandwidth that is not a positive number, an unknown kde
// method, form with a kde population or unknown form, a missing column, a non-numeric or empty
// background cell (naming file and line), fewer than 2 background values, a background whose
// values are all equal when no bandwidth is given, and unknown fields. population_hd (optional)
// is read as population, its problems named under it; it is refused with form "approximate"
// (Lindley's approximation replaces both means by the pooled mean in one population). Throws
// validation::FileError when a background file cannot be read.
EvidenceModelPtr read_continuous_model(const nlohmann::json& item, const ReadContext& context);

// Reads the item's model against each alternative to Hp: "alternatives": {"<id>":
// {"population_hd": {...}}, ...}, each entry the population of sources of the recovered material
// if that alternative is true (an empty entry: the shared population). The measurements, the
// within-source standard deviation and population are shared, so the numerator is the same
// against every alternative. Throws as read_per_alternative and read_continuous_model, a problem
// with an entry's field named "alternatives.<id>.<field>".
std::vector<EvidenceModelPtr> read_continuous_alternatives(const nlohmann::json& item,
                                                           std::span<const std::string> alternative_ids,
                                                           const ReadContext& context);

// The background column `column` of CSV text read from the file `name` (at least 2 finite
// values). Throws as above.
std::vector<double> read_background_column(const std::string& text, const std::string& name, const std::string& column,
                                           const validation::Location& where);

}  // namespace counterpoise::models::continuous
