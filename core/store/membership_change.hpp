#pragma once
// A change of who is a member of a case in the shared store, and in which role: one `member`
// audit row in the case's chain (docs/case-store.md, "Membership changes"). The row's examiner
// column holds the declared name and its account column the database role that made the change;
// the values say what changed:
//   old = {"member": M, "role": R or null}                       (null: M was not a member)
//   new = {"member": M, "os_account": A, "role": R' or null}     (null: M is no longer one)
// where A is the operating-system account the program ran under. In the database, inserting the
// row is what changes the members table (a trigger), so no membership changes without its row.

#include <optional>
#include <string>

#include <nlohmann/json.hpp>

namespace counterpoise::store {

struct AuditRow;

struct MembershipChange {
  std::string member;                   // the database role whose membership changes
  std::optional<std::string> old_role;  // nullopt: was not a member
  std::optional<std::string> new_role;  // nullopt: is no longer a member
  std::string os_account;               // of whoever made the change
};

// True for "examiner", "reviewer" and "reader" (member_role in postgres_schema.hpp).
bool is_member_role(const std::string& role);

// The stored old and new values of a change (canonical JSON objects as above).
nlohmann::json membership_old_value(const MembershipChange& change);
nlohmann::json membership_new_value(const MembershipChange& change);

// The change a `member` row records. Throws validation::InvalidValue when the row is malformed:
// a value missing or not an object of exactly the members above, the two naming different or
// empty members, a role that is not a member role, no change of role, or an empty account.
MembershipChange membership_change_of(const AuditRow& row);

}  // namespace counterpoise::store
