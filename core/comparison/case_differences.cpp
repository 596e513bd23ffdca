#include "core/comparison/case_differences.hpp"

#include <algorithm>
#include <map>
#include <set>

#include "core/casefile/field_names.hpp"
#include "core/interchange/case_json.hpp"
#include "core/models/item_fields.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::comparison {

using nlohmann::json;

namespace {

// Members of an item a person writes in words; they do not enter the LR.
constexpr std::string_view kItemWordingFields[] = {"title", "description", "notes", "source_data"};

bool is_item_wording(std::string_view field) {
  return std::find(std::begin(kItemWordingFields), std::end(kItemWordingFields), field) != std::end(kItemWordingFields);
}

std::optional<json> member(const json& object, const std::string& key) {
  if (!object.is_object()) return std::nullopt;
  const auto found = object.find(key);
  if (found == object.end()) return std::nullopt;
  return *found;
}

bool included_in(const std::optional<json>& combination) {
  if (!combination || !combination->is_object()) return true;
  const auto included = combination->find("included");
  return included == combination->end() || !included->is_boolean() || included->get<bool>();
}

DifferenceKind section_kind(const std::string& section, const std::string& field) {
  if (section == "case") return DifferenceKind::case_details;
  if (section != "propositions") return DifferenceKind::setting;
  if (field == "conditioning_information") return DifferenceKind::conditioning;
  if (field == "assumptions") return DifferenceKind::assumptions;
  return DifferenceKind::propositions;
}

// The top-level member of a data file's field ("frequencies.file" → "frequencies").
std::string top_member(const std::string& field) { return field.substr(0, field.find_first_of(".[")); }

// The data files an item reads, keyed by the member that names them.
std::map<std::string, std::vector<models::DataFileUse>> files_by_member(const casefile::Item& item) {
  std::map<std::string, std::vector<models::DataFileUse>> files;
  for (auto& use : item.model->data_files()) files[top_member(use.field)].push_back(std::move(use));
  return files;
}

// The files of one member on both sides, paired by field; empty when every file has the same
// bytes (the same digest) on both sides.
std::vector<DataFileChange> changed_files(const std::vector<models::DataFileUse>& old_uses,
                                          const std::vector<models::DataFileUse>& new_uses) {
  std::map<std::string, DataFileChange> by_field;
  for (const auto& use : old_uses) by_field[use.field].old_use = use;
  for (const auto& use : new_uses) by_field[use.field].new_use = use;
  std::vector<DataFileChange> changes;
  bool any_changed = false;
  for (auto& [field, change] : by_field) {
    change.field = field;
    const bool same = change.old_use && change.new_use && change.old_use->sha256 == change.new_use->sha256 &&
                      change.old_use->name == change.new_use->name;
    any_changed = any_changed || !same;
    changes.push_back(std::move(change));
  }
  if (!any_changed) changes.clear();
  return changes;
}

class DifferenceList {
 public:
  void add(DifferenceKind kind, DifferencePath path, std::optional<json> old_value, std::optional<json> new_value,
           std::vector<DataFileChange> files = {}) {
    Difference d;
    d.kind = kind;
    d.place = kind == DifferenceKind::item_order ? "order of the items"
              : path.section == "items"        ? casefile::change_place_words("item", path.item_id, path.field)
                                               : casefile::change_place_words("section", path.section, path.field);
    d.path = std::move(path);
    d.old_value = std::move(old_value);
    d.new_value = std::move(new_value);
    d.files = std::move(files);
    list_.push_back(std::move(d));
  }
  std::vector<Difference> take() { return std::move(list_); }

