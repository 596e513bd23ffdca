#include "app/editor/case_document.hpp"

#include <QCoreApplication>
#include <QCryptographicHash>
#include <QDeadlineTimer>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QSaveFile>
#include <QStandardPaths>
#include <QThread>

#include "core/interchange/case_json.hpp"
#include "core/store/case_location.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/examiner_key.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

std::filesystem::path to_path(const QString& path) { return std::filesystem::path(path.toStdString()); }

// The case a new document starts from: one neutral item, so the weight view shows something at
// once, and no proposition level (the core names it missing until the user chooses one).
json new_case_template() {
  return json{
      {"format", interchange::kCaseFormatName},
      {"version", interchange::kCaseFormatVersion},
      {"case", {{"reference", ""}, {"title", "Untitled case"}}},
      {"mode", "casework"},
      {"propositions", {{"hp", ""}, {"hd", ""}}},  // no level chosen for the user
      {"items", json::array({json{{"id", "E1"}, {"title", "First item of findings"}, {"model", "assigned"},
                                  {"p_given_hp", 0.5}, {"p_given_hd", 0.5}}})},
  };
}

QString not_a_case_message(const QString& name) {
  return CaseDocument::tr("%1 is not a Counterpoise case: the editor opens case files (.cpcase) and cases saved as JSON.")
      .arg(name);
}

// The reason a reader gave, up to where it quotes what it read, with anything unprintable left out.
QString printable_reason(const std::string& reason) {
  QString text = QString::fromStdString(reason.substr(0, reason.find("; last read")));
  text.removeIf([](QChar c) { return !c.isPrint(); });
  return text.size() > 160 ? text.left(157) + QStringLiteral("…") : text;
}

}  // namespace

CaseDocument::CaseDocument(QObject* parent)
    : QObject(parent), runner_(new SpreadRunner(this)) {
  qRegisterMetaType<SpreadResult>();
  qRegisterMetaType<Changes>();
  recovery_timer_.setSingleShot(true);
  recovery_timer_.setInterval(500);
  connect(&recovery_timer_, &QTimer::timeout, this, &CaseDocument::writeRecovery);
  connect(runner_, &SpreadRunner::finished, this, [this](const SpreadResult& result) {
    spread_ = result;
    emit changed(Change::spread);
  });
}

CaseDocument::~CaseDocument() { flushRecovery(); }

const store::CaseState& CaseDocument::state() const { return store_ ? store_->state() : state_; }

json CaseDocument::document() const { return state().to_document(); }

std::optional<json> CaseDocument::value(const store::EntityRef& entity, const std::string& field) const {
  try {
    return state().value_at(entity, field);
  } catch (const std::exception&) {
    return std::nullopt;
  }
}

std::optional<json> CaseDocument::itemBody(const std::string& id) const { return value(store::EntityRef::item(id), ""); }

std::vector<std::string> CaseDocument::itemIds() const {
  std::vector<std::string> ids;
  for (const auto& [id, body] : state().items()) ids.push_back(id);
  return ids;
}

std::string CaseDocument::freshItemId() const {
  for (int n = static_cast<int>(state().items().size()) + 1;; ++n) {
    std::string id = "E" + std::to_string(n);
    if (!state().item_position(id)) return id;
  }
}

bool CaseDocument::inDatabase() const { return store::is_database_address(path_.toStdString()); }

std::filesystem::path CaseDocument::baseDir() const {
  // A case in a database has no folder: relative data paths are read against the current
  // folder, as the command line does (store::case_base_dir).
  if (path_.isEmpty() || inDatabase()) return std::filesystem::current_path();
  return to_path(QFileInfo(path_).absolutePath());
}

QString CaseDocument::displayName() const {
  if (path_.isEmpty()) return tr("Untitled case");
  if (inDatabase()) return QString::fromStdString(store_ ? store_->where() : path_.toStdString());
  return QFileInfo(path_).fileName();
}

QString CaseDocument::baseName() const {
  if (path_.isEmpty()) return {};
  if (!inDatabase()) return QFileInfo(path_).completeBaseName();
  QString name = QString::fromStdString(store_ ? store::parse_database_address(path_.toStdString()).reference : "case");
  for (QChar& c : name)
    if (!(c.isLetterOrNumber() || c == '.' || c == '-' || c == '_')) c = '-';
  return name.startsWith('.') ? "case" + name : name;
}

// --- files -----------------------------------------------------------------------------------

void CaseDocument::adopt(store::CaseState state, FileKind kind, const QString& path) {
  if (kind != FileKind::case_store) store_.reset();
  state_ = std::move(state);
  kind_ = kind;
  path_ = path.isEmpty() || store::is_database_address(path.toStdString()) ? path
                                                                            : QFileInfo(path).absoluteFilePath();
  modified_ = false;
  if (kind != FileKind::case_store) read_only_ = false, read_only_reason_.clear();
  recompute();
  emit changed(Change::content | Change::evaluation | Change::file | Change::guard | Change::history);
}

