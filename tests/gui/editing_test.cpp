// GUI tests of safe editing and of the audit trail the editing leaves (Qt Test, offscreen):
// the wheel does not change a control the user is not working in, and one deliberate change
// of a field is one undo step and one audit row holding the whole field's old and new value.

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QComboBox>
#include <QFileDialog>
#include <QFloat16>
#include <QDialog>
#include <QDialogButtonBox>
#include <QLabel>
#include <QPushButton>
#include <QTreeWidget>
#include <QInputDialog>
#include <QMenuBar>
#include <QMessageBox>
#include <QProgressDialog>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTextBrowser>
#include <QTimer>
#include <QToolBar>
#include <QToolButton>
#include <QLineEdit>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>
#include <QWheelEvent>

#include <pwd.h>
#include <sqlite3.h>
#include <unistd.h>

#include "app/editor/editor_settings.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/guard_panel.hpp"
#include "app/editor/help_window.hpp"
#include "app/editor/history_panel.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/main_window.hpp"
#include "app/editor/probability_editor.hpp"
#include "app/editor/section_form.hpp"
#include "core/store/case_store.hpp"
#include "editor_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::editor_test;

namespace {

// One notch of a mouse wheel turned towards the user, at the middle of `widget`.
void turn_wheel(QWidget* widget) {
  const QPointF centre = QRectF(widget->rect()).center();
  QWheelEvent wheel(centre, widget->mapToGlobal(centre), QPoint(), QPoint(0, -120), Qt::NoButton, Qt::NoModifier,
                    Qt::NoScrollPhase, false);
  QApplication::sendEvent(widget, &wheel);
}

// The action of `window`'s menu bar whose text (without '&') starts with `text`.
QAction* menu_action(const MainWindow& window, const QString& menu, const QString& text) {
  for (QAction* top : window.menuBar()->actions()) {
    if (top->text().remove('&') != menu || !top->menu()) continue;
    for (QAction* a : top->menu()->actions())
      if (a->text().remove('&').startsWith(text)) return a;
  }
  return nullptr;
}

// Answers the next input dialog with `text` once it is shown.
void answer_next_input_dialog(const QString& text) {
  QTimer::singleShot(0, [text] {
    QTRY_VERIFY(qobject_cast<QInputDialog*>(QApplication::activeModalWidget()));
    auto* dialog = qobject_cast<QInputDialog*>(QApplication::activeModalWidget());
    dialog->setTextValue(text);
    dialog->accept();
  });
}

}  // namespace

class EditingTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-test-editing");
    // The examiner is declared once per user; these tests are a user who has declared one
    // (Harwick Vale demo name).
    editor::settings::set_examiner_name("Dr Imogen Tarrant");
    QVERIFY(temp_.isValid());
  }

  // The wheel over the proposition level, while the user works in another field, changes
  // nothing: not the case, not the combo box, not the undo stack. With the focus in the combo
  // box the same wheel changes the level (so the event does reach a focused control).
  void wheelOverUnfocusedComboChangesNothing() {
    MainWindow window;
    window.show();
    QVERIFY(QTest::qWaitForWindowActive(&window));
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.showTab(MainWindow::PropositionsTab);
    auto* level = window.propositionsForm()->findChild<QComboBox*>("propositions.level");
    QVERIFY(level);
    auto* hp = window.propositionsForm()->findChild<QWidget*>("propositions.hp");
    QVERIFY(hp);
    hp->setFocus();
    QTRY_VERIFY(hp->hasFocus());
    const auto before = window.document()->value(store::EntityRef::section("propositions"), "level");
    const int index_before = level->currentIndex();

    turn_wheel(level);
    QCOMPARE(level->currentIndex(), index_before);
    QCOMPARE(window.document()->value(store::EntityRef::section("propositions"), "level"), before);
    QCOMPARE(window.undoStack()->count(), 0);
    QVERIFY(level->focusPolicy() != Qt::WheelFocus);  // the wheel does not take the focus either

    level->setFocus();
    QTRY_VERIFY(level->hasFocus());
    turn_wheel(level);
    QVERIFY(level->currentIndex() != index_before);
    QVERIFY(window.document()->value(store::EntityRef::section("propositions"), "level") != before);
  }

  // Typing " (red)" at the end of an item's title, in a case file, is one change: one undo step
  // and one audit row whose old and new values are the whole title before and after; the
  // history names the field in words.
  void typingIntoTitleIsOneAuditRowAndOneUndoStep() {
    const QString path = temp_.filePath("title.cpcase");
    MainWindow window;
    window.show();
    QVERIFY(QTest::qWaitForWindowActive(&window));
    QCOMPARE(window.openPath(kBreakIn), QString());
    QCOMPARE(window.saveTo(path), QString());
    window.showTab(MainWindow::FindingsTab);
    window.selectItem("E1");
    const std::string old_title = item_field(window, "E1", "title")->get<std::string>();
    const std::size_t rows_before = window.document()->caseStore()->audit_rows().size();

    QLineEdit* title = window.itemForm()->findChild<QLineEdit*>("itemTitle");
    QVERIFY(title);
    title->setFocus();
    QTRY_VERIFY(title->hasFocus());
    title->end(false);
    QTest::keyClicks(title, " (red)");
    // Typing alone, before a pause, commits nothing.
    QCOMPARE(item_field(window, "E1", "title"), std::optional<nlohmann::json>(old_title));
    const std::string new_title = old_title + " (red)";
    QTRY_COMPARE_WITH_TIMEOUT(item_field(window, "E1", "title"), std::optional<nlohmann::json>(new_title), 5000);
    // Leaving the field after the pause commits nothing more.
    window.itemForm()->descriptionField()->setFocus();
    QTest::qWait(2 * editor::kCommitPauseMs);

    QCOMPARE(window.undoStack()->count(), 1);
    const auto rows = window.document()->caseStore()->audit_rows();
    QCOMPARE(rows.size(), rows_before + 1);
    const auto& row = rows.back();
    QCOMPARE(row.field, std::string("title"));
    QCOMPARE(row.old_value, std::optional<std::string>(nlohmann::json(old_title).dump()));
    QCOMPARE(row.new_value, std::optional<std::string>(nlohmann::json(new_title).dump()));

    window.showTab(MainWindow::HistoryTab);
    auto* audit = window.historyPanel()->auditTable();
    QTRY_VERIFY(audit->rowCount() == static_cast<int>(rows.size()));
    QCOMPARE(audit->item(0, editor::HistoryPanel::WhatColumn)->text(), QString("title of E1"));
    QCOMPARE(audit->item(0, editor::HistoryPanel::ActionColumn)->text(), QString("changed"));

    // One undo step takes the whole change back.
    window.undoStack()->undo();
    QCOMPARE(item_field(window, "E1", "title"), std::optional<nlohmann::json>(old_title));
  }

  // A probability typed and committed with Enter is one row naming "P(E|Hp) of E4".
  void historyNamesProbabilityInWords() {
    const QString path = temp_.filePath("probability.cpcase");
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    QCOMPARE(window.saveTo(path), QString());
    window.showTab(MainWindow::FindingsTab);
    window.selectItem("E4");
    retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.75");
    window.showTab(MainWindow::HistoryTab);
    auto* audit = window.historyPanel()->auditTable();
    QTRY_VERIFY(audit->rowCount() >= 2);
    QCOMPARE(audit->item(0, editor::HistoryPanel::WhatColumn)->text(), QString("P(E|Hp) of E4"));
    QCOMPARE(audit->item(0, editor::HistoryPanel::NewValueColumn)->text(), QString("0.75"));
    // Beside the examiner, every row's operating-system account, as the system names the account
    // this test runs under (getpwuid, as `id -un` does); a shared store's rows show the database
    // role there instead (shared_store_test).
    QVERIFY(!audit->isColumnHidden(editor::HistoryPanel::ExaminerColumn));
    QVERIFY(!audit->isColumnHidden(editor::HistoryPanel::AccountColumn));
    QCOMPARE(audit->horizontalHeaderItem(editor::HistoryPanel::AccountColumn)->text(), QString("Operating-system account"));
    const passwd* entry = getpwuid(getuid());
    QVERIFY(entry != nullptr);
    for (int row = 0; row < audit->rowCount(); ++row)
      QCOMPARE(audit->item(row, editor::HistoryPanel::AccountColumn)->text(), QString::fromLocal8Bit(entry->pw_name));
  }

  // A reviewer's note on a sealed revision reads in words in the history: the reviewer, "review
  // note", the revision and the verdict with the note; no JSON.
  void historyShowsReviewNotesInWords() {
    const QString path = temp_.filePath("reviewed.cpcase");
    {
      MainWindow window;
      QCOMPARE(window.openPath(kBreakIn), QString());
      QCOMPARE(window.saveTo(path), QString());
    }
    {
      auto store = store::CaseStore::open(path.toStdString(), store::OpenMode::edit);
      const store::ExaminerName examiner("Dr Imogen Tarrant"), reviewer("Dr Owen Pryce");
      store.declare_reviewer(examiner, reviewer);
      store.seal_revision(examiner, "report bytes", "breakin-r1.pdf");
      store.add_review_note(reviewer, 1, store::ReviewVerdict::disagree, "E2 should cite the validation file.");
    }
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(path), QString());
    window.showTab(MainWindow::HistoryTab);
    auto* audit = window.historyPanel()->auditTable();
    QTRY_VERIFY(audit->rowCount() >= 4);
    QCOMPARE(audit->item(0, editor::HistoryPanel::ExaminerColumn)->text(), QString("Dr Owen Pryce (reviewer)"));
    QCOMPARE(audit->item(0, editor::HistoryPanel::ActionColumn)->text(), QString("review note"));
    QCOMPARE(audit->item(0, editor::HistoryPanel::WhatColumn)->text(), QString("sealed revision 1"));
    QCOMPARE(audit->item(0, editor::HistoryPanel::NewValueColumn)->text(), QString("disagree: \u201cE2 should cite the validation file.\u201d"));
    QCOMPARE(audit->item(1, editor::HistoryPanel::ActionColumn)->text(), QString("sealed"));
    QCOMPARE(audit->item(2, editor::HistoryPanel::NewValueColumn)->text(), QString("Dr Owen Pryce"));  // the declared reviewer, by name
  }

  // The examiner is asked for once, kept in the settings, and recorded in every audit row of
  // the case file created afterwards; the next case file does not ask again.
  void examinerAskedOnceAndRecordedInAuditRows() {
    editor::settings::set_examiner_name("");
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    answer_next_input_dialog("Dr Owen Pritchard");
    QCOMPARE(window.saveTo(temp_.filePath("examiner.cpcase")), QString());
    QCOMPARE(editor::settings::examiner_name(), QString("Dr Owen Pritchard"));
    window.selectItem("E4");
    retype(window.itemForm()->probabilityEditor(false)->pointField(), "0.4");
    const auto rows = window.document()->caseStore()->audit_rows();
    QVERIFY(rows.size() >= 2);
    for (const auto& row : rows) QCOMPARE(QString::fromStdString(row.examiner), QString("Dr Owen Pritchard"));
    window.showTab(MainWindow::HistoryTab);
    QTRY_COMPARE(window.historyPanel()->auditTable()->item(0, editor::HistoryPanel::ExaminerColumn)->text(), QString("Dr Owen Pritchard"));

    // Declared once: a second case file is created without asking (a dialog would block here).
    MainWindow second;
    QCOMPARE(second.openPath(kGlass), QString());
    QCOMPARE(second.saveTo(temp_.filePath("examiner-2.cpcase")), QString());
    QCOMPARE(QString::fromStdString(second.document()->caseStore()->audit_rows().back().examiner), QString("Dr Owen Pritchard"));
    editor::settings::set_examiner_name("Dr Imogen Tarrant");
  }

  // Undo back to the saved state: the status no longer says there are unsaved edits.
  void undoToSavedStateClearsUnsaved() {
    const QString path = temp_.filePath("undo-saved.json");
    QFile::remove(path);
    QVERIFY(QFile::copy(kBreakIn, path));
    MainWindow window;
    QCOMPARE(window.openPath(path), QString());
    window.selectItem("E4");
    retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.9");
    QVERIFY(window.document()->modified());
    QVERIFY(window.isWindowModified());
    window.undoStack()->undo();
    QVERIFY(!window.document()->modified());
    QVERIFY(!window.isWindowModified());
    window.undoStack()->redo();
    QVERIFY(window.document()->modified());
    window.document()->discardRecovery();
  }

  // Edit has Cut, Copy and Paste acting on the focused field; Save As has a shortcut; Help
  // opens the user guide; About names the version, the build and the libraries' licences.
  void desktopHabits() {
    MainWindow window;
    window.show();
    QVERIFY(QTest::qWaitForWindowActive(&window));
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.showTab(MainWindow::CaseTab);
    auto* reference = window.caseForm()->findChild<QLineEdit*>("case.reference");
    reference->setFocus();
    QTRY_VERIFY(reference->hasFocus());
    reference->selectAll();
    QAction* copy = menu_action(window, "Edit", "Copy");
    QAction* paste = menu_action(window, "Edit", "Paste");
    QVERIFY(copy && paste && menu_action(window, "Edit", "Cut"));
    copy->trigger();
    QCOMPARE(QApplication::clipboard()->text(), QString("VFL-2026-0417"));
    reference->end(false);
    paste->trigger();
    QCOMPARE(reference->text(), QString("VFL-2026-0417VFL-2026-0417"));

    QAction* save_as = menu_action(window, "File", "Save As");
    QVERIFY(save_as && !save_as->shortcut().isEmpty());

    QAction* guide = menu_action(window, "Help", "User Guide");
    QVERIFY(guide);
    guide->trigger();
    auto* shown = window.findChild<editor::UserGuideWindow*>();
    QVERIFY(shown && shown->isVisible());
    QVERIFY2(shown->browser()->toPlainText().contains("Propositions"), qPrintable(shown->browser()->toPlainText().left(200)));

    const QString about = editor::about_text();
    QVERIFY(about.contains(COUNTERPOISE_VERSION));
    QVERIFY(about.contains(QString::fromLatin1(qVersion())));
    for (const char* name : {"Qt", "Boost", "SQLite", "OpenSSL", "nlohmann-json", "LGPL", "MIT"}) QVERIFY2(about.contains(name), name);
    QVERIFY(about.contains("Build "));
  }

  // Issuing a report from a JSON file says first, in one question, that the report seals a case
  // file and offers to create one; Cancel asks for no PDF name and leaves the file as it was.
  void issuingFromJsonExplainsTheCaseFileFirst() {
    MainWindow window;
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    QAction* issue = menu_action(window, "File", "Issue Report");
    QVERIFY(issue && issue->isEnabled());
    QString asked;
    bool file_dialog = false;
    QTimer answer;
    connect(&answer, &QTimer::timeout, &window, [&] {
      QWidget* modal = QApplication::activeModalWidget();
      if (auto* box = qobject_cast<QMessageBox*>(modal)) {
        asked = box->text();
        box->button(QMessageBox::Cancel)->click();
      } else if (auto* dialog = qobject_cast<QFileDialog*>(modal)) {
        file_dialog = true;
        dialog->reject();
      }
    });
    answer.start(50);
    issue->trigger();
    answer.stop();
    QVERIFY2(asked.contains("case file (.cpcase)"), qPrintable(asked));
    QVERIFY2(asked.contains("Create a case file from it now, then issue the report?"), qPrintable(asked));
    QVERIFY(!file_dialog);
    QCOMPARE(window.document()->fileKind(), editor::FileKind::interchange_json);
  }

  // The toolbar's Undo keeps its short label while the menu names the step to undo, so the
  // buttons after it do not move as the step's name changes.
  void toolbarButtonsStayPutAsUndoIsNamed() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    auto* toolbar = window.findChild<QToolBar*>();
    QVERIFY(toolbar);
    const auto positions = [toolbar] {
      QList<int> x;
      for (QToolButton* button : toolbar->findChildren<QToolButton*>())
        if (button->isVisible()) x << button->x();
      return x;
    };
    QToolButton* undo = nullptr;
    for (QToolButton* button : toolbar->findChildren<QToolButton*>())
      if (button->defaultAction() && button->defaultAction()->iconText() == "Undo") undo = button;
    QVERIFY(undo);
    QTest::qWait(50);
    const QList<int> before = positions();
    QVERIFY(window.edits()->setItemField("E4", "title", nlohmann::json("A title long enough to widen a label")));
    QVERIFY(window.undoStack()->canUndo());
    QVERIFY2(undo->defaultAction()->text().remove('&').size() > QString("Undo").size(), qPrintable(undo->defaultAction()->text()));
    QTest::qWait(50);
    QCOMPARE(undo->text(), QString("Undo"));
    QCOMPARE(positions(), before);
  }

  // The guard's rewrite is shown before it is applied: Cancel changes nothing; Apply changes the
  // flagged sentence in its own field and nothing else.
  void guardRewriteIsPreviewedFirst() {
    const std::string flagged = "The chance that the glass on his jacket got there by coincidence is 1 in 1,000.";
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    QVERIFY(window.edits()->setItemField("E1", "description", flagged + " The fragments were recovered by tape lifting."));
    window.showTab(MainWindow::GuardTab);
    auto* guard = window.guardPanel();
    int row = -1;
    for (int i = 0; i < guard->list()->topLevelItemCount(); ++i)
      if (guard->list()->topLevelItem(i)->text(0).startsWith("Item E1")) row = i;
    QVERIFY(row >= 0);
    const nlohmann::json before = window.document()->document();
    const int steps = window.undoStack()->count();

    QString preview;
    auto answer = [&preview](QDialogButtonBox::ButtonRole role) {
      QTimer::singleShot(0, [&preview, role] {
        QTRY_VERIFY(QApplication::activeModalWidget() && QApplication::activeModalWidget()->objectName() == "rewritePreview");
        auto* dialog = QApplication::activeModalWidget();
        preview = dialog->findChild<QLabel*>("rewriteText")->text();
        for (auto* button : dialog->findChild<QDialogButtonBox*>()->buttons())
          if (dialog->findChild<QDialogButtonBox*>()->buttonRole(button) == role) button->click();
      });
    };
    answer(QDialogButtonBox::RejectRole);
    QVERIFY(!guard->previewSuggestion(row));
    QVERIFY(preview.contains("coincidence"));  // the sentence as it is
    QVERIFY(preview.contains("Would read"));
    QCOMPARE(window.document()->document(), before);
    QCOMPARE(window.undoStack()->count(), steps);

    answer(QDialogButtonBox::AcceptRole);
    QVERIFY(guard->previewSuggestion(row));
    QCOMPARE(window.undoStack()->count(), steps + 1);
    const std::string rewritten = item_field(window, "E1", "description")->get<std::string>();
    QVERIFY(rewritten.find("coincidence is 1 in 1,000") == std::string::npos);
    // The sentence after the flagged one is kept, in the same field.
    QVERIFY2(rewritten.ends_with(" The fragments were recovered by tape lifting."), rewritten.c_str());
    // Every other field of the case is as it was.
    nlohmann::json after = window.document()->document();
    nlohmann::json expected = before;
    for (auto& item : expected["items"])
      if (item["id"] == "E1") item["description"] = rewritten;
    QCOMPARE(after, expected);
  }

  // A file that is not a case: one sentence, naming the file, without its bytes.
  void openingANonCaseFileSaysSo() {
    const QString path = temp_.filePath("photo.png");
    QFile file(path);
    QVERIFY(file.open(QIODevice::WriteOnly));
    file.write(QByteArray::fromHex("89504e470d0a1a0a0000000d49484452") + QByteArray(64, '\x01'));
    file.close();
    MainWindow window;
    const QString message = window.openPath(path);
    QCOMPARE(message, QString("photo.png is not a Counterpoise case: the editor opens case files (.cpcase) and cases saved as JSON."));

    const QString other = temp_.filePath("other.json");
    QFile json(other);
    QVERIFY(json.open(QIODevice::WriteOnly));
    json.write(R"({"name": "a list of things", "items": [1, 2]})");
    json.close();
    QCOMPARE(window.openPath(other),
             QString("other.json is not a Counterpoise case: the editor opens case files (.cpcase) and cases saved as JSON."));
  }

  // Export of the report shows a progress dialog (the window stays responsive) and Cancel
  // leaves no file written.
  void exportShowsProgressAndCancels() {
    MainWindow window;
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    QSignalSpy shown(&window, &MainWindow::progressShown);
    const QString pdf = temp_.filePath("progress.pdf");
    QCOMPARE(window.exportReportPdf(pdf), QString());
    QCOMPARE(shown.count(), 1);
    QCOMPARE(shown.front().front().toString(), QString("Writing the report"));
    QVERIFY(QFileInfo(pdf).size() > 1000);

    const QString cancelled = temp_.filePath("cancelled.pdf");
    auto connection = connect(&window, &MainWindow::progressShown, &window, [&window] {
      window.findChild<QProgressDialog*>("workProgress")->cancel();
    });
    QCOMPARE(window.exportReportPdf(cancelled), QString("Cancelled: no report was written."));
    disconnect(connection);
    QVERIFY(!QFileInfo::exists(cancelled));
  }

  // After a change the intervals are computed in the background: the status bar shows a busy
  // bar until they arrive, and the window takes edits meanwhile.
  void intervalsShowProgress() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    QVERIFY(window.document()->waitForSpread(30000));
    QTRY_VERIFY(!window.intervalsProgress()->isVisible());
    window.selectItem("E3");
    retype(window.itemForm()->reportedLrField(), "450");
    QVERIFY(window.document()->spreadPending());
    QVERIFY(window.intervalsProgress()->isVisible());
    QVERIFY(window.document()->waitForSpread(30000));
    QTRY_VERIFY(!window.intervalsProgress()->isVisible());
  }

  // A case file changed behind the program's back (an item's title rewritten through the SQLite
  // C API, as with the sqlite3 shell) fails verification: the editor opens it read-only, says
  // why, and no edit or seal reaches the file.
  void tamperedCaseFileOpensReadOnly() {
    const QString path = temp_.filePath("tampered.cpcase");
    QVERIFY(saved_then_changed(path, "UPDATE items SET body = json_set(body, '$.title', 'Changed afterwards') "
                                     "WHERE item_id = 'E1'"));
    const auto bytes = [&path] {
      QFile file(path);
      return file.open(QIODevice::ReadOnly) ? file.readAll() : QByteArray();
    };
    const QByteArray tampered = bytes();

    MainWindow window;
    QCOMPARE(window.openPath(path), QString());
    QVERIFY(window.document()->readOnly());
    const QString reason = window.document()->readOnlyReason();
    QVERIFY2(reason.contains("fails verification") && reason.contains("item \"E1\" differs"), qPrintable(reason));
    QSignalSpy failed(window.document(), &editor::CaseDocument::editFailed);
    QVERIFY(!window.document()->setField(store::EntityRef::item("E2"), "title", nlohmann::json("Edited")));
    QCOMPARE(failed.count(), 1);
    QString problem;
    QVERIFY(!window.document()->prepareSeal(nullptr, problem));
    QVERIFY2(problem.contains("fails verification"), qPrintable(problem));
    QVERIFY(!window.document()->sealerKey(problem));
    QCOMPARE(bytes(), tampered);
  }

  // A case file carrying a trigger of its own (one that would count to 10^12 when a session row
  // is written) is refused at once, in one sentence naming the trigger; the program's own
  // triggers and tables are not enough to open it.
  void caseFileWithForeignTriggerIsRefused() {
    const QString path = temp_.filePath("trigger.cpcase");
    QVERIFY(saved_then_changed(path, "CREATE TRIGGER spin AFTER INSERT ON session BEGIN WITH RECURSIVE c(x) AS "
                                     "(SELECT 1 UNION ALL SELECT x + 1 FROM c WHERE x < 1000000000000) "
                                     "SELECT count(*) FROM c; END"));
    MainWindow window;
    const QString message = window.openPath(path);
    QVERIFY2(message.contains("holds a trigger \"spin\" (on table \"session\") that this program did not create"),
             qPrintable(message));
    // The path is named once ("Cannot open P: P: ..." repeated it).
    QVERIFY2(message.startsWith("Cannot open " + path + ": "), qPrintable(message));
    QCOMPARE(message.count(path), 1);
    QVERIFY(window.document()->caseStore() == nullptr);
  }

 private:
  // Saves the break-in demo case as the case file `path`, closes it, and runs `sql` on the file
  // through the SQLite C API, as someone with the sqlite3 shell would. False when a step fails.
  static bool saved_then_changed(const QString& path, const char* sql) {
    {
      MainWindow window;
      if (!window.openPath(kBreakIn).isEmpty() || !window.saveTo(path).isEmpty()) return false;
    }
    sqlite3* db = nullptr;
    const bool opened = sqlite3_open_v2(path.toUtf8().constData(), &db, SQLITE_OPEN_READWRITE, nullptr) == SQLITE_OK;
    const bool changed = opened && sqlite3_exec(db, sql, nullptr, nullptr, nullptr) == SQLITE_OK;
    sqlite3_close(db);
    return changed;
  }

  QTemporaryDir temp_;
};

QTEST_MAIN(EditingTest)
#include "editing_test.moc"
