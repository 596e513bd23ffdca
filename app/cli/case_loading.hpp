#pragma once
// Loading a case for a command: the file is read and checked; problems are printed to `err`.

#include <iosfwd>
#include <optional>
#include <string>

#include "core/casefile/case_model.hpp"
#include "core/interchange/case_json.hpp"

namespace counterpoise::cli {

// Reads a case file (interchange JSON or case store) with every problem listed.
interchange::CaseReadResult read_case_argument(const std::string& path);

// Prints each problem on its own line: "PATH: item E1, field p_given_hp: ...".
void print_problems(const std::string& path, const validation::Diagnostics& diagnostics, std::ostream& err);

}  // namespace counterpoise::cli
