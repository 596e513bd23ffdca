#pragma once
// What the GUI tests share: the demo cases they open, the core's own evaluation of what the
// editor holds (computed without the editor's code, to compare the screen against), and typing
// into a field the way a user does.

#include <QFile>
#include <QLineEdit>
#include <QTemporaryDir>
#include <QString>
#include <QTest>

#include <optional>
#include <stdexcept>
#include <string>

#include <nlohmann/json.hpp>

#include "app/editor/case_document.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/item_table_model.hpp"
#include "app/editor/main_window.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/store/case_store.hpp"
#include "core/store/examiner_key.hpp"

// Compares two JSON values, printing both when they differ.
#define SAME_JSON(actual, expected)                                                             \
  QVERIFY2(nlohmann::json(actual) == nlohmann::json(expected),                                  \
           qPrintable(QString::fromStdString(nlohmann::json(actual).dump() + " is not " +       \
                                             nlohmann::json(expected).dump())))

namespace counterpoise::editor_test {

using editor::ItemTableModel;
using editor::MainWindow;

// COUNTERPOISE_KEY_DIR set to `folder` for one test.
class KeyFolder {
 public:
  explicit KeyFolder(const QString& folder) { qputenv(store::kKeyFolderVariable, folder.toUtf8()); }
  ~KeyFolder() { qunsetenv(store::kKeyFolderVariable); }
  KeyFolder(const KeyFolder&) = delete;
  KeyFolder& operator=(const KeyFolder&) = delete;
};

inline const QString kNetwork = QStringLiteral(COUNTERPOISE_DEMO_DIR "/harwick-vale-network.json");
inline const QString kBreakIn = QStringLiteral(COUNTERPOISE_DEMO_DIR "/harwick-vale-breakin.json");
// A single-source DNA case with the two propositions Hp and Hd (the demo DNA case weighs Hp
// against two alternatives); it reads the demo's table.
inline const QString kDna = QStringLiteral(COUNTERPOISE_DEMO_DIR "/../tests/data/gui/dna-two-propositions.json");
inline const QString kGlass = QStringLiteral(COUNTERPOISE_DEMO_DIR "/harwick-vale-glass.json");
inline const QString kMixture = QStringLiteral(COUNTERPOISE_DEMO_DIR "/harwick-vale-mixture.json");

// The core's evaluation of what the editor holds, computed without the editor's code.
inline evaluation::CaseEvaluation core_evaluation(const MainWindow& window) {
  auto read = interchange::read_case(window.document()->document(), window.document()->baseDir());
  if (!read.value) throw std::runtime_error("the case does not read: " + read.diagnostics.problems().front().text());
  return evaluation::evaluate_case(*read.value);
}

inline const evaluation::ItemEvaluation& core_item(const evaluation::CaseEvaluation& e, const std::string& id) {
  for (const auto& item : e.items)
    if (item.id == id) return item;
  throw std::runtime_error("no item " + id);
}

inline QString table_text(const MainWindow& window, const std::string& id, int column) {
  const auto* model = window.itemModel();
  return model->index(model->rowOf(id), column).data().toString();
}

inline double table_raw(const MainWindow& window, const std::string& id, int column) {
  const auto* model = window.itemModel();
  return model->index(model->rowOf(id), column).data(ItemTableModel::RawValueRole).toDouble();
}

// Replaces the text of a line field the way a user does: select all, type, press Enter (which
// commits the typing as one change; see editor::commit_typing).
inline void retype(QLineEdit* line, const QString& text) {
  line->setFocus();
  line->selectAll();
  QTest::keyClicks(line, text);
  QTest::keyClick(line, Qt::Key_Return);
}

// Opens `path` in a window large enough for the whole item form, on item `id` of the Findings tab.
inline bool open_on_item(MainWindow& window, const QString& path, const std::string& id) {
  window.resize(1300, 1000);
  window.show();
  if (!window.openPath(path).isEmpty()) return false;
  window.showTab(MainWindow::FindingsTab);
  window.selectItem(id);
  return true;
}

// The texts of the in-place messages a form shows at the moment (hidden ones left out).
inline QStringList shown_messages(const QWidget* form) {
  QStringList texts;
  for (const auto* message : form->findChildren<editor::FieldMessage*>())
    if (!message->isHidden() && !message->text().isEmpty()) texts << message->text();
  return texts;
}

inline bool any_contains(const QStringList& texts, const QString& part) {
  for (const auto& t : texts)
    if (t.contains(part)) return true;
  return false;
}

inline std::optional<nlohmann::json> item_field(const MainWindow& window, const std::string& id, const std::string& field) {
  return window.document()->value(store::EntityRef::item(id), field);
}

// The bytes of a file, or empty when it cannot be read.
inline std::string file_bytes(const QString& path) {
  QFile file(path);
  if (!file.open(QIODevice::ReadOnly)) return {};
  return file.readAll().toStdString();
}

// Writes `document` as `name` in `folder`; returns its path, or empty when it cannot be written.
inline QString write_case(const QTemporaryDir& folder, const QString& name, const nlohmann::json& document) {
  const QString path = folder.filePath(name);
  QFile file(path);
  if (!file.open(QIODevice::WriteOnly)) return {};
  file.write(QByteArray::fromStdString(document.dump(2) + "\n"));
  return path;
}

// The audit rows of the window's case file.
inline std::size_t audit_rows(const MainWindow& window) { return window.document()->caseStore()->audit_rows().size(); }

// The entry of alternative `id` in an item's evaluation.
inline const evaluation::AlternativeEvaluation& against(const evaluation::ItemEvaluation& item, const std::string& id) {
  for (const auto& a : item.by_alternative)
    if (a.id == id) return a;
  throw std::runtime_error("no alternative " + id);
}

}  // namespace counterpoise::editor_test
