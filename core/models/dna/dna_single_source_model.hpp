#pragma once
// The `dna-single-source` model: a single-source STR profile (the questioned profile) that
// matches a reference profile. LR = 1 / match probability, where the match probability is the
// probability that the alternative donor under Hd has the profile, multiplied over loci (summed
// in log10): product rule (NRC II 1996, eq. 4.1), Balding-Nichols theta correction (NRC II eq.
// 4.10a/b) and relatives by IBD coefficients — see match_probability.hpp; minimum allele
// frequency 5/2N for a database of N people (NRC II 1996, p. 148, as cited in Butler 2005,
// "Forensic DNA Typing" 2nd ed., ch. 21) or a configured floor; sampling uncertainty from a Dirichlet posterior (allele_posterior.hpp).
// Formulas, sources and assumptions: docs/methods.md, "DNA, single source".

#include <optional>
#include <span>
#include <string>
#include <vector>

#include "core/models/dna/allele_frequencies.hpp"
#include "core/models/dna/allele_posterior.hpp"
#include "core/models/dna/match_probability.hpp"
#include "core/models/dna/minimum_frequency.hpp"
#include "core/models/evidence_model.hpp"

namespace counterpoise::models::dna {

// The alternative donor under Hd.
struct Relationship {
  std::string name;  // "unrelated", "parent-child", "full-sibling", "half-sibling", "first-cousin", "ibd"
  IbdCoefficients ibd;
};

// What happened at one locus of the questioned profile.
struct LocusEvaluation {
  enum class Status { used, not_interpretable, differs, not_compared, sex_marker };
  std::string locus;                                 // as written in the profile
  std::vector<std::string> genotype;                 // as written (one or two alleles)
  std::optional<std::vector<std::string>> reference; // the reference genotype, when given
  Status status = Status::used;
  // Only for loci that enter the match probability (status used):
  LocusGenotype frequencies;                         // the frequencies used (after any floor)
  std::string allele_a, allele_b;                    // the genotype's alleles (allele_b empty if homozygote)
  std::optional<double> table_p, table_q;            // as in the table; nullopt when not listed
  bool floored_p = false, floored_q = false;         // the minimum frequency was used
  double minimum_frequency = 0.0;                    // the floor at this locus (0: none)
  std::string minimum_frequency_rule;                // "5/2N (N = 302)", "min_allele_frequency"
  double log10_match_probability = 0.0;
  std::optional<AllelePosterior> posterior;          // when counts are known
};

class DnaSingleSourceModel final : public EvidenceModel {
 public:
  // `as_written` holds the model's fields exactly as read (the file reference, not the table).
  DnaSingleSourceModel(double theta, Relationship relationship, std::vector<LocusEvaluation> loci,
                       std::vector<ModelNote> notes, nlohmann::json as_written, std::vector<DataFileUse> data_files = {});

  std::string kind() const override { return "dna-single-source"; }
  PointResult evaluate() const override;
  // True when allele counts are known at every locus used and the profiles do not differ.
  bool is_uncertain() const override;
  // Draws of log10 LR with every used locus's frequencies drawn from its Dirichlet posterior,
  // floored by the same minimum allele frequency as the point value.
  void draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const override;
  std::string assumptions() const override;
  nlohmann::json to_json() const override { return as_written_; }
  std::vector<DataFileUse> data_files() const override { return data_files_; }

  const std::vector<LocusEvaluation>& loci() const { return loci_; }
  bool excluded() const;  // some interpretable locus differs

 private:
  double theta_;
  Relationship relationship_;
  std::vector<LocusEvaluation> loci_;
  std::vector<ModelNote> notes_;
  nlohmann::json as_written_;
  std::vector<DataFileUse> data_files_;  // the frequency table's file, when it came from one
  double log10_match_probability_ = 0.0;  // sum over used loci
};

// The names of the standard relationships of the alternative donor ("unrelated" first), as the
// case file spells them.
std::vector<std::string> standard_relationship_names();

// The IBD coefficients of a named relationship; nullopt for an unknown name.
std::optional<IbdCoefficients> ibd_of_relationship(std::string_view name);

// Reads theta (required, in [0, 1)), relationship (optional, default "unrelated"; a name or
// {"ibd": [k0, k1, k2]} with each in [0, 1] summing to 1 within 1e-9), profile (required),
// reference_profile (required), uninterpretable_loci, min_allele_frequency (a number in (0, 1],
// "5/2N" or "none") and frequencies (required, see read_frequency_table). Throws
// validation::InvalidValue naming the item and field for: unknown fields, a reference profile
// absent or empty or with a genotype at none of the profile's interpretable STR loci (no locus
// compared, so no LR), a genotype that is not one or two non-empty
// allele strings, a locus given twice (in any spelling), an uninterpretable locus not in the
// profile or listed twice, a profile locus used in the match probability but missing from the
// frequency table, an allele not in the table when no minimum frequency applies, "5/2N" at a
// locus without a database size, and everything read_frequency_table throws for.
EvidenceModelPtr read_dna_single_source_model(const nlohmann::json& item, const ReadContext& context);

// Reads one relationship of the alternative donor per alternative:
// "alternatives": {"<id>": {"relationship": ...}, ...}, the other fields shared (see
// models::read_per_alternative for the errors).
std::vector<EvidenceModelPtr> read_dna_single_source_alternatives(const nlohmann::json& item,
                                                                  std::span<const std::string> alternative_ids,
                                                                  const ReadContext& context);

}  // namespace counterpoise::models::dna
