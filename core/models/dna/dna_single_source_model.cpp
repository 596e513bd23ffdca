#include "core/models/dna/dna_single_source_model.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <set>

#include "core/models/dna/str_loci.hpp"
#include "core/models/dna/str_profile.hpp"
#include "core/models/item_fields.hpp"
#include "core/models/per_alternative.hpp"
#include "core/numbers/log10_math.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"
#include "core/validation/checks.hpp"

namespace counterpoise::models::dna {

using nlohmann::json;
using numbers::exact_text;
using numbers::significant_text;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr std::string_view kModelFields[] = {"theta", "relationship", "profile", "reference_profile",
                                             "uninterpretable_loci", "min_allele_frequency", "frequencies"};

struct NamedRelationship {
  std::string_view name;
  IbdCoefficients ibd;
  std::string_view words;  // for the assumptions paragraph
};

// IBD coefficients (k0, k1, k2) of the standard relationships (Weir, Anderson & Hepler 2006,
// "Genetic relatedness analysis: modern data and new challenges", Nat. Rev. Genet. 7:771,
// Table 1 — from memory; the values are common practice).
constexpr NamedRelationship kRelationships[] = {
    {"unrelated", {1.0, 0.0, 0.0}, "a person unrelated to the person of interest"},
    {"parent-child", {0.0, 1.0, 0.0}, "a parent or child of the person of interest"},
    {"full-sibling", {0.25, 0.5, 0.25}, "a full sibling of the person of interest"},
    {"half-sibling", {0.5, 0.5, 0.0}, "a half sibling of the person of interest"},
    {"first-cousin", {0.75, 0.25, 0.0}, "a first cousin of the person of interest"},
};

std::string relationship_names() {
  std::string text;
  for (const auto& r : kRelationships) text += (text.empty() ? "" : ", ") + std::string(r.name);
  return text + ", or {\"ibd\": [k0, k1, k2]}";
}

Relationship read_relationship(const json& item, const Location& where) {
  const json* member = reading::find_member(item, "relationship");
  if (!member) return Relationship{"unrelated", {1.0, 0.0, 0.0}};
  const Location at = where.with_field("relationship");
  if (member->is_string()) {
    const std::string name = member->get<std::string>();
    if (auto ibd = ibd_of_relationship(name)) return Relationship{name, *ibd};
    throw InvalidValue(at, "unknown relationship '" + name + "' (expected " + relationship_names() + ")");
  }
  if (!member->is_object())
    throw InvalidValue(at, "expected a relationship name or {\"ibd\": [k0, k1, k2]}, found " +
                               reading::json_type_name(*member));
  reading::check_known_members(*member, {"ibd"}, at);
  const Location ibd_at = at.with_field("ibd");
  const auto k = reading::read_number_array(reading::require_member(*member, "ibd", at), ibd_at);
  if (k.size() != 3)
    throw validation::InconsistentSizes(ibd_at, "expected three coefficients [k0, k1, k2], found " +
                                                    std::to_string(k.size()));
  for (std::size_t i = 0; i < 3; ++i)
    validation::check_probability(Location{where.item, ibd_at.field + "[" + std::to_string(i) + "]"}, k[i]);
  const double sum = k[0] + k[1] + k[2];
  if (std::fabs(sum - 1.0) > 1e-9)
    throw InvalidValue(ibd_at, "coefficients sum to " + exact_text(sum) + "; k0 + k1 + k2 must be 1");
  return Relationship{"ibd", {k[0], k[1], k[2]}};
}

std::string list_text(const std::vector<std::string>& names) {
  std::string text;
  for (const auto& name : names) text += (text.empty() ? "" : ", ") + name;
  return text;
}

std::string genotype_text(const std::vector<std::string>& genotype) {
  return genotype.size() == 1 ? genotype[0] : genotype[0] + "," + genotype[1];
}

// Frequencies and floor for one locus that enters the match probability.
void evaluate_locus(LocusEvaluation& e, const FrequencyTable& table, const MinimumFrequencyRule& rule,
                    double theta, const IbdCoefficients& ibd, const Location& at) {
  const LocusFrequencies* locus = table.find(e.locus);
  if (!locus) throw InvalidValue(at, "locus " + locus_key(e.locus) + " is not in the frequency table");
  const auto [a, b] = as_pair(e.genotype);
  const bool homozygote = a == b;
  e.allele_a = a;
  e.allele_b = homozygote ? "" : b;

  const auto total = locus->allele_total();
  const LocusFloor floor = locus_floor(*locus, rule, e.locus, at);
  e.minimum_frequency = floor.value;
  e.minimum_frequency_rule = floor.rule_text;
  auto frequency_of = [&](const std::string& allele, std::optional<double>& listed, bool& floored) {
    const FlooredFrequency f = floored_frequency(*locus, allele, floor, e.locus, at);
    listed = f.listed;
    floored = f.floored;
    return f.value;
  };
  e.frequencies.homozygote = homozygote;
  e.frequencies.p = frequency_of(a, e.table_p, e.floored_p);
  if (!homozygote) e.frequencies.q = frequency_of(b, e.table_q, e.floored_q);
  e.log10_match_probability = log10_match_probability(e.frequencies, theta, ibd);

  if (locus->has_counts && total) {
    auto count_of = [&](const std::string& allele) -> std::int64_t {
      auto it = locus->alleles.find(allele);
      return it == locus->alleles.end() ? 0 : it->second.count.value_or(0);
    };
    std::int64_t types = static_cast<std::int64_t>(locus->alleles.size());
    if (!locus->alleles.count(a)) ++types;
    if (!homozygote && !locus->alleles.count(b)) ++types;
    const std::int64_t na = count_of(a), nb = homozygote ? 0 : count_of(b);
    if (na + nb > *total)
      throw InvalidValue(at, "the counts of the profile's alleles at locus " + locus_key(e.locus) +
                                 " exceed the " + std::to_string(*total) + " alleles counted");
    e.posterior = allele_posterior(homozygote, na, nb, *total, types);
  }
}

std::string status_name(LocusEvaluation::Status status) {
  switch (status) {
    case LocusEvaluation::Status::used: return "used";
    case LocusEvaluation::Status::not_interpretable: return "not-interpretable";
    case LocusEvaluation::Status::differs: return "differs";
    case LocusEvaluation::Status::not_compared: return "not-compared";
    case LocusEvaluation::Status::sex_marker: return "sex-marker";
  }
  return "used";
}

}  // namespace

