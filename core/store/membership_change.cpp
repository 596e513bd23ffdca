#include "core/store/membership_change.hpp"

#include "core/reading/json_text.hpp"
#include "core/store/audit_log.hpp"
#include "core/store/postgres_schema.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {

using nlohmann::json;

const validation::Location kWhere{"member", "role"};

[[noreturn]] void malformed(const std::string& why) {
  throw validation::InvalidValue(kWhere, "malformed membership row: " + why);
}

json role_value(const std::optional<std::string>& role) { return role ? json(*role) : json(nullptr); }

// A stored value as an object with exactly `members`.
json value_of(const AuditRow& row, const std::optional<std::string>& text, const char* which,
              std::initializer_list<const char*> members) {
  if (!text) malformed(std::string("no ") + which + " value");
  json value = reading::parse_json_text(*text, "audit row " + std::to_string(row.seq) + ", " + which + " value");
  if (!value.is_object() || value.size() != members.size()) malformed(std::string("the ") + which + " value is not the expected object");
  for (const char* name : members)
    if (!value.contains(name)) malformed(std::string("the ") + which + " value has no " + name);
  return value;
}

std::optional<std::string> role_of(const json& value, const char* which) {
  const json& role = value.at("role");
  if (role.is_null()) return std::nullopt;
  if (!role.is_string() || !is_member_role(role.get<std::string>()))
    malformed(std::string("the ") + which + " role is not examiner, reviewer, reader or null");
  return role.get<std::string>();
}

std::string string_of(const json& value, const char* name) {
  const json& member = value.at(name);
  if (!member.is_string() || member.get<std::string>().empty()) malformed(std::string(name) + " is not a non-empty string");
  return member.get<std::string>();
}

}  // namespace

bool is_member_role(const std::string& role) {
  return role == member_role::examiner || role == member_role::reviewer || role == member_role::reader;
}

json membership_old_value(const MembershipChange& change) {
  return {{"member", change.member}, {"role", role_value(change.old_role)}};
}

json membership_new_value(const MembershipChange& change) {
  return {{"member", change.member}, {"os_account", change.os_account}, {"role", role_value(change.new_role)}};
}

MembershipChange membership_change_of(const AuditRow& row) {
  const json before = value_of(row, row.old_value, "old", {"member", "role"});
  const json after = value_of(row, row.new_value, "new", {"member", "os_account", "role"});
  MembershipChange change{string_of(after, "member"), role_of(before, "old"), role_of(after, "new"),
                          string_of(after, "os_account")};
  if (string_of(before, "member") != change.member) malformed("the old and new values name different members");
  if (change.old_role == change.new_role) malformed("the role does not change");
  return change;
}

}  // namespace counterpoise::store
