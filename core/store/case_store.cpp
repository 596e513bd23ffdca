#include "core/store/case_store.hpp"

#include <map>
#include <set>
#include <stdexcept>

#include "core/platform/sha256.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_file_header.hpp"
#include "core/store/membership_change.hpp"
#include "core/store/postgres_backend.hpp"
#include "core/store/sqlite_backend.hpp"

namespace counterpoise::store {

using nlohmann::json;
using validation::FileError;
using validation::InvalidValue;

namespace {

// Messages about a store start with where it is (a path, or a database and case reference).
FileError store_error(const std::string& where, const std::string& message) {
  return FileError({}, where + ": " + message);
}

std::optional<std::string> optional_text(const std::optional<json>& value) {
  if (!value) return std::nullopt;
  return canonical_text(*value);
}

// A JSON value stored in the case read with the bounds of an imported case (a file from
// elsewhere may hold a huge or deeply nested value anywhere), or null when it does not read:
// for listings, which show what reads and leave a damaged row to verify, which names it.
json lenient_stored_json(const std::string& text) {
  try {
    return reading::parse_json_text(text, "stored value");
  } catch (const validation::Error&) {
    return nullptr;
  }
}

// A JSON body of the entity tables (`what`: "item "E1" (table items, column body)"): the case is
// built from these, so one that does not read makes the file unusable, said as damage.
json stored_body(const std::string& where, const std::string& text, const std::string& what) {
  try {
    return reading::parse_json_text(text, what);
  } catch (const validation::Error& e) {
    throw store_error(where, std::string("the case tables are damaged (changed outside the program?): ") + e.what());
  }
}

RevisionInfo revision_info(const StoredRevision& stored, const std::optional<AuditRow>& seal) {
  RevisionInfo info;
  info.revision = stored.revision;
  info.opened_seq = stored.opened_seq;
  info.sealed_seq = stored.sealed_seq;
  info.sealed_at = stored.sealed_at;
  info.sealed_by = stored.sealed_by;
  info.state_sha256 = stored.state_sha256;
  info.report_sha256 = stored.report_sha256;
  info.report_file_name = stored.report_file_name;
  if (info.sealed() && seal) {
    info.sealed_by_account = seal->account.value_or("");
    // The seal row's own record of who: read leniently (with the bounds of any stored value),
    // since verify, not this listing, judges a damaged row.
    const json record = lenient_stored_json(seal->new_value.value_or(""));
    if (record.is_object()) {
      info.report_examiner = record.value("report_examiner", "");
      info.sealer_role = record.value("sealer_role", "");
      info.public_key = record.value(kSealPublicKeyMember, "");
      info.signature = record.value(kSealSignatureMember, "");
      info.program = record.value(kSealProgramMember, "");
    }
  }
  return info;
}

// One line saying what an audit row did, for the refusal of an edit based on an old state.
std::string change_summary(const AuditRow& row) {
  std::string who = row.examiner.empty() ? std::string("the program") : row.examiner;
  if (row.account) who += " (account " + *row.account + ")";
  std::string what = row.action + " " + row.entity;
  if (!row.key.empty()) what += " " + row.key;
  if (!row.field.empty() && row.entity != "case") what += " field " + row.field;
  if (row.entity == "case") what = row.action;
  return "row " + std::to_string(row.seq) + " at " + row.at + " by " + who + ": " + what;
}

}  // namespace

struct CaseStore::Impl {
  std::unique_ptr<StoreBackend> backend;
  std::filesystem::path path;  // the case file; empty for a case in a database
  StoreOptions options;
  OpenMode mode = OpenMode::read_only;
  // The replay position at the last committed row: state, revision, reviewers, ...
  AuditReplay head;
  std::string last_hash = kGenesisHash;

  const std::string& where() const { return backend->where(); }
  VerifyReport verify() const;
  // Runs verify unless nothing but this connection changed the store since it last passed;
  // throws CaseFailsVerification when it fails.
  void require_verified();
  void load();
  // After open: reads the head and, for editing, verifies and prepares the store.
  void start();
  [[noreturn]] void refuse_stale_edit(const AuditRow& tail, std::int64_t last_seq) const;

