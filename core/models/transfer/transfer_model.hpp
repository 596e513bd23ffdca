#pragma once
// The `transfer` evidence model: findings at activity level, the presence of one group of n
// items (glass fragments, fibres) matching the control, and no other group — or the absence of
// any such material. Event tree and derivation: docs/methods.md, "Transfer at activity level".
//   group found:   LR = t0 + P0 tn / (P1 Sn gamma)
//   nothing found: LR = t0 P0 / P0 = t0
// (Evett 1986, J. Forensic Sci. Soc. 26:3 — from memory, not verified against the text;
// presented in Aitken, Taroni & Bozza, Statistics and the Evaluation of Evidence for Forensic
// Scientists, 3rd ed. 2021, chapter on transfer evidence — from memory for the section.)

#include <cstdint>
#include <optional>
#include <string>

#include "core/models/evidence_model.hpp"
#include "core/probability/probability_assignment.hpp"

namespace counterpoise::models::transfer {

enum class Found { group, none };

// The six probabilities as log10 (-inf for 0).
struct TransferLog10Terms {
  double t0 = 0, tn = 0, p0 = 0, p1 = 0, sn = 0, gamma = 0;
};

// The branches of the event tree that produce the findings, as log10 probabilities.
struct EventTree {
  // group found: Hp = n transferred and no background group (tn P0) or nothing transferred and
  // one matching background group of n (t0 P1 Sn gamma); Hd = one matching background group.
  // nothing found: Hp = nothing transferred and no background group (t0 P0); Hd = no group (P0).
  double log10_hp_transfer = 0;    // tn P0 (group) — unused (-inf) for nothing found
  double log10_hp_background = 0;  // t0 P1 Sn gamma (group), t0 P0 (nothing found)
  double log10_hd = 0;             // P1 Sn gamma (group), P0 (nothing found)
  double log10_numerator() const;  // sum of the Hp branches
  double log10_lr() const;         // numerator - denominator; ±inf for a zero side
};

// The event tree for the findings `found` from the six probabilities (log10).
EventTree event_tree(Found found, const TransferLog10Terms& terms);

struct TransferInputs {
  Found found = Found::group;
  bool found_given = false;
  std::optional<std::int64_t> items;  // n, the number of items in the group (for the report)
  // Absent members are allowed only where `found` does not use them.
  std::optional<probability::Assignment> t0, tn, p0, p1, sn, gamma;
};

class TransferModel final : public EvidenceModel {
 public:
  explicit TransferModel(TransferInputs inputs, nlohmann::json as_written = nullptr);

  std::string kind() const override { return "transfer"; }
  PointResult evaluate() const override;
  bool is_uncertain() const override;
  // Independent draws of each probability from its assignment, through the same event tree.
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override;

 private:
  TransferLog10Terms mean_terms() const;
  TransferInputs inputs_;
  nlohmann::json as_written_;
};

// Reads t0, tn, p0, p1, sn, gamma (each a probability in any assignment form), found ("group",
// the default, or "none") and n (optional, >= 1). Throws validation::InvalidValue naming the item
// and field for: a missing probability that `found` needs (group: all six; none: t0 and p0), any
// invalid assignment (see probability::read_assignment), t0 + tn > 1 (named at tn), p0 + p1 > 1
// (named at p1), both sides of the event tree zero (named at the first zero probability of the
// denominator), an unknown found value, n < 1, n given with found "none", and unknown fields.
EvidenceModelPtr read_transfer_model(const nlohmann::json& item, const ReadContext& context);

}  // namespace counterpoise::models::transfer
