#pragma once
// JSON results on standard output: indented, with every string safe for a terminal and the
// whole still valid JSON (validation::display_json).

#include <iosfwd>

#include <nlohmann/json.hpp>

namespace counterpoise::cli {

// Writes `document` indented by two spaces and a line end. Strings that are not valid UTF-8 (a
// file name given as an argument) are written with U+FFFD in place of each bad byte.
void print_json(std::ostream& out, const nlohmann::json& document);

}  // namespace counterpoise::cli