  // Builds the rows of one change by `who` (with an open-revision row first when needed and the
  // change is not an annotation), checks them by replay, asks options.validate, then writes
  // rows, entity tables and chain head in one transaction. `extra` writes more in the same
  // transaction (the seal's revision row).
  std::int64_t commit(
      const ExaminerName& who,
      const std::function<AuditRow(const CaseState&, std::int64_t revision)>& make_row,
      bool validate_result,
      const std::function<void(const AuditRow&, const CaseState&)>& extra = {},
      bool annotation = false, const AuditRow* fixed_open_revision = nullptr);
  AuditRow new_row(const ExaminerName& who, std::string action, std::string entity,
                   std::string key, std::string field) const;
  void write_state_difference(const CaseState& before, const CaseState& after);
  void require_editable() const {
    if (mode != OpenMode::edit) throw std::logic_error("the case store was opened read-only");
  }
};

void CaseStore::Impl::load() {
  const BackendSnapshot snapshot(*backend);
  json document = json::object();
  for (const auto& [name, body] : backend->sections())
    document[name] = stored_body(where(), body, "section \"" + name + "\" (table sections, column body)");
  json items = json::array();
  for (const StoredItem& item : backend->items())
    items.push_back(stored_body(where(), item.body, "item \"" + item.id + "\" (table items, column body)"));
  document["items"] = std::move(items);
  CaseState state;
  try {
    state = CaseState::from_document(document);
  } catch (const validation::Error& e) {
    throw store_error(
        where(),
        std::string("the case tables are damaged (changed outside the program?): ") + e.what());
  }
  const std::optional<AuditRow> last = backend->last_audit_row();
  if (!last) throw store_error(where(), "the case has no audit log (damaged)");
  last_hash = last->hash;
  const std::vector<StoredRevision> revisions = backend->revisions(false);
  if (revisions.empty()) throw store_error(where(), "the case has no revision (damaged)");
  std::set<std::string> reviewers;
  for (const std::string& value : backend->new_values_of(action::declare_reviewer)) {
    // Leniently: a row that does not read is verify's to name (by its seq), and a read-only
    // open must still let verify run.
    const json name = lenient_stored_json(value);
    if (name.is_string()) reviewers.insert(name.get<std::string>());
  }
  std::map<std::string, std::optional<std::string>> recorded_roles;
  for (const std::string& value : backend->new_values_of(action::change_member)) {
    const json change = lenient_stored_json(value);  // leniently, as above
    if (!change.is_object() || !change.contains("member") || !change["member"].is_string() ||
        !change.contains("role"))
      continue;
    const json& role = change["role"];
    recorded_roles[change["member"].get<std::string>()] =
        role.is_string() ? std::optional<std::string>(role.get<std::string>()) : std::nullopt;
  }
  head = AuditReplay(std::move(state), revisions.back().revision,
                     revisions.back().sealed_seq.has_value(), last->seq,
                     last->account.has_value(), std::move(reviewers), std::move(recorded_roles));
}

void CaseStore::Impl::start() {
  load();
  if (mode != OpenMode::edit) return;
  // A store that fails verify is never written to, not even by an upgrade or a session row.
  require_verified();
  if (backend->prepare_for_editing()) load();
}

AuditRow CaseStore::Impl::new_row(const ExaminerName& who, std::string action,
                                  std::string entity, std::string key, std::string field) const {
  AuditRow row;
  row.at = utc_timestamp_now();
  row.examiner = who.text();
  row.account = backend->account();
  row.action = std::move(action);
  row.entity = std::move(entity);
  row.key = std::move(key);
  row.field = std::move(field);
  return row;
}

void CaseStore::Impl::write_state_difference(const CaseState& before, const CaseState& after) {
  for (const auto& [name, value] : after.sections()) {
    auto old = before.sections().find(name);
    const std::string text = canonical_text(value);
    if (old != before.sections().end() && canonical_text(old->second) == text) continue;
    backend->put_section(name, text);
  }
  for (const auto& [name, value] : before.sections())
    if (!after.sections().count(name)) backend->delete_section(name);
  std::map<std::string, std::pair<std::size_t, const json*>> old_items;
  for (std::size_t i = 0; i < before.items().size(); ++i)
    old_items[before.items()[i].first] = {i, &before.items()[i].second};
  for (std::size_t i = 0; i < after.items().size(); ++i) {
    const auto& [id, body] = after.items()[i];
    const StoredItem stored{id, static_cast<std::int64_t>(i), canonical_text(body)};
    auto old = old_items.find(id);
    if (old == old_items.end()) {
      backend->insert_item(stored);
      continue;
    }
    const bool same = old->second.first == i && canonical_text(*old->second.second) == stored.body;
    old_items.erase(old);
    if (!same) backend->update_item(stored);
  }
  for (const auto& [id, unused] : old_items) backend->delete_item(id);
}

void CaseStore::Impl::refuse_stale_edit(const AuditRow& tail, std::int64_t last_seq) const {
  std::string changes;
  constexpr std::int64_t kShown = 3;
  for (std::int64_t seq = last_seq + 1; seq <= tail.seq && seq <= last_seq + kShown; ++seq) {
    const std::optional<AuditRow> row = seq == tail.seq ? tail : backend->audit_row(seq);
    if (row) changes += (changes.empty() ? "" : "; ") + change_summary(*row);
  }
  if (tail.seq > last_seq + kShown)
    changes += "; and " + std::to_string(tail.seq - last_seq - kShown) + " more";
  if (changes.empty())
    changes = "its last audit row is now " + std::to_string(tail.seq) + ", not " +
              std::to_string(last_seq);
  throw CaseChanged({}, where() + ": the case was changed after this copy of it was read (" +
                            changes +
                            "), so this edit, made against the older state, was refused and "
                            "nothing was written. Open the case again and repeat the edit.");
}

std::int64_t CaseStore::Impl::commit(
    const ExaminerName& who,
    const std::function<AuditRow(const CaseState&, std::int64_t)>& make_row, bool validate_result,
    const std::function<void(const AuditRow&, const CaseState&)>& extra, bool annotation,
    const AuditRow* fixed_open_revision) {
  require_editable();
  AuditReplay replay = head;
  const std::int64_t last_seq = head.rows();
  std::vector<AuditRow> rows;
  std::string prev = last_hash;
  const auto append = [&](AuditRow row) {
    row.seq = last_seq + static_cast<std::int64_t>(rows.size()) + 1;
    row.prev_hash = prev;
    row.hash = audit_row_hash(row);
    replay.apply(row);  // the same check verify makes: a row that would not fit is never written
    prev = row.hash;
    rows.push_back(std::move(row));
  };
  if (head.sealed() && !annotation && fixed_open_revision) {
    append(*fixed_open_revision);  // a prepared seal's row, with the time its statement signed
  } else if (head.sealed() && !annotation) {
    AuditRow open = new_row(who, action::open_revision, "case", "", "revision");
    open.revision = head.revision() + 1;
    open.old_value = std::to_string(head.revision());
    open.new_value = std::to_string(head.revision() + 1);
    append(std::move(open));
  }
  AuditRow change = make_row(replay.state(), replay.revision());
  change.revision = replay.revision();
  append(std::move(change));
  if (validate_result && options.validate) options.validate(replay.state().to_document());

  BackendWrite write(*backend);
  require_verified();  // inside the write lock: nobody changes the store between check and write
  {
    const std::optional<AuditRow> tail = backend->last_audit_row();
    if (!tail) throw store_error(where(), "the case has no audit log (damaged)");
    if (tail->seq != last_seq || tail->hash != last_hash) refuse_stale_edit(*tail, last_seq);
  }
  for (const AuditRow& row : rows) {
    if (row.action == action::open_revision) backend->insert_revision(row.revision, row.seq);
    backend->insert_audit_row(row);
  }
  write_state_difference(head.state(), replay.state());
  if (extra) extra(rows.back(), replay.state());
  backend->write_chain_head(rows.back().seq, rows.back().hash);
  write.commit();

  head = std::move(replay);
  last_hash = rows.back().hash;
  return rows.back().seq;
}

CaseStore::CaseStore(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
CaseStore::CaseStore(CaseStore&&) noexcept = default;
CaseStore& CaseStore::operator=(CaseStore&&) noexcept = default;
CaseStore::~CaseStore() = default;

CaseStore CaseStore::open(const std::filesystem::path& path, OpenMode mode,
                          const StoreOptions& options) {
  auto impl = std::make_unique<Impl>();
  impl->path = path;
  impl->options = options;
  impl->mode = mode;
  impl->backend = SqliteBackend::open(path, mode, options);
  impl->start();
  return CaseStore(std::move(impl));
}

CaseStore CaseStore::open(const DatabaseCase& address, OpenMode mode,
                          const StoreOptions& options) {
  auto impl = std::make_unique<Impl>();
  impl->options = options;
  impl->mode = mode;
  impl->backend = PostgresBackend::open(address, mode, options);
  impl->start();
  return CaseStore(std::move(impl));
}

namespace {

// The first row of every case: the whole document, imported by `examiner`.
AuditRow import_row(const CaseState& state, const ExaminerName& examiner,
                    const std::string& account) {
  AuditRow row;
  row.seq = 1;
  row.revision = 1;
  row.at = utc_timestamp_now();
  row.examiner = examiner.text();
  row.account = account;
  row.action = action::import_case;
  row.entity = "case";
  row.field = "import";
  row.new_value = state_text(state);
  row.prev_hash = kGenesisHash;
  row.hash = audit_row_hash(row);
  AuditReplay().apply(row);
  return row;
}

}  // namespace

CaseStore CaseStore::create(const std::filesystem::path& path, const json& document,
                            const ExaminerName& examiner, const StoreOptions& options) {
  const CaseState state = CaseState::from_document(document);
  if (options.validate) options.validate(document);
  SqliteBackend::create_file(path, state,
                             import_row(state, examiner, operating_system_account()));
  return open(path, OpenMode::edit, options);
}

CaseStore CaseStore::create(const DatabaseCase& address, const json& document,
                            const ExaminerName& examiner, const StoreOptions& options) {
  const CaseState state = CaseState::from_document(document);
  if (options.validate) options.validate(document);
  auto backend = PostgresBackend::open_new(address, options);
  backend->create_case(state, import_row(state, examiner, backend->account()));
  auto impl = std::make_unique<Impl>();
  impl->options = options;
  impl->mode = OpenMode::edit;
  impl->backend = std::move(backend);
  impl->start();
  return CaseStore(std::move(impl));
}

json CaseStore::document() const { return impl_->head.state().to_document(); }
std::string CaseStore::export_canonical() const { return state_text(impl_->head.state()); }
const CaseState& CaseStore::state() const { return impl_->head.state(); }
std::int64_t CaseStore::current_revision() const { return impl_->head.revision(); }
const std::string& CaseStore::account() const { return impl_->backend->account(); }
std::optional<std::string> CaseStore::edit_refusal() const { return impl_->backend->edit_refusal(); }
const std::filesystem::path& CaseStore::path() const { return impl_->path; }
const std::string& CaseStore::where() const { return impl_->where(); }

std::int64_t CaseStore::set_field(const ExaminerName& examiner, const EntityRef& entity,
                                  const std::string& field, const std::optional<json>& value) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        AuditRow row = impl_->new_row(examiner, action::set_field, entity_kind_name(entity.kind),
                                      entity.key, field);
        if (entity.kind == EntityKind::item && !current.item_position(entity.key))
          throw InvalidValue({entity.key, field}, "there is no item with this id");
        row.old_value = optional_text(current.value_at(entity, field));
        row.new_value = optional_text(value);
        CaseState probe = current;  // the state's own checks give the precise message
        probe.set_value(entity, field, value);
        return row;
      },
      true);
}

