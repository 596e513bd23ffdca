#include "core/guard/wording_overrides.hpp"

#include "core/reading/json_fields.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::guard {

namespace {

std::string non_empty_string(const nlohmann::json& object, std::string_view key, const validation::Location& where) {
  const auto at = where.with_field(std::string(key));
  std::string text = reading::read_string(reading::require_member(object, key, where), at);
  if (text.find_first_not_of(" \t\r\n") == std::string::npos)
    throw validation::InvalidValue(at, "must not be empty");
  return text;
}

}  // namespace

std::vector<WordingOverride> read_wording_overrides(const casefile::Case& value) {
  std::vector<WordingOverride> result;
  if (!value.report) return result;
  const validation::Location where{"report", ""};
  reading::require_object(*value.report, where);
  const auto* overrides = reading::find_member(*value.report, "wording_overrides");
  if (!overrides) return result;
  if (!overrides->is_array())
    throw validation::InvalidValue(where.with_field("wording_overrides"),
                                   "must be an array, not " + reading::json_type_name(*overrides));
  for (std::size_t i = 0; i < overrides->size(); ++i) {
    const auto entry_at = validation::Location{"report", "wording_overrides[" + std::to_string(i) + "]"};
    const auto& entry = (*overrides)[i];
    reading::require_object(entry, entry_at);
    reading::check_known_members(entry, {"rule", "item", "reason"}, entry_at);
    WordingOverride o{non_empty_string(entry, "rule", entry_at), non_empty_string(entry, "item", entry_at),
                      non_empty_string(entry, "reason", entry_at)};
    if (o.item != "*" && o.item != "case" && o.item != "propositions" && !value.find_item(o.item))
      throw validation::InvalidValue(entry_at.with_field("item"),
                                     "names \"" + o.item + "\", which is not an item of this case (nor \"case\", \"propositions\" or \"*\")");
    result.push_back(std::move(o));
  }
  return result;
}

const WordingOverride* matching_override(std::string_view rule_id, std::string_view item,
                                         const std::vector<WordingOverride>& overrides) {
  for (const auto& o : overrides)
    if (o.rule == rule_id && (o.item == "*" || o.item == item)) return &o;
  return nullptr;
}

}  // namespace counterpoise::guard
