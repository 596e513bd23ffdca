#pragma once
// Canonical JSON text: the byte form that the case store hashes and compares.
// Object members sorted by key (byte order of their UTF-8 text), no insignificant white space,
// numbers in the shortest text that reads back to the same double (integers as integers),
// strings as UTF-8 with only the escapes JSON requires (RFC 8259, section 7).
// It is interchange::canonical_text with a finiteness check first (kept as the store's entry point).

#include <string>

#include <nlohmann/json.hpp>

namespace counterpoise::store {

// The canonical text of `document`. Throws validation::InvalidValue when a string is not valid
// UTF-8 or a number is not finite (neither has a canonical JSON form).
std::string canonical_text(const nlohmann::json& document);

}  // namespace counterpoise::store