std::vector<std::string> standard_relationship_names() {
  std::vector<std::string> names;
  for (const auto& r : kRelationships) names.emplace_back(r.name);
  return names;
}

std::optional<IbdCoefficients> ibd_of_relationship(std::string_view name) {
  for (const auto& r : kRelationships)
    if (r.name == name) return r.ibd;
  return std::nullopt;
}

DnaSingleSourceModel::DnaSingleSourceModel(double theta, Relationship relationship,
                                           std::vector<LocusEvaluation> loci, std::vector<ModelNote> notes,
                                           json as_written, std::vector<DataFileUse> data_files)
    : theta_(theta),
      relationship_(std::move(relationship)),
      loci_(std::move(loci)),
      notes_(std::move(notes)),
      as_written_(std::move(as_written)),
      data_files_(std::move(data_files)) {
  for (const auto& e : loci_)
    if (e.status == LocusEvaluation::Status::used) log10_match_probability_ += e.log10_match_probability;
}

bool DnaSingleSourceModel::excluded() const {
  return std::any_of(loci_.begin(), loci_.end(),
                     [](const LocusEvaluation& e) { return e.status == LocusEvaluation::Status::differs; });
}

bool DnaSingleSourceModel::is_uncertain() const {
  if (excluded()) return false;
  bool any = false;
  for (const auto& e : loci_) {
    if (e.status != LocusEvaluation::Status::used) continue;
    if (!e.posterior) return false;
    any = true;
  }
  return any;
}