std::int64_t CaseStore::add_item(const ExaminerName& examiner, const json& item,
                                 std::optional<std::size_t> position) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        const std::string id = item_id_of(item, "new item");
        const std::size_t at = position.value_or(current.items().size());
        CaseState probe = current;
        probe.add_item(item, at);
        AuditRow row = impl_->new_row(examiner, action::add_item, "item", id, "");
        row.new_value = canonical_text(json{{"item", item}, {"position", at}});
        return row;
      },
      true);
}

std::int64_t CaseStore::remove_item(const ExaminerName& examiner, const std::string& id) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        const auto at = current.item_position(id);
        if (!at) throw InvalidValue({id, {}}, "there is no item with this id");
        AuditRow row = impl_->new_row(examiner, action::remove_item, "item", id, "");
        row.old_value =
            canonical_text(json{{"item", current.items()[*at].second}, {"position", *at}});
        return row;
      },
      true);
}

std::int64_t CaseStore::move_item(const ExaminerName& examiner, const std::string& id,
                                  std::size_t position) {
  return impl_->commit(
      examiner,
      [&](const CaseState& current, std::int64_t) {
        const auto at = current.item_position(id);
        if (!at) throw InvalidValue({id, {}}, "there is no item with this id");
        CaseState probe = current;
        probe.move_item(id, position);
        AuditRow row = impl_->new_row(examiner, action::move_item, "item", id, "position");
        row.old_value = std::to_string(*at);
        row.new_value = std::to_string(position);
        return row;
      },
      true);
}

