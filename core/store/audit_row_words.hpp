#pragma once
// An audit row as a person reads it in a history: who, what was done, to what, and the values
// before and after. Changes to the case name their field in words (casefile/field_names); rows
// that record something about the case without changing it (a review note, a declared reviewer,
// a seal, a change of membership) are told in words instead of their stored JSON.

#include <string>

#include "core/store/audit_log.hpp"

namespace counterpoise::store {

struct AuditRowWords {
  std::string who;        // the declared name; a review note's says it is the reviewer's
  std::string action;     // "changed", "reviewed", "sealed", "added a member", ...
  std::string place;      // "P(E|Hp) of E4", "sealed revision 2", "member cp_opryce", ...
  std::string old_value;  // empty when the row has none
  std::string new_value;
};

// The words for `row`. A stored value is shown as its JSON text for a change to the case; a
// record row whose value does not read as the program writes it is shown as stored (verify names
// what is wrong with it). Never throws on a row's content.
AuditRowWords audit_row_words(const AuditRow& row);

}  // namespace counterpoise::store
