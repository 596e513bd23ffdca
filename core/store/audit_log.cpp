#include "core/store/audit_log.hpp"

#include <chrono>
#include <cstdio>
#include <ctime>

#include "core/platform/sha256.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/membership_change.hpp"
#include "core/store/review_note.hpp"
#include "core/store/seal_statement.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using nlohmann::json;
using validation::InvalidValue;

namespace {

// A JSON string as canonical_text writes it (nlohmann::json's escaping with ensure_ascii off:
// the two-character escapes for " \\ \b \f \n \r \t, \u00xx for other control characters,
// everything else as is).
std::string json_string_text(const std::string& value) {
  std::string out;
  out.reserve(value.size() + 2);
  out += '"';
  for (const char c : value) {
    switch (c) {
      case '"':
        out += "\\\"";
        break;
      case '\\':
        out += "\\\\";
        break;
      case '\b':
        out += "\\b";
        break;
      case '\f':
        out += "\\f";
        break;
      case '\n':
        out += "\\n";
        break;
      case '\r':
        out += "\\r";
        break;
      case '\t':
        out += "\\t";
        break;
      default:
        if (static_cast<unsigned char>(c) < 0x20) {
          char buffer[8];
          std::snprintf(buffer, sizeof buffer, "\\u%04x", static_cast<unsigned>(c));
          out += buffer;
        } else {
          out += c;
        }
    }
  }
  out += '"';
  return out;
}

}  // namespace

std::string audit_row_hash(const AuditRow& row) {
  // Byte for byte canonical_text() of the object in the header comment (members in sorted
  // order), written directly because verify hashes every row.
  std::string text;
  text.reserve(256 + row.old_value.value_or("").size() + row.new_value.value_or("").size());
  const auto member = [&](const char* name, const std::string& value) {
    text += text.empty() ? "{\"" : ",\"";
    text += name;
    text += "\":";
    text += value;
  };
  const auto string = [](const std::string& value) { return json_string_text(value); };
  const auto text_or_null = [&](const std::optional<std::string>& v) {
    return v ? string(*v) : std::string("null");
  };
  if (row.account) member("account", string(*row.account));
  member("action", string(row.action));
  member("at", string(row.at));
  member("entity", string(row.entity));
  member("examiner", string(row.examiner));
  member("field", string(row.field));
  member("key", string(row.key));
  member("new", text_or_null(row.new_value));
  member("old", text_or_null(row.old_value));
  member("prev", string(row.prev_hash));
  member("revision", std::to_string(row.revision));
  member("seq", std::to_string(row.seq));
  text += "}";
  return platform::sha256_hex(text);
}

std::string state_text(const CaseState& state) { return canonical_text(state.to_document()); }

bool is_annotation(const std::string& name) {
  return name == action::upgrade_format || name == action::declare_reviewer ||
         name == action::review || name == action::change_member;
}

std::optional<std::string> case_examiner(const CaseState& state) {
  const auto section = state.sections().find("case");
  if (section == state.sections().end() || !section->second.is_object()) return std::nullopt;
  const auto name = section->second.find("examiner");
  if (name == section->second.end() || !name->is_string()) return std::nullopt;
  std::string text = name->get<std::string>();
  const auto first = text.find_first_not_of(" \t\r\n");
  if (first == std::string::npos) return std::nullopt;
  text = text.substr(first, text.find_last_not_of(" \t\r\n") - first + 1);
  return text;
}

std::string utc_timestamp_now() {
  using namespace std::chrono;
  const auto now = system_clock::now();
  const auto millis = duration_cast<milliseconds>(now.time_since_epoch()).count() % 1000;
  const std::time_t seconds = system_clock::to_time_t(now);
  std::tm utc{};
  gmtime_r(&seconds, &utc);
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%04d-%02d-%02dT%02d:%02d:%02d.%03dZ", utc.tm_year + 1900,
                utc.tm_mon + 1, utc.tm_mday, utc.tm_hour, utc.tm_min, utc.tm_sec,
                static_cast<int>(millis));
  return buffer;
}

namespace {

[[noreturn]] void misfit(const std::string& why) { throw InvalidValue({}, why); }

// A stored value: must be JSON in canonical form (the hash covers the text, replay the value).
std::optional<json> stored_value(const std::optional<std::string>& text, const char* which) {
  if (!text) return std::nullopt;
  json value;
  try {
    value = reading::parse_json_text(*text, std::string(which) + " value");
  } catch (const validation::Error& e) {
    misfit(std::string("the ") + which + " value is not valid JSON: " + e.what());
  }
  if (canonical_text(value) != *text)
    misfit(std::string("the ") + which + " value is not in canonical form");
  return value;
}

std::string text_of(const std::optional<json>& value) {
  return value ? canonical_text(*value) : "(absent)";
}

EntityRef entity_of(const AuditRow& row) {
  if (row.entity == "section") return EntityRef::section(row.key);
  if (row.entity == "item") return EntityRef::item(row.key);
  misfit("unknown entity \"" + row.entity + "\" for action " + row.action);
}

std::size_t position_of(const json& value) {
  if (!value.is_number_unsigned()) misfit("a position must be a whole number");
  return value.get<std::size_t>();
}

}  // namespace