 private:
  std::vector<Difference> list_;
};

void compare_section(const std::string& name, const std::optional<json>& old_section,
                     const std::optional<json>& new_section, DifferenceList& out) {
  if (old_section == new_section) return;
  const bool both_objects = old_section && new_section && old_section->is_object() && new_section->is_object();
  if (!both_objects) {
    out.add(section_kind(name, ""), {name, "", ""}, old_section, new_section);
    return;
  }
  std::set<std::string> keys;
  for (const auto& [key, _] : old_section->items()) keys.insert(key);
  for (const auto& [key, _] : new_section->items()) keys.insert(key);
  for (const auto& key : keys) {
    auto old_value = member(*old_section, key);
    auto new_value = member(*new_section, key);
    if (old_value != new_value) out.add(section_kind(name, key), {name, "", key}, old_value, new_value);
  }
}

DifferenceKind item_member_kind(const std::string& field, const std::optional<json>& old_value,
                                const std::optional<json>& new_value) {
  if (is_item_wording(field)) return DifferenceKind::wording;
  if (field == "level") return DifferenceKind::item_level;
  if (field == "combination") {
    const bool was = included_in(old_value), is = included_in(new_value);
    if (was == is) return DifferenceKind::wording;  // only the reasons' words changed
    return is ? DifferenceKind::item_included : DifferenceKind::item_excluded;
  }
  return DifferenceKind::input_value;
}

void compare_item(const casefile::Item& old_item, const json& old_json, const casefile::Item& new_item,
                  const json& new_json, DifferenceList& out) {
  const auto old_files = files_by_member(old_item);
  const auto new_files = files_by_member(new_item);
  std::set<std::string> keys;
  for (const auto& [key, _] : old_json.items()) keys.insert(key);
  for (const auto& [key, _] : new_json.items()) keys.insert(key);
  for (const auto& [key, _] : old_files) keys.insert(key);
  for (const auto& [key, _] : new_files) keys.insert(key);
  static const std::vector<models::DataFileUse> none;
  const auto files_of = [&](const auto& map, const std::string& key) -> const std::vector<models::DataFileUse>& {
    const auto found = map.find(key);
    return found == map.end() ? none : found->second;
  };
  for (const auto& key : keys) {
    if (key == "id") continue;
    auto old_value = member(old_json, key);
    auto new_value = member(new_json, key);
    auto files = changed_files(files_of(old_files, key), files_of(new_files, key));
    if (!files.empty()) {
      out.add(DifferenceKind::data_file, {"items", new_item.id, key}, old_value, new_value, std::move(files));
    } else if (old_value != new_value) {
      out.add(item_member_kind(key, old_value, new_value), {"items", new_item.id, key}, old_value, new_value);
    }
  }
}

// The ids of `items` that `other` also holds, in `items`' order.
std::vector<std::string> common_order(const std::vector<casefile::Item>& items, const casefile::Case& other) {
  std::vector<std::string> ids;
  for (const auto& item : items)
    if (other.find_item(item.id)) ids.push_back(item.id);
  return ids;
}

}  // namespace

bool Difference::enters_lr() const {
  switch (kind) {
    case DifferenceKind::item_added:
    case DifferenceKind::item_removed:
    case DifferenceKind::item_included:
    case DifferenceKind::item_excluded:
    case DifferenceKind::input_value:
    case DifferenceKind::data_file: return true;
    default: return false;
  }
}

bool Difference::is_wording() const {
  return kind == DifferenceKind::wording || kind == DifferenceKind::conditioning ||
         kind == DifferenceKind::assumptions || (kind == DifferenceKind::propositions && path.field != "level") ||
         (kind == DifferenceKind::case_details && (path.field == "title" || path.field == "purpose"));
}

std::vector<Difference> list_differences(const CaseVersion& a, const CaseVersion& b) {
  const json old_document = interchange::write_case(a.value);
  const json new_document = interchange::write_case(b.value);
  DifferenceList out;

  std::set<std::string> sections;
  for (const auto& [key, _] : old_document.items()) sections.insert(key);
  for (const auto& [key, _] : new_document.items()) sections.insert(key);
  sections.erase("items");
  sections.erase("case");
  compare_section("case", member(old_document, "case"), member(new_document, "case"), out);
  for (const auto& name : sections) compare_section(name, member(old_document, name), member(new_document, name), out);

  const json& old_items = old_document.at("items");
  const json& new_items = new_document.at("items");
  // Removed items first, where they stood, then b's items in order.
  for (std::size_t i = 0; i < a.value.items.size(); ++i)
    if (!b.value.find_item(a.value.items[i].id))
      out.add(DifferenceKind::item_removed, {"items", a.value.items[i].id, ""}, old_items[i], std::nullopt);
  for (std::size_t j = 0; j < b.value.items.size(); ++j) {
    const auto& new_item = b.value.items[j];
    const auto old_position = std::find_if(a.value.items.begin(), a.value.items.end(),
                                           [&](const casefile::Item& item) { return item.id == new_item.id; });
    if (old_position == a.value.items.end()) {
      out.add(DifferenceKind::item_added, {"items", new_item.id, ""}, std::nullopt, new_items[j]);
      continue;
    }
    const auto i = static_cast<std::size_t>(old_position - a.value.items.begin());
    compare_item(*old_position, old_items[i], new_item, new_items[j], out);
  }
  const auto old_order = common_order(a.value.items, b.value);
  const auto new_order = common_order(b.value.items, a.value);
  if (old_order != new_order) out.add(DifferenceKind::item_order, {"items", "", "order"}, json(old_order), json(new_order));
  return out.take();
}