namespace {

// The report's examiner of `state`, or InvalidValue naming case.examiner.
std::string required_case_examiner(const CaseState& state, const char* for_what) {
  const auto examiner = case_examiner(state);
  if (!examiner)
    throw InvalidValue({"case", "examiner"},
                       std::string("the case names no examiner; ") + for_what +
                           " needs the report's examiner named in the case");
  return *examiner;
}

}  // namespace

std::int64_t CaseStore::declare_reviewer(const ExaminerName& examiner,
                                         const ExaminerName& reviewer) {
  const std::string report_examiner =
      required_case_examiner(impl_->head.state(), "declaring a reviewer");
  if (examiner.text() != report_examiner)
    throw InvalidValue({"examiner", "name"},
                       examiner.text() + " is not the case's examiner (" + report_examiner +
                           "); only the case's examiner declares its reviewers");
  if (reviewer.text() == report_examiner)
    throw InvalidValue({"reviewer", "name"},
                       "the case's examiner cannot be declared a reviewer of the same case");
  if (impl_->head.reviewers().count(reviewer.text()))
    throw InvalidValue({"reviewer", "name"}, reviewer.text() + " is already a declared reviewer");
  return impl_->commit(
      examiner,
      [&](const CaseState&, std::int64_t) {
        AuditRow row = impl_->new_row(examiner, action::declare_reviewer, "case", "", "reviewer");
        row.new_value = canonical_text(json(reviewer.text()));
        return row;
      },
      false, {}, true);
}

