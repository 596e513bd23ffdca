#include "core/models/dna_mixture/dna_mixture_model.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <set>

#include "core/models/dna/allele_frequencies.hpp"
#include "core/models/dna/minimum_frequency.hpp"
#include "core/models/dna/str_loci.hpp"
#include "core/models/dna/str_profile.hpp"
#include "core/models/dna_mixture/unknown_genotypes.hpp"
#include "core/models/item_fields.hpp"
#include "core/numbers/log10_math.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/json_fields.hpp"
#include "core/validation/checks.hpp"
#include "core/validation/word_list.hpp"

namespace counterpoise::models::dna_mixture {

using nlohmann::json;
using numbers::exact_text;
using numbers::significant_text;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr double kMinusInfinity = -std::numeric_limits<double>::infinity();
constexpr std::size_t kLeadingSets = 6;
// A table that lists every allele sums to 1 only up to rounding; within this distance of 1 the
// observed and reference alleles are taken to be all the alleles there are (no class Q).
constexpr double kSumRounding = 1e-12;

constexpr std::string_view kModelFields[] = {"theta", "observed", "uncertain", "references", "hp", "hd", "dropout",
                                             "dropout_homozygote", "dropout_by_contributor", "dropin",
                                             "min_allele_frequency", "frequencies"};

std::string side_name(Side side) { return side == Side::hp ? "Hp" : "Hd"; }

std::string list_text(const std::vector<std::string>& names) {
  std::string text;
  for (const auto& name : names) text += (text.empty() ? "" : ", ") + name;
  return text;
}

double log10_of(double p) { return p > 0.0 ? std::log10(p) : kMinusInfinity; }

// log10 LR from the two log10 probabilities; nullopt when both are zero.
std::optional<double> log10_ratio(double log10_hp, double log10_hd) {
  if (log10_hp == kMinusInfinity && log10_hd == kMinusInfinity) return std::nullopt;
  if (log10_hd == kMinusInfinity) return std::numeric_limits<double>::infinity();
  return log10_hp - log10_hd;
}

// The observed alleles at one locus: distinct non-empty strings (an empty list is a locus where
// everything dropped out).
std::vector<std::string> read_observed_alleles(const json& value, const Location& at) {
  std::vector<std::string> alleles = dna::read_allele_list(value, at, "an array of the alleles observed");
  std::set<std::string> seen;
  for (std::size_t i = 0; i < alleles.size(); ++i)
    if (!seen.insert(alleles[i]).second)
      throw InvalidValue(Location{at.item, at.field + "[" + std::to_string(i) + "]"},
                         "allele " + alleles[i] + " is listed twice");
  return alleles;
}

MixtureProposition read_proposition(const json& item, const std::string& key, const std::map<std::string, dna::Profile>& references,
                                    const Location& where) {
  const Location at = where.with_field(key);
  const json& value = reading::require_member(item, key, where);
  reading::require_object(value, at);
  reading::check_known_members(value, {"contributors", "unknowns", "number_of_contributors"}, at);
  MixtureProposition proposition;
  if (const json* names = reading::find_member(value, "contributors")) {
    const Location names_at = at.with_field("contributors");
    proposition.contributors = reading::read_string_array(*names, names_at);
    for (std::size_t i = 0; i < proposition.contributors.size(); ++i) {
      const Location name_at{names_at.item, names_at.field + "[" + std::to_string(i) + "]"};
      const std::string& name = proposition.contributors[i];
      if (!references.count(name))
        throw InvalidValue(name_at, "contributor '" + name + "' has no reference profile in references");
      if (std::count(proposition.contributors.begin(), proposition.contributors.end(), name) > 1)
        throw InvalidValue(name_at, "contributor '" + name + "' is named twice");
    }
  }
  const Location unknowns_at = at.with_field("unknowns");
  const std::int64_t unknowns = reading::read_count(reading::require_member(value, "unknowns", at), unknowns_at);
  if (unknowns > kMaxContributors)
    throw InvalidValue(unknowns_at, std::to_string(unknowns) + " unknown contributors; at most " +
                                        std::to_string(kMaxContributors) + " contributors are supported");
  proposition.unknowns = static_cast<int>(unknowns);
  const int total = proposition.total();
  if (total < 1) throw InvalidValue(at, side_name(key == "hp" ? Side::hp : Side::hd) + " has no contributors");
  if (total > kMaxContributors)
    throw InvalidValue(at, std::to_string(proposition.contributors.size()) + " named and " + std::to_string(unknowns) +
                               " unknown contributors make " + std::to_string(total) + "; at most " +
                               std::to_string(kMaxContributors) + " are supported");
  if (const json* stated = reading::find_member(value, "number_of_contributors")) {
    const Location stated_at = at.with_field("number_of_contributors");
    const std::int64_t n = reading::read_count(*stated, stated_at);
    if (n != total)
      throw InvalidValue(stated_at, "number_of_contributors is " + std::to_string(n) + " but " +
                                        std::to_string(proposition.contributors.size()) + " named (" +
                                        list_text(proposition.contributors) + ") and " + std::to_string(unknowns) +
                                        " unknown contributors make " + std::to_string(total));
  }
  return proposition;
}

// The classes of one locus: observed alleles, the named people's unobserved alleles, then Q.
LocusClasses build_classes(const std::string& locus_name, const std::vector<std::string>& observed,
                           const std::vector<std::string>& uncertain,
                           const std::vector<std::pair<std::string, std::vector<std::string>>>& references,
                           const dna::LocusFrequencies& table, const dna::LocusFloor& floor,
                           const Location& observed_at, const Location& uncertain_at,
                           const Location& references_at, const Location& frequencies_at) {
  LocusClasses locus;
  enum class Seen { yes, uncertain, no };
  auto add_class = [&](const std::string& allele, Seen seen, const Location& at) {
    const dna::FlooredFrequency f = dna::floored_frequency(table, allele, floor, locus_name, at);
    AlleleClass c;
    c.allele = allele;
    c.frequency = f.value;
    c.listed = f.listed;
    c.floored = f.floored;
    c.observed = seen == Seen::yes;
    c.uncertain = seen == Seen::uncertain;
    locus.classes.push_back(std::move(c));
  };
  for (const auto& allele : observed) add_class(allele, Seen::yes, observed_at);
  for (const auto& allele : uncertain) add_class(allele, Seen::uncertain, uncertain_at);
  for (const auto& [name, genotype] : references) {
    const auto [a, b] = dna::as_pair(genotype);
    for (const std::string& allele : {a, b}) {
      int index = locus.index_of(allele);
      if (index < 0) {
        add_class(allele, Seen::no, references_at.with_field(name).with_field(locus_name));
        index = static_cast<int>(locus.classes.size()) - 1;
      }
      ++locus.classes[index].conditioning_copies;
    }
  }
  double sum = 0.0;
  for (const auto& c : locus.classes) sum += c.frequency;
  if (sum > 1.0 + kSumRounding)
    throw InvalidValue(frequencies_at, "at locus " + locus_name + " the frequencies of the observed, uncertain and "
                                       "reference alleles sum to " + significant_text(sum, 6) + ", more than 1");
  if (1.0 - sum > kSumRounding) {
    AlleleClass other;
    other.allele = kOtherAlleles;
    other.frequency = 1.0 - sum;
    other.other = true;
    locus.classes.push_back(std::move(other));
  }
  return locus;
}

ClassGenotype class_genotype(const LocusClasses& classes, const std::vector<std::string>& genotype) {
  const auto [a, b] = dna::as_pair(genotype);
  int i = classes.index_of(a), j = classes.index_of(b);
  if (i > j) std::swap(i, j);
  return {i, j};
}

LocusContributors contributors_at(const MixtureSettings& settings, const MixtureProposition& proposition,
                                  const LocusClasses& classes,
                                  const std::vector<std::pair<std::string, std::vector<std::string>>>& references) {
  LocusContributors contributors;
  contributors.unknowns = proposition.unknowns;
  for (const auto& name : proposition.contributors)
    for (const auto& [person, genotype] : references)
      if (person == name) contributors.known.push_back({class_genotype(classes, genotype), settings.dropout_group(name)});
  return contributors;
}

std::string genotype_text(const LocusClasses& classes, const ClassGenotype& g) {
  return classes.classes[g.first].allele + "," + classes.classes[g.second].allele;
}

// Every unordered set of unknown genotypes with its genotype and observation probabilities.
void for_each_term(const LocusClasses& classes, const LocusContributors& contributors, double theta, double dropin,
                   const Dropout& dropout,
                   const std::function<void(std::span<const ClassGenotype>, double genotypes, double observation)>& visit) {
  std::vector<TypedContributor> everyone;
  for_each_unknown_genotype_set(classes, contributors.unknowns, theta,
                                [&](std::span<const ClassGenotype> unknowns, double probability) {
    everyone = contributors.known;
    for (const auto& g : unknowns) everyone.push_back({g, kSharedDropout});
    visit(unknowns, probability, observation_probability(classes, everyone, dropin, dropout));
  });
}

// The unordered sets of unknown genotypes with the largest shares of the locus probability.
std::vector<GenotypeSetShare> leading_sets(const LocusClasses& classes, const LocusContributors& contributors,
                                           double theta, double dropin, const Dropout& dropout) {
  struct Candidate {
    double probability;
    std::vector<ClassGenotype> genotypes;
  };
  std::vector<Candidate> best;
  double total = 0.0;
  for_each_term(classes, contributors, theta, dropin, dropout,
                [&](std::span<const ClassGenotype> unknowns, double genotypes, double observation) {
    const double p = genotypes * observation;
    if (p <= 0.0) return;
    total += p;
    if (best.size() == kLeadingSets && p <= best.back().probability) return;
    best.push_back({p, std::vector<ClassGenotype>(unknowns.begin(), unknowns.end())});
    std::sort(best.begin(), best.end(), [](const Candidate& x, const Candidate& y) { return x.probability > y.probability; });
    if (best.size() > kLeadingSets) best.pop_back();
  });
  std::vector<GenotypeSetShare> shares;
  for (const auto& candidate : best) {
    GenotypeSetShare share;
    for (const auto& g : candidate.genotypes) share.genotypes.push_back(genotype_text(classes, g));
    share.share = candidate.probability / total;
    shares.push_back(std::move(share));
  }
  return shares;
}

// Every rate, with the shared d at `d` and the own rates as stated.
Dropout dropout_with(const MixtureSettings& settings, double d) {
  Dropout dropout{d, settings.dropout_homozygote, {}};
  for (const auto& [person, rate] : settings.own_dropout) dropout.own.push_back(rate);
  return dropout;
}

// dropout_by_contributor: {name: d} or {name: {"dropout": d, "dropout_homozygote": d2}}, for
// people who are contributors under at least one proposition. An own rate is a number: only the
// shared d may be a distribution (one integral over one d).
std::map<std::string, DropoutRate> read_own_dropout(const json& item, const MixtureSettings& settings,
                                                    const Location& where) {
  std::map<std::string, DropoutRate> rates;
  const json* member = reading::find_member(item, "dropout_by_contributor");
  if (!member) return rates;
  const Location at = where.with_field("dropout_by_contributor");
  reading::require_object(*member, at);
  for (auto it = member->begin(); it != member->end(); ++it) {
    const std::string& person = it.key();
    const Location person_at = at.with_field(person);
    const auto named = [&person](const MixtureProposition& p) {
      return std::find(p.contributors.begin(), p.contributors.end(), person) != p.contributors.end();
    };
    if (!named(settings.hp) && !named(settings.hd))
      throw InvalidValue(person_at, "'" + person + "' is a contributor under neither proposition, so has no drop-out "
                                    "probability; unknown contributors follow dropout");
    DropoutRate rate;
    if (it.value().is_object() && !it.value().contains("dropout"))
      throw InvalidValue(person_at, "a person's own drop-out probability is a number or {\"dropout\": d, "
                                    "\"dropout_homozygote\": d2}; only the shared dropout may be a distribution");
    if (it.value().is_object()) {
      reading::check_known_members(it.value(), {"dropout", "dropout_homozygote"}, person_at);
      const Location d_at = person_at.with_field("dropout");
      const json& d = reading::require_member(it.value(), "dropout", person_at);
      if (!d.is_number())
        throw InvalidValue(d_at, "a person's own drop-out probability must be a number; only the shared dropout may "
                                 "be a distribution");
      rate.d = validation::check_probability(d_at, reading::read_number(d, d_at));
      if (auto d2 = reading::read_optional_number(it.value(), "dropout_homozygote", person_at))
        rate.homozygote = validation::check_probability(person_at.with_field("dropout_homozygote"), *d2);
    } else if (it.value().is_number()) {
      rate.d = validation::check_probability(person_at, reading::read_number(it.value(), person_at));
    } else {
      throw InvalidValue(person_at, "a person's own drop-out probability must be a number (or {\"dropout\": d, "
                                    "\"dropout_homozygote\": d2}); only the shared dropout may be a distribution");
    }
    rates.emplace(person, rate);
  }
  return rates;
}

// uncertain: {locus: [alleles]}, keyed by locus name as `observed` is.
std::map<std::string, std::pair<std::string, json>> read_uncertain_loci(const json& item, const Location& where) {
  std::map<std::string, std::pair<std::string, json>> loci;  // locus key: name as written, alleles
  const json* member = reading::find_member(item, "uncertain");
  if (!member) return loci;
  const Location at = where.with_field("uncertain");
  reading::require_object(*member, at);
  for (auto it = member->begin(); it != member->end(); ++it)
    if (!loci.emplace(dna::locus_key(it.key()), std::pair{it.key(), it.value()}).second)
      throw InvalidValue(at.with_field(it.key()), "locus " + dna::locus_key(it.key()) + " is given twice");
  return loci;
}

json probability_json(double log10_p) {
  return log10_p == kMinusInfinity ? json(nullptr) : json(log10_p);
}

json lr_json(const std::optional<double>& log10_lr) {
  if (!log10_lr) return {{"state", "undefined"}};
  if (*log10_lr == kMinusInfinity) return {{"state", "zero"}};
  if (*log10_lr == std::numeric_limits<double>::infinity()) return {{"state", "infinite"}};
  return {{"state", "finite"}, {"log10_lr", *log10_lr}};
}

json proposition_json(const MixtureProposition& p) {
  return {{"contributors", p.contributors}, {"unknowns", p.unknowns}, {"number_of_contributors", p.total()}};
}

json shares_json(const std::vector<GenotypeSetShare>& shares) {
  json rows = json::array();
  for (const auto& s : shares) rows.push_back({{"unknown_genotypes", s.genotypes}, {"share", s.share}});
  return rows;
}

}  // namespace

