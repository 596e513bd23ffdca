#pragma once
// Reading untrusted JSON text with bounds: a size limit, a nesting limit, a limit on the number of
// values and on the length of one string, all checked on nlohmann::json's parse events as the
// document is built (the parse stops at the first excess), so hostile input costs time and memory
// in proportion to its size. Numbers must be finite and must not underflow to zero (1e-400 is
// refused, not read as 0); text must be valid UTF-8 (RFC 8259, section 8.1); a member name may
// appear once per object. Errors name the line and column.

#include <cstddef>
#include <filesystem>
#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

namespace counterpoise::reading {

// The bounds of one document. The defaults are the documented limits of a case file
// (docs/case-store.md, "Limits for imported JSON").
struct JsonLimits {
  std::size_t max_bytes = 16u << 20;        // 16 MiB of text
  std::size_t max_depth = 64;               // nested arrays/objects
  std::size_t max_values = 1'000'000;       // scalars, arrays and objects together
  std::size_t max_string_bytes = 1u << 20;  // one string or member name: 1 MiB
};

// The document parsed from `text`. `source` names the file in messages. Throws
// validation::InvalidValue for a syntax error, invalid UTF-8, a number that overflows to infinity
// or underflows to zero, a repeated member name or a limit exceeded, each naming the line and
// column where it was found; for a number or a text, the error's Location names the item and
// field too (in a case file "items[2].p_given_hp" is the third item, by its id once read, field
// p_given_hp; elsewhere the path from the root).
nlohmann::json parse_json_text(std::string_view text, const std::string& source,
                               const JsonLimits& limits = {});

// parse_json_text of a file's content; the size limit is checked before the file is read.
// Throws validation::FileError when the file cannot be read or is too large.
nlohmann::json read_json_file(const std::filesystem::path& path, const JsonLimits& limits = {});

}  // namespace counterpoise::reading
