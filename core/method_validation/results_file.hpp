#pragma once
// Reading a method's validation results: one row per comparison with its ground truth and what
// the method gave (an LR, a log10 LR, or a raw score to be calibrated), optionally a condition
// (e.g. DNA quantity, instrument) to break the results down by.
//
// CSV (RFC 4180, through reading::parse_csv) with a header row naming the columns:
//   truth        "hp" (Hp true, e.g. same source) or "hd" (Hd true), any letter case — required
//   lr | log10_lr | score   exactly one of the three
//   condition    optional text
// JSON: {"results": [{"truth": "hp", "log10_lr": 2.1, "condition": "..."}, ...]} with the same names.
// An LR must be positive ("inf" is read as an explicit infinite LR); a log10 LR is a finite
// number, "inf" or "-inf" (LR 0, stated explicitly); a score is finite. Everything else is an
// error naming the row (CSV line, or results[i] in JSON) and the column.

#include <filesystem>
#include <map>
#include <string>
#include <string_view>

#include "core/method_validation/validation_set.hpp"

namespace counterpoise::method_validation {

enum class ResultValue { lr, log10_lr, score };
std::string_view result_value_name(ResultValue v);  // "lr", "log10_lr", "score"

struct ResultsTable {
  std::string source;  // file name for messages and the report
  ResultValue value = ResultValue::log10_lr;
  // Values as log10 LRs (lr and log10_lr columns) or raw scores (score column).
  ValidationSet all;
  std::map<std::string, ValidationSet> by_condition;  // empty without a condition column
};

// Parses CSV text. Throws validation::InvalidValue naming `source`, the line and the column.
ResultsTable parse_results_csv(std::string_view text, const std::string& source);
// Parses the JSON form. Throws validation::InvalidValue naming results[i] and the field.
ResultsTable parse_results_json(std::string_view text, const std::string& source);
// Reads a results file: JSON when the name ends in .json, CSV otherwise. Throws
// validation::FileError when it cannot be read, and as the parsers.
ResultsTable read_results_file(const std::filesystem::path& path);

}  // namespace counterpoise::method_validation
