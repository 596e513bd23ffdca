#pragma once
// The address of a case kept in a PostgreSQL database (docs/case-store.md, "The shared store"):
//   postgresql://[user@][host][:port]/DATABASE?case=REFERENCE[&other libpq parameters]
// Everything but the `case` parameter is given to libpq as it is, so the usual PG environment
// variables, the service file (?service=NAME) and the password file fill in what the address
// leaves out. A password is never taken from the address: it would end up in shell histories,
// process lists and logs; libpq reads it from the password file (~/.pgpass or PGPASSFILE).

#include <string>
#include <string_view>

namespace counterpoise::store {

struct DatabaseCase {
  // What libpq is given: the address without its case parameter (a URI, or "" for the
  // environment's settings alone).
  std::string connection;
  // The case's reference in the store (1..200 bytes of UTF-8 without control characters).
  std::string reference;
  // How messages name the case: the address without a password (it never has one).
  std::string label() const;
};

// True when `text` is a PostgreSQL address (starts with postgresql:// or postgres://) rather
// than a file name.
bool is_database_address(std::string_view text);

// Reads an address as above. Throws validation::InvalidValue (item "address") when it is not a
// PostgreSQL address, names no case or the case twice, holds a password (in the user part or as
// a parameter; the message does not repeat the address), or the reference is not a valid one.
DatabaseCase parse_database_address(std::string_view text);

// The connection part of an address that names a database but no case (for setting up the
// store): the address as libpq takes it. Throws validation::InvalidValue as
// parse_database_address does for a password, and for an address that names a case.
std::string parse_database_connection(std::string_view text);

// Throws validation::InvalidValue (item "case", field "reference") unless `reference` is a valid
// case reference: 1..200 bytes of valid UTF-8 without control characters.
void check_case_reference(std::string_view reference);

}  // namespace counterpoise::store
