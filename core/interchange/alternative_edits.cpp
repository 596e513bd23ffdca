#include "core/interchange/alternative_edits.hpp"

#include <algorithm>
#include <optional>
#include <set>
#include <string_view>

#include "core/casefile/case_model.hpp"
#include "core/interchange/case_json.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::interchange {

using nlohmann::json;
using validation::InvalidValue;
using validation::Location;

namespace {

constexpr const char* kPropositions = "propositions";
constexpr const char* kPGiven = "p_given";
constexpr const char* kAlternatives = "alternatives";

// The fields a model keeps per alternative in an "alternatives" entry (those its
// AlternativesReader lets an entry hold, less what every alternative shares: a reported LR's
// method). The assigned model keys p_given by proposition id instead.
// A network keeps Hd's states in its proposition (proposition.hd), moved to and from the entry's
// "hd" by network_hd below.
std::vector<std::string_view> entry_fields(const std::string& model) {
  if (model == "reported-lr") return {"lr", "log10_lr", "interval", "interval_log10"};
  if (model == "dna-single-source") return {"relationship"};
  if (model == "dna-mixture") return {"hd"};
  if (model == "continuous-two-level") return {"population_hd"};
  if (model == "transfer") return {"t0_hd", "tn_hd"};
  return {};
}

constexpr const char* kNetworkModel = "network";

json propositions_of(const json& document) {
  const auto it = document.find(kPropositions);
  return it != document.end() && it->is_object() ? *it : json::object();
}

const json& items_of(const json& document) {
  static const json none = json::array();
  const auto it = document.find("items");
  return it != document.end() && it->is_array() ? *it : none;
}

std::string id_of(const json& item) {
  const auto it = item.find("id");
  return it != item.end() && it->is_string() ? it->get<std::string>() : std::string();
}

std::string model_of(const json& item) {
  const auto it = item.find("model");
  return it != item.end() && it->is_string() ? it->get<std::string>() : std::string();
}

const json& alternative_list(const json& propositions) {
  static const json none = json::array();
  const auto it = propositions.find(kAlternatives);
  return it != propositions.end() && it->is_array() ? *it : none;
}

std::string alternative_id(const json& alternative) {
  return alternative.is_object() ? id_of(alternative) : std::string();
}

// The position of alternative `id` in the list; throws naming it when there is none.
std::size_t position_of(const json& list, const std::string& id) {
  for (std::size_t i = 0; i < list.size(); ++i)
    if (alternative_id(list[i]) == id) return i;
  throw InvalidValue(Location{kPropositions, std::string(kAlternatives) + "." + id}, "no alternative has this id");
}

// Applies `change` to each item; the items it changed are returned with their new bodies.
template <typename Change>
std::vector<std::pair<std::string, json>> changed_items(const json& document, Change&& change) {
  std::vector<std::pair<std::string, json>> out;
  for (const json& item : items_of(document)) {
    if (!item.is_object()) continue;
    json body = item;
    change(body);
    if (body != item) out.emplace_back(id_of(item), std::move(body));
  }
  return out;
}

// The member `key` of an item when it is an object (per-alternative values), else nullptr.
json* keyed_member(json& item, const char* key) {
  const auto it = item.find(key);
  return it != item.end() && it->is_object() ? &*it : nullptr;
}

void rename_key(json* keyed, const std::string& from, const std::string& to) {
  if (!keyed || !keyed->contains(from) || keyed->contains(to)) return;
  (*keyed)[to] = (*keyed)[from];
  keyed->erase(from);
}

// Hd's inputs of one item moved to the alternative `id` (see the header).
void item_to_several(json& item, const std::string& id) {
  const std::string model = model_of(item);
  if (model == "assigned") {
    if (item.contains(kPGiven) || (!item.contains("p_given_hp") && !item.contains("p_given_hd"))) return;
    json keyed = json::object();
    if (item.contains("p_given_hp")) keyed[casefile::kHpId] = item["p_given_hp"];
    if (item.contains("p_given_hd")) keyed[id] = item["p_given_hd"];
    item.erase("p_given_hp");
    item.erase("p_given_hd");
    item[kPGiven] = std::move(keyed);
    return;
  }
  if (item.contains(kAlternatives)) return;
  if (model == kNetworkModel) {
    json entry = json::object();
    if (json* proposition = keyed_member(item, "proposition"); proposition && proposition->contains("hd")) {
      entry["hd"] = (*proposition)["hd"];
      proposition->erase("hd");
    }
    item[kAlternatives] = json{{id, std::move(entry)}};
    return;
  }
  const auto fields = entry_fields(model);
  if (fields.empty()) return;
  json entry = json::object();
  for (const auto field : fields) {
    const std::string key(field);
    if (!item.contains(key)) continue;
    entry[key] = item[key];
    item.erase(key);
  }
  item[kAlternatives] = json{{id, std::move(entry)}};
}

// The alternative `id`'s inputs of one item made the two-proposition ones (see the header).
// Values for any other key stay where they are, so nothing is dropped; the reader names them.
void item_to_two(json& item, const std::string& id) {
  if (json* keyed = keyed_member(item, kPGiven)) {
    if (keyed->contains(casefile::kHpId)) item["p_given_hp"] = (*keyed)[casefile::kHpId];
    if (keyed->contains(id)) item["p_given_hd"] = (*keyed)[id];
    keyed->erase(casefile::kHpId);
    keyed->erase(id);
    if (keyed->empty()) item.erase(kPGiven);
  }
  if (json* entries = keyed_member(item, kAlternatives)) {
    if (entries->contains(id) && (*entries)[id].is_object()) {
      json entry = (*entries)[id];
      entries->erase(id);
      if (json* proposition = keyed_member(item, "proposition"); proposition && model_of(item) == kNetworkModel &&
                                                                  entry.contains("hd")) {
        (*proposition)["hd"] = entry["hd"];
        entry.erase("hd");
      }
      for (auto it = entry.begin(); it != entry.end(); ++it) item[it.key()] = it.value();
    }
    if (entries->empty()) item.erase(kAlternatives);
  }
}

std::string field_words(std::string_view field) {
  if (field == "text") return "proposition";
  return std::string(field);
}

}  // namespace