PointResult DnaSingleSourceModel::evaluate() const {
  PointResult result;
  const bool exclusion = excluded();
  json loci = json::array();
  json excluded_loci = json::array();
  for (const auto& e : loci_) {
    json row = {{"locus", e.locus}, {"genotype", e.genotype}, {"status", status_name(e.status)}};
    if (e.reference) row["reference_genotype"] = *e.reference;
    if (e.status == LocusEvaluation::Status::used) {
      row["zygosity"] = e.frequencies.homozygote ? "homozygote" : "heterozygote";
      json used = json::object(), listed = json::object();
      used[e.allele_a] = e.frequencies.p;
      listed[e.allele_a] = e.table_p ? json(*e.table_p) : json(nullptr);
      if (!e.frequencies.homozygote) {
        used[e.allele_b] = e.frequencies.q;
        listed[e.allele_b] = e.table_q ? json(*e.table_q) : json(nullptr);
      }
      row["frequencies_used"] = used;
      row["table_frequencies"] = listed;
      row["minimum_frequency_applied"] = e.floored_p || e.floored_q;
      if (e.minimum_frequency > 0.0) {
        row["minimum_frequency"] = e.minimum_frequency;
        row["minimum_frequency_rule"] = e.minimum_frequency_rule;
      }
      row["log10_match_probability"] = e.log10_match_probability;
      row["match_probability"] = std::pow(10.0, e.log10_match_probability);
      if (e.posterior) {
        json alpha = {e.posterior->alpha_a};
        if (!e.posterior->homozygote) alpha.push_back(e.posterior->alpha_b);
        alpha.push_back(e.posterior->alpha_rest);
        row["dirichlet_parameters"] = alpha;
      }
    }
    if (e.status != LocusEvaluation::Status::used)
      excluded_loci.push_back({{"locus", e.locus}, {"reason", status_name(e.status)}});
    loci.push_back(std::move(row));
  }
  result.detail = {{"theta", theta_},
                   {"relationship", {{"name", relationship_.name},
                                     {"ibd", {relationship_.ibd.k0, relationship_.ibd.k1, relationship_.ibd.k2}}}},
                   {"loci", std::move(loci)},
                   {"excluded_loci", std::move(excluded_loci)},
                   {"exclusion", exclusion},
                   {"sampling_interval", is_uncertain()}};
  result.notes = notes_;
  if (exclusion) {
    result.lr = numbers::LikelihoodRatio::zero();
    result.log10_p_given_hp = -std::numeric_limits<double>::infinity();
    result.detail["log10_match_probability"] = nullptr;
    return result;
  }
  result.detail["log10_match_probability"] = log10_match_probability_;
  result.log10_p_given_hp = 0.0;
  result.log10_p_given_hd = log10_match_probability_;
  result.lr = numbers::LikelihoodRatio::from_log10_probabilities(0.0, log10_match_probability_);
  return result;
}

void DnaSingleSourceModel::draw_log10_lr(std::mt19937_64& rng, std::span<double> out) const {
  if (!is_uncertain()) {
    EvidenceModel::draw_log10_lr(rng, out);
    return;
  }
  struct Sampled {
    const LocusEvaluation* locus;
    AlleleSampler sampler;
  };
  std::vector<Sampled> used;
  for (const auto& e : loci_)
    if (e.status == LocusEvaluation::Status::used) used.push_back({&e, AlleleSampler(*e.posterior)});
  for (double& value : out) {
    // Locus factors are multiplied in plain arithmetic; a factor below 1e-30, or a running
    // product below 1e-250, is moved into log10 first, so nothing can underflow.
    double log10_mp = 0.0, product = 1.0;
    for (Sampled& s : used) {
      LocusGenotype g;
      g.homozygote = s.locus->frequencies.homozygote;
      s.sampler(rng, g.p, g.q);
      // The same floor as the point value, so draws and point describe one method.
      g.p = std::max(g.p, s.locus->minimum_frequency);
      if (!g.homozygote) g.q = std::max(g.q, s.locus->minimum_frequency);
      const bool linear = g.p >= kLinearFrequencyFloor && (g.homozygote || g.q >= kLinearFrequencyFloor);
      const double factor = linear ? match_probability(g, theta_, relationship_.ibd) : 0.0;
      if (linear && factor >= 1e-30) {
        product *= factor;
        if (product < 1e-250) {
          log10_mp += std::log10(product);
          product = 1.0;
        }
      } else {
        log10_mp += log10_match_probability(g, theta_, relationship_.ibd);
      }
    }
    value = -(log10_mp + std::log10(product));
  }
}

