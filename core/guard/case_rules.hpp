#pragma once
// A case's own wording rules. A laboratory keeps its additions to the shipped rules in a rule
// file (docs/reasoning-guard.md, "How a lab extends the rules"); the case's `guard` section
// names the files that apply to it, loaded after the shipped rules in the order given, so that
// every check of the case — the warnings of evaluate and validate, the editor, the report's
// wording check — uses the same rules:
//
//   "guard": { "rules": ["lab-wording.json"] }
//
// Paths are relative to the case file. The files are read with the case, so the rules a report
// was checked with are the bytes whose digest it prints.

#include <filesystem>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/casefile/case_model.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/models/data_file.hpp"

namespace counterpoise::guard {

// Reads the `guard` section: its only member is `rules`, a file name or a list of them. Throws
// validation::InvalidValue (item "guard", field "rules" or "rules[i]") for another member, a
// name that is not a non-empty string or is given twice; validation::FileError (field
// "rules[i]") when a file cannot be read.
std::vector<models::DataFile> read_guard_section(const nlohmann::json& section, const std::filesystem::path& base_dir);

// The shipped rules with the case's rule files added in order. Throws what load_default throws,
// and validation::InvalidValue (item "guard", field "rules[i]") when a case's rule file is not a
// valid rule file, with the rule file's own message.
WordingChecker checker_for_case(const casefile::Case& value);
// The same for rule files given directly (the editor holds them apart from a read case).
WordingChecker checker_with_rule_files(const std::vector<models::DataFile>& files);

// What identifies a set of rule files (their names and digests in order), so a checker built
// from them can be kept until one of them changes.
std::string rule_files_key(const std::vector<models::DataFile>& files);

// How a report names the rules it was checked with: "the reasoning guard's shipped rules (N
// rules)", or with the laboratory's files named with their SHA-256; and, when the checker has a
// learned reading, that the case's own texts were read by it too (its size and file digest).
std::string rules_description(const WordingChecker& checker, const std::vector<models::DataFile>& files);

}  // namespace counterpoise::guard
