#pragma once
// The one notifier of the editor. A CaseDocument owns the case as its JSON document (the
// store's CaseState: sections and ordered items), the file it belongs to (a .cpcase case store
// or a JSON interchange file), the point evaluation (recomputed synchronously after every edit)
// and the full evaluation with uncertainty (recomputed off the GUI thread). It emits changed()
// with what changed; panels and models re-render from it.
//
// Ownership (written once): the MainWindow owns the CaseDocument and its QUndoStack; widgets
// hold non-owning pointers to both and never write the document: they call the EditFacade,
// whose QUndoCommands are the only callers of the mutating functions below.

#include <QFlags>
#include <QObject>
#include <QString>
#include <QTimer>

#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "app/editor/guard_findings.hpp"
#include "app/editor/point_evaluation.hpp"
#include "app/editor/spread_runner.hpp"
#include "core/reading/data_access.hpp"
#include "core/store/case_state.hpp"

namespace counterpoise::platform {
class Ed25519PrivateKey;
}
namespace counterpoise::store {
class CaseStore;
struct StoreOptions;
class ExaminerName;
struct PreparedSeal;
}

namespace counterpoise::editor {

enum class FileKind { none, interchange_json, case_store };

enum class Change {
  content = 0x1,     // the case document
  evaluation = 0x2,  // the point evaluation (always with content)
  spread = 0x4,      // the evaluation with uncertainty arrived
  file = 0x8,        // path, kind, read-only or modified state
  guard = 0x10,      // wording findings
  history = 0x20,    // audit rows or revisions (store)
};
Q_DECLARE_FLAGS(Changes, Change)

class CaseDocument : public QObject {
  Q_OBJECT
 public:
  explicit CaseDocument(QObject* parent = nullptr);
  ~CaseDocument() override;

  // --- files -------------------------------------------------------------------------------
  // Each returns an empty string on success or the message to show (naming the file).
  QString newCase();                                   // an untitled case from the template
  QString openFile(const QString& path);               // .cpcase or JSON, by content, or a
                                                       // postgresql://…/DB?case=REF address
  QString saveJson(const QString& path);               // writes the interchange file
  QString saveAsCaseStore(const QString& path);        // creates a .cpcase and switches to it
  QString save();                                      // JSON: rewrite; store: nothing to do

  FileKind fileKind() const { return kind_; }
  // The file's absolute path, or the database address as given.
  QString filePath() const { return path_; }
  // True for a case in a shared database (fileKind() is then case_store).
  bool inDatabase() const;
  QString displayName() const;
  // A name for files made from the case (a report, an export), without folder or suffix: the
  // file's base name, or the case reference of a case in a database with any character other
  // than letters, digits, '.', '-' and '_' made a '-'; "" for a case never saved.
  QString baseName() const;
  bool readOnly() const { return read_only_; }
  QString readOnlyReason() const { return read_only_reason_; }
  // Unsaved edits (JSON files only: a case store commits every edit).
  bool modified() const { return modified_; }
  std::filesystem::path baseDir() const;

  // The examiner's declared name, recorded (with the OS account) with every edit and seal of a
  // case file; empty: changes to a case file are refused with a message asking for the name.
  void setExaminer(const QString& name) { examiner_ = name; }
  QString examiner() const { return examiner_; }
  // Marks the content as the saved one (undo returned to the state last saved).
  void markSaved();

  // The store, when the case is a .cpcase; nullptr otherwise.
  store::CaseStore* caseStore() const { return store_.get(); }

  // --- content -----------------------------------------------------------------------------
  const store::CaseState& state() const;
  nlohmann::json document() const;
  // The value at (entity, field) or nullopt (see store::CaseState::value_at); never throws.
  std::optional<nlohmann::json> value(const store::EntityRef& entity, const std::string& field) const;
  std::optional<nlohmann::json> itemBody(const std::string& id) const;
  std::vector<std::string> itemIds() const;
  // A fresh id ("E5") not yet used by any item.
  std::string freshItemId() const;