void AuditReplay::apply(const AuditRow& row) {
  // A set row's old value is compared as text with the canonical text of the state: that checks
  // the fit and the canonical form at once, without parsing it.
  const bool is_set = row.action == action::set_field;
  const auto old_value = is_set ? std::nullopt : stored_value(row.old_value, "old");
  const auto new_value = stored_value(row.new_value, "new");
  const bool first = rows_ == 0;
  if (first != (row.action == action::import_case))
    misfit(first ? "the first row must be the import of the case"
                 : "a case can be imported only once");
  if (row.account) {
    if (row.account->empty()) misfit("the row records an empty operating-system account");
    if (!records_accounts_ && row.action != action::import_case &&
        row.action != action::upgrade_format)
      misfit("the first row recording an account must be the import or a format upgrade");
    if (row.examiner.empty() && row.action != action::upgrade_format)
      misfit("the row names no examiner");
    records_accounts_ = true;
  } else if (records_accounts_) {
    misfit("the row records no operating-system account although the rows before it do");
  }

  if (row.action == action::import_case) {
    if (row.entity != "case" || row.field != "import" || old_value || !new_value ||
        row.revision != 1)
      misfit("malformed import row");
    try {
      state_ = CaseState::from_document(*new_value);
    } catch (const validation::Error& e) {
      misfit(std::string("the imported document is not a case: ") + e.what());
    }
    revision_ = 1;
  } else if (is_annotation(row.action)) {
    apply_annotation(row, old_value, new_value);
  } else if (row.action == action::open_revision) {
    if (!sealed_)
      misfit("a new revision was opened although revision " + std::to_string(revision_) +
             " is not sealed");
    if (row.entity != "case" || row.field != "revision" || !old_value || !new_value ||
        *old_value != json(revision_) || *new_value != json(revision_ + 1) ||
        row.revision != revision_ + 1)
      misfit("the revision numbers do not follow on from revision " + std::to_string(revision_));
    revision_ += 1;
    sealed_ = false;
  } else {
    if (row.revision != revision_)
      misfit("the row names revision " + std::to_string(row.revision) +
             " but the current revision is " + std::to_string(revision_));
    if (sealed_)
      misfit("a change inside revision " + std::to_string(revision_) + " after it was sealed");
    try {
      if (row.action == action::set_field) {
        const EntityRef entity = entity_of(row);
        const json* found = state_.find_value(entity, row.field);
        const std::string current = found ? canonical_text(*found) : "(absent)";
        const std::string recorded = row.old_value ? *row.old_value : "(absent)";
        if (current != recorded)
          misfit("the old value " + recorded + " differs from the value in the case, " + current);
        state_.set_value(entity, row.field, new_value);
      } else if (row.action == action::add_item) {
        if (row.entity != "item" || old_value || !new_value || !new_value->is_object() ||
            !new_value->contains("item") || !new_value->contains("position"))
          misfit("malformed add row");
        if (item_id_of(new_value->at("item"), row.key) != row.key)
          misfit("the added item's id differs from the row's");
        state_.add_item(new_value->at("item"), position_of(new_value->at("position")));
      } else if (row.action == action::remove_item) {
        if (row.entity != "item" || new_value || !old_value || !old_value->is_object() ||
            !old_value->contains("item") || !old_value->contains("position"))
          misfit("malformed remove row");
        const auto position = state_.item_position(row.key);
        if (!position) misfit("there is no item \"" + row.key + "\" to remove");
        const json recorded = {{"item", state_.items()[*position].second}, {"position", *position}};
        if (canonical_text(recorded) != *row.old_value)
          misfit("the removed item recorded differs from the item in the case, " +
                 canonical_text(recorded));
        state_.remove_item(row.key);
      } else if (row.action == action::move_item) {
        if (row.entity != "item" || row.field != "position" || !old_value || !new_value)
          misfit("malformed move row");
        const auto position = state_.item_position(row.key);
        if (!position || json(*position) != *old_value)
          misfit("the old position " + text_of(old_value) +
                 " differs from the item's position in the case");
        state_.move_item(row.key, position_of(*new_value));
      } else if (row.action == action::seal) {
        if (row.entity != "case" || row.field != "seal" || old_value || !new_value ||
            !new_value->is_object())
          misfit("malformed seal row");
        const auto digest = new_value->find("state_sha256");
        if (digest == new_value->end() || *digest != json(platform::sha256_hex(state_text(state_))))
          misfit("the sealed state digest differs from the digest of the replayed case");
        if (new_value->value("revision", json()) != json(revision_))
          misfit("the seal names another revision");
        if (row.account) check_seal_people(row, *new_value);
        // A signed seal must verify with the key it records; an unsigned one (every seal made
        // before signing existed, or sealed without a key on purpose) is reported by verify.
        check_seal_signatures(row, *new_value, state_);
        sealed_ = true;
      } else {
        misfit("unknown action \"" + row.action + "\"");
      }
    } catch (const InvalidValue& e) {
      // The state's own checks (unknown item, id change) mean the row does not fit either.
      if (e.where().item.empty() && e.where().field.empty()) throw;
      misfit(e.what());
    }
  }
  ++rows_;
}

