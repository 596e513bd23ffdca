#pragma once
// The current state of a case as the store keeps it: the top-level members of the case
// document ("sections": format, version, case, propositions, priors, ...) and the ordered list
// of items keyed by their id. An edit names an entity (a section or an item) and a field
// (a top-level member of that entity's object, or "" for the entity's whole value).

#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

namespace counterpoise::store {

enum class EntityKind { section, item };

struct EntityRef {
  EntityKind kind = EntityKind::section;
  std::string key;  // section name ("case", "propositions", ...) or item id ("E1")

  static EntityRef section(std::string name) { return {EntityKind::section, std::move(name)}; }
  static EntityRef item(std::string id) { return {EntityKind::item, std::move(id)}; }
};

// "section" or "item", as written in the audit.
const char* entity_kind_name(EntityKind kind);

class CaseState {
 public:
  // Splits a case document into sections and items. Throws validation::InvalidValue unless the
  // document is an object whose "items" member is an array of objects, each with a non-empty
  // string "id" that no other item has.
  static CaseState from_document(const nlohmann::json& document);
  // The document again: the sections as members, plus "items" in order.
  nlohmann::json to_document() const;

  const std::map<std::string, nlohmann::json>& sections() const { return sections_; }
  const std::vector<std::pair<std::string, nlohmann::json>>& items() const { return items_; }
  // Position of the item with this id, or nullopt.
  std::optional<std::size_t> item_position(const std::string& id) const;

  // The value at (entity, field); nullopt when the entity or member is absent.
  // Throws validation::InvalidValue when `field` is not "" and the entity is not an object.
  std::optional<nlohmann::json> value_at(const EntityRef& entity, const std::string& field) const;
  // The same without a copy: a pointer into the state (valid until the next change), or nullptr.
  const nlohmann::json* find_value(const EntityRef& entity, const std::string& field) const;
  // Sets (or with nullopt removes) the value at (entity, field). Throws validation::InvalidValue
  // for an unknown item, the section name "items", a change of an item's id, an item that would
  // not be an object, or a field of an entity that is not an object.
  void set_value(const EntityRef& entity, const std::string& field,
                 const std::optional<nlohmann::json>& value);
  // Inserts `item` (an object with a new id) before `position` (0..size). Throws InvalidValue.
  void add_item(const nlohmann::json& item, std::size_t position);
  // Removes the item and returns its body. Throws InvalidValue for an unknown id.
  nlohmann::json remove_item(const std::string& id);
  // Moves the item to `position` (0..size-1, counted after taking it out). Throws InvalidValue.
  void move_item(const std::string& id, std::size_t position);

 private:
  std::map<std::string, nlohmann::json> sections_;
  std::vector<std::pair<std::string, nlohmann::json>> items_;
};

// The id of an item object; throws validation::InvalidValue naming `where_item` when missing.
std::string item_id_of(const nlohmann::json& item, const std::string& where_item);

}  // namespace counterpoise::store
