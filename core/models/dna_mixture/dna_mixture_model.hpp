#pragma once
// The `dna-mixture` model: a questioned STR profile with alleles from one to four people, some
// possibly missing (drop-out) or extra (drop-in), compared under two propositions that name
// which typed people contributed and how many unknown people did. Per locus, the probability of
// the observed alleles under each proposition sums over the unknowns' genotypes
// (unknown_genotypes.hpp) of the semi-continuous observation model (locus_likelihood.hpp);
// loci multiply (log10 sums). The drop-out probability d is a number or a distribution: the LR
// then averages each proposition's probability over d (dropout_uncertainty.hpp), and the curve
// of the LR over d is kept with the d that minimises it. With d = c = 0 the model is the
// classical mixture model (Weir et al. 1997, J. Forensic Sci. 42:213; with theta Curran et al.
// 1999); one contributor with d = c = 0 gives the single-source model's LR.
// Formulas, sources and assumptions: docs/methods.md, "DNA mixtures".

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/models/dna_mixture/allele_classes.hpp"
#include "core/models/dna_mixture/dropout_uncertainty.hpp"
#include "core/models/dna_mixture/locus_likelihood.hpp"
#include "core/models/evidence_model.hpp"
#include "core/models/per_alternative.hpp"
#include "core/probability/probability_assignment.hpp"

namespace counterpoise::models::dna_mixture {

enum class Side { hp, hd };

// Who contributed under one proposition.
struct MixtureProposition {
  std::vector<std::string> contributors;  // named people (keys of "references")
  int unknowns = 0;
  int total() const { return static_cast<int>(contributors.size()) + unknowns; }
};

// One unordered set of unknown genotypes with its share of the locus probability.
struct GenotypeSetShare {
  std::vector<std::string> genotypes;  // "12,15" per unknown ("Q" for any other allele)
  double share = 0.0;                  // of P(observed | proposition) at the point drop-out
};

// One set of unknown genotypes summed over at a locus, with its two factors.
struct GenotypeSetTerm {
  std::vector<std::string> genotypes;  // "12,15" per unknown ("Q" for any other allele)
  double genotype_probability = 0.0;   // P(these genotypes | named people's alleles), every ordering
  double observation_probability = 0.0;  // P(alleles observed | every contributor's genotype, d)
};

// One locus of the questioned profile that enters the LR.
struct MixtureLocus {
  std::string locus;                                                       // as written
  std::vector<std::string> observed;                                       // as written
  std::vector<std::string> uncertain;                                      // marked uncertain
  std::vector<std::pair<std::string, std::vector<std::string>>> references;  // name, genotype
  LocusClasses classes;
  double minimum_frequency = 0.0;
  std::string minimum_frequency_rule;
  LocusLikelihood hp, hd;
  std::vector<GenotypeSetShare> leading_hp, leading_hd;  // the largest shares at the point drop-out
  LocusContributors contributors_hp, contributors_hd;
};

struct MixtureSettings {
  double theta = 0.0;
  double dropin = 0.0;
  // The shared d: the unknowns' and every named person's without a rate of their own.
  probability::Assignment dropout = probability::PointValue{0.0};
  std::optional<double> dropout_homozygote;  // nullopt: d^2
  // Named people's own rates (fixed numbers); a person's drop-out group is 1 + their position
  // in this map (kSharedDropout for everyone else).
  std::map<std::string, DropoutRate> own_dropout;
  MixtureProposition hp, hd;
  int dropout_group(const std::string& person) const;
};

class DnaMixtureModel final : public EvidenceModel {
 public:
  // Computes the LR (integrated over d when d has a distribution) and the curve over d.
  DnaMixtureModel(MixtureSettings settings, std::vector<MixtureLocus> loci, std::vector<ModelNote> notes,
                  nlohmann::json as_written, std::vector<DataFileUse> data_files = {});

  std::string kind() const override { return "dna-mixture"; }
  PointResult evaluate() const override;
  // False: uncertainty about d is averaged into the LR (and shown as the curve over d).
  bool is_uncertain() const override { return false; }
  std::string assumptions() const override;
  nlohmann::json to_json() const override { return as_written_; }
  std::vector<DataFileUse> data_files() const override { return data_files_; }