std::string DnaSingleSourceModel::assumptions() const {
  std::string donor;
  for (const auto& r : kRelationships)
    if (r.name == relationship_.name) donor = std::string(r.words);
  if (donor.empty())
    donor = "a relative of the person of interest sharing 0, 1 or 2 alleles identical by descent with "
            "probabilities " + numbers::entered_for_readers(relationship_.ibd.k0) + ", " +
            numbers::entered_for_readers(relationship_.ibd.k1) + " and " + numbers::entered_for_readers(relationship_.ibd.k2);
  std::string text =
      "The LR assumes that, if Hp is true, the person of interest is the source of the questioned profile, "
      "so the matching profiles are certain; and that, if Hd is true, the source is " + donor +
      ", from the population represented by the frequency table";
  text += theta_ > 0.0 ? ", whose alleles share ancestry with those of the person of interest to the degree "
                         "measured by \u03b8 = " + numbers::entered_for_readers(theta_) + " (the Balding-Nichols model)"
                       : ", with no shared ancestry allowed for (\u03b8 = 0, the product rule)";
  text += ". It further assumes that the questioned profile comes from a single person and shows every allele "
          "of that person at the loci used (no drop-out, no drop-in); that genotypes at different loci are "
          "independent; that the frequency table describes the population of alternative donors; and that "
          "alleles rarer than the minimum allele frequency are given that frequency. Loci marked not "
          "interpretable and the sex marker Amelogenin are not used.";
  return text;
}