std::int64_t CaseStore::add_review_note(const ExaminerName& reviewer, std::int64_t revision,
                                        ReviewVerdict verdict, const std::string& note) {
  if (!impl_->head.reviewers().count(reviewer.text()))
    throw InvalidValue({"examiner", "name"},
                       reviewer.text() + " is not a declared reviewer of this case; the case's "
                                         "examiner declares reviewers");
  const bool sealed = revision >= 1 && (revision < impl_->head.revision() ||
                                        (revision == impl_->head.revision() && impl_->head.sealed()));
  if (!sealed)
    throw InvalidValue({"review", "revision"}, "revision " + std::to_string(revision) +
                                                   " is not a sealed revision of this case");
  check_review_note(verdict, note);
  return impl_->commit(
      reviewer,
      [&](const CaseState&, std::int64_t) {
        AuditRow row = impl_->new_row(reviewer, action::review, "case", "", "review");
        row.new_value = canonical_text(review_value(revision, verdict, note));
        return row;
      },
      false, {}, true);
}

std::vector<ReviewNote> CaseStore::review_notes() const {
  std::vector<ReviewNote> notes;
  for (const AuditRow& row : audit_rows())
    if (row.action == action::review) {
      try {
        notes.push_back(review_note_of(row));
      } catch (const validation::Error&) {
        // A malformed row is verify's to report; the listing shows the notes that read.
      }
    }
  return notes;
}

std::int64_t CaseStore::change_membership(const ExaminerName& examiner, const std::string& member,
                                          const std::optional<std::string>& role) {
  if (!impl_->backend->has_members())
    throw InvalidValue({"member", "name"}, "a case file has no members: whoever holds its edit "
                                           "lock writes it; members are a shared store's");
  if (role && !is_member_role(*role))
    throw InvalidValue({"member", "role"}, "a case member is an examiner, a reviewer or a reader");
  impl_->require_editable();
  const MembershipChange change{member, impl_->backend->member_role(member), role,
                                operating_system_account()};
  if (change.old_role == change.new_role)
    throw InvalidValue({"member", "role"},
                       role ? "the database role " + member + " already has the role " + *role + " in this case"
                            : "the database role " + member + " is not a member of this case");
  return impl_->commit(
      examiner,
      [&](const CaseState&, std::int64_t) {
        AuditRow row = impl_->new_row(examiner, action::change_member, "case", "", "member");
        row.old_value = canonical_text(membership_old_value(change));
        row.new_value = canonical_text(membership_new_value(change));
        return row;
      },
      false, {}, true);
}

std::vector<std::string> CaseStore::reviewers() const {
  return {impl_->head.reviewers().begin(), impl_->head.reviewers().end()};
}

std::string CaseStore::sealer_role(const ExaminerName& sealer) const {
  const std::string report_examiner =
      required_case_examiner(impl_->head.state(), "sealing a revision");
  if (sealer.text() == report_examiner) return kSealerIsExaminer;
  if (impl_->head.reviewers().count(sealer.text())) return kSealerIsReviewer;
  throw InvalidValue({"examiner", "name"},
                     sealer.text() + " is neither the report's examiner (" + report_examiner +
                         ") nor a declared reviewer of this case, and cannot seal its report");
}

