#pragma once
// Typed reads from nlohmann::json with the one error idiom: each throws validation::InvalidValue
// naming the item and field when the value is missing, of the wrong type, or out of range.
// No reader converts between types (a string "0.5" is not a number) or clamps.

#include <cstdint>
#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

using nlohmann::json;
using validation::Location;

// "number", "string", "object", ... for messages.
std::string json_type_name(const json& value);

// Throws unless `value` is an object.
void require_object(const json& value, const Location& where);
// The member `key` of object `object`; throws "missing field" naming `where.with_field(key)`.
const json& require_member(const json& object, std::string_view key, const Location& where);
// Pointer to the member or nullptr when absent (null counts as absent).
const json* find_member(const json& object, std::string_view key);
// Throws naming the first member of `object` not in `allowed` (catches misspelt fields).
void check_known_members(const json& object, std::initializer_list<std::string_view> allowed,
                         const Location& where);

// A finite JSON number (integers accepted). Throws for other types and for values that
// overflowed to infinity when the text was parsed.
double read_number(const json& value, const Location& where);
// A whole, non-negative number within int64 (e.g. counts).
std::int64_t read_count(const json& value, const Location& where);
std::string read_string(const json& value, const Location& where);
bool read_bool(const json& value, const Location& where);
std::vector<double> read_number_array(const json& value, const Location& where);
std::vector<std::string> read_string_array(const json& value, const Location& where);

// Optional members: the default when absent.
std::string read_string_or(const json& object, std::string_view key, const Location& where,
                           std::string fallback = {});
std::optional<double> read_optional_number(const json& object, std::string_view key,
                                           const Location& where);

}  // namespace counterpoise::reading
