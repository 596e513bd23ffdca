#include "reports/report_settings.hpp"

#include "core/reading/json_fields.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::reports {

namespace {

std::string non_empty_string(const nlohmann::json& object, std::string_view key, const validation::Location& where) {
  const auto at = where.with_field(std::string(key));
  std::string text = reading::read_string(reading::require_member(object, key, where), at);
  if (text.find_first_not_of(" \t\r\n") == std::string::npos)
    throw validation::InvalidValue(at, "must not be empty");
  return text;
}

}  // namespace

std::string_view reported_value_name(ReportedValue value) {
  return value == ReportedValue::point ? "point" : "conservative";
}

ReportSettings read_report_settings(const casefile::Case& value) {
  ReportSettings settings;
  if (!value.report) return settings;
  const validation::Location where{"report", ""};
  const auto& section = *value.report;
  reading::require_object(section, where);
  reading::check_known_members(section, {"reported_value", "wording_overrides"}, where);
  if (const auto* reported = reading::find_member(section, "reported_value")) {
    const auto at = where.with_field("reported_value");
    const std::string name = reading::read_string(*reported, at);
    if (name == "point") settings.reported_value = ReportedValue::point;
    else if (name == "conservative") settings.reported_value = ReportedValue::conservative;
    else throw validation::InvalidValue(at, "must be \"point\" or \"conservative\", not \"" + name + "\"");
  }
  if (const auto* overrides = reading::find_member(section, "wording_overrides")) {
    const auto at = where.with_field("wording_overrides");
    if (!overrides->is_array())
      throw validation::InvalidValue(at, "must be an array, not " + reading::json_type_name(*overrides));
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
      settings.wording_overrides.push_back(std::move(o));
    }
  }
  return settings;
}

}  // namespace counterpoise::reports
