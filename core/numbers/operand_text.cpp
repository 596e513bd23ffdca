#include "core/numbers/operand_text.hpp"

namespace counterpoise::numbers {

std::string operand_for_readers(const std::string& number_text) {
  // The operators number_text writes inside one number: " × " and " − " (U+00D7, U+2212).
  const bool calculation = number_text.find(" \u00d7 ") != std::string::npos ||
                           number_text.find(" \u2212 ") != std::string::npos;
  return calculation ? "(" + number_text + ")" : number_text;
}

}  // namespace counterpoise::numbers