RevisionInfo CaseStore::seal_revision(const ExaminerName& sealer, std::string_view report_bytes,
                                      const std::string& report_file_name) {
  return seal_revision(prepare_seal(sealer, nullptr), report_bytes, report_file_name);
}

PreparedSeal CaseStore::prepare_seal(const ExaminerName& sealer,
                                     std::shared_ptr<const platform::Ed25519PrivateKey> key) const {
  impl_->require_editable();
  PreparedSeal prepared;
  SealStatement& statement = prepared.anchor.statement;
  statement.sealer_role = sealer_role(sealer);
  statement.report_examiner = *case_examiner(impl_->head.state());
  statement.case_reference = case_reference(impl_->head.state());
  statement.state_sha256 = platform::sha256_hex(state_text(impl_->head.state()));
  statement.sealer = sealer.text();
  statement.program = kProgramName;
  prepared.after_seq = impl_->head.rows();
  prepared.after_hash = impl_->last_hash;
  statement.revision = impl_->head.revision();
  statement.chain_head_seq = prepared.after_seq;
  statement.chain_head_hash = prepared.after_hash;
  if (impl_->head.sealed()) {
    AuditRow open = impl_->new_row(sealer, action::open_revision, "case", "", "revision");
    open.seq = prepared.after_seq + 1;
    open.revision = impl_->head.revision() + 1;
    open.old_value = std::to_string(impl_->head.revision());
    open.new_value = std::to_string(impl_->head.revision() + 1);
    open.prev_hash = prepared.after_hash;
    open.hash = audit_row_hash(open);
    statement.revision = open.revision;
    statement.chain_head_seq = open.seq;
    statement.chain_head_hash = open.hash;
    prepared.open_revision = std::move(open);
  }
  statement.sealed_at = utc_timestamp_now();
  if (key) {
    statement.public_key = key->public_key().hex();
    prepared.anchor.signature = platform::hex_text(key->sign(statement.signed_bytes()));
  }
  prepared.key = std::move(key);
  return prepared;
}

RevisionInfo CaseStore::seal_revision(const PreparedSeal& prepared, std::string_view report_bytes,
                                      const std::string& report_file_name) {
  const SealStatement& statement = prepared.anchor.statement;
  if (impl_->head.rows() != prepared.after_seq || impl_->last_hash != prepared.after_hash)
    throw CaseChanged({}, impl_->where() + ": the case changed after the seal was prepared, so the report "
                                           "made for it was not sealed and nothing was written; issue it again");
  const ExaminerName sealer(statement.sealer);
  sealer_role(sealer);  // the people may have changed (a reviewer declared) only through rows: checked again
  const std::string report_sha256 = platform::sha256_hex(report_bytes);
  json value{{"report_examiner", statement.report_examiner},
             {"report_file_name", report_file_name},
             {"report_sha256", report_sha256},
             {"revision", statement.revision},
             {"sealer_role", statement.sealer_role},
             {"state_sha256", statement.state_sha256},
             {kSealProgramMember, statement.program}};
  if (prepared.key) {
    value[kSealPublicKeyMember] = statement.public_key;
    value[kSealSignatureMember] = prepared.anchor.signature;
    value[kSealReportSignatureMember] = platform::hex_text(
        prepared.key->sign(sealed_report_bytes_to_sign(prepared.anchor.signature, report_sha256)));
  }
  impl_->commit(
      sealer,
      [&](const CaseState&, std::int64_t) {
        AuditRow row = impl_->new_row(sealer, action::seal, "case", "", "seal");
        row.at = statement.sealed_at;
        row.new_value = canonical_text(value);
        return row;
      },
      false,
      [&](const AuditRow& row, const CaseState& current) {
        // The row written must be the one the statement describes; replay has checked the
        // signature against the row, so this only guards the program's own bookkeeping.
        if (row.revision != statement.revision || row.seq != statement.chain_head_seq + 1 ||
            row.prev_hash != statement.chain_head_hash)
          throw std::logic_error("the seal row differs from the prepared seal");
        const std::string text = state_text(current);
        SealedRevisionRecord record;
        record.revision = row.revision;
        record.sealed_seq = row.seq;
        record.sealed_at = row.at;
        record.sealed_by = row.examiner;
        record.state_json = text;
        record.state_sha256 = platform::sha256_hex(text);
        record.report_file_name = report_file_name;
        record.report_bytes = std::string(report_bytes);
        record.report_sha256 = report_sha256;
        impl_->backend->seal_revision(record);
      },
      false, prepared.open_revision ? &*prepared.open_revision : nullptr);
  for (const RevisionInfo& info : revisions())
    if (info.revision == statement.revision) return info;
  throw std::logic_error("the sealed revision is not listed");
}

