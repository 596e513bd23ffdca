#pragma once
// The one error idiom of core: every check at the boundary throws one of these, and every
// message is formatted by describe() so it always names the item and the field.

#include <stdexcept>
#include <string>
#include <vector>

namespace counterpoise::validation {

// Where a value came from: the item (or section) and the field inside it.
// Either part may be empty; describe() then leaves it out.
struct Location {
  std::string item;   // e.g. "E1", "propositions", "priors"
  std::string field;  // e.g. "p_given_hp", "p_given_hd.counts.k"

  Location with_field(const std::string& sub) const;  // appends ".sub" to the field
};

// "item E1, field p_given_hp: <message>" — the single formatter for all core messages. The item
// and field are shown with display_text, the message with display_lines (display_text.hpp), so
// no message carries a raw control character or invalid UTF-8 from a file.
std::string describe(const Location& where, const std::string& message);

// Base of every error that core reports to the user.
class Error : public std::runtime_error {
 public:
  Error(Location where, std::string message);
  const Location& where() const noexcept { return where_; }
  const std::string& bare_message() const noexcept { return message_; }

 private:
  Location where_;
  std::string message_;
};

// A value that is out of range, of the wrong type, missing, or contradicts another value.
class InvalidValue : public Error {
 public:
  using Error::Error;
};

// Sizes that must agree do not (vectors of different lengths, CPT rows of the wrong width).
class InconsistentSizes : public Error {
 public:
  using Error::Error;
};

// A file whose format name or version this program does not read.
class UnsupportedFormat : public Error {
 public:
  using Error::Error;
};

// An input/output failure (file missing, unreadable, disk full) with the path in the message.
class FileError : public Error {
 public:
  using Error::Error;
};

// One problem found while reading a case; validate lists all of them.
struct Problem {
  Location where;
  std::string message;
  std::string text() const { return describe(where, message); }
};

// Collects problems so a reader can go on after the first one. A reader that can only
// report one problem throws; a reader that can go on records and continues.
class Diagnostics {
 public:
  void add(const Error& error);
  void add(Location where, std::string message);
  bool empty() const noexcept { return problems_.empty(); }
  const std::vector<Problem>& problems() const noexcept { return problems_; }

 private:
  std::vector<Problem> problems_;
};

}  // namespace counterpoise::validation
