#include "core/validation/input_error.hpp"

namespace counterpoise::validation {

Location Location::with_field(const std::string& sub) const {
  return Location{item, field.empty() ? sub : field + "." + sub};
}

std::string describe(const Location& where, const std::string& message) {
  std::string text;
  if (!where.item.empty()) text += "item " + where.item;
  if (!where.field.empty()) text += (text.empty() ? "field " : ", field ") + where.field;
  return text.empty() ? message : text + ": " + message;
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
