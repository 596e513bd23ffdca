#pragma once
// One of the two versions a comparison looks at: the case as read, the folder its relative data
// file names are resolved against, how the user named it, and the digest that identifies it.

#include <filesystem>
#include <string>

#include "core/casefile/case_model.hpp"

namespace counterpoise::comparison {

struct CaseVersion {
  casefile::Case value;
  std::filesystem::path base_dir;  // relative data file names in the case are resolved here
  std::string label;               // as the user named it: "case.json", "case.cpcase@2"
  std::string sha256;              // of the case's canonical JSON (interchange::canonical_text)
};

// The version of `value` read from `base_dir`, labelled `label`, with its digest computed.
// Throws validation::InvalidValue only when the case holds text that is not valid UTF-8.
CaseVersion make_version(casefile::Case value, std::filesystem::path base_dir, std::string label);

}  // namespace counterpoise::comparison