std::string kind_name(DifferenceKind kind) {
  switch (kind) {
    case DifferenceKind::propositions: return "propositions";
    case DifferenceKind::conditioning: return "conditioning-information";
    case DifferenceKind::assumptions: return "assumptions";
    case DifferenceKind::case_details: return "case-details";
    case DifferenceKind::setting: return "setting";
    case DifferenceKind::item_added: return "item-added";
    case DifferenceKind::item_removed: return "item-removed";
    case DifferenceKind::item_included: return "item-included";
    case DifferenceKind::item_excluded: return "item-excluded";
    case DifferenceKind::input_value: return "input-value";
    case DifferenceKind::data_file: return "data-file";
    case DifferenceKind::wording: return "wording";
    case DifferenceKind::item_level: return "item-level";
    case DifferenceKind::item_order: return "item-order";
  }
  return "unknown";
}

std::string kind_words(DifferenceKind kind) {
  switch (kind) {
    case DifferenceKind::propositions: return "Propositions changed";
    case DifferenceKind::conditioning: return "Conditioning information changed";
    case DifferenceKind::assumptions: return "Assumptions changed";
    case DifferenceKind::case_details: return "Case details changed";
    case DifferenceKind::setting: return "Setting changed";
    case DifferenceKind::item_added: return "Item added";
    case DifferenceKind::item_removed: return "Item removed";
    case DifferenceKind::item_included: return "Item now included in the combined LR";
    case DifferenceKind::item_excluded: return "Item now left out of the combined LR";
    case DifferenceKind::input_value: return "Input changed";
    case DifferenceKind::data_file: return "Data file changed";
    case DifferenceKind::wording: return "Wording changed";
    case DifferenceKind::item_level: return "Level addressed changed";
    case DifferenceKind::item_order: return "Items reordered";
  }
  return "Changed";
}

std::string value_words(const std::optional<json>& value) {
  if (!value) return "(absent)";
  const json& v = *value;
  if (v.is_null()) return "(none)";
  if (v.is_string()) return v.get<std::string>();
  if (v.is_boolean()) return v.get<bool>() ? "yes" : "no";
  if (v.is_number()) return numbers::entered_for_readers(v.get<double>());
  if (v.is_array()) {
    std::string text = "[";
    for (std::size_t i = 0; i < v.size(); ++i) text += (i ? ", " : "") + value_words(v[i]);
    return text + "]";
  }
  std::string text;
  for (const auto& [key, element] : v.items()) {
    if (!text.empty()) text += "; ";
    // The combination's members in words; a model's nested keys ("k", "n" of counts) as written,
    // since the same key means another thing at the top of an item.
    const bool combination_member = key == "included" || key == "independence" || key == "exclusion_reason";
    text += (combination_member ? casefile::field_words(key) : key) + " " + value_words(element);
  }
  return text.empty() ? "(empty)" : text;
}

std::string data_file_words(const std::optional<models::DataFileUse>& use) {
  if (!use) return "(none)";
  return use->name + " (SHA-256 " + use->sha256.substr(0, 12) + "…, " +
         numbers::count_for_readers(static_cast<std::int64_t>(use->bytes)) + " bytes)";
}

}  // namespace counterpoise::comparison