EvidenceModelPtr read_dna_single_source_model(const json& item, const ReadContext& context) {
  const Location& where = context.where;
  check_model_members(item,
                      {"theta", "relationship", "profile", "reference_profile", "uninterpretable_loci",
                       "min_allele_frequency", "frequencies"},
                      where);
  const double theta = reading::read_number(reading::require_member(item, "theta", where),
                                                where.with_field("theta"));
  if (!(theta >= 0.0 && theta < 1.0))
    throw InvalidValue(where.with_field("theta"), "theta " + exact_text(theta) + " is outside [0, 1)");
  const Relationship relationship = read_relationship(item, where);
  const MinimumFrequencyRule rule = read_minimum_frequency_rule(item, where);

  const Location profile_at = where.with_field("profile");
  const Profile profile = read_profile(reading::require_member(item, "profile", where), profile_at);
  if (profile.loci.empty()) throw InvalidValue(profile_at, "the profile lists no loci");
  std::optional<Profile> reference;
  if (const json* member = reading::find_member(item, "reference_profile"))
    reference = read_profile(*member, where.with_field("reference_profile"));

  std::set<std::string> uninterpretable;
  if (const json* member = reading::find_member(item, "uninterpretable_loci")) {
    const Location at = where.with_field("uninterpretable_loci");
    const auto names = reading::read_string_array(*member, at);
    for (std::size_t i = 0; i < names.size(); ++i) {
      const Location name_at{at.item, at.field + "[" + std::to_string(i) + "]"};
      const std::string key = locus_key(names[i]);
      if (!profile.index.count(key)) throw InvalidValue(name_at, "locus " + names[i] + " is not in the profile");
      if (!uninterpretable.insert(key).second) throw InvalidValue(name_at, "locus " + names[i] + " is listed twice");
    }
  }

  const FrequencyTable table =
      read_frequency_table(reading::require_member(item, "frequencies", where), context);
  // The LR compares the questioned profile with the person of interest's: without that profile
  // nothing is compared, and a match probability alone is no LR (it would assume the match).
  if (!reference || reference->loci.empty())
    throw InvalidValue(where.with_field("reference_profile"),
                       "no reference profile is given, so no locus is compared and there is no LR: enter the "
                       "person of interest's genotype at each locus of the questioned profile");

  std::vector<ModelNote> notes = table.warnings();
  std::vector<LocusEvaluation> loci;
  std::vector<std::string> nonstandard, not_compared, floored, differs, not_interpretable, no_counts;
  bool amelogenin_differs = false, amelogenin_seen = false;
  for (const auto& [name, genotype] : profile.loci) {
    const Location at = profile_at.with_field(name);
    LocusEvaluation e;
    e.locus = name;
    e.genotype = genotype;
    const std::string key = locus_key(name);
    if (reference) {
      auto it = reference->index.find(key);
      if (it != reference->index.end()) e.reference = reference->loci[it->second].second;
    }
    if (!canonical_locus_name(name)) nonstandard.push_back(name);
    if (is_amelogenin(name)) {
      e.status = LocusEvaluation::Status::sex_marker;
      amelogenin_seen = true;
      amelogenin_differs = e.reference && as_pair(*e.reference) != as_pair(genotype);
    } else if (uninterpretable.count(key)) {
      e.status = LocusEvaluation::Status::not_interpretable;
      not_interpretable.push_back(name);
    } else if (reference && !e.reference) {
      e.status = LocusEvaluation::Status::not_compared;
      not_compared.push_back(name);
    } else {
      if (e.reference && as_pair(*e.reference) != as_pair(genotype)) {
        // An exclusion needs no frequencies: the locus may even be absent from the table.
        e.status = LocusEvaluation::Status::differs;
        differs.push_back(name + " (" + genotype_text(genotype) + " against " + genotype_text(*e.reference) + ")");
        loci.push_back(std::move(e));
        continue;
      }
      evaluate_locus(e, table, rule, theta, relationship.ibd, at);
      if (e.floored_p || e.floored_q) {
        std::string alleles = e.floored_p ? e.allele_a : "";
        if (e.floored_q) alleles += (alleles.empty() ? "" : ", ") + e.allele_b;
        floored.push_back(name + " (allele " + alleles + ": " + significant_text(e.minimum_frequency, 6) + ", " +
                          e.minimum_frequency_rule + ")");
      }
      if (e.status == LocusEvaluation::Status::used && !e.posterior) no_counts.push_back(name);
    }
    loci.push_back(std::move(e));
  }

  // A reference typed at none of the questioned profile's interpretable STR loci compares
  // nothing either.
  const bool compared_any = std::any_of(loci.begin(), loci.end(), [](const LocusEvaluation& e) {
    return e.status == LocusEvaluation::Status::used || e.status == LocusEvaluation::Status::differs;
  });
  if (!compared_any && !not_compared.empty())
    throw InvalidValue(where.with_field("reference_profile"),
                       "the reference profile has no genotype at " + list_text(not_compared) +
                           ", so no locus is compared and there is no LR: enter the person of interest's genotype "
                           "at those loci");
  if (!differs.empty())
    notes.push_back({"exclusion", "the questioned and reference profiles differ at " + list_text(differs) +
                                      "; the findings exclude the person of interest (LR = 0)"});
  if (!not_interpretable.empty())
    notes.push_back({"not-interpretable", "loci marked not interpretable and not used: " + list_text(not_interpretable)});
  if (!not_compared.empty())
    notes.push_back({"locus-not-compared", "loci typed in the questioned profile but not in the reference "
                                           "profile are not used: " + list_text(not_compared)});
  if (!floored.empty())
    notes.push_back({"minimum-allele-frequency", "the minimum allele frequency was used at " + list_text(floored)});
  if (!nonstandard.empty())
    notes.push_back({"nonstandard-locus", "the profile names loci that are not standard STR locus names (check "
                                          "the spelling): " + list_text(nonstandard)});
  if (amelogenin_seen)
    notes.push_back({"amelogenin-not-used",
                     amelogenin_differs
                         ? "Amelogenin differs between the profiles; it is a sex marker, not used in the match "
                           "probability, and a difference there does not by itself exclude (check the typing)"
                         : "Amelogenin is a sex marker and is not used in the match probability"});
  if (!no_counts.empty() && differs.empty())
    notes.push_back({"no-sampling-interval", "no allele counts at " + list_text(no_counts) +
                                                 " (frequencies without a database size, or frequency x 2N not a "
                                                 "whole number), so the LR has no sampling interval"});

  json as_written = json::object();
  for (auto key : kModelFields)
    if (const json* member = reading::find_member(item, key)) as_written[std::string(key)] = *member;
  std::vector<DataFileUse> data_files;
  if (table.source_file()) data_files.push_back(*table.source_file());
  return std::make_shared<DnaSingleSourceModel>(theta, relationship, std::move(loci), std::move(notes),
                                                std::move(as_written), std::move(data_files));
}

std::vector<EvidenceModelPtr> read_dna_single_source_alternatives(const json& item,
                                                                  std::span<const std::string> alternative_ids,
                                                                  const ReadContext& context) {
  return read_per_alternative(item, alternative_ids, {"relationship"}, &read_dna_single_source_model, context);
}

}  // namespace counterpoise::models::dna
