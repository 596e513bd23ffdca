#include "core/interchange/case_json.hpp"

#include <algorithm>
#include <cmath>
#include <set>

#include "core/guard/case_rules.hpp"
#include "core/models/item_fields.hpp"
#include "core/models/model_registry.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/data_access.hpp"
#include "core/reading/json_fields.hpp"
#include "core/reading/json_text.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/checks.hpp"
#include "core/validation/iso_date.hpp"

namespace counterpoise::interchange {

using casefile::Case;
using casefile::Item;
using nlohmann::json;
using reading::check_known_members;
using reading::find_member;
using reading::json_type_name;
using reading::read_bool;
using reading::read_count;
using reading::read_number;
using reading::read_number_array;
using reading::read_optional_number;
using reading::read_string;
using reading::read_string_array;
using reading::read_string_or;
using reading::require_member;
using validation::Diagnostics;
using validation::InvalidValue;
using validation::Location;

namespace {

// Runs one reading step; a problem is recorded and reading goes on with the next step.
// Returns whether the step ran without a problem.
template <class Step>
bool attempt(Diagnostics& diagnostics, Step&& step) {
  try {
    step();
    return true;
  } catch (const validation::Error& error) {
    diagnostics.add(error);
    return false;
  }
}

std::optional<std::string> optional_text(const json& object, std::string_view key, const Location& where) {
  const json* member = find_member(object, key);
  if (!member) return std::nullopt;
  return read_string(*member, where.with_field(std::string(key)));
}

std::string required_text(const json& object, std::string_view key, const Location& where) {
  const Location at = where.with_field(std::string(key));
  std::string text = read_string(require_member(object, key, where), at);
  if (text.find_first_not_of(" \t\r\n") == std::string::npos) throw InvalidValue(at, "must not be empty");
  return text;
}

casefile::PropositionLevel read_level(const json& value, const Location& where) {
  const std::string name = read_string(value, where);
  auto level = casefile::parse_level(name);
  if (!level)
    throw InvalidValue(where, "unknown level \"" + name + "\" (expected one of: " + casefile::level_names_text() + ")");
  return *level;
}

void check_format(const json& document, Diagnostics& diagnostics) {
  const Location where{"file", ""};
  attempt(diagnostics, [&] {
    const std::string format = read_string(require_member(document, "format", where), where.with_field("format"));
    if (format != kCaseFormatName)
      throw validation::UnsupportedFormat(where.with_field("format"),
                                          "not a Counterpoise case file (format \"" + format + "\", expected \"" +
                                              kCaseFormatName + "\")");
  });
  attempt(diagnostics, [&] {
    const auto version = read_count(require_member(document, "version", where), where.with_field("version"));
    if (version > kCaseFormatVersion)
      throw validation::UnsupportedFormat(where.with_field("version"),
                                          "case file version " + std::to_string(version) +
                                              " is newer than this program reads (version " +
                                              std::to_string(kCaseFormatVersion) + "); use a newer Counterpoise");
    if (version < 1) throw validation::UnsupportedFormat(where.with_field("version"), "version must be 1");
  });
}

casefile::CaseDetails read_details(const json& value) {
  const Location where{"case", ""};
  check_known_members(value, {"reference", "title", "laboratory", "examiner", "purpose", "requested_by", "date"}, where);
  casefile::CaseDetails details;
  details.reference = required_text(value, "reference", where);
  details.title = read_string_or(value, "title", where);
  details.laboratory = optional_text(value, "laboratory", where);
  details.examiner = optional_text(value, "examiner", where);
  details.purpose = optional_text(value, "purpose", where);
  details.requested_by = optional_text(value, "requested_by", where);
  details.date = optional_text(value, "date", where);
  if (details.date) validation::check_iso_calendar_date(*details.date, where.with_field("date"));
  return details;
}

casefile::Alternative read_alternative(const json& value, std::size_t index, std::set<std::string>& ids) {
  const Location where{"propositions", "alternatives[" + std::to_string(index) + "]"};
  check_known_members(value, {"id", "text", "weight", "unspecified"}, where);
  casefile::Alternative alternative;
  alternative.id = required_text(value, "id", where);
  const Location at{"propositions", "alternatives." + alternative.id};
  if (alternative.id == casefile::kHpId)
    throw InvalidValue(where.with_field("id"), "\"Hp\" names the proposition Hp; give the alternative another id");
  if (!ids.insert(alternative.id).second)
    throw InvalidValue(where.with_field("id"), "duplicate alternative id \"" + alternative.id + "\"");
  alternative.text = required_text(value, "text", at);
  if (const json* weight = find_member(value, "weight")) {
    const double w = read_number(*weight, at.with_field("weight"));
    if (!(w > 0.0))
      throw InvalidValue(at.with_field("weight"), "a weight is the fact-finder's relative prior weight of the alternative "
                                                  "and must be positive, found " + numbers::exact_text(w));
    alternative.weight = w;
  }
  if (const json* unspecified = find_member(value, "unspecified"))
    alternative.unspecified = read_bool(*unspecified, at.with_field("unspecified"));
  return alternative;
}

void read_alternatives(const json& value, casefile::Propositions& out, Diagnostics& diagnostics) {
  const Location where{"propositions", "alternatives"};
  if (!value.is_array() || value.empty()) {
    diagnostics.add(where, "alternatives is a list of at least one {\"id\", \"text\"}");
    return;
  }
  std::set<std::string> ids;
  for (std::size_t i = 0; i < value.size(); ++i)
    attempt(diagnostics, [&] { out.alternatives.push_back(read_alternative(value[i], i, ids)); });
  std::size_t weighted = 0;
  double total = 0.0;
  for (const auto& alternative : out.alternatives)
    if (alternative.weight) ++weighted, total += *alternative.weight;
  if (weighted != 0 && weighted != out.alternatives.size()) {
    for (const auto& alternative : out.alternatives)
      if (!alternative.weight)
        diagnostics.add(Location{"propositions", "alternatives." + alternative.id + ".weight"},
                        "missing: give a weight to every alternative or to none");
  } else if (!std::isfinite(total)) {
    diagnostics.add(where, "the weights are too large to add up; scale them down (only their ratios matter)");
  }
  if (!out.alternatives.empty()) out.hd = out.alternatives.front().text;
}

void read_propositions(const json& value, casefile::Propositions& out, Diagnostics& diagnostics) {
  const Location where{"propositions", ""};
  attempt(diagnostics, [&] {
    check_known_members(value, {"level", "hp", "hd", "alternatives", "conditioning_information", "assumptions"}, where);
  });
  if (!value.is_object()) return;
  attempt(diagnostics, [&] { out.level = read_level(require_member(value, "level", where), where.with_field("level")); });
  attempt(diagnostics, [&] { out.hp = required_text(value, "hp", where); });
  if (const json* alternatives = find_member(value, "alternatives")) {
    if (find_member(value, "hd"))
      diagnostics.add(where.with_field("hd"), "give either \"hd\" (one alternative) or \"alternatives\" (a list), not both");
    read_alternatives(*alternatives, out, diagnostics);
  } else {
    attempt(diagnostics, [&] { out.hd = required_text(value, "hd", where); });
  }
  attempt(diagnostics, [&] { out.conditioning_information = optional_text(value, "conditioning_information", where); });
  attempt(diagnostics, [&] {
    if (const json* a = find_member(value, "assumptions")) out.assumptions = read_string_array(*a, where.with_field("assumptions"));
  });
}

casefile::CombinationChoice read_combination(const json& value, const Location& item_where) {
  const Location where = item_where.with_field("combination");
  check_known_members(value, {"included", "independence", "exclusion_reason"}, where);
  casefile::CombinationChoice choice;
  if (const json* included = find_member(value, "included")) choice.included = read_bool(*included, where.with_field("included"));
  choice.independence = optional_text(value, "independence", where);
  choice.exclusion_reason = optional_text(value, "exclusion_reason", where);
  if (!choice.included && (!choice.exclusion_reason || choice.exclusion_reason->empty()))
    throw InvalidValue(where.with_field("exclusion_reason"),
                       "an item left out of the combination needs a reason (exclusion_reason)");
  return choice;
}

// The item's model, or in a case with several alternatives its model against each.
void item_models(const models::ModelEntry& entry, const json& value, const casefile::Propositions& propositions,
                 const models::ReadContext& context, Item& item) {
  if (!propositions.has_alternatives()) {
    for (const char* key : {"p_given", models::kAlternativesField})
      if (find_member(value, key))
        throw InvalidValue(context.where.with_field(key),
                           "per-alternative inputs need a list of alternatives in the propositions "
                           "(propositions.alternatives); this case has the two propositions hp and hd");
    item.model = entry.read(value, context);
    return;
  }
  const auto ids = propositions.alternative_ids();
  item.alternative_models = entry.read_alternatives(value, ids, context);
  item.model = item.alternative_models.front();
  json fields = json::object();
  for (auto it = value.begin(); it != value.end(); ++it)
    if (std::find(std::begin(models::kCommonItemFields), std::end(models::kCommonItemFields), it.key()) ==
        std::end(models::kCommonItemFields))
      fields[it.key()] = it.value();
  item.alternative_fields_as_written = std::move(fields);
}

std::optional<Item> read_item(const json& value, std::size_t index, const casefile::Propositions& propositions,
                              const std::filesystem::path& base_dir, Diagnostics& diagnostics) {
  Location where{"#" + std::to_string(index + 1), ""};
  if (!value.is_object()) {
    diagnostics.add(where, "an item must be an object, found " + json_type_name(value));
    return std::nullopt;
  }
  Item item;
  bool ok = true;
  // Every field is read so that all of the item's problems are reported; any one refuses the item.
  const auto step = [&](auto&& body) { ok = attempt(diagnostics, body) && ok; };
  step([&] {
    const json& id = require_member(value, "id", where);
    item.id = read_string(id, where.with_field("id"));
    if (item.id.empty()) throw InvalidValue(where.with_field("id"), "must not be empty");
    where = Location{item.id, ""};
  });
  step([&] { item.title = optional_text(value, "title", where); });
  step([&] { item.description = optional_text(value, "description", where); });
  step([&] { item.notes = optional_text(value, "notes", where); });
  step([&] { item.source_data = optional_text(value, "source_data", where); });
  step([&] {
    if (const json* level = find_member(value, "level")) item.level = read_level(*level, where.with_field("level"));
  });
  step([&] {
    if (const json* combination = find_member(value, "combination")) item.combination = read_combination(*combination, where);
  });
  step([&] {
    item.model_name = read_string(require_member(value, "model", where), where.with_field("model"));
    const auto* entry = models::find_model(item.model_name);
    if (!entry)
      throw InvalidValue(where.with_field("model"), "unknown model \"" + item.model_name +
                                                        "\" (known models: " + models::model_names_text() + ")");
    item_models(*entry, value, propositions, models::ReadContext{base_dir, where}, item);
  });
  if (!ok) return std::nullopt;
  return item;
}

casefile::PriorSettings read_priors(const json& value) {
  const Location where{"priors", ""};
  check_known_members(value, {"odds", "range", "one_of_n", "thresholds"}, where);
  casefile::PriorSettings priors;
  if (const json* odds = find_member(value, "odds")) {
    priors.odds = read_number_array(*odds, where.with_field("odds"));
    for (std::size_t i = 0; i < priors.odds.size(); ++i)
      validation::check_positive(Location{"priors", "odds[" + std::to_string(i) + "]"}, priors.odds[i]);
  }
  if (const json* range = find_member(value, "range")) {
    const Location at = where.with_field("range");
    check_known_members(*range, {"from", "to", "points"}, at);
    const double from = validation::check_positive(at.with_field("from"), read_number(require_member(*range, "from", at), at.with_field("from")));
    const double to = validation::check_positive(at.with_field("to"), read_number(require_member(*range, "to", at), at.with_field("to")));
    const auto points = read_count(require_member(*range, "points", at), at.with_field("points"));
    if (!(from < to)) throw InvalidValue(at, "\"from\" must be smaller than \"to\"");
    if (points < 2 || points > 1000000) throw InvalidValue(at.with_field("points"), "points must be between 2 and 1000000");
    priors.range = casefile::PriorRange{from, to, static_cast<int>(points)};
  }
  if (const json* n = find_member(value, "one_of_n")) {
    priors.one_of_n = read_number_array(*n, where.with_field("one_of_n"));
    for (std::size_t i = 0; i < priors.one_of_n.size(); ++i) {
      const Location at{"priors", "one_of_n[" + std::to_string(i) + "]"};
      if (!(priors.one_of_n[i] >= 2.0))
        throw InvalidValue(at, "N must be at least 2 (one of N possible sources, prior odds 1/(N-1))");
    }
  }
  if (const json* thresholds = find_member(value, "thresholds")) {
    auto list = read_number_array(*thresholds, where.with_field("thresholds"));
    for (std::size_t i = 0; i < list.size(); ++i)
      if (!(list[i] > 0.0 && list[i] < 1.0))
        throw InvalidValue(Location{"priors", "thresholds[" + std::to_string(i) + "]"},
                           "a threshold is a posterior probability strictly between 0 and 1");
    priors.thresholds = std::move(list);
  }
  return priors;
}

casefile::UncertaintySettings read_uncertainty(const json& value) {
  const Location where{"uncertainty", ""};
  check_known_members(value, {"seed", "draws", "credible_level", "conservative_level"}, where);
  casefile::UncertaintySettings settings;
  if (const json* seed = find_member(value, "seed")) {
    if (!seed->is_number_unsigned() && !(seed->is_number_integer() && seed->get<std::int64_t>() >= 0))
      throw InvalidValue(where.with_field("seed"), "the seed is a whole number >= 0");
    settings.seed = seed->get<std::uint64_t>();
  }
  if (const json* draws = find_member(value, "draws")) {
    const auto n = read_count(*draws, where.with_field("draws"));
    if (n < 1000 || n > 100000000) throw InvalidValue(where.with_field("draws"), "draws must be between 1000 and 100000000");
    settings.draws = n;
  }
  for (const char* key : {"credible_level", "conservative_level"}) {
    if (auto level = read_optional_number(value, key, where)) {
      if (!(*level > 0.5 && *level < 1.0)) throw InvalidValue(where.with_field(key), "level must be strictly between 0.5 and 1");
      (std::string(key) == "credible_level" ? settings.credible_level : settings.conservative_level) = *level;
    }
  }
  return settings;
}

verbal::VerbalScale read_scale(const json& value, const std::filesystem::path& base_dir) {
  const Location where{"verbal_scale", ""};
  if (value.is_string()) {
    const std::string name = value.get<std::string>();
    if (name == "enfsi-2015") return verbal::VerbalScale::enfsi_2015();
    throw InvalidValue(where, "unknown built-in scale \"" + name + "\" (built in: enfsi-2015; or give {\"file\": ...})");
  }
  if (value.is_object() && value.contains("file") && value.size() == 1) {
    const Location at = where.with_field("file");
    const std::string name = read_string(value.at("file"), at);
    const auto path = reading::locate_data_file(base_dir, name, at);
    return verbal::VerbalScale::from_json(parse_json_text(reading::read_text_file(path, at), name), where);
  }
  return verbal::VerbalScale::from_json(value, where);
}

}  // namespace

std::vector<validation::Problem> alternatives_problems(const json& alternatives) {
  casefile::Propositions scratch;
  Diagnostics diagnostics;
  read_alternatives(alternatives, scratch, diagnostics);
  return diagnostics.problems();
}

CaseReadResult read_case(const json& document, const std::filesystem::path& base_dir) {
  CaseReadResult result;
  Diagnostics& diagnostics = result.diagnostics;
  if (!document.is_object()) {
    diagnostics.add(Location{"file", ""}, "a case file is a JSON object, found " + json_type_name(document));
    return result;
  }
  check_format(document, diagnostics);
  if (!diagnostics.empty()) return result;  // another format: its fields mean nothing to us

  attempt(diagnostics, [&] {
    check_known_members(document, {"format", "version", "case", "mode", "propositions", "items", "priors",
                                   "uncertainty", "verbal_scale", "guard", "report"},
                        Location{"file", ""});
  });
  Case value;
  attempt(diagnostics, [&] { value.details = read_details(require_member(document, "case", Location{"file", ""})); });
  attempt(diagnostics, [&] {
    if (const json* mode = find_member(document, "mode")) {
      const std::string name = read_string(*mode, Location{"file", "mode"});
      if (name == "casework") value.mode = casefile::CaseMode::casework;
      else if (name == "training") value.mode = casefile::CaseMode::training;
      else throw InvalidValue(Location{"file", "mode"}, "mode must be \"casework\" or \"training\"");
    }
  });
  if (const json* propositions = find_member(document, "propositions")) {
    read_propositions(*propositions, value.propositions, diagnostics);
  } else {
    diagnostics.add(Location{"propositions", ""}, "missing: a case needs the propositions Hp and Hd");
  }

  const json* items = find_member(document, "items");
  if (!items || !items->is_array()) {
    diagnostics.add(Location{"items", ""}, items ? "items must be an array" : "missing: a case needs at least one item of findings");
  } else {
    if (items->empty()) diagnostics.add(Location{"items", ""}, "a case needs at least one item of findings");
    // Duplicates are found on the raw ids, so an item whose fields are also wrong still counts.
    std::set<std::string> ids;
    for (const auto& raw : *items) {
      const json* id = find_member(raw, "id");
      if (!id || !id->is_string()) continue;
      const std::string text = id->get<std::string>();
      if (!ids.insert(text).second) diagnostics.add(Location{text, "id"}, "duplicate item id \"" + text + "\"");
    }
    for (std::size_t i = 0; i < items->size(); ++i)
      if (auto item = read_item((*items)[i], i, value.propositions, base_dir, diagnostics)) value.items.push_back(std::move(*item));
  }
  attempt(diagnostics, [&] { if (const json* p = find_member(document, "priors")) value.priors = read_priors(*p); });
  attempt(diagnostics, [&] { if (const json* u = find_member(document, "uncertainty")) value.uncertainty = read_uncertainty(*u); });
  attempt(diagnostics, [&] {
    if (const json* s = find_member(document, "verbal_scale")) {
      value.verbal_scale = read_scale(*s, base_dir);
      value.verbal_scale_source = *s;
    }
  });
  if (const json* g = find_member(document, "guard")) {
    value.guard = *g;
    attempt(diagnostics, [&] { value.guard_rule_files = guard::read_guard_section(*g, base_dir); });
  }
  if (const json* r = find_member(document, "report")) value.report = *r;
  if (diagnostics.empty()) result.value = std::move(value);
  return result;
}

namespace {

void put_optional(json& object, const char* key, const std::optional<std::string>& text) {
  if (text) object[key] = *text;
}

}  // namespace

json write_item(const Item& item) {
  json j = item.alternative_fields_as_written ? *item.alternative_fields_as_written : item.model->to_json();
  j["id"] = item.id;
  j["model"] = item.model_name;
  put_optional(j, "title", item.title);
  put_optional(j, "description", item.description);
  put_optional(j, "notes", item.notes);
  put_optional(j, "source_data", item.source_data);
  if (item.level) j["level"] = std::string(casefile::level_name(*item.level));
  if (item.combination) {
    json c = {{"included", item.combination->included}};
    put_optional(c, "independence", item.combination->independence);
    put_optional(c, "exclusion_reason", item.combination->exclusion_reason);
    j["combination"] = c;
  }
  return j;
}

json write_case(const Case& value) {
  json document = {{"format", kCaseFormatName}, {"version", value.version}};
  json details = {{"reference", value.details.reference}};
  if (!value.details.title.empty()) details["title"] = value.details.title;
  put_optional(details, "laboratory", value.details.laboratory);
  put_optional(details, "examiner", value.details.examiner);
  put_optional(details, "purpose", value.details.purpose);
  put_optional(details, "requested_by", value.details.requested_by);
  put_optional(details, "date", value.details.date);
  document["case"] = details;
  if (value.mode) document["mode"] = std::string(casefile::mode_name(*value.mode));
  json propositions = {{"level", std::string(casefile::level_name(value.propositions.level))},
                       {"hp", value.propositions.hp}};
  if (value.propositions.has_alternatives()) {
    json alternatives = json::array();
    for (const auto& alternative : value.propositions.alternatives) {
      json a = {{"id", alternative.id}, {"text", alternative.text}};
      if (alternative.weight) a["weight"] = *alternative.weight;
      if (alternative.unspecified) a["unspecified"] = *alternative.unspecified;
      alternatives.push_back(a);
    }
    propositions["alternatives"] = alternatives;
  } else {
    propositions["hd"] = value.propositions.hd;
  }
  put_optional(propositions, "conditioning_information", value.propositions.conditioning_information);
  if (!value.propositions.assumptions.empty()) propositions["assumptions"] = value.propositions.assumptions;
  document["propositions"] = propositions;
  json items = json::array();
  for (const auto& item : value.items) items.push_back(write_item(item));
  document["items"] = items;
  if (value.priors) {
    json priors = json::object();
    if (!value.priors->odds.empty()) priors["odds"] = value.priors->odds;
    if (value.priors->range)
      priors["range"] = {{"from", value.priors->range->from_odds}, {"to", value.priors->range->to_odds},
                         {"points", value.priors->range->points}};
    if (!value.priors->one_of_n.empty()) priors["one_of_n"] = value.priors->one_of_n;
    if (value.priors->thresholds) priors["thresholds"] = *value.priors->thresholds;
    document["priors"] = priors;
  }
  if (value.uncertainty) {
    json u = json::object();
    if (value.uncertainty->seed) u["seed"] = *value.uncertainty->seed;
    if (value.uncertainty->draws) u["draws"] = *value.uncertainty->draws;
    if (value.uncertainty->credible_level) u["credible_level"] = *value.uncertainty->credible_level;
    if (value.uncertainty->conservative_level) u["conservative_level"] = *value.uncertainty->conservative_level;
    document["uncertainty"] = u;
  }
  if (value.verbal_scale_source) document["verbal_scale"] = *value.verbal_scale_source;
  if (value.guard) document["guard"] = *value.guard;
  if (value.report) document["report"] = *value.report;
  return document;
}

namespace {
// One spelling per number: a float with an integral value within 2^53 is written as an integer,
// so 1 and 1.0 (the same value) have the same canonical text.
bool is_integral_float(const json& value) {
  if (!value.is_number_float()) return false;
  const double x = value.get<double>();
  return std::isfinite(x) && x == std::trunc(x) && std::abs(x) <= 9007199254740992.0;
}

bool has_integral_float(const json& value) {
  if (value.is_structured()) {
    for (const auto& element : value)
      if (has_integral_float(element)) return true;
    return false;
  }
  return is_integral_float(value);
}

json with_canonical_numbers(const json& value) {
  if (value.is_object()) {
    json out = json::object();
    for (auto it = value.begin(); it != value.end(); ++it) out[it.key()] = with_canonical_numbers(it.value());
    return out;
  }
  if (value.is_array()) {
    json out = json::array();
    for (const auto& element : value) out.push_back(with_canonical_numbers(element));
    return out;
  }
  if (is_integral_float(value)) return json(static_cast<std::int64_t>(value.get<double>()));
  return value;
}
}  // namespace

std::string canonical_text(const json& document) {
  try {
    // Most documents have no integral floats: they are written without a copy.
    const json& source = document;
    if (!has_integral_float(source)) return source.dump(-1, ' ', false, json::error_handler_t::strict);
    return with_canonical_numbers(source).dump(-1, ' ', false, json::error_handler_t::strict);
  } catch (const json::type_error& error) {
    throw InvalidValue(Location{}, std::string("text is not valid UTF-8 (") + error.what() + ")");
  }
}

json parse_json_text(const std::string& text, const std::string& source) {
  // One bounded reader of untrusted JSON for the whole program (size, depth, value count,
  // finite numbers, valid UTF-8, no repeated member names).
  return reading::parse_json_text(text, source);
}

CaseReadResult read_case_file(const std::filesystem::path& path) {
  const Location where{"file", path.string()};
  try {
    const json document = reading::read_json_file(path);
    return read_case(document, path.parent_path());
  } catch (const validation::Error& error) {
    CaseReadResult result;
    result.diagnostics.add(error);
    return result;
  }
}

}  // namespace counterpoise::interchange