std::vector<RevisionInfo> CaseStore::revisions() const {
  std::vector<RevisionInfo> out;
  for (const StoredRevision& stored : impl_->backend->revisions(false))
    out.push_back(revision_info(
        stored, stored.sealed_seq ? impl_->backend->audit_row(*stored.sealed_seq) : std::nullopt));
  return out;
}

std::optional<RevisionInfo> CaseStore::latest_seal() const {
  std::optional<RevisionInfo> latest;
  for (RevisionInfo& info : revisions())
    if (info.sealed()) latest = std::move(info);
  return latest;
}

namespace {
std::string sealed_or_refuse(std::optional<std::string> content, std::int64_t revision) {
  if (!content)
    throw InvalidValue({"revision " + std::to_string(revision), {}},
                       "there is no sealed revision with this number");
  return std::move(*content);
}
}  // namespace

std::string CaseStore::sealed_report_bytes(std::int64_t revision) const {
  return sealed_or_refuse(impl_->backend->sealed_report_bytes(revision), revision);
}

std::string CaseStore::sealed_state_text(std::int64_t revision) const {
  return sealed_or_refuse(impl_->backend->sealed_state_json(revision), revision);
}

std::vector<AuditRow> CaseStore::audit_rows() const {
  std::vector<AuditRow> out;
  impl_->backend->each_audit_row([&](const AuditRow& row) { out.push_back(row); });
  return out;
}

VerifyReport CaseStore::verify() const { return impl_->verify(); }

void CaseStore::Impl::require_verified() {
  if (!backend->changed_since_verified()) return;
  const VerifyReport report = verify();
  if (!report.ok())
    throw CaseFailsVerification(
        {}, where() + ": the case fails verification (audit row " +
                std::to_string(report.problem->seq) + ": " + report.problem->reason +
                "), so nothing is written to it: it was changed outside the program. It can "
                "still be read; go back to a copy you trust.");
  backend->mark_verified();
}

namespace {

// The revisions as stored must be what the audit says: opened by its row, sealed exactly when
// a seal row says so, and a sealed revision's content must match its seal's digests.
std::optional<VerifyProblem> check_revisions(const std::vector<StoredRevision>& stored,
                                             const std::map<std::int64_t, AuditRow>& openings,
                                             const std::map<std::int64_t, AuditRow>& seals,
                                             std::int64_t last) {
  std::int64_t count = 0;
  for (const StoredRevision& r : stored) {
    ++count;
    auto opening = openings.find(r.revision);
    if (r.revision != count || opening == openings.end() || opening->second.seq != r.opened_seq)
      return VerifyProblem{opening == openings.end() ? last : opening->second.seq,
                           "revision " + std::to_string(r.revision) +
                               " in the revisions table does not match the audit"};
    auto seal = seals.find(r.revision);
    if ((seal != seals.end()) != r.sealed_seq.has_value())
      return VerifyProblem{seal != seals.end() ? seal->second.seq : last,
                           "revision " + std::to_string(r.revision) +
                               " is sealed in one place but not in the other"};
    if (seal == seals.end()) continue;
    // Replay has read this value already (a seal row's value must be canonical JSON): a value
    // that does not read here cannot match.
    const json recorded = lenient_stored_json(seal->second.new_value.value_or(""));
    if (!recorded.is_object())
      return VerifyProblem{seal->second.seq, "the seal row's new_value is not a JSON object"};
    if (*r.sealed_seq != seal->second.seq ||
        platform::sha256_hex(r.state_json) != recorded.value("state_sha256", "") ||
        r.state_sha256 != recorded.value("state_sha256", "") ||
        platform::sha256_hex(r.report_bytes) != recorded.value("report_sha256", "") ||
        r.report_sha256 != recorded.value("report_sha256", "") ||
        r.report_file_name != recorded.value("report_file_name", "") ||
        r.sealed_at != seal->second.at || r.sealed_by != seal->second.examiner)
      return VerifyProblem{seal->second.seq,
                           "the stored content of sealed revision " + std::to_string(r.revision) +
                               " does not match its seal (state or report changed)"};
  }
  return std::nullopt;
}

// The entity rows must hold exactly the replayed state: compare "position body" rows by key.
std::optional<VerifyProblem> compare_entities(const char* kind,
                                              std::map<std::string, std::string> expected,
                                              std::map<std::string, std::string> actual,
                                              std::int64_t last) {
  for (const auto& [key, row] : expected) {
    auto it = actual.find(key);
    if (it == actual.end() || it->second != row)
      return VerifyProblem{last, std::string(kind) + " \"" + key +
                                     "\" differs from the audit (changed outside the program "
                                     "after row " +
                                     std::to_string(last) + ")"};
    actual.erase(it);
  }
  if (!actual.empty())
    return VerifyProblem{last, std::string(kind) + " \"" + actual.begin()->first +
                                   "\" is not in the audit (added outside the program)"};
  return std::nullopt;
}

}  // namespace