DnaMixtureModel::DnaMixtureModel(MixtureSettings settings, std::vector<MixtureLocus> loci, std::vector<ModelNote> notes,
                                 json as_written, std::vector<DataFileUse> data_files)
    : settings_(std::move(settings)),
      loci_(std::move(loci)),
      notes_(std::move(notes)),
      as_written_(std::move(as_written)),
      data_files_(std::move(data_files)) {
  log10_p_hp_ = log10_expected_likelihood(settings_.dropout, [this](double d) { return log10_probability(Side::hp, d); });
  log10_p_hd_ = log10_expected_likelihood(settings_.dropout, [this](double d) { return log10_probability(Side::hd, d); });
  curve_ = dropout_curve([this](double d) { return log10_lr_at(d); }, kDropoutCurvePoints);
}

int MixtureSettings::dropout_group(const std::string& person) const {
  const auto it = own_dropout.find(person);
  return it == own_dropout.end() ? kSharedDropout : 1 + static_cast<int>(std::distance(own_dropout.begin(), it));
}

double DnaMixtureModel::point_dropout() const { return probability::mean(settings_.dropout); }

Dropout DnaMixtureModel::dropout_at(double d) const { return dropout_with(settings_, d); }

std::vector<GenotypeSetTerm> DnaMixtureModel::genotype_set_terms(std::size_t locus, Side side, double d) const {
  const MixtureLocus& l = loci_.at(locus);
  std::vector<GenotypeSetTerm> terms;
  for_each_term(l.classes, side == Side::hp ? l.contributors_hp : l.contributors_hd, settings_.theta, settings_.dropin,
                dropout_at(d), [&](std::span<const ClassGenotype> unknowns, double genotypes, double observation) {
    if (genotypes * observation <= 0.0) return;
    GenotypeSetTerm term;
    for (const auto& g : unknowns) term.genotypes.push_back(genotype_text(l.classes, g));
    term.genotype_probability = genotypes;
    term.observation_probability = observation;
    terms.push_back(std::move(term));
  });
  return terms;
}

