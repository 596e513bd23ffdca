#include "core/models/per_alternative.hpp"

#include <algorithm>

#include "core/reading/json_fields.hpp"

namespace counterpoise::models {

using nlohmann::json;
using validation::InvalidValue;
using validation::Location;

namespace {

std::string id_list(std::span<const std::string> ids) {
  std::string text;
  for (const auto& id : ids) text += (text.empty() ? "" : ", ") + id;
  return text;
}

bool field_is_one_of(const std::string& field, std::initializer_list<std::string_view> names) {
  return std::any_of(names.begin(), names.end(), [&](std::string_view name) {
    return field == name || (field.size() > name.size() && field.compare(0, name.size(), name) == 0 &&
                             (field[name.size()] == '.' || field[name.size()] == '['));
  });
}

}  // namespace

void check_proposition_keys(const json& keyed, std::span<const std::string> alternative_ids, bool with_hp,
                            const Location& where) {
  reading::require_object(keyed, where);
  const auto known = [&](const std::string& key) {
    return (with_hp && key == "Hp") || std::find(alternative_ids.begin(), alternative_ids.end(), key) != alternative_ids.end();
  };
  for (auto it = keyed.begin(); it != keyed.end(); ++it)
    if (!known(it.key()))
      throw InvalidValue(where.with_field(it.key()), "\"" + it.key() + "\" is not the id of a proposition of this case (" +
                                                         (with_hp ? std::string("Hp, ") : std::string()) +
                                                         id_list(alternative_ids) + ")");
  if (with_hp && !reading::find_member(keyed, "Hp"))
    throw InvalidValue(where.with_field("Hp"), "missing: the probability of the findings if Hp is true");
  for (const auto& id : alternative_ids)
    if (!reading::find_member(keyed, id))
      throw InvalidValue(where.with_field(id), "missing: alternative " + id + " needs its own value");
}

std::vector<EvidenceModelPtr> read_per_alternative(const json& item, std::span<const std::string> alternative_ids,
                                                   std::initializer_list<std::string_view> overridable,
                                                   const SingleReader& read, const ReadContext& context) {
  const Location& where = context.where;
  const Location at = where.with_field(kAlternativesField);
  const json* entries = reading::find_member(item, kAlternativesField);
  if (!entries)
    throw InvalidValue(at, "missing: the case has several alternatives to Hp, so this item needs an entry for each (" +
                               id_list(alternative_ids) + ")");
  check_proposition_keys(*entries, alternative_ids, false, at);
  json shared = item;
  shared.erase(kAlternativesField);
  std::vector<EvidenceModelPtr> models;
  for (const auto& id : alternative_ids) {
    const json& entry = entries->at(id);
    const Location entry_at = at.with_field(id);
    reading::check_known_members(entry, overridable, entry_at);
    json merged = shared;
    for (auto it = entry.begin(); it != entry.end(); ++it) merged[it.key()] = it.value();
    // Only the fields this entry gave are placed in it when they are wrong, and those the item
    // does not share either (a missing one can only be given per alternative, or shared).
    std::vector<std::string_view> names;
    for (auto name : overridable)
      if (entry.contains(std::string(name)) || !shared.contains(std::string(name))) names.push_back(name);
    try {
      models.push_back(read(merged, context));
    } catch (const validation::Error& error) {
      const bool in_entry = std::any_of(names.begin(), names.end(), [&](std::string_view name) {
        return field_is_one_of(error.where().field, {name});
      });
      if (!in_entry) throw;
      const Location placed{error.where().item, entry_at.field + "." + error.where().field};
      if (dynamic_cast<const validation::InconsistentSizes*>(&error))
        throw validation::InconsistentSizes(placed, error.bare_message());
      throw InvalidValue(placed, error.bare_message());
    }
  }
  return models;
}

}  // namespace counterpoise::models