void AuditReplay::apply_annotation(const AuditRow& row, const std::optional<json>& old_value,
                                   const std::optional<json>& new_value) {
  if (!row.account) misfit("a " + row.action + " row must record an account");
  if (row.revision != revision_)
    misfit("the row names revision " + std::to_string(row.revision) +
           " but the current revision is " + std::to_string(revision_));
  if (row.action == action::upgrade_format) {
    if (row.entity != "case" || row.field != "format" || !old_value || !new_value ||
        !old_value->is_number_unsigned() || !new_value->is_number_unsigned() ||
        new_value->get<std::uint64_t>() <= old_value->get<std::uint64_t>())
      misfit("malformed format upgrade row");
    return;
  }
  if (row.action == action::review) {
    if (row.entity != "case" || row.field != "review" || old_value || !new_value)
      misfit("malformed review row");
    const ReviewNote note = review_note_of(row);
    if (!reviewers_.count(row.examiner))
      misfit(row.examiner + " wrote a review note but is not a declared reviewer");
    const bool sealed_revision =
        note.revision >= 1 && (note.revision < revision_ || (note.revision == revision_ && sealed_));
    if (!sealed_revision)
      misfit("the review note is on revision " + std::to_string(note.revision) +
             ", which is not sealed");
    return;
  }
  if (row.action == action::change_member) {
    if (row.entity != "case" || row.field != "member") misfit("malformed membership row");
    MembershipChange change;
    try {
      change = membership_change_of(row);
    } catch (const validation::Error& e) {
      misfit(e.bare_message());
    }
    // The database checks each change against its members table; the chain keeps its own rows
    // consistent with one another, so a row taken out or altered shows.
    const auto recorded = recorded_roles_.find(change.member);
    if (recorded != recorded_roles_.end() && recorded->second != change.old_role)
      misfit("the membership row gives " + change.member + " the old role " +
             change.old_role.value_or("none") + ", but the last membership row gave it " +
             recorded->second.value_or("none"));
    recorded_roles_[change.member] = change.new_role;
    return;
  }
  // declare-reviewer
  if (row.entity != "case" || row.field != "reviewer" || old_value || !new_value ||
      !new_value->is_string() || new_value->get<std::string>().empty())
    misfit("malformed reviewer row");
  const auto examiner = case_examiner(state_);
  if (!examiner || row.examiner != *examiner)
    misfit("a reviewer was declared by " + row.examiner +
           ", who is not the case's examiner (" + examiner.value_or("none named") + ")");
  if (!reviewers_.insert(new_value->get<std::string>()).second)
    misfit("the reviewer " + new_value->get<std::string>() + " was declared twice");
}

void AuditReplay::check_seal_people(const AuditRow& row, const json& seal) const {
  const auto examiner = case_examiner(state_);
  if (!examiner) misfit("the seal's case names no examiner");
  if (seal.value("report_examiner", json()) != json(*examiner))
    misfit("the seal does not name the report's examiner, " + *examiner);
  const json role = seal.value("sealer_role", json());
  const bool as_examiner = row.examiner == *examiner;
  const bool as_reviewer = !as_examiner && reviewers_.count(row.examiner) != 0;
  if (!as_examiner && !as_reviewer)
    misfit(row.examiner + " sealed the revision but is neither the report's examiner (" +
           *examiner + ") nor a declared reviewer");
  if (role != json(as_examiner ? kSealerIsExaminer : kSealerIsReviewer))
    misfit("the seal's sealer_role does not match who sealed it");
}

}  // namespace counterpoise::store