void CaseDocument::flushRecovery() {
  // Unsaved edits of the current case keep their snapshot before another case replaces it.
  if (!recovery_timer_.isActive()) return;
  recovery_timer_.stop();
  writeRecovery();
}

QString CaseDocument::newCase() {
  flushRecovery();
  store_.reset();
  adopt(store::CaseState::from_document(new_case_template()), FileKind::none, {});
  return {};
}

QString CaseDocument::openDatabaseCase(const QString& address) {
  try {
    const std::string location = address.toStdString();
    store::CaseStore opened = [&] {
      try {
        read_only_ = false;
        read_only_reason_.clear();
        return store::open_case_store(location, store::OpenMode::edit, storeOptions());
      } catch (const store::CaseFailsVerification& failed) {
        read_only_ = true;
        read_only_reason_ = QString::fromStdString(failed.bare_message());
        return store::open_case_store(location, store::OpenMode::read_only, storeOptions());
      }
    }();
    // A reviewer or reader of the case sees it read-only rather than have every edit refused.
    if (const auto refusal = opened.edit_refusal()) {
      read_only_ = true;
      read_only_reason_ = QString::fromStdString(*refusal);
    }
    store_ = std::make_unique<store::CaseStore>(std::move(opened));
    adopt(store_->state(), FileKind::case_store, address);
    return {};
  } catch (const std::exception& error) {
    // The message names the database and the case (never a password: an address holding one
    // is refused before any connection).
    return tr("Cannot open the case: %1").arg(QString::fromStdString(error.what()));
  }
}

QString CaseDocument::openFile(const QString& path) {
  flushRecovery();
  if (store::is_database_address(path.toStdString())) return openDatabaseCase(path);
  const auto file = to_path(path);
  try {
    if (store::is_case_file(file)) {
      store::CaseStore opened = [&] {
        try {
          read_only_ = false;
          read_only_reason_.clear();
          return store::CaseStore::open(file, store::OpenMode::edit, storeOptions());
        } catch (const store::CaseInUse& in_use) {
          read_only_ = true;
          read_only_reason_ = QString::fromStdString(in_use.bare_message());
          return store::CaseStore::open(file, store::OpenMode::read_only, storeOptions());
        } catch (const store::CaseFailsVerification& failed) {
          // A file changed behind the program's back is shown, never written to.
          read_only_ = true;
          read_only_reason_ = QString::fromStdString(failed.bare_message());
          return store::CaseStore::open(file, store::OpenMode::read_only, storeOptions());
        }
      }();
      store_ = std::make_unique<store::CaseStore>(std::move(opened));
      adopt(store_->state(), FileKind::case_store, path);
      return {};
    }
    QFile in(path);
    if (!in.open(QIODevice::ReadOnly)) return tr("Cannot open %1: %2").arg(path, in.errorString());
    const QString name = QFileInfo(path).fileName();
    const QByteArray bytes = in.readAll();
    // A file that is not a case is said to be so in one sentence; its bytes are never shown.
    const QByteArray start = bytes.trimmed().left(1);
    if (start != "{") return not_a_case_message(name);
    json document;
    try {
      document = interchange::parse_json_text(bytes.toStdString(), name.toStdString());
    } catch (const std::exception& error) {
      return tr("%1 cannot be opened: it looks like a case in JSON but is damaged (%2).").arg(name, printable_reason(error.what()));
    }
    if (!document.is_object() || document.value("format", json()) != json(interchange::kCaseFormatName)) return not_a_case_message(name);
    auto state = store::CaseState::from_document(document);
    store_.reset();
    adopt(std::move(state), FileKind::interchange_json, path);
    return {};
  } catch (const std::exception& error) {
    // The store's messages already start with the path it was given: say it once.
    QString reason = QString::fromStdString(error.what());
    if (reason.startsWith(path + ": ")) reason.remove(0, path.size() + 2);
    return tr("Cannot open %1: %2").arg(path, reason);
  }
}

QString CaseDocument::saveJson(const QString& path) {
  QSaveFile out(path);
  if (!out.open(QIODevice::WriteOnly)) return tr("Cannot write %1: %2").arg(path, out.errorString());
  const std::string text = document().dump(2) + "\n";
  out.write(text.data(), static_cast<qint64>(text.size()));
  if (!out.commit()) return tr("Cannot write %1: %2").arg(path, out.errorString());
  if (kind_ != FileKind::case_store) {
    discardRecovery();
    kind_ = FileKind::interchange_json;
    path_ = QFileInfo(path).absoluteFilePath();
    modified_ = false;
    emit changed(Change::file);
  }
  return {};
}