  // --- evaluation --------------------------------------------------------------------------
  const PointSnapshot& points() const { return points_; }
  const SpreadResult& spread() const { return spread_; }
  // True while a full evaluation for the current content is still running.
  bool spreadPending() const;
  // Waits (processing events) until the full evaluation for the current content has arrived or
  // `timeout_ms` passed; returns whether it arrived. For tests and the screenshot mode.
  bool waitForSpread(int timeout_ms);
  // Problems the core reported for `item` (an item id or a section: "case", "propositions",
  // "file", "priors") whose field starts with `field_prefix`; "" matches all of the item.
  std::vector<validation::Problem> problemsAt(const std::string& item, const std::string& field_prefix) const;
  const GuardFindings& guard() const { return guard_; }
  // The data files the case names that were refused as lying outside its folder and the
  // laboratory data folders, in the last evaluation (reading/data_access.hpp).
  const std::vector<reading::RefusedDataFile>& refusedDataFiles() const { return refused_files_; }
  // Allows the refused data files above for the rest of this session (the user was asked, and
  // agreed, naming each) and evaluates again.
  void allowRefusedDataFiles();

  // --- edits: only EditFacade's commands call these ------------------------------------------
  // Each applies one edit (through the store when present: one committed transaction with its
  // audit row) and returns true, or emits editFailed with the reason and returns false.
  bool setField(const store::EntityRef& entity, const std::string& field, const std::optional<nlohmann::json>& value);
  bool addItem(const nlohmann::json& item, std::size_t position);
  bool removeItem(const std::string& id);
  bool moveItem(const std::string& id, std::size_t position);
  // Replaces the whole document (JSON files only: recovery of unsaved edits).
  bool replaceDocument(const nlohmann::json& document);

  // Issuing a report, in the steps `counterpoise-cli report` takes (docs/case-store.md, "Signed
  // seals"). sealerKey settles who seals before any work: the declared examiner must be allowed
  // to seal this case (store::CaseStore::sealer_role); then returns their signing key
  // (store::find_signing_key), null when they have none. Sets `problem` (and returns null) when
  // nothing can be sealed: not a case file, read-only, no examiner or one who may not seal, a
  // key file that cannot be used.
  std::shared_ptr<const platform::Ed25519PrivateKey> sealerKey(QString& problem) const;
  // Fixes and signs the seal before the report is rendered (store::CaseStore::prepare_seal; a
  // null `key`: unsigned, as the user chose); nullopt with `problem` set when it cannot be made.
  std::optional<store::PreparedSeal> prepareSeal(std::shared_ptr<const platform::Ed25519PrivateKey> key,
                                                 QString& problem) const;
  // Writes the prepared seal with the report rendered for it; returns "" or the reason nothing
  // was written (the case changed since prepareSeal: store::CaseChanged, or verification).
  QString sealRevision(const store::PreparedSeal& prepared, const QByteArray& report_bytes,
                       const QString& report_file_name);

  // --- recovery of unsaved JSON edits ------------------------------------------------------
  // A snapshot of unsaved edits to the file at `path` left by an earlier session, if any.
  std::optional<nlohmann::json> recoverySnapshot() const;
  void discardRecovery();
  // The folder where recovery snapshots are written (for tests).
  static QString recoveryFolder();

 signals:
  void changed(counterpoise::editor::Changes what);
  void editFailed(const QString& message);

 private:
  void adopt(store::CaseState state, FileKind kind, const QString& path);
  QString openDatabaseCase(const QString& address);
  store::StoreOptions storeOptions() const;
  store::ExaminerName declaredExaminer() const;
  // Why no revision can be sealed now (not a case file, read-only), or "".
  QString sealingRefusal() const;
  void contentChanged();
  void recompute();
  void writeRecovery();
  void flushRecovery();
  QString recoveryPath() const;

  std::unique_ptr<store::CaseStore> store_;
  store::CaseState state_;  // used when there is no store
  FileKind kind_ = FileKind::none;
  QString path_;
  bool read_only_ = false;
  QString read_only_reason_;
  bool modified_ = false;
  QString examiner_;
  PointSnapshot points_;
  std::vector<reading::RefusedDataFile> refused_files_;
  SpreadResult spread_;
  SpreadRunner* runner_ = nullptr;
  GuardFindings guard_;
  GuardService guard_service_;
  QTimer recovery_timer_;  // recovery snapshots are written after a short pause, not per keystroke
};

}  // namespace counterpoise::editor

Q_DECLARE_OPERATORS_FOR_FLAGS(counterpoise::editor::Changes)
Q_DECLARE_METATYPE(counterpoise::editor::Changes)