std::string alternative_problem_words(const validation::Problem& problem, const json& alternatives) {
  const std::string& field = problem.where.field;
  const std::string prefix = kAlternatives;
  const auto named = [&](std::size_t index, std::string_view rest) {
    std::string words = "Alternative " + std::to_string(index + 1);
    const std::string id = index < alternatives.size() ? alternative_id(alternatives[index]) : std::string();
    if (!id.empty()) words += " (" + validation::display_text(id) + ")";
    if (!rest.empty()) words += ", " + field_words(rest);
    return words + ": " + validation::display_lines(problem.message);
  };
  if (field.rfind(prefix + "[", 0) == 0) {
    const std::size_t close = field.find(']');
    const std::size_t index = std::stoul(field.substr(prefix.size() + 1, close - prefix.size() - 1));
    const std::size_t dot = field.find('.', close);
    return named(index, dot == std::string::npos ? std::string_view() : std::string_view(field).substr(dot + 1));
  }
  // "alternatives.<id>.<field>": the longest id that fits, since an id may hold a dot.
  std::optional<std::size_t> best;
  for (std::size_t i = 0; i < alternatives.size(); ++i) {
    const std::string at = prefix + "." + alternative_id(alternatives[i]);
    if (field.rfind(at, 0) == 0 && (field.size() == at.size() || field[at.size()] == '.') &&
        (!best || alternative_id(alternatives[*best]).size() < alternative_id(alternatives[i]).size()))
      best = i;
  }
  if (best) {
    const std::size_t length = prefix.size() + 1 + alternative_id(alternatives[*best]).size();
    return named(*best, field.size() > length ? std::string_view(field).substr(length + 1) : std::string_view());
  }
  return "The alternatives: " + validation::display_lines(problem.message);
}