QString CaseDocument::saveAsCaseStore(const QString& path) {
  try {
    const json current = document();
    auto created = store::CaseStore::create(to_path(path), current, declaredExaminer());
    discardRecovery();
    store_ = std::make_unique<store::CaseStore>(std::move(created));
    read_only_ = false;
    read_only_reason_.clear();
    adopt(store_->state(), FileKind::case_store, path);
    return {};
  } catch (const std::exception& error) {
    return tr("Cannot create %1: %2").arg(path, QString::fromStdString(error.what()));
  }
}

store::StoreOptions CaseDocument::storeOptions() const { return {}; }

store::ExaminerName CaseDocument::declaredExaminer() const {
  // Throws validation::InvalidValue ("no examiner's name was given ...") when none is set, so a
  // change to a case file is refused, with that message, rather than recorded without a name.
  return store::ExaminerName(examiner_.toStdString());
}

void CaseDocument::markSaved() {
  if (!modified_ || kind_ == FileKind::case_store) return;
  modified_ = false;
  discardRecovery();
  emit changed(Change::file);
}

QString CaseDocument::save() {
  if (kind_ == FileKind::case_store) return {};
  if (kind_ == FileKind::interchange_json && !path_.isEmpty()) return saveJson(path_);
  return tr("The case has no file yet: use Save As.");
}

// --- edits -----------------------------------------------------------------------------------

namespace {

template <typename Body>
bool attempt_edit(CaseDocument* document, bool read_only, const QString& read_only_reason, Body&& body) {
  if (read_only) {
    emit document->editFailed(CaseDocument::tr("The case is open read-only: %1").arg(read_only_reason));
    return false;
  }
  try {
    body();
    return true;
  } catch (const std::exception& error) {
    emit document->editFailed(CaseDocument::tr("The edit was not made: %1").arg(QString::fromStdString(error.what())));
    return false;
  }
}

}  // namespace

bool CaseDocument::setField(const store::EntityRef& entity, const std::string& field, const std::optional<json>& value) {
  const bool ok = attempt_edit(this, read_only_, read_only_reason_, [&] {
    if (store_) store_->set_field(declaredExaminer(), entity, field, value);
    else state_.set_value(entity, field, value);
  });
  if (ok) contentChanged();
  return ok;
}

bool CaseDocument::addItem(const json& item, std::size_t position) {
  const bool ok = attempt_edit(this, read_only_, read_only_reason_, [&] {
    if (store_) store_->add_item(declaredExaminer(), item, position);
    else state_.add_item(item, position);
  });
  if (ok) contentChanged();
  return ok;
}

bool CaseDocument::removeItem(const std::string& id) {
  const bool ok = attempt_edit(this, read_only_, read_only_reason_, [&] {
    if (store_) store_->remove_item(declaredExaminer(), id);
    else state_.remove_item(id);
  });
  if (ok) contentChanged();
  return ok;
}

bool CaseDocument::moveItem(const std::string& id, std::size_t position) {
  const bool ok = attempt_edit(this, read_only_, read_only_reason_, [&] {
    if (store_) store_->move_item(declaredExaminer(), id, position);
    else state_.move_item(id, position);
  });
  if (ok) contentChanged();
  return ok;
}

bool CaseDocument::replaceDocument(const json& document) {
  if (store_) {
    emit editFailed(tr("A case file keeps every edit; its content is not replaced as a whole."));
    return false;
  }
  const bool ok = attempt_edit(this, read_only_, read_only_reason_, [&] { state_ = store::CaseState::from_document(document); });
  if (ok) contentChanged();
  return ok;
}

QString CaseDocument::sealingRefusal() const {
  if (!store_) return tr("Only a case file (.cpcase) can seal a revision: save the case as a case file first.");
  if (read_only_) return tr("The case is open read-only: %1").arg(read_only_reason_);
  return {};
}

std::shared_ptr<const platform::Ed25519PrivateKey> CaseDocument::sealerKey(QString& problem) const {
  problem = sealingRefusal();
  if (!problem.isEmpty()) return nullptr;
  try {
    const store::ExaminerName sealer = declaredExaminer();
    store_->sealer_role(sealer);  // who may seal is settled before the key is looked for
    return store::find_signing_key(sealer);
  } catch (const std::exception& error) {
    problem = QString::fromStdString(error.what());
  }
  return nullptr;
}

std::optional<store::PreparedSeal> CaseDocument::prepareSeal(std::shared_ptr<const platform::Ed25519PrivateKey> key,
                                                             QString& problem) const {
  problem = sealingRefusal();
  if (!problem.isEmpty()) return std::nullopt;
  try {
    return store_->prepare_seal(declaredExaminer(), std::move(key));
  } catch (const std::exception& error) {
    problem = QString::fromStdString(error.what());
  }
  return std::nullopt;
}

