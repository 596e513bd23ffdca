#pragma once
// The `transfer` evidence model: findings at activity level, the presence of one group of n
// items (glass fragments, fibres) matching the control, and no other group — or the absence of
// any such material. Event tree and derivation: docs/methods.md, "Transfer at activity level".
//   group found:   LR = t0 + P0 tn / (P1 Sn gamma)
//   nothing found: LR = t0 P0 / P0 = t0
// When the alternative describes an activity of its own that may also transfer material (the
// person was present but did something else), its transfer probabilities t0', tn' enter the
// denominator the way t0, tn enter the numerator:
//   group found:   LR = (tn P0 + t0 P1 Sn gamma) / (tn' P0 + t0' P1 Sn gamma)
//   nothing found: LR = t0 P0 / (t0' P0) = t0 / t0'
// (t0' = 1, tn' = 0 when not given: nothing is transferred if the alternative is true.)
// (Evett 1986, J. Forensic Sci. Soc. 26:3 — from memory, not verified against the text;
// presented in Aitken, Taroni & Bozza, Statistics and the Evaluation of Evidence for Forensic
// Scientists, 3rd ed. 2021, chapter on transfer evidence — from memory for the section.)

#include <cstdint>
#include <limits>
#include <optional>
#include <string>

#include "core/models/evidence_model.hpp"
#include "core/models/per_alternative.hpp"
#include "core/probability/probability_assignment.hpp"

namespace counterpoise::models::transfer {

enum class Found { group, none };

// The six probabilities as log10 (-inf for 0).
struct TransferLog10Terms {
  double t0 = 0, tn = 0, p0 = 0, p1 = 0, sn = 0, gamma = 0;
  // The transfer probabilities if the alternative is true: log10 1 and log10 0 (-inf) unless the
  // alternative transfers material too (has_hd_transfer).
  double t0_hd = 0, tn_hd = -std::numeric_limits<double>::infinity();
  bool has_hd_transfer = false;
};

// The branches of the event tree that produce the findings, as log10 probabilities.
struct EventTree {
  // group found: Hp = n transferred and no background group (tn P0) or nothing transferred and
  // one matching background group of n (t0 P1 Sn gamma); Hd = one matching background group.
  // nothing found: Hp = nothing transferred and no background group (t0 P0); Hd = no group (P0).
  // With transfer under the alternative, Hd's branches are those of Hp with t0', tn'.
  double log10_hp_transfer = 0;    // tn P0 (group) — unused (-inf) for nothing found
  double log10_hp_background = 0;  // t0 P1 Sn gamma (group), t0 P0 (nothing found)
  double log10_hd_transfer = -std::numeric_limits<double>::infinity();  // tn' P0 (group)
  double log10_hd_background = 0;  // (t0') P1 Sn gamma (group), (t0') P0 (nothing found)
  double log10_hd = 0;             // the sum of Hd's branches
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
  // Transfer if the alternative is true; absent: none (t0' = 1, tn' = 0).
  std::optional<probability::Assignment> t0_hd, tn_hd;
};

class TransferModel final : public EvidenceModel {
 public:
  // `hd_stream` numbers the alternative: t0' and tn' are drawn from a generator of that stream
  // (see draw_log10_lr).
  explicit TransferModel(TransferInputs inputs, nlohmann::json as_written = nullptr, std::uint32_t hd_stream = 0);

  std::string kind() const override { return "transfer"; }
  PointResult evaluate() const override;
  bool is_uncertain() const override;
  // Independent draws of each probability from its assignment, through the same event tree:
  // t0, tn, p0, p1, sn, gamma from `rng` in that order (so the models of one item against
  // several alternatives, drawn from one generator state, share them draw for draw), t0' and tn'
  // from a generator of the alternative's own stream seeded from a copy of `rng`'s state, which
  // leaves `rng` where the shared draws leave it.
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override;

 private:
  TransferLog10Terms mean_terms() const;
  TransferInputs inputs_;
  nlohmann::json as_written_;
  std::uint32_t hd_stream_ = 0;
};

// Reads t0, tn, p0, p1, sn, gamma (each a probability in any assignment form), found ("group",
// the default, or "none") and n (optional, >= 1). Throws validation::InvalidValue naming the item
// and field for: a missing probability that `found` needs (group: all six; none: t0 and p0), any
// invalid assignment (see probability::read_assignment), t0 + tn > 1 (named at tn), p0 + p1 > 1
// (named at p1), both sides of the event tree zero (named at the first zero probability of the
// denominator), an unknown found value, n < 1, n given with found "none", and unknown fields.
// t0_hd and tn_hd (optional, any assignment form) are the transfer probabilities if Hd is true:
// found "group" needs both or neither (the missing one named), found "none" uses t0_hd;
// t0_hd + tn_hd > 1 is named at tn_hd, and both sides of the tree zero at t0_hd.
EvidenceModelPtr read_transfer_model(const nlohmann::json& item, const ReadContext& context);

// Reads the item's model against each alternative to Hp: "alternatives": {"<id>": {"t0_hd":
// ..., "tn_hd": ...}, ...}, each entry the transfer probabilities if that alternative is true
// (an empty entry: nothing transferred under it). The findings, t0, tn and the background terms
// are shared, so P(E|Hp) is the same against every alternative. Throws as read_per_alternative
// and read_transfer_model, a problem with an entry's field named "alternatives.<id>.<field>".
std::vector<EvidenceModelPtr> read_transfer_alternatives(const nlohmann::json& item,
                                                         std::span<const std::string> alternative_ids,
                                                         const ReadContext& context);

}  // namespace counterpoise::models::transfer
