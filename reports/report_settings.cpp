#include "reports/report_settings.hpp"

#include "core/guard/wording_overrides.hpp"
#include "core/reading/json_fields.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::reports {

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
  settings.wording_overrides = guard::read_wording_overrides(value);
  return settings;
}

}  // namespace counterpoise::reports
