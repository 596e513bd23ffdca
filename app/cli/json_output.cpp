#include "app/cli/json_output.hpp"

#include <ostream>

#include "core/validation/display_text.hpp"

namespace counterpoise::cli {

void print_json(std::ostream& out, const nlohmann::json& document) {
  out << validation::display_json(document.dump(2, ' ', false, nlohmann::json::error_handler_t::replace)) << "\n";
}

}  // namespace counterpoise::cli
