#include "core/store/database_case.hpp"

#include <optional>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/store/canonical_json.hpp"
#include "core/validation/display_text.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using validation::InvalidValue;

namespace {

constexpr std::string_view kSchemes[] = {"postgresql://", "postgres://"};
constexpr std::size_t kMaxReferenceBytes = 200;

std::optional<int> hex_digit(char c) {
  if (c >= '0' && c <= '9') return c - '0';
  if (c >= 'a' && c <= 'f') return c - 'a' + 10;
  if (c >= 'A' && c <= 'F') return c - 'A' + 10;
  return std::nullopt;
}

// RFC 3986 percent-decoding, as libpq decodes the other parts of the URI.
std::string percent_decoded(std::string_view text) {
  std::string out;
  for (std::size_t i = 0; i < text.size(); ++i) {
    if (text[i] == '%') {
      const auto high = i + 2 < text.size() ? hex_digit(text[i + 1]) : std::nullopt;
      const auto low = i + 2 < text.size() ? hex_digit(text[i + 2]) : std::nullopt;
      if (!high || !low)
        throw InvalidValue({"address", "case"},
                           "a '%' in the case reference is not followed by "
                           "two hexadecimal digits");
      out += static_cast<char>(*high * 16 + *low);
      i += 2;
    } else {
      out += text[i];
    }
  }
  return out;
}

bool is_control(unsigned char c) { return c < 0x20 || c == 0x7f; }

}  // namespace

bool is_database_address(std::string_view text) {
  for (std::string_view scheme : kSchemes)
    if (text.substr(0, scheme.size()) == scheme) return true;
  return false;
}

void check_case_reference(std::string_view reference) {
  const validation::Location where{"case", "reference"};
  if (reference.empty()) throw InvalidValue(where, "the case reference is empty");
  if (reference.size() > kMaxReferenceBytes)
    throw InvalidValue(where, "the case reference is longer than " +
                                  std::to_string(kMaxReferenceBytes) + " bytes");
  try {
    canonical_text(nlohmann::json(std::string(reference)));  // refuses invalid UTF-8
  } catch (const validation::Error&) {
    throw InvalidValue(where, "the case reference is not valid UTF-8");
  }
  for (unsigned char c : reference)
    if (is_control(c)) throw InvalidValue(where, "the case reference holds a control character");
}

namespace {

struct ParsedAddress {
  std::string connection;
  std::optional<std::string> reference;
};

ParsedAddress parse_address(std::string_view text) {
  const validation::Location where{"address", {}};
  if (!is_database_address(text))
    throw InvalidValue(where, "a database address starts with postgresql:// or postgres://");
  const std::size_t scheme_end = text.find("://") + 3;
  const std::size_t query_start = text.find('?');
  const std::string_view before_query = text.substr(0, query_start);
  // The authority runs to the first '/' after the scheme; a ':' in its user part (before '@')
  // would introduce a password.
  const std::string_view authority =
      before_query.substr(scheme_end, before_query.find('/', scheme_end) - scheme_end);
  const std::size_t at = authority.rfind('@');
  if (at != std::string_view::npos && authority.substr(0, at).find(':') != std::string_view::npos)
    throw InvalidValue(where,
                       "the database address holds a password; give it in the password file "
                       "(~/.pgpass or PGPASSFILE) or a service file instead, never in the address");
  ParsedAddress result;
  result.connection = std::string(before_query);
  std::vector<std::string> kept;
  std::optional<std::string> reference;
  if (query_start != std::string_view::npos) {
    std::string_view query = text.substr(query_start + 1);
    while (true) {
      const std::size_t amp = query.find('&');
      const std::string_view pair = query.substr(0, amp);
      const std::string_view key = pair.substr(0, pair.find('='));
      if (key == "password")
        throw InvalidValue(where,
                           "the database address holds a password parameter; give the "
                           "password in the password file (~/.pgpass or PGPASSFILE) or a "
                           "service file instead, never in the address");
      if (key == "case") {
        if (reference)
          throw InvalidValue(where.with_field("case"), "the address names the case twice");
        reference = percent_decoded(pair.substr(std::min(pair.size(), key.size() + 1)));
      } else if (!pair.empty()) {
        kept.emplace_back(pair);
      }
      if (amp == std::string_view::npos) break;
      query = query.substr(amp + 1);
    }
  }
  result.reference = std::move(reference);
  for (std::size_t i = 0; i < kept.size(); ++i) result.connection += (i == 0 ? "?" : "&") + kept[i];
  return result;
}

}  // namespace

DatabaseCase parse_database_address(std::string_view text) {
  ParsedAddress parsed = parse_address(text);
  if (!parsed.reference)
    throw InvalidValue({"address", "case"},
                       "the database address names no case: add ?case=REFERENCE");
  check_case_reference(*parsed.reference);
  return {std::move(parsed.connection), std::move(*parsed.reference)};
}

std::string parse_database_connection(std::string_view text) {
  ParsedAddress parsed = parse_address(text);
  if (parsed.reference)
    throw InvalidValue({"address", "case"},
                       "this command sets up a whole database: give its address without ?case=");
  return parsed.connection;
}

std::string DatabaseCase::label() const {
  return (connection.empty() ? std::string("the database of the PG environment") : connection) +
         " (case " + validation::display_text(reference) + ")";
}

}  // namespace counterpoise::store