  const MixtureSettings& settings() const { return settings_; }
  const std::vector<MixtureLocus>& loci() const { return loci_; }
  // log10 P(observed profile | proposition, d) over all loci (-inf for zero).
  double log10_probability(Side side, double d) const;
  // log10 LR at d (-inf/+inf for zero/infinite; nullopt when impossible under both).
  std::optional<double> log10_lr_at(double d) const;
  // log10 P(observed profile | proposition) with d averaged over its distribution.
  double log10_p_given_hp() const { return log10_p_hp_; }
  double log10_p_given_hd() const { return log10_p_hd_; }
  const DropoutCurve& curve() const { return curve_; }
  // The shared drop-out probability at which per-locus values are shown: the mean of its
  // distribution.
  double point_dropout() const;
  // Every rate with the shared d at `d` (own rates as stated).
  Dropout dropout_at(double d) const;
  // The sets of unknown genotypes summed over at loci()[locus] under `side` at shared d, in the
  // order enumerated, each with a non-zero product (they sum to that locus's probability).
  std::vector<GenotypeSetTerm> genotype_set_terms(std::size_t locus, Side side, double d) const;

 private:
  MixtureSettings settings_;
  std::vector<MixtureLocus> loci_;
  std::vector<ModelNote> notes_;
  nlohmann::json as_written_;
  std::vector<DataFileUse> data_files_;
  double log10_p_hp_ = 0.0, log10_p_hd_ = 0.0;
  DropoutCurve curve_;
};

// The number of points of the curve over d (d = 0, 0.01, ..., 1).
inline constexpr int kDropoutCurvePoints = 101;

// Reads theta (required, in [0, 1)), observed ({locus: [alleles]}, required), uncertain
// (optional, {locus: [alleles]}: alleles below the threshold, at observed loci), references
// ({name: {locus: genotype}}), hp and hd ({"contributors": [names], "unknowns": n, optional
// "number_of_contributors"}), dropout (required: a probability or a distribution as for assigned
// probabilities), dropout_homozygote (optional, in [0, 1]), dropout_by_contributor (optional,
// {name: d} or {name: {"dropout": d, "dropout_homozygote": d2}} for named contributors),
// dropin (required, in [0, 1]), min_allele_frequency and frequencies (as for
// dna-single-source). Throws validation::InvalidValue naming the item and field for: unknown
// fields; an observed or uncertain allele listed twice, in both lists, or not a non-empty
// string; uncertain alleles at a locus not observed; an own rate for a person who is no
// contributor or given as a distribution; a locus given twice; a contributor with no reference
// profile, named twice, or a proposition with no contributors or more than 4; a stated
// number_of_contributors that differs from the named people plus unknowns; a reference profile
// missing an observed locus; an observed locus missing from the frequency table; an allele not
// in the table with no minimum frequency (as dna-single-source); frequencies of the observed and
// reference alleles summing above 1; more observed alleles at a locus than a proposition's
// contributors can carry when dropin is 0; findings impossible under both propositions; and
// everything read_frequency_table and read_assignment throw for.
EvidenceModelPtr read_dna_mixture_model(const nlohmann::json& item, const ReadContext& context);

// Reads the item's model against each alternative to Hp: "alternatives": {"<id>": {"hd":
// {"contributors": [...], "unknowns": n}}, ...}, each entry's hd the contributors if that
// alternative is true (a shared hd is the default an entry replaces); everything else, hp
// included, is shared, so P(E|Hp) is the same against every alternative. An own drop-out rate
// (dropout_by_contributor) of a person who contributes under some alternatives only is used
// against those. Throws as read_per_alternative and read_dna_mixture_model, a problem with an
// entry's hd named "alternatives.<id>.hd...".
std::vector<EvidenceModelPtr> read_dna_mixture_alternatives(const nlohmann::json& item,
                                                            std::span<const std::string> alternative_ids,
                                                            const ReadContext& context);

}  // namespace counterpoise::models::dna_mixture
