#include "core/casefile/field_names.hpp"

#include <algorithm>
#include <array>
#include <utility>

namespace counterpoise::casefile {

namespace {

using Words = std::pair<std::string_view, std::string_view>;

// Item fields: the common ones (core/models/item_fields.hpp) and each model's own. The
// conditional notation P(E|Hp) is the trade's (common practice).
constexpr std::array kItemFields{
    Words{"title", "title"},
    Words{"description", "description"},
    Words{"model", "model"},
    Words{"level", "level addressed"},
    Words{"combination", "combination"},
    Words{"notes", "notes"},
    Words{"source_data", "source of the data"},
    Words{"p_given_hp", "P(E|Hp)"},
    Words{"p_given_hd", "P(E|Hd)"},
    Words{"lr", "reported LR"},
    Words{"log10_lr", "reported log10 LR"},
    Words{"interval", "interval of the reported LR"},
    Words{"interval_log10", "log10 interval of the reported LR"},
    Words{"method", "method"},
    Words{"found", "items found"},
    Words{"n", "group size"},
    Words{"t0", "t0 (nothing transferred, persisted and recovered)"},
    Words{"tn", "tn (this group transferred, persisted and recovered)"},
    Words{"p0", "P0 (no group on an unconnected person)"},
    Words{"p1", "P1 (one group on an unconnected person)"},
    Words{"sn", "Sn (a group of this size)"},
    Words{"gamma", "γ (frequency of the characteristics)"},
    Words{"theta", "θ (co-ancestry)"},
    Words{"relationship", "donor's relationship"},
    Words{"profile", "questioned profile"},
    Words{"reference_profile", "reference profile"},
    Words{"uninterpretable_loci", "loci not interpretable"},
    Words{"min_allele_frequency", "minimum allele frequency"},
    Words{"frequencies", "allele frequencies"},
    Words{"control", "control measurements"},
    Words{"recovered", "recovered measurements"},
    Words{"within_sd", "within-source standard deviation"},
    Words{"within_replicates", "replicate measurements"},
    Words{"population", "population"},
    Words{"form", "formula"},
    Words{"nodes", "network nodes and tables"},
    Words{"proposition", "proposition node"},
    Words{"observed", "observed findings"},
    Words{"covers", "items the network covers"},
    Words{"references", "reference profiles"},
    Words{"dropout", "drop-out probability"},
    Words{"dropout_homozygote", "drop-out probability of a homozygote"},
    Words{"dropout_by_contributor", "drop-out probabilities of named people"},
    Words{"uncertain", "alleles marked uncertain"},
    Words{"dropin", "drop-in probability"},
    Words{"p_given", "probability of the findings under each proposition"},
    Words{"alternatives", "alternatives to Hp"},
    Words{"included", "included in the combined LR"},
    Words{"independence", "why independent"},
    Words{"exclusion_reason", "reason left out"},
    // Section fields.
    Words{"reference", "reference"},
    Words{"laboratory", "laboratory"},
    Words{"examiner", "examiner"},
    Words{"requested_by", "requested by"},
    Words{"date", "date"},
    Words{"purpose", "purpose"},
    Words{"hp", "Hp"},
    Words{"hd", "Hd"},
    Words{"conditioning_information", "conditioning information"},
    Words{"assumptions", "assumptions"},
    Words{"odds", "prior odds"},
    Words{"one_of_n", "one of N"},
    Words{"range", "range of prior odds"},
    Words{"thresholds", "thresholds"},
    Words{"verbal_scale", "verbal scale"},
    Words{"draws", "draws"},
    Words{"seed", "seed"},
    Words{"credible_level", "credible level"},
    Words{"conservative_level", "conservative level"},
};

constexpr std::array kSections{
    Words{"case", "case details"},
    Words{"propositions", "propositions"},
    Words{"mode", "mode (casework or training)"},
    Words{"priors", "prior odds"},
    Words{"report", "report settings"},
    Words{"guard", "wording rules"},
    Words{"uncertainty", "uncertainty settings"},
};

constexpr std::array kActions{
    Words{"set", "changed"},       Words{"add", "added"},     Words{"remove", "removed"},
    Words{"move", "moved"},        Words{"import", "created"}, Words{"open-revision", "opened a revision"},
    Words{"seal", "sealed"},
};

template <std::size_t N>
bool listed(const std::array<Words, N>& table, std::string_view key) {
  return std::any_of(table.begin(), table.end(), [&](const Words& w) { return w.first == key; });
}

template <std::size_t N>
std::string look_up(const std::array<Words, N>& table, std::string_view key) {
  const auto found = std::find_if(table.begin(), table.end(), [&](const Words& w) { return w.first == key; });
  if (found != table.end()) return std::string(found->second);
  std::string plain(key);
  std::replace(plain.begin(), plain.end(), '_', ' ');
  return plain;
}

}  // namespace

std::string field_words(std::string_view field) {
  const std::size_t cut = field.find_first_of(".[");
  std::string words = look_up(kItemFields, field.substr(0, cut));
  if (cut == std::string_view::npos) return words;
  std::string_view tail = field.substr(cut);
  if (tail.front() == '.') tail.remove_prefix(1);
  return words + " (" + std::string(tail) + ")";
}

bool has_field_words(std::string_view field) { return listed(kItemFields, field.substr(0, field.find_first_of(".["))); }

std::string change_place_words(std::string_view entity, std::string_view key, std::string_view field) {
  if (entity == "item") {
    if (field.empty()) return "item " + std::string(key);
    return field_words(field) + " of " + std::string(key);
  }
  if (entity == "section") {
    const std::string section = look_up(kSections, key);
    if (field.empty()) return section;
    return field_words(field) + " (" + section + ")";
  }
  return "the whole case";
}

std::string action_words(std::string_view action) { return look_up(kActions, action); }

}  // namespace counterpoise::casefile
