#pragma once
// Where a version to compare is, as a person names it (a command-line argument, the editor's
// Compare with…): an interchange JSON case, a case store (a .cpcase file or a shared-store
// address postgresql://…/DB?case=REF) for its current state, or STORE@N for sealed revision N
// of a store. One reader for the command line and the editor.

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>

#include "core/interchange/case_json.hpp"

namespace counterpoise::comparison {

struct VersionLocation {
  std::string location;                  // a JSON case, a .cpcase file or a database address
  std::optional<std::int64_t> revision;  // a sealed revision of that case store
};

// "STORE.cpcase@3" and "postgresql://…/DB?case=REF@3" name revision 3; a file that exists under
// the whole name is that file; in a database address only an @ after the case parameter names
// a revision (an @ before it is the user's). Throws validation::InvalidValue (item "version")
// when what follows the @ is not a whole number.
VersionLocation parse_version_location(const std::string& text);

struct LocatedCase {
  interchange::CaseReadResult read;  // the case, or every problem found reading it
  std::filesystem::path base_dir;    // relative data file names in the case are resolved here
};

// Reads the version at `where`: a store opened read-only (its checks apply; a revision must be
// sealed). Never throws for what it reads: every problem, the store's refusals included, is in
// read.diagnostics.
LocatedCase read_version_at(const VersionLocation& where);

}  // namespace counterpoise::comparison
