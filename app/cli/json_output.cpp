#include "app/cli/json_output.hpp"

#include <ostream>

#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

std::string json_text(const nlohmann::json& value, int indent) {
  return validation::display_json(value.dump(indent, ' ', false, nlohmann::json::error_handler_t::replace));
}

void print_json(std::ostream& out, const nlohmann::json& document) { out << json_text(document, 2) << "\n"; }

}  // namespace counterpoise::cli
