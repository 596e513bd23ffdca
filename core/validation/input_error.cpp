#include "core/validation/input_error.hpp"

#include "core/validation/display_text.hpp"

namespace counterpoise::validation {

Location Location::with_field(const std::string& sub) const {
  return Location{item, field.empty() ? sub : field + "." + sub};
}

std::string describe(const Location& where, const std::string& message) {
  // Item ids, field names and values quoted in messages can come from a hostile file: every
  // message leaves here with its control characters and invalid bytes escaped (display_text.hpp).
  std::string text;
  if (!where.item.empty()) text += "item " + display_text(where.item);
  if (!where.field.empty()) text += (text.empty() ? "field " : ", field ") + display_text(where.field);
  return text.empty() ? display_lines(message) : text + ": " + display_lines(message);
}

Error::Error(Location where, std::string message)
    : std::runtime_error(describe(where, message)),
      where_(std::move(where)),
      message_(std::move(message)) {}

void Diagnostics::add(const Error& error) { problems_.push_back({error.where(), error.bare_message()}); }

void Diagnostics::add(Location where, std::string message) {
  problems_.push_back({std::move(where), std::move(message)});
}

}  // namespace counterpoise::validation