QString CaseDocument::sealRevision(const store::PreparedSeal& prepared, const QByteArray& report_bytes,
                                   const QString& report_file_name) {
  if (const QString refused = sealingRefusal(); !refused.isEmpty()) return refused;
  try {
    store_->seal_revision(prepared,
                          std::string_view(report_bytes.constData(), static_cast<std::size_t>(report_bytes.size())),
                          report_file_name.toStdString());
  } catch (const std::exception& error) {
    // store::CaseChanged says itself that the case moved on since prepareSeal and nothing was written.
    return QString::fromStdString(error.what());
  }
  emit changed(Change::history | Change::file);
  return {};
}

void CaseDocument::contentChanged() {
  if (!store_) {
    modified_ = true;
    recovery_timer_.start();
  }
  recompute();
  emit changed(Change::content | Change::evaluation | Change::guard | Change::file | Change::history);
}

void CaseDocument::recompute() {
  const json current = document();
  reading::RefusedDataFiles refused;  // the data files refused as outside, for the open prompt
  points_ = evaluate_points(current, baseDir());
  if (points_.evaluated_case) guard_service_.useRuleFiles(points_.evaluated_case->guard_rule_files);
  refused_files_ = refused.files();
  guard_ = guard_service_.check(current);
  if (points_.evaluated_case) {
    try {
      guard_.case_checks = guard::check_case_setup(*points_.evaluated_case);
    } catch (const std::exception&) {
      // Only ill-formed UTF-8 throws, and the case was read from the editor's own JSON document.
    }
  }
  runner_->request(runner_->latestGeneration() + 1, points_.evaluated_case);
}

void CaseDocument::allowRefusedDataFiles() {
  if (refused_files_.empty()) return;
  for (const auto& file : refused_files_) reading::allow_file_for_this_run(file.resolved);
  recompute();
  emit changed(Change::content | Change::evaluation | Change::guard);
}

bool CaseDocument::spreadPending() const { return !runner_->idle(); }

bool CaseDocument::waitForSpread(int timeout_ms) {
  QDeadlineTimer deadline(timeout_ms);
  while (!runner_->idle() && !deadline.hasExpired()) {
    QCoreApplication::processEvents(QEventLoop::AllEvents, 20);
    if (!runner_->idle()) QThread::msleep(2);
  }
  return runner_->idle();
}

std::vector<validation::Problem> CaseDocument::problemsAt(const std::string& item, const std::string& field_prefix) const {
  std::vector<validation::Problem> out;
  for (const auto& problem : points_.problems) {
    if (problem.where.item != item) continue;
    const std::string& field = problem.where.field;
    if (field_prefix.empty() ||
        (field.compare(0, field_prefix.size(), field_prefix) == 0 &&
         (field.size() == field_prefix.size() || field[field_prefix.size()] == '.' || field[field_prefix.size()] == '[')))
      out.push_back(problem);
  }
  return out;
}

// --- recovery --------------------------------------------------------------------------------

QString CaseDocument::recoveryFolder() {
  return QStandardPaths::writableLocation(QStandardPaths::AppLocalDataLocation) + "/recovery";
}

QString CaseDocument::recoveryPath() const {
  const QString key = path_.isEmpty() ? QStringLiteral("untitled") : path_;
  const QByteArray digest = QCryptographicHash::hash(key.toUtf8(), QCryptographicHash::Sha256).toHex().left(24);
  return recoveryFolder() + "/" + QString::fromLatin1(digest) + ".json";
}

void CaseDocument::writeRecovery() {
  QDir().mkpath(recoveryFolder());
  QSaveFile out(recoveryPath());
  if (!out.open(QIODevice::WriteOnly)) return;
  const json snapshot{{"path", path_.toStdString()}, {"document", document()}};
  const std::string text = snapshot.dump();
  out.write(text.data(), static_cast<qint64>(text.size()));
  out.commit();
}

std::optional<json> CaseDocument::recoverySnapshot() const {
  if (kind_ == FileKind::case_store) return std::nullopt;
  QFile in(recoveryPath());
  if (!in.open(QIODevice::ReadOnly)) return std::nullopt;
  try {
    json snapshot = json::parse(in.readAll().toStdString());
    if (snapshot.value("path", std::string()) != path_.toStdString()) return std::nullopt;
    json recovered = snapshot.at("document");
    if (recovered == document()) return std::nullopt;
    return recovered;
  } catch (const std::exception&) {
    return std::nullopt;
  }
}

void CaseDocument::discardRecovery() {
  recovery_timer_.stop();
  QFile::remove(recoveryPath());
}

}  // namespace counterpoise::editor