VerifyReport CaseStore::Impl::verify() const {
  const BackendSnapshot snapshot(*backend);
  VerifyReport report;
  const auto fail = [&](std::int64_t seq, std::string reason) {
    if (!report.problem) report.problem = VerifyProblem{seq, std::move(reason)};
    return report;
  };
  AuditReplay replay;
  std::map<std::int64_t, AuditRow> seals, openings;  // by revision
  std::string prev = kGenesisHash;
  std::int64_t expected = 1;
  backend->each_audit_row([&](const AuditRow& row) {
    if (report.problem) return;  // the first problem is the one reported
    if (row.seq != expected) {
      fail(expected, "audit row " + std::to_string(expected) + " is missing (the next row is " +
                         std::to_string(row.seq) + ")");
      return;
    }
    if (row.prev_hash != prev) {
      fail(row.seq, "its link to the previous row does not match that row's hash");
      return;
    }
    if (audit_row_hash(row) != row.hash) {
      fail(row.seq, "its hash does not match its content (the row was changed)");
      return;
    }
    try {
      replay.apply(row);
    } catch (const validation::Error& e) {
      fail(row.seq, "it does not fit the case replayed up to it: " + std::string(e.what()));
      return;
    }
    if (row.action == action::seal) {
      seals[row.revision] = row;
      const json value = reading::parse_json_text(*row.new_value, "seal value");  // replay has read it
      report.seals.push_back({row.revision, row.seq, row.examiner, row.at,
                              value.value(kSealPublicKeyMember, "")});
    }
    if (row.action == action::import_case || row.action == action::open_revision)
      openings[row.revision] = row;
    prev = row.hash;
    ++expected;
    ++report.rows_checked;
  });
  if (report.problem) return report;
  const std::int64_t last = expected - 1;
  if (last == 0) return fail(0, "the audit log is empty");
  const std::string head = backend->chain_head();
  if (head != std::to_string(last) + " " + prev)
    return fail(last, "the audit log ends at row " + std::to_string(last) +
                          " but the store recorded a different last row (" + head +
                          "): rows were removed or added");
  const std::vector<StoredRevision> stored = backend->revisions(true);
  if (auto problem = check_revisions(stored, openings, seals, last)) {
    report.problem = std::move(problem);
    return report;
  }
  const auto count = static_cast<std::int64_t>(stored.size());
  if (count != replay.revision())
    return fail(last, "the revisions table has " + std::to_string(count) +
                          " revisions, the audit " + std::to_string(replay.revision()));
  report.revisions = count;
  const CaseState& expected_state = replay.state();
  std::map<std::string, std::string> sections, items, stored_items;
  for (const auto& [name, value] : expected_state.sections())
    sections[name] = canonical_text(value);
  for (std::size_t i = 0; i < expected_state.items().size(); ++i)
    items[expected_state.items()[i].first] =
        std::to_string(i) + " " + canonical_text(expected_state.items()[i].second);
  for (const StoredItem& item : backend->items())
    stored_items[item.id] = std::to_string(item.position) + " " + item.body;
  report.problem = compare_entities("section", std::move(sections), backend->sections(), last);
  if (!report.problem)
    report.problem = compare_entities("item", std::move(items), std::move(stored_items), last);
  return report;
}

bool is_case_file(const std::filesystem::path& path) {
  try {
    return read_case_file_header(path).kind == FileKind::case_file;
  } catch (const validation::Error&) {
    return false;
  }
}

}  // namespace counterpoise::store
