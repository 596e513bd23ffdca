#include "core/reading/json_fields.hpp"

#include <cmath>
#include <limits>

#include "core/numbers/number_text.hpp"

namespace counterpoise::reading {

using validation::InvalidValue;

std::string json_type_name(const json& value) {
  if (value.is_number()) return "number";
  return value.type_name();
}

void require_object(const json& value, const Location& where) {
  if (!value.is_object())
    throw InvalidValue(where, "expected an object, found " + json_type_name(value));
}

const json& require_member(const json& object, std::string_view key, const Location& where) {
  require_object(object, where);
  auto it = object.find(key);
  if (it == object.end() || it->is_null())
    throw InvalidValue(where.with_field(std::string(key)), "missing field");
  return *it;
}

const json* find_member(const json& object, std::string_view key) {
  if (!object.is_object()) return nullptr;
  auto it = object.find(key);
  if (it == object.end() || it->is_null()) return nullptr;
  return &*it;
}

void check_known_members(const json& object, std::initializer_list<std::string_view> allowed,
                         const Location& where) {
  require_object(object, where);
  for (auto it = object.begin(); it != object.end(); ++it) {
    bool known = false;
    for (auto name : allowed) known = known || it.key() == name;
    if (!known) {
      std::string list;
      for (auto name : allowed) list += (list.empty() ? "" : ", ") + std::string(name);
      throw InvalidValue(where.with_field(it.key()), "unknown field (expected one of: " + list + ")");
    }
  }
}

double read_number(const json& value, const Location& where) {
  if (!value.is_number())
    throw InvalidValue(where, "expected a number, found " + json_type_name(value));
  const double x = value.get<double>();
  if (std::isnan(x)) throw InvalidValue(where, "value is NaN (not a number)");
  if (std::isinf(x)) throw InvalidValue(where, "number is too large to represent (overflows to infinity)");
  return x;
}

std::int64_t read_count(const json& value, const Location& where) {
  if (value.is_number_unsigned()) {
    const auto u = value.get<std::uint64_t>();
    if (u > static_cast<std::uint64_t>(std::numeric_limits<std::int64_t>::max()))
      throw InvalidValue(where, "count is too large");
    return static_cast<std::int64_t>(u);
  }
  if (value.is_number_integer()) {
    const auto i = value.get<std::int64_t>();
    if (i < 0) throw InvalidValue(where, "count " + std::to_string(i) + " must not be negative");
    return i;
  }
  if (value.is_number_float()) {
    const double x = value.get<double>();
    if (x < 0) throw InvalidValue(where, "count " + numbers::exact_text(x) + " must not be negative");
    throw InvalidValue(where, "count " + numbers::exact_text(x) + " must be a whole number");
  }
  throw InvalidValue(where, "expected a whole number, found " + json_type_name(value));
}

std::string read_string(const json& value, const Location& where) {
  if (!value.is_string()) throw InvalidValue(where, "expected a string, found " + json_type_name(value));
  return value.get<std::string>();
}

bool read_bool(const json& value, const Location& where) {
  if (!value.is_boolean()) throw InvalidValue(where, "expected true or false, found " + json_type_name(value));
  return value.get<bool>();
}

std::vector<double> read_number_array(const json& value, const Location& where) {
  if (!value.is_array()) throw InvalidValue(where, "expected an array of numbers, found " + json_type_name(value));
  std::vector<double> out;
  out.reserve(value.size());
  for (std::size_t i = 0; i < value.size(); ++i)
    out.push_back(read_number(value[i], Location{where.item, where.field + "[" + std::to_string(i) + "]"}));
  return out;
}

std::vector<std::string> read_string_array(const json& value, const Location& where) {
  if (!value.is_array()) throw InvalidValue(where, "expected an array of strings, found " + json_type_name(value));
  std::vector<std::string> out;
  for (std::size_t i = 0; i < value.size(); ++i)
    out.push_back(read_string(value[i], Location{where.item, where.field + "[" + std::to_string(i) + "]"}));
  return out;
}

std::string read_string_or(const json& object, std::string_view key, const Location& where,
                           std::string fallback) {
  const json* member = find_member(object, key);
  return member ? read_string(*member, where.with_field(std::string(key))) : fallback;
}

std::optional<double> read_optional_number(const json& object, std::string_view key,
                                           const Location& where) {
  const json* member = find_member(object, key);
  if (!member) return std::nullopt;
  return read_number(*member, where.with_field(std::string(key)));
}

}  // namespace counterpoise::reading
