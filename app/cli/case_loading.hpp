#pragma once
// Loading a case for a command: the file is read and checked; problems are printed to `err`.

#include <iosfwd>
#include <optional>
#include <string>
#include <string_view>

#include "app/cli/cli_command.hpp"
#include "core/casefile/case_model.hpp"
#include "core/interchange/case_json.hpp"

namespace counterpoise::cli {

// The option that lets a case read data files outside its folder and the laboratory data folders
// for one run (reading::DataAccess).
inline constexpr std::string_view kAllowDataOutside = "--allow-data-outside";

// Where the files a case in `case_folder` names may be read from: the default rules, or every file
// when `arguments` has kAllowDataOutside.
reading::DataAccess data_access_for(const std::filesystem::path& case_folder, const ParsedArguments& arguments);

// Reads a case file (interchange JSON or case store) with every problem listed; the files it names
// are read as data_access_for allows.
interchange::CaseReadResult read_case_argument(const std::string& path, const ParsedArguments& arguments);

// Prints each problem on its own line: "PATH: item E1, field p_given_hp: ...".
void print_problems(const std::string& path, const validation::Diagnostics& diagnostics, std::ostream& err);

}  // namespace counterpoise::cli