double DnaMixtureModel::log10_probability(Side side, double d) const {
  const Dropout dropout = dropout_at(d);
  double sum = 0.0;
  for (const auto& locus : loci_) {
    const double p = (side == Side::hp ? locus.hp : locus.hd).probability(dropout);
    if (p <= 0.0) return kMinusInfinity;
    sum += std::log10(p);
  }
  return sum;
}

std::optional<double> DnaMixtureModel::log10_lr_at(double d) const {
  return log10_ratio(log10_probability(Side::hp, d), log10_probability(Side::hd, d));
}

PointResult DnaMixtureModel::evaluate() const {
  PointResult result;
  const double d = point_dropout();
  const Dropout dropout = dropout_at(d);
  json loci = json::array();
  for (const auto& locus : loci_) {
    json classes = json::array();
    for (const auto& c : locus.classes.classes) {
      json row = {{"allele", c.allele}, {"frequency", c.frequency}, {"observed", c.observed}, {"uncertain", c.uncertain},
                  {"other_alleles", c.other}, {"conditioning_copies", c.conditioning_copies}};
      if (!c.other) row["table_frequency"] = c.listed ? json(*c.listed) : json(nullptr);
      if (!c.other) row["minimum_frequency_applied"] = c.floored;
      classes.push_back(std::move(row));
    }
    json references = json::object();
    for (const auto& [name, genotype] : locus.references) references[name] = genotype;
    const double log10_hp = log10_of(locus.hp.probability(dropout));
    const double log10_hd = log10_of(locus.hd.probability(dropout));
    json row = {{"locus", locus.locus},
                {"observed", locus.observed},
                {"uncertain", locus.uncertain},
                {"references", references},
                {"classes", classes},
                {"hp", {{"genotype_sets", locus.hp.genotype_sets()}, {"log10_probability", probability_json(log10_hp)},
                        {"leading_genotype_sets", shares_json(locus.leading_hp)}}},
                {"hd", {{"genotype_sets", locus.hd.genotype_sets()}, {"log10_probability", probability_json(log10_hd)},
                        {"leading_genotype_sets", shares_json(locus.leading_hd)}}},
                {"lr", lr_json(log10_ratio(log10_hp, log10_hd))}};
    if (locus.minimum_frequency > 0.0) {
      row["minimum_frequency"] = locus.minimum_frequency;
      row["minimum_frequency_rule"] = locus.minimum_frequency_rule;
    }
    loci.push_back(std::move(row));
  }
  json curve = json::array();
  for (const auto& point : curve_.points) curve.push_back({{"dropout", point.d}, {"lr", lr_json(point.log10_lr)}});
  const bool integrated = probability::is_uncertain(settings_.dropout);
  json own = json::object();
  for (const auto& [person, rate] : settings_.own_dropout)
    own[person] = {{"dropout", rate.d}, {"homozygote", rate.homozygote ? json(*rate.homozygote) : json("d^2")}};
  result.detail = {
      {"theta", settings_.theta},
      {"dropin", settings_.dropin},
      {"dropout", {{"assignment", probability::describe(settings_.dropout)},
                   {"integrated", integrated},
                   {"point", d},
                   {"homozygote", settings_.dropout_homozygote ? json(*settings_.dropout_homozygote) : json("d^2")},
                   {"by_contributor", std::move(own)}}},
      {"hp", proposition_json(settings_.hp)},
      {"hd", proposition_json(settings_.hd)},
      {"loci", std::move(loci)},
      {"lr_at_point_dropout", lr_json(log10_lr_at(d))},
      {"dropout_curve", {{"points", std::move(curve)},
                         {"minimum", {{"dropout", curve_.minimum.d}, {"lr", lr_json(curve_.minimum.log10_lr)}}}}}};
  result.notes = notes_;
  result.log10_p_given_hp = log10_p_hp_;
  result.log10_p_given_hd = log10_p_hd_;
  result.lr = numbers::LikelihoodRatio::from_log10_probabilities(log10_p_hp_, log10_p_hd_);
  return result;
}

