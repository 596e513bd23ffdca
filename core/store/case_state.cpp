#include "core/store/case_state.hpp"

#include <algorithm>
#include <set>

#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using nlohmann::json;
using validation::InvalidValue;
using validation::Location;

namespace {
constexpr const char* kItems = "items";
}

const char* entity_kind_name(EntityKind kind) {
  return kind == EntityKind::section ? "section" : "item";
}

std::string item_id_of(const json& item, const std::string& where_item) {
  if (!item.is_object()) throw InvalidValue({where_item, {}}, "an item must be an object");
  auto it = item.find("id");
  if (it == item.end() || !it->is_string() || it->get_ref<const std::string&>().empty())
    throw InvalidValue({where_item, "id"}, "an item needs a non-empty text id");
  return it->get<std::string>();
}

CaseState CaseState::from_document(const json& document) {
  if (!document.is_object()) throw InvalidValue({}, "a case document must be a JSON object");
  CaseState state;
  for (auto it = document.begin(); it != document.end(); ++it)
    if (it.key() != kItems) state.sections_.emplace(it.key(), it.value());
  auto items = document.find(kItems);
  if (items == document.end() || !items->is_array())
    throw InvalidValue({"items", {}}, "the case needs an array of items (it may be empty)");
  std::set<std::string> seen;
  for (std::size_t i = 0; i < items->size(); ++i) {
    const json& item = (*items)[i];
    std::string id = item_id_of(item, "items[" + std::to_string(i) + "]");
    if (!seen.insert(id).second)
      throw InvalidValue({id, "id"}, "two items have the id \"" + id + "\"");
    state.items_.emplace_back(std::move(id), item);
  }
  return state;
}

json CaseState::to_document() const {
  json document = json::object();
  for (const auto& [name, value] : sections_) document[name] = value;
  json items = json::array();
  for (const auto& [id, body] : items_) items.push_back(body);
  document[kItems] = std::move(items);
  return document;
}

std::optional<std::size_t> CaseState::item_position(const std::string& id) const {
  for (std::size_t i = 0; i < items_.size(); ++i)
    if (items_[i].first == id) return i;
  return std::nullopt;
}

const json* CaseState::find_value(const EntityRef& entity, const std::string& field) const {
  const json* body = nullptr;
  if (entity.kind == EntityKind::section) {
    auto it = sections_.find(entity.key);
    if (it == sections_.end()) return nullptr;
    body = &it->second;
  } else {
    auto position = item_position(entity.key);
    if (!position) return nullptr;
    body = &items_[*position].second;
  }
  if (field.empty()) return body;
  if (!body->is_object())
    throw InvalidValue({entity.key, field}, "the entity is not an object, so it has no fields");
  auto it = body->find(field);
  return it == body->end() ? nullptr : &*it;
}

std::optional<json> CaseState::value_at(const EntityRef& entity, const std::string& field) const {
  const json* value = find_value(entity, field);
  if (!value) return std::nullopt;
  return *value;
}

void CaseState::set_value(const EntityRef& entity, const std::string& field,
                          const std::optional<json>& value) {
  const Location where{entity.key, field};
  if (entity.kind == EntityKind::section) {
    if (entity.key == kItems)
      throw InvalidValue(where, "items are edited one by one, not as a section");
    if (entity.key.empty()) throw InvalidValue(where, "a section needs a name");
    auto it = sections_.find(entity.key);
    if (field.empty()) {
      if (value)
        sections_[entity.key] = *value;
      else
        sections_.erase(entity.key);
      return;
    }
    if (it == sections_.end()) {
      if (!value) return;
      sections_[entity.key] = json::object({{field, *value}});
      return;
    }
    if (!it->second.is_object())
      throw InvalidValue(where, "the section is not an object, so it has no fields");
    if (value)
      it->second[field] = *value;
    else
      it->second.erase(field);
    return;
  }
  auto position = item_position(entity.key);
  if (!position) throw InvalidValue(where, "there is no item with this id");
  json& body = items_[*position].second;
  if (field.empty()) {
    if (!value) throw InvalidValue(where, "remove an item with remove, not by clearing it");
    if (item_id_of(*value, entity.key) != entity.key)
      throw InvalidValue(where, "an item's id cannot be changed");
    body = *value;
    return;
  }
  if (field == "id") throw InvalidValue(where, "an item's id cannot be changed");
  if (value)
    body[field] = *value;
  else
    body.erase(field);
}

void CaseState::add_item(const json& item, std::size_t position) {
  const std::string id = item_id_of(item, "new item");
  if (item_position(id)) throw InvalidValue({id, "id"}, "an item with this id already exists");
  if (position > items_.size())
    throw InvalidValue({id, "position"}, "position " + std::to_string(position) +
                                             " is beyond the end of the " +
                                             std::to_string(items_.size()) + " items");
  items_.insert(items_.begin() + static_cast<std::ptrdiff_t>(position), {id, item});
}

json CaseState::remove_item(const std::string& id) {
  auto position = item_position(id);
  if (!position) throw InvalidValue({id, {}}, "there is no item with this id");
  json body = std::move(items_[*position].second);
  items_.erase(items_.begin() + static_cast<std::ptrdiff_t>(*position));
  return body;
}

void CaseState::move_item(const std::string& id, std::size_t position) {
  auto from = item_position(id);
  if (!from) throw InvalidValue({id, {}}, "there is no item with this id");
  if (position >= items_.size())
    throw InvalidValue({id, "position"}, "position " + std::to_string(position) +
                                             " is beyond the last of the " +
                                             std::to_string(items_.size()) + " items");
  auto entry = std::move(items_[*from]);
  items_.erase(items_.begin() + static_cast<std::ptrdiff_t>(*from));
  items_.insert(items_.begin() + static_cast<std::ptrdiff_t>(position), std::move(entry));
}

}  // namespace counterpoise::store
