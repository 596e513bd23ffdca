#pragma once
// Reading untrusted JSON text with bounds: a size limit, a nesting limit and a limit on the
// number of values, checked on nlohmann::json's parse events as the document is built (the
// parse stops at the first excess), so hostile input costs bounded time and memory. Numbers must be
// finite; text must be valid UTF-8 (RFC 8259, section 8.1). Errors name the line and column.

#include <cstddef>
#include <filesystem>
#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

namespace counterpoise::reading {

struct JsonLimits {
  std::size_t max_bytes = 16u << 20;   // 16 MiB of text
  std::size_t max_depth = 64;          // nested arrays/objects
  std::size_t max_values = 1'000'000;  // scalars, arrays and objects together
};

// The document parsed from `text`. `source` names the file in messages. Throws
// validation::InvalidValue for a syntax error, invalid UTF-8, a non-finite number, a duplicate
// member name or a limit exceeded, each naming the line and column where it was found.
nlohmann::json parse_json_text(std::string_view text, const std::string& source,
                               const JsonLimits& limits = {});

// parse_json_text of a file's content; the size limit is checked before the file is read.
// Throws validation::FileError when the file cannot be read or is too large.
nlohmann::json read_json_file(const std::filesystem::path& path, const JsonLimits& limits = {});

}  // namespace counterpoise::reading
