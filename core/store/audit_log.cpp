#include "core/store/audit_log.hpp"

#include <chrono>
#include <cstdio>
#include <ctime>

#include "core/store/canonical_json.hpp"
#include "core/store/json_text.hpp"
#include "core/store/sha256.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

using nlohmann::json;
using validation::InvalidValue;

std::string audit_row_hash(const AuditRow& row) {
  const auto text_or_null = [](const std::optional<std::string>& v) {
    return v ? json(*v) : json(nullptr);
  };
  const json content = {{"action", row.action},
                        {"at", row.at},
                        {"entity", row.entity},
                        {"examiner", row.examiner},
                        {"field", row.field},
                        {"key", row.key},
                        {"new", text_or_null(row.new_value)},
                        {"old", text_or_null(row.old_value)},
                        {"prev", row.prev_hash},
                        {"revision", row.revision},
                        {"seq", row.seq}};
  return sha256_hex(canonical_text(content));
}

std::string state_text(const CaseState& state) { return canonical_text(state.to_document()); }

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
    value = parse_json_text(*text, std::string(which) + " value");
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
  const auto old_value = stored_value(row.old_value, "old");
  const auto new_value = stored_value(row.new_value, "new");
  const bool first = rows_ == 0;
  if (first != (row.action == action::import_case))
    misfit(first ? "the first row must be the import of the case"
                 : "a case can be imported only once");

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
        const auto current = state_.value_at(entity, row.field);
        if (text_of(current) != text_of(old_value))
          misfit("the old value " + text_of(old_value) + " differs from the value in the case, " +
                 text_of(current));
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
        if (digest == new_value->end() || *digest != json(sha256_hex(state_text(state_))))
          misfit("the sealed state digest differs from the digest of the replayed case");
        if (new_value->value("revision", json()) != json(revision_))
          misfit("the seal names another revision");
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

}  // namespace counterpoise::store
