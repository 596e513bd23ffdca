#pragma once
// JSON results on standard output: indented, with every string safe for a terminal and the
// whole still valid JSON (validation::display_json).

#include <iosfwd>
#include <string>

#include <nlohmann/json.hpp>

namespace counterpoise::cli {

// `value` as JSON text indented by `indent` spaces (-1: on one line), safe for a terminal and still
// valid JSON. Strings that are not valid UTF-8 (a file name given as an argument) are written with
// U+FFFD in place of each bad byte. For a document written piece by piece (check-wording --json).
std::string json_text(const nlohmann::json& value, int indent = -1);

// Writes `document` indented by two spaces and a line end, as json_text makes it.
void print_json(std::ostream& out, const nlohmann::json& document);

}  // namespace counterpoise::cli
