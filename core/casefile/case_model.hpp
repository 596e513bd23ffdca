#pragma once
// The case: who asked what, the propositions and conditioning information, the items of
// findings with their models, and the settings for uncertainty, priors and wording. Plain data:
// read from and written to the interchange file by core/interchange/case_json, evaluated by
// core/evaluation. Optional fields stay optional so that writing reproduces what was read.

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/casefile/proposition_level.hpp"
#include "core/models/evidence_model.hpp"
#include "core/verbal/verbal_scale.hpp"

namespace counterpoise::casefile {

// Casework: a report for a real case — the prior is the fact-finder's and none is set by the
// scientist. Training: a teaching case where priors may be shown prominently.
enum class CaseMode { casework, training };

struct CaseDetails {
  std::string reference;                  // the laboratory's case reference
  std::string title;
  std::optional<std::string> laboratory;
  std::optional<std::string> examiner;
  std::optional<std::string> purpose;     // the question the scientist was asked
  std::optional<std::string> requested_by;
  std::optional<std::string> date;        // ISO 8601 date of the evaluation
};

// One of several alternatives to Hp (propositions.alternatives in the case file). The weights are
// the fact-finder's relative prior weights among the alternatives: used only in the compound LR
// and in illustrations, normalised to sum to 1.
struct Alternative {
  std::string id;                 // "Hd1", ...: how items name it (p_given, alternatives)
  std::string text;
  std::optional<double> weight;   // positive; given for every alternative or for none
  // Nothing is known of it beyond the findings' range; as written (absent, true or false).
  std::optional<bool> unspecified;

  bool is_unspecified() const { return unspecified.value_or(false); }
};

// The id by which per-proposition inputs name Hp, and the id of the single alternative of a
// two-proposition case.
inline constexpr const char* kHpId = "Hp";
inline constexpr const char* kSingleAlternativeId = "Hd";

struct Propositions {
  PropositionLevel level = PropositionLevel::source;
  std::string hp;                          // the prosecution proposition
  // The defence (or alternative) proposition. With several alternatives: the first one's text,
  // so that what reads one Hd sees Hp against the first alternative (never written back).
  std::string hd;
  // Empty: the two-proposition case (hp, hd). Otherwise the alternatives to Hp, in file order.
  std::vector<Alternative> alternatives;
  std::optional<std::string> conditioning_information;
  std::vector<std::string> assumptions;

  bool has_alternatives() const { return !alternatives.empty(); }
  // The alternatives' ids in order; {"Hd"} for a two-proposition case.
  std::vector<std::string> alternative_ids() const;
  // The weights normalised to sum to 1, in order; nullopt unless every alternative has one.
  std::optional<std::vector<double>> normalised_weights() const;
};

struct CombinationChoice {
  bool included = true;
  std::optional<std::string> independence;      // why this item is independent of the others
  std::optional<std::string> exclusion_reason;  // required when included is false
};

struct Item {
  std::string id;
  std::optional<std::string> title;
  std::optional<std::string> description;  // the findings, in words
  std::optional<PropositionLevel> level;   // the level this item's LR addresses
  std::string model_name;
  // The model of Hp against the first alternative (against Hd in a two-proposition case).
  models::EvidenceModelPtr model;
  // In a case with several alternatives: one model per alternative, in the order of
  // propositions.alternatives (the first is `model`), and the item's model fields as written,
  // which writing reproduces. Empty in a two-proposition case.
  std::vector<models::EvidenceModelPtr> alternative_models;
  std::optional<nlohmann::json> alternative_fields_as_written;
  std::optional<CombinationChoice> combination;  // absent: included, no justification given
  std::optional<std::string> notes;
  std::optional<std::string> source_data;        // what data the item was computed from

  bool included() const { return !combination || combination->included; }
  // The model of Hp against alternative `index` (`model` in a two-proposition case).
  const models::EvidenceModel& model_against(std::size_t index) const {
    return alternative_models.empty() ? *model : *alternative_models.at(index);
  }
  std::string title_or_id() const { return title && !title->empty() ? *title : id; }
};

struct PriorRange {
  double from_odds, to_odds;
  int points;
};

struct PriorSettings {
  std::vector<double> odds;        // prior odds Hp:Hd, e.g. 1e-6
  std::optional<PriorRange> range; // log-spaced sweep
  std::vector<double> one_of_n;    // "one of N possible sources": prior odds 1/(N-1)
  std::optional<std::vector<double>> thresholds;  // posterior probabilities of interest

  std::vector<double> thresholds_or_default() const;  // 0.5, 0.95, 0.99 when none given
};

struct UncertaintySettings {
  std::optional<std::uint64_t> seed;
  std::optional<std::int64_t> draws;            // Monte Carlo draws (default 100 000)
  std::optional<double> credible_level;         // central interval (default 0.90)
  std::optional<double> conservative_level;     // one-sided (default 0.95: the 5th or 95th percentile)

  std::uint64_t seed_or_default() const { return seed.value_or(20151); }
  std::int64_t draws_or_default() const { return draws.value_or(100000); }
  double credible_level_or_default() const { return credible_level.value_or(0.90); }
  double conservative_level_or_default() const { return conservative_level.value_or(0.95); }
};

struct Case {
  int version = 1;
  CaseDetails details;
  std::optional<CaseMode> mode;
  Propositions propositions;
  std::vector<Item> items;
  std::optional<PriorSettings> priors;
  std::optional<UncertaintySettings> uncertainty;
  // The scale as written: absent (the default), a name, {"file": ...} or an inline scale.
  std::optional<nlohmann::json> verbal_scale_source;
  verbal::VerbalScale verbal_scale = verbal::VerbalScale::enfsi_2015();
  // Sections owned by other parts of the program (guard overrides, report settings), kept as
  // read so that they round-trip; each owner validates its own.
  std::optional<nlohmann::json> guard;
  std::optional<nlohmann::json> report;
  // The laboratory's wording rule files the `guard` section names, as read when the case was
  // read (core/guard/case_rules.hpp), loaded after the shipped rules.
  std::vector<models::DataFile> guard_rule_files;

  CaseMode mode_or_default() const { return mode.value_or(CaseMode::casework); }
  UncertaintySettings uncertainty_or_default() const { return uncertainty.value_or(UncertaintySettings{}); }
  const Item* find_item(const std::string& id) const;
};

std::string_view mode_name(CaseMode mode);

}  // namespace counterpoise::casefile