std::string DnaMixtureModel::assumptions() const {
  // "A, B and 1 unknown person".
  auto people = [](const MixtureProposition& p) {
    std::vector<std::string> parts = p.contributors;
    if (p.unknowns > 0)
      parts.push_back(std::to_string(p.unknowns) + " unknown " + (p.unknowns == 1 ? "person" : "people"));
    return validation::list_in_words(parts);
  };
  const bool integrated = probability::is_uncertain(settings_.dropout);
  std::string text = "The LR assumes that, if Hp is true, the questioned profile comes from " + people(settings_.hp) +
                     ", and that, if Hd is true, it comes from " + people(settings_.hd) +
                     "; unknown contributors are unrelated to the named people and come from the population "
                     "represented by the frequency table";
  text += settings_.theta > 0.0 ? ", with shared ancestry allowed for by \u03b8 = " + numbers::entered_for_readers(settings_.theta) +
                                      " (the Balding-Nichols sampling formula, conditioned on the named people's alleles)"
                                : ", with no shared ancestry allowed for (\u03b8 = 0, the product rule)";
  text += std::string(". Each allele copy of a contributor drops out independently with ") +
          (settings_.own_dropout.empty() ? "the same probability d" : "probability d") +
          " (a homozygous contributor's allele with " +
          (settings_.dropout_homozygote ? numbers::entered_for_readers(*settings_.dropout_homozygote) : std::string("d squared")) + ")";
  for (const auto& [person, rate] : settings_.own_dropout)
    text += ", except " + person + "'s, which drop out with probability " + numbers::entered_for_readers(rate.d) + " (a homozygote's with " +
            (rate.homozygote ? numbers::entered_for_readers(*rate.homozygote) : numbers::entered_for_readers(rate.d) + " squared") + ")";
  text += std::string(", d being ") +
          (integrated ? "uncertain and described by " + probability::describe(settings_.dropout) +
                            ", over which the probabilities of the findings are averaged"
                      : numbers::entered_for_readers(probability::mean(settings_.dropout))) +
          "; an allele no contributor carries appears by drop-in with probability " + numbers::entered_for_readers(settings_.dropin) +
          " times its frequency per locus.";
  const bool any_uncertain =
      std::any_of(loci_.begin(), loci_.end(), [](const MixtureLocus& l) { return !l.uncertain.empty(); });
  if (any_uncertain)
    text += " Alleles marked uncertain (below the threshold) are taken as neither seen nor missing: they need no "
            "drop-in, and a contributor carrying one needs no drop-out.";
  text += " Peak heights are not used; loci are independent; alleles rarer than the minimum allele frequency are "
          "given that frequency; the sex marker Amelogenin is not used.";
  return text;
}

