#pragma once
// Shared helpers of the comparison tests: a case version from JSON text, and small invented
// Harwick Vale cases to change one member at a time.

#include <filesystem>
#include <stdexcept>
#include <string>

#include <nlohmann/json.hpp>

#include "core/comparison/case_version.hpp"
#include "core/interchange/case_json.hpp"

namespace comparison_test {

// The version of the case `document`, read as if it were a file in `base_dir`. Throws
// std::runtime_error with the reader's first problem when the document is not a valid case.
inline counterpoise::comparison::CaseVersion version_of(const nlohmann::json& document, const std::string& label,
                                                        const std::filesystem::path& base_dir = COUNTERPOISE_DEMO_DIR) {
  auto read = counterpoise::interchange::read_case(document, base_dir);
  if (!read.value) throw std::runtime_error(read.diagnostics.problems().front().text());
  return counterpoise::comparison::make_version(std::move(*read.value), base_dir, label);
}

inline counterpoise::comparison::CaseVersion demo_version(const std::string& file_name) {
  const auto path = std::filesystem::path(COUNTERPOISE_DEMO_DIR) / file_name;
  auto read = counterpoise::interchange::read_case_file(path);
  if (!read.value) throw std::runtime_error(read.diagnostics.problems().front().text());
  return counterpoise::comparison::make_version(std::move(*read.value), path.parent_path(), file_name);
}

// An invented case of three items: assigned probabilities (E1), a reported LR (E2) and a
// transfer item at activity level (T1), all numbers invented.
inline nlohmann::json three_item_case() {
  return nlohmann::json::parse(R"json({
    "format": "counterpoise.case", "version": 1,
    "case": {"reference": "VFL-2026-0900", "title": "Shed at Lark Row, Harwick Vale (invented)",
             "examiner": "Dr Imogen Thwaite"},
    "propositions": {"level": "activity",
                     "hp": "Mr Ellery Vance forced the door of the shed at Lark Row.",
                     "hd": "Mr Ellery Vance has never been to the shed at Lark Row.",
                     "conditioning_information": "The shed door was forced on 2 June 2026."},
    "items": [
      {"id": "E1", "title": "Paint on the crowbar", "model": "assigned",
       "p_given_hp": 0.8, "p_given_hd": 0.02},
      {"id": "E2", "title": "Tool mark on the door", "model": "reported-lr", "lr": 40},
      {"id": "T1", "title": "Fibres on the door frame", "model": "transfer", "found": "group", "n": 5,
       "t0": 0.1, "tn": 0.3, "p0": 0.6, "p1": 0.3, "sn": 0.2, "gamma": 0.05}
    ]
  })json");
}

}  // namespace comparison_test