std::string fresh_alternative_id(const json& alternatives) {
  std::set<std::string> taken;
  for (const json& alternative : alternatives) taken.insert(alternative_id(alternative));
  for (std::size_t n = alternatives.size() + 1;; ++n)
    if (std::string id = "Hd" + std::to_string(n); !taken.count(id)) return id;
}

AlternativesEdit to_several_alternatives(const json& document) {
  json propositions = propositions_of(document);
  if (propositions.contains(kAlternatives))
    throw InvalidValue(Location{kPropositions, kAlternatives}, "the case has several alternatives to Hp already");
  const auto hd = propositions.find("hd");
  json first{{"id", kFirstAlternativeId}, {"text", hd != propositions.end() ? *hd : json("")}};
  propositions.erase("hd");
  propositions[kAlternatives] = json::array({std::move(first)});
  return {std::move(propositions),
          changed_items(document, [](json& item) { item_to_several(item, kFirstAlternativeId); })};
}

AlternativesEdit to_two_propositions(const json& document) {
  json propositions = propositions_of(document);
  const json& list = alternative_list(propositions);
  if (list.empty())
    throw InvalidValue(Location{kPropositions, kAlternatives}, "the case has the two propositions Hp and Hd already");
  if (list.size() > 1)
    throw InvalidValue(Location{kPropositions, kAlternatives},
                       "a case goes back to the two propositions Hp and Hd only with one alternative left; remove " +
                           std::to_string(list.size() - 1) + " of the " + std::to_string(list.size()) + " first");
  const std::string id = alternative_id(list[0]);
  const json text = list[0].is_object() && list[0].contains("text") ? list[0]["text"] : json("");
  propositions.erase(kAlternatives);
  propositions["hd"] = text;
  return {std::move(propositions), changed_items(document, [&](json& item) { item_to_two(item, id); })};
}

AlternativesEdit rename_alternative(const json& document, const std::string& from, const std::string& to) {
  json propositions = propositions_of(document);
  json list = alternative_list(propositions);
  const std::size_t index = position_of(list, from);
  list[index]["id"] = to;
  const auto problems = alternatives_problems(list);
  for (const auto& problem : problems)
    if (problem.where.field.rfind("alternatives[" + std::to_string(index) + "].id", 0) == 0)
      throw InvalidValue(problem.where, problem.message);
  propositions[kAlternatives] = list;
  return {std::move(propositions), changed_items(document, [&](json& item) {
            rename_key(keyed_member(item, kPGiven), from, to);
            rename_key(keyed_member(item, kAlternatives), from, to);
          })};
}

std::vector<AlternativeValue> values_naming(const json& document, const std::string& id) {
  std::vector<AlternativeValue> out;
  for (const json& item : items_of(document)) {
    if (!item.is_object()) continue;
    for (const char* key : {kPGiven, kAlternatives}) {
      const auto member = item.find(key);
      if (member == item.end() || !member->is_object() || !member->contains(id)) continue;
      out.push_back({id_of(item), std::string(key) + "." + id, (*member)[id]});
    }
  }
  return out;
}

AlternativesEdit remove_alternative(const json& document, const std::string& id) {
  json propositions = propositions_of(document);
  json list = alternative_list(propositions);
  const std::size_t index = position_of(list, id);
  if (list.size() == 1)
    throw InvalidValue(Location{kPropositions, std::string(kAlternatives) + "." + id},
                       "the only alternative cannot be removed: go back to the two propositions Hp and Hd instead");
  list.erase(list.begin() + static_cast<std::ptrdiff_t>(index));
  propositions[kAlternatives] = std::move(list);
  return {std::move(propositions), changed_items(document, [&](json& item) {
            for (const char* key : {kPGiven, kAlternatives})
              if (json* keyed = keyed_member(item, key)) keyed->erase(id);
          })};
}

}  // namespace counterpoise::interchange