EvidenceModelPtr read_dna_mixture_model(const json& item, const ReadContext& context) {
  const Location& where = context.where;
  check_model_members(item,
                      {"theta", "observed", "uncertain", "references", "hp", "hd", "dropout", "dropout_homozygote",
                       "dropout_by_contributor", "dropin", "min_allele_frequency", "frequencies"},
                      where);
  MixtureSettings settings;
  settings.theta = reading::read_number(reading::require_member(item, "theta", where), where.with_field("theta"));
  if (!(settings.theta >= 0.0 && settings.theta < 1.0))
    throw InvalidValue(where.with_field("theta"), "theta " + exact_text(settings.theta) + " is outside [0, 1)");

  const Location references_at = where.with_field("references");
  std::map<std::string, dna::Profile> references;
  if (const json* member = reading::find_member(item, "references")) {
    reading::require_object(*member, references_at);
    for (auto it = member->begin(); it != member->end(); ++it) {
      if (it.key().empty()) throw InvalidValue(references_at, "a reference profile needs a non-empty name");
      references.emplace(it.key(), dna::read_profile(it.value(), references_at.with_field(it.key())));
    }
  }
  settings.hp = read_proposition(item, "hp", references, where);
  settings.hd = read_proposition(item, "hd", references, where);

  settings.dropout = probability::read_assignment(reading::require_member(item, "dropout", where),
                                                  where.with_field("dropout"));
  settings.own_dropout = read_own_dropout(item, settings, where);
  if (auto d2 = reading::read_optional_number(item, "dropout_homozygote", where))
    settings.dropout_homozygote = validation::check_probability(where.with_field("dropout_homozygote"), *d2);
  settings.dropin = validation::check_probability(
      where.with_field("dropin"),
      reading::read_number(reading::require_member(item, "dropin", where), where.with_field("dropin")));

  const dna::MinimumFrequencyRule rule = dna::read_minimum_frequency_rule(item, where);
  const Location observed_at = where.with_field("observed");
  const json& observed = reading::require_member(item, "observed", where);
  reading::require_object(observed, observed_at);
  if (observed.empty()) throw InvalidValue(observed_at, "the observed profile lists no loci");
  const dna::FrequencyTable table =
      dna::read_frequency_table(reading::require_member(item, "frequencies", where), context);

  const Location uncertain_at = where.with_field("uncertain");
  auto uncertain_loci = read_uncertain_loci(item, where);
  std::vector<ModelNote> notes = table.warnings();
  std::vector<MixtureLocus> loci;
  std::set<std::string> keys;
  std::vector<std::string> floored, nonstandard;
  bool amelogenin = false;
  for (auto it = observed.begin(); it != observed.end(); ++it) {
    const std::string& name = it.key();
    const Location locus_at = observed_at.with_field(name);
    const std::string key = dna::locus_key(name);
    if (!keys.insert(key).second) throw InvalidValue(locus_at, "locus " + key + " is given twice");
    const std::vector<std::string> alleles = read_observed_alleles(it.value(), locus_at);
    std::vector<std::string> uncertain;
    if (const auto found = uncertain_loci.find(key); found != uncertain_loci.end()) {
      const Location marked_at = uncertain_at.with_field(found->second.first);
      uncertain = read_observed_alleles(found->second.second, marked_at);
      for (std::size_t i = 0; i < uncertain.size(); ++i)
        if (std::find(alleles.begin(), alleles.end(), uncertain[i]) != alleles.end())
          throw InvalidValue(Location{marked_at.item, marked_at.field + "[" + std::to_string(i) + "]"},
                             "allele " + uncertain[i] + " is listed both as observed and as uncertain at locus " + key);
      uncertain_loci.erase(found);
    }
    if (dna::is_amelogenin(name)) {
      amelogenin = true;
      continue;
    }
    if (!dna::canonical_locus_name(name)) nonstandard.push_back(name);
    std::vector<std::pair<std::string, std::vector<std::string>>> locus_references;
    for (const auto& [person, profile] : references) {
      const auto* genotype = profile.find(name);
      if (!genotype)
        throw InvalidValue(references_at.with_field(person),
                           "the reference profile of " + person + " has no locus " + key +
                               ", which the observed profile shows; every named person must be typed at every "
                               "locus used");
      locus_references.emplace_back(person, *genotype);
    }
    if (settings.dropin == 0.0) {
      for (const auto* side : {&settings.hp, &settings.hd}) {
        const int carry = 2 * side->total();
        // Named at the proposition, whose contributors are too few (in a case with several
        // alternatives, at the alternative's entry).
        if (static_cast<int>(alleles.size()) > carry)
          throw InvalidValue(where.with_field(side == &settings.hp ? "hp" : "hd"), "locus " + key + " shows " + std::to_string(alleles.size()) + " alleles, more than the " +
                                           std::to_string(carry) + " that the " + std::to_string(side->total()) +
                                           " contributors under " + side_name(side == &settings.hp ? Side::hp : Side::hd) +
                                           " can carry, and dropin is 0 (no drop-in)");
      }
    }
    const dna::LocusFrequencies* frequencies = table.find(name);
    if (!frequencies) throw InvalidValue(locus_at, "locus " + key + " is not in the frequency table");
    const dna::LocusFloor floor = dna::locus_floor(*frequencies, rule, name, where);
    LocusClasses classes = build_classes(name, alleles, uncertain, locus_references, *frequencies, floor, locus_at,
                                         uncertain_at.with_field(name), references_at, where.with_field("frequencies"));
    std::vector<std::string> floored_here;
    for (const auto& c : classes.classes)
      if (c.floored) floored_here.push_back(c.allele);
    if (!floored_here.empty())
      floored.push_back(name + " (allele " + list_text(floored_here) + ": " + significant_text(floor.value, 6) + ", " +
                        floor.rule_text + ")");
    const LocusContributors hp = contributors_at(settings, settings.hp, classes, locus_references);
    const LocusContributors hd = contributors_at(settings, settings.hd, classes, locus_references);
    const Dropout point = dropout_with(settings, probability::mean(settings.dropout));
    MixtureLocus locus{name,
                       alleles,
                       uncertain,
                       locus_references,
                       classes,
                       floor.value,
                       floor.rule_text,
                       LocusLikelihood(classes, hp, settings.theta, settings.dropin),
                       LocusLikelihood(classes, hd, settings.theta, settings.dropin),
                       leading_sets(classes, hp, settings.theta, settings.dropin, point),
                       leading_sets(classes, hd, settings.theta, settings.dropin, point),
                       hp,
                       hd};
    loci.push_back(std::move(locus));
  }
  if (loci.empty()) throw InvalidValue(observed_at, "the observed profile has no locus besides Amelogenin");
  if (!uncertain_loci.empty()) {
    const auto& [key, written] = *uncertain_loci.begin();
    throw InvalidValue(uncertain_at.with_field(written.first),
                       "locus " + key + " has uncertain alleles but is not in the observed profile (list it there, "
                       "with [] if no allele was seen above the threshold)");
  }

  if (!floored.empty())
    notes.push_back({"minimum-allele-frequency", "the minimum allele frequency was used at " + list_text(floored)});
  if (!nonstandard.empty())
    notes.push_back({"nonstandard-locus", "the observed profile names loci that are not standard STR locus names "
                                          "(check the spelling): " + list_text(nonstandard)});
  if (amelogenin) notes.push_back({"amelogenin-not-used", "Amelogenin is a sex marker and is not used"});
  std::vector<std::string> conditioning_only;
  for (const auto& [person_binding, profile] : references) {
    const std::string& person = person_binding;  // a lambda may not capture a structured binding before C++20 in clang 14
    const auto named = [&](const MixtureProposition& p) {
      return std::find(p.contributors.begin(), p.contributors.end(), person) != p.contributors.end();
    };
    if (!named(settings.hp) && !named(settings.hd)) conditioning_only.push_back(person);
    std::vector<std::string> unused;
    for (const auto& [locus, genotype] : profile.loci)
      if (!keys.count(dna::locus_key(locus))) unused.push_back(locus);
    if (!unused.empty())
      notes.push_back({"reference-locus-not-used", "loci in the reference profile of " + person +
                                                       " that the observed profile does not show are not used: " +
                                                       list_text(unused)});
  }
  if (!conditioning_only.empty())
    notes.push_back({"reference-not-a-contributor",
                     "named in references but a contributor under neither proposition (their alleles still "
                     "condition the unknowns' genotypes through theta): " + list_text(conditioning_only)});

  json as_written = json::object();
  for (auto key : kModelFields)
    if (const json* member = reading::find_member(item, key)) as_written[std::string(key)] = *member;
  std::vector<DataFileUse> data_files;
  if (table.source_file()) data_files.push_back(*table.source_file());
  auto model = std::make_shared<DnaMixtureModel>(std::move(settings), std::move(loci), std::move(notes),
                                                 std::move(as_written), std::move(data_files));
  if (model->log10_p_given_hp() == kMinusInfinity && model->log10_p_given_hd() == kMinusInfinity) {
    std::string where_zero;
    const double d = model->point_dropout();
    for (const auto& locus : model->loci()) {
      const Dropout dropout = model->dropout_at(d);
      if (locus.hp.probability(dropout) == 0.0 && locus.hd.probability(dropout) == 0.0)
        where_zero += (where_zero.empty() ? "" : ", ") + locus.locus;
    }
    throw InvalidValue(observed_at, "the observed alleles are impossible under both propositions" +
                                        (where_zero.empty() ? std::string() : " (at locus " + where_zero + ")") +
                                        "; with no drop-out or drop-in allowed, every allele of a named contributor "
                                        "must be observed and every observed allele carried");
  }
  return model;
}

namespace {

// The contributors named in `proposition` (read leniently: the model's reader checks the form).
std::set<std::string> contributors_in(const json* proposition) {
  std::set<std::string> names;
  if (!proposition || !proposition->is_object()) return names;
  const auto list = proposition->find("contributors");
  if (list == proposition->end() || !list->is_array()) return names;
  for (const auto& name : *list)
    if (name.is_string()) names.insert(name.get<std::string>());
  return names;
}

// Everyone named as a contributor under Hp or under any alternative.
std::set<std::string> contributors_anywhere(const json& item) {
  std::set<std::string> names = contributors_in(reading::find_member(item, "hp"));
  names.merge(contributors_in(reading::find_member(item, "hd")));
  if (const json* entries = reading::find_member(item, kAlternativesField); entries && entries->is_object())
    for (const auto& entry : *entries)
      if (entry.is_object()) names.merge(contributors_in(reading::find_member(entry, "hd")));
  return names;
}

}  // namespace

std::vector<EvidenceModelPtr> read_dna_mixture_alternatives(const json& item, std::span<const std::string> alternative_ids,
                                                            const ReadContext& context) {
  const std::set<std::string> anywhere = contributors_anywhere(item);
  // An own rate of someone who contributes only under other alternatives does not apply to the
  // pair read here; a rate for someone who contributes nowhere stays, for the reader to refuse.
  const auto read = [&anywhere](const json& merged, const ReadContext& merged_context) {
    json own = merged;
    if (const auto rates = own.find("dropout_by_contributor"); rates != own.end() && rates->is_object()) {
      std::set<std::string> here = contributors_in(reading::find_member(own, "hp"));
      here.merge(contributors_in(reading::find_member(own, "hd")));
      for (const auto& person : anywhere)
        if (!here.count(person)) rates->erase(person);
    }
    return read_dna_mixture_model(own, merged_context);
  };
  return read_per_alternative(item, alternative_ids, {"hd"}, read, context);
}

}  // namespace counterpoise::models::dna_mixture
