// GUI tests of several alternatives to Hp in the case editor (Qt Test, offscreen): the
// propositions tab switches a two-proposition case to a list of alternatives and back, adds,
// renames, reorders, weighs and removes alternatives, each change one undo step (and in a case
// file, one audit row per section or item it changes); refused input is named in the user's
// words; a removal that takes values out of items names them and waits for a yes. The item
// forms show one field per alternative, and the LRs are checked against the core's evaluation
// and against the formulas written out: LR against alternative i = P(E|Hp) / P(E|Hd_i), the
// compound LR = P(E|Hp) / sum_i w_i P(E|Hd_i) with the weights normalised here (common
// practice; DOMAIN "More than two propositions").

#include <QApplication>
#include <QCheckBox>
#include <QComboBox>
#include <QFile>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QStandardPaths>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QTreeWidget>
#include <QUndoStack>

#include <cmath>
#include <numeric>
#include <array>

#include "app/editor/alternatives_editor.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/guard_panel.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/probability_editor.hpp"
#include "app/editor/section_form.hpp"
#include "core/store/case_store.hpp"
#include "editor_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::editor_test;
using editor::AlternativesEditor;
using nlohmann::json;


namespace {

// An invented two-proposition case (Harwick Vale demo scenario): an assigned item, a reported
// LR and transfer findings.
json two_propositions() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-ALTED", "title": "Glass from the Mill Street shop" },
    "mode": "casework",
    "propositions": { "level": "source", "hp": "The glass came from the broken window at the Mill Street shop",
      "hd": "The glass came from another window of the same kind" },
    "items": [
      { "id": "E1", "title": "Glass composition", "model": "assigned", "p_given_hp": 0.6, "p_given_hd": 0.05 },
      { "id": "E2", "title": "Refractive index", "model": "reported-lr", "lr": 300, "method": "Vale refractive index comparison" }
    ] })");
}

AlternativesEditor* alternatives_of(const MainWindow& window) {
  return window.propositionsForm()->findChild<AlternativesEditor*>();
}

json alternatives(const MainWindow& window) {
  return window.document()->value(store::EntityRef::section("propositions"), "alternatives").value_or(json());
}

// Undo gives back `before` and redo `after`, each as one step.
bool undo_redo_exact(MainWindow& window, const json& before, const json& after) {
  window.undoStack()->undo();
  const bool undone = window.document()->document() == before;
  window.undoStack()->redo();
  return undone && window.document()->document() == after;
}

// Types `text` into a cell of the list as the table's editor commits it.
void edit_cell(AlternativesEditor* editor, int row, int column, const QString& text) {
  editor->table()->item(row, column)->setText(text);
}


}  // namespace

class AlternativesTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-alternatives-test");
    editor::settings::set_examiner_name("Dr Imogen Tarrant");  // Harwick Vale demo name
  }

  // The whole round: switch, add, text, weights, values per alternative, rename, reorder,
  // remove with its question, back to Hp and Hd; undo and redo of each, in a case file.
  void editsTheListAndEveryItemFollows() {
    QTemporaryDir folder;
    const QString source = write_case(folder, "glass.json", two_propositions());
    MainWindow window;
    QVERIFY(open_on_item(window, source, "E1"));
    QCOMPARE(window.saveTo(folder.filePath("glass.cpcase")), QString());
    window.showTab(MainWindow::PropositionsTab);
    AlternativesEditor* editor = alternatives_of(window);
    QVERIFY(editor && editor->switchButton()->isVisible());
    QVERIFY(!editor->table()->isVisible());

    // Switch: Hd becomes Hd1 with its text, and each item's value under Hd moves with it.
    json before = window.document()->document();
    std::size_t rows = audit_rows(window);
    int steps = window.undoStack()->count();
    editor->switchButton()->click();
    SAME_JSON(alternatives(window), json::parse(R"([{ "id": "Hd1", "text": "The glass came from another window of the same kind" }])"));
    SAME_JSON(*item_field(window, "E1", "p_given"), json::parse(R"({ "Hp": 0.6, "Hd1": 0.05 })"));
    SAME_JSON(*item_field(window, "E2", "alternatives"), json::parse(R"({ "Hd1": { "lr": 300 } })"));
    QCOMPARE(window.undoStack()->count(), steps + 1);
    QCOMPARE(audit_rows(window), rows + 3);  // the propositions and the two items
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));
    QTRY_VERIFY(editor->table()->isVisible());
    QVERIFY(!window.propositionsForm()->findChild<QWidget*>("propositions.hd")->isVisible());

    // Add two alternatives: one step and one audit row each; the core names the missing text.
    for (const char* id : {"Hd2", "Hd3"}) {
      before = window.document()->document();
      rows = audit_rows(window);
      editor->addButton()->click();
      SAME_JSON(alternatives(window).back()["id"], json(id));
      QCOMPARE(audit_rows(window), rows + 1);
      QVERIFY(undo_redo_exact(window, before, window.document()->document()));
    }
    QTRY_COMPARE(editor->table()->rowCount(), 3);
    QTRY_VERIFY2(editor->message().contains("Alternative 2 (Hd2), proposition: must not be empty"), qPrintable(editor->message()));

    const QStringList texts{"The glass came from the glazing workshop where he works",
                            "The glass came from his brother's greenhouse"};
    for (int row : {1, 2}) {
      before = window.document()->document();
      rows = audit_rows(window);
      edit_cell(editor, row, AlternativesEditor::TextColumn, texts[row - 1]);
      SAME_JSON(alternatives(window)[row]["text"], json(texts[row - 1].toStdString()));
      QCOMPARE(audit_rows(window), rows + 1);
      QVERIFY(undo_redo_exact(window, before, window.document()->document()));
    }
    QTRY_COMPARE(editor->message(), QString());

    // Weights: given for all at once (equal), then one changed.
    before = window.document()->document();
    editor->weightsBox()->click();
    for (const auto& a : alternatives(window)) SAME_JSON(a["weight"], json(1));
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));
    QTRY_VERIFY(editor->weightsBox()->isChecked());
    before = window.document()->document();
    edit_cell(editor, 0, AlternativesEditor::WeightColumn, "6");
    SAME_JSON(alternatives(window)[0]["weight"], json(6));
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));

    // Unspecified: checked in its column, one step and one audit row, shown checked; unchecked
    // again for what follows (what the flag does to the compound is checked against the formula
    // in every_model_alternatives_test).
    before = window.document()->document();
    rows = audit_rows(window);
    QTRY_VERIFY(editor->table()->item(2, AlternativesEditor::UnspecifiedColumn));
    editor->table()->item(2, AlternativesEditor::UnspecifiedColumn)->setCheckState(Qt::Checked);
    SAME_JSON(alternatives(window)[2]["unspecified"], json(true));
    QVERIFY(!alternatives(window)[1].contains("unspecified"));
    QCOMPARE(audit_rows(window), rows + 1);
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));
    QTRY_COMPARE(editor->table()->item(2, AlternativesEditor::UnspecifiedColumn)->checkState(), Qt::Checked);
    before = window.document()->document();
    editor->table()->item(2, AlternativesEditor::UnspecifiedColumn)->setCheckState(Qt::Unchecked);
    QVERIFY(!alternatives(window)[2].contains("unspecified"));
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));

    // Refused input: nothing changes, the message names the alternative and the field.
    const json kept = window.document()->document();
    steps = window.undoStack()->count();
    QTRY_COMPARE(editor->table()->item(0, AlternativesEditor::WeightColumn)->text(), QString("6"));
    edit_cell(editor, 0, AlternativesEditor::WeightColumn, "-2");
    QTRY_VERIFY2(editor->message().startsWith("Alternative 1 (Hd1), weight: a weight is the fact-finder's relative prior weight"),
                 qPrintable(editor->message()));
    QTRY_COMPARE(editor->table()->item(0, AlternativesEditor::WeightColumn)->text(), QString("6"));  // shown as it is
    edit_cell(editor, 1, AlternativesEditor::WeightColumn, "");
    QTRY_VERIFY2(editor->message().contains("Alternative 2 (Hd2), weight: missing: give a weight to every alternative or to none"),
                 qPrintable(editor->message()));
    edit_cell(editor, 1, AlternativesEditor::IdColumn, "Hd1");
    QTRY_VERIFY2(editor->message().contains("Alternative 2 (Hd2), id: duplicate alternative id \"Hd1\""), qPrintable(editor->message()));
    edit_cell(editor, 2, AlternativesEditor::IdColumn, "Hp");
    QTRY_VERIFY2(editor->message().contains("names the proposition Hp"), qPrintable(editor->message()));
    SAME_JSON(window.document()->document(), kept);
    QCOMPARE(window.undoStack()->count(), steps);

    // Each item's form: one field per alternative; values typed there.
    window.showTab(MainWindow::FindingsTab);
    window.selectItem("E1");
    editor::ItemForm* form = window.itemForm();
    QVERIFY(form->alternativeProbability("Hd3"));
    QTRY_VERIFY(form->alternativeProbability("Hd3")->isVisible());
    QVERIFY(!form->probabilityEditor(false)->isVisible());
    QCOMPARE(form->alternativeProbability("Hd1")->pointField()->text(), QString("0.05"));
    retype(form->alternativeProbability("Hd2")->pointField(), "0.2");
    retype(form->alternativeProbability("Hd3")->pointField(), "0.5");
    SAME_JSON(*item_field(window, "E1", "p_given"), json::parse(R"({ "Hp": 0.6, "Hd1": 0.05, "Hd2": 0.2, "Hd3": 0.5 })"));
    window.selectItem("E2");
    QTRY_VERIFY(form->alternativeLrField("Hd2")->isVisible());
    QVERIFY(!form->reportedLrField()->isVisible());
    retype(form->alternativeLrField("Hd2"), "50");
    retype(form->alternativeLrField("Hd3"), "2");
    SAME_JSON(*item_field(window, "E2", "alternatives"), json::parse(R"({ "Hd1": { "lr": 300 }, "Hd2": { "lr": 50 }, "Hd3": { "lr": 2 } })"));

    // The core's evaluation against the formulas written out.
    const auto evaluated = core_evaluation(window);
    const auto& e1 = core_item(evaluated, "E1");
    const double p_hp = 0.6, p_hd[] = {0.05, 0.2, 0.5}, w[] = {6, 1, 1};
    const char* ids[] = {"Hd1", "Hd2", "Hd3"};
    for (int i = 0; i < 3; ++i) QCOMPARE(against(e1, ids[i]).lr.log10(), std::log10(p_hp / p_hd[i]));
    const double total = std::accumulate(std::begin(w), std::end(w), 0.0);
    double mixed = 0;
    for (int i = 0; i < 3; ++i) mixed += w[i] / total * p_hd[i];
    QVERIFY(e1.compound);
    // 1e-12 in log10: the core sums in log space (log_sum_exp), the test directly.
    QVERIFY(std::abs(e1.compound->lr.log10() - std::log10(p_hp / mixed)) < 1e-12);
    const auto& e2 = core_item(evaluated, "E2");
    for (int i = 0; i < 3; ++i) QCOMPARE(against(e2, ids[i]).lr.log10(), std::log10(std::array{300.0, 50.0, 2.0}[i]));
    // Compound of reported LRs: P(E|Hp) cancels, LR = 1 / sum_i w_i / LR_i.
    QVERIFY(std::abs(e2.compound->lr.log10() - std::log10(1.0 / (6.0 / 8 / 300 + 1.0 / 8 / 50 + 1.0 / 8 / 2))) < 1e-12);
    QTRY_VERIFY2(form->resultLabel()->text().contains("Against Hd2: LR 50"), qPrintable(form->resultLabel()->text()));
    // Each alternative's sentence names it (ENFSI 2015 band 10-100 for LR 50: moderate support).
    QVERIFY2(form->resultLabel()->text().contains("Against Hd2: LR 50 (log10 1.70). The findings provide moderate support "
                                                  "for Hp rather than Hd2."),
             qPrintable(form->resultLabel()->text()));
    QVERIFY(!form->resultLabel()->text().contains("rather than Hd."));
    // The status bar gives the combined LR against each alternative, and the weighted set.
    const QString status = window.findChild<QLabel*>("statusLr")->text();
    QVERIFY2(status.startsWith("Combined LR against Hd1 ") && status.contains(", Hd2 ") && status.contains(", Hd3 ") &&
                 status.contains("; the weighted set "),
             qPrintable(status));

    // Rename Hd3: the list and every item's key, one step.
    window.showTab(MainWindow::PropositionsTab);
    before = window.document()->document();
    rows = audit_rows(window);
    steps = window.undoStack()->count();
    edit_cell(editor, 2, AlternativesEditor::IdColumn, "Brother");
    SAME_JSON(alternatives(window)[2]["id"], json("Brother"));
    SAME_JSON((*item_field(window, "E1", "p_given"))["Brother"], json(0.5));
    SAME_JSON((*item_field(window, "E2", "alternatives"))["Brother"], json::parse(R"({ "lr": 2 })"));
    QCOMPARE(window.undoStack()->count(), steps + 1);
    QCOMPARE(audit_rows(window), rows + 3);
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));

    // Reorder: Brother up.
    QTRY_COMPARE(editor->table()->item(2, AlternativesEditor::IdColumn)->text(), QString("Brother"));
    editor->table()->selectRow(2);
    before = window.document()->document();
    editor->upButton()->click();
    SAME_JSON(alternatives(window)[1]["id"], json("Brother"));
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));

    // Remove Hd2: asked first, naming the items and what they lose; No changes nothing.
    QTRY_COMPARE(editor->table()->item(2, AlternativesEditor::IdColumn)->text(), QString("Hd2"));
    editor->table()->selectRow(2);
    QString asked;
    editor->setConfirmation([&](const QString& text) { asked = text; return false; });
    const json with_hd2 = window.document()->document();
    editor->removeButton()->click();
    QVERIFY2(asked.contains("item E1: the probability of the findings if Hd2 is true (0.2)"), qPrintable(asked));
    QVERIFY2(asked.contains("item E2: its values against Hd2 ({\"lr\":50})"), qPrintable(asked));
    SAME_JSON(window.document()->document(), with_hd2);
    editor->setConfirmation([](const QString&) { return true; });
    editor->removeButton()->click();
    SAME_JSON(alternatives(window).size(), std::size_t(2));
    QVERIFY(!item_field(window, "E1", "p_given")->contains("Hd2"));
    QVERIFY(!item_field(window, "E2", "alternatives")->contains("Hd2"));
    QVERIFY(undo_redo_exact(window, with_hd2, window.document()->document()));

    // Back to Hp and Hd only with one alternative left.
    QTRY_VERIFY(!editor->backButton()->isEnabled());
    QTRY_COMPARE(editor->table()->rowCount(), 2);
    editor->table()->selectRow(1);
    editor->removeButton()->click();
    QTRY_VERIFY(editor->backButton()->isEnabled());
    before = window.document()->document();
    editor->backButton()->click();
    const auto propositions = *window.document()->value(store::EntityRef::section("propositions"), "");
    SAME_JSON(propositions["hd"], json("The glass came from another window of the same kind"));
    QVERIFY(!propositions.contains("alternatives"));
    SAME_JSON(*item_field(window, "E1", "p_given_hd"), json(0.05));
    SAME_JSON(*item_field(window, "E2", "lr"), json(300));
    QVERIFY(undo_redo_exact(window, before, window.document()->document()));
    QTRY_VERIFY(editor->switchButton()->isVisible());
    QTRY_VERIFY(window.propositionsForm()->findChild<QWidget*>("propositions.hd")->isVisible());
  }

  // Every model takes per-alternative values: a transfer item's transfer under Hd moves to the
  // first alternative's entry when the case switches, and the item reads without a problem.
  void otherModelsSwitchToo() {
    QTemporaryDir folder;
    json document = two_propositions();
    document["items"].push_back(json::parse(R"({ "id": "T1", "model": "transfer", "t0": 0.1, "tn": 0.3, "p0": 0.9,
      "p1": 0.08, "sn": 0.4, "gamma": 0.05, "t0_hd": 0.8, "tn_hd": 0.01 })"));
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "transfer.json", document), "T1"));
    alternatives_of(window)->switchButton()->click();
    window.selectItem("T1");
    QVERIFY(window.document()->problemsAt("T1", "").empty());
    SAME_JSON(*item_field(window, "T1", "alternatives"), json::parse(R"({ "Hd1": { "t0_hd": 0.8, "tn_hd": 0.01 } })"));
    QVERIFY(!item_field(window, "T1", "t0_hd"));
  }

  // The DNA form: a relationship per alternative, its LR the core's model of the same case with
  // that relationship read on its own.
  void dnaRelationshipPerAlternative() {
    MainWindow window;
    QVERIFY(open_on_item(window, kDna, "D1"));
    AlternativesEditor* editor = alternatives_of(window);
    editor->switchButton()->click();
    editor->addButton()->click();
    edit_cell(editor, 1, AlternativesEditor::TextColumn, "The DNA came from a brother of Mr Pryce");
    window.selectItem("D1");
    QComboBox* brother = window.itemForm()->alternativeRelationship("Hd2");
    QVERIFY(brother);
    QTRY_VERIFY(brother->isVisible());  // a row added to a shown form is shown once events run
    QTRY_VERIFY(any_contains(shown_messages(window.itemForm()), "alternative Hd2 needs its own value"));
    const int sibling = brother->findData("full-sibling");
    brother->setCurrentIndex(sibling);
    emit brother->activated(sibling);
    SAME_JSON((*item_field(window, "D1", "alternatives"))["Hd2"], json::parse(R"({ "relationship": "full-sibling" })"));
    QCOMPARE(window.itemForm()->alternativeRelationship("Hd1")->currentData().toString(), QString("unrelated"));
    // The second DNA item of the case needs its donor under Hd2 too before the case reads whole.
    window.selectItem("D2");
    QComboBox* other = window.itemForm()->alternativeRelationship("Hd2");
    QCOMPARE(other->currentIndex(), -1);
    other->setCurrentIndex(other->findData("unrelated"));
    emit other->activated(other->currentIndex());
    SAME_JSON((*item_field(window, "D2", "alternatives"))["Hd1"], json::parse(R"({ "relationship": "full-sibling" })"));

    // The same item as a two-proposition case with the brother as Hd, read by the core alone.
    json alone = window.document()->document();
    alone["propositions"].erase("alternatives");
    alone["propositions"]["hd"] = "The DNA came from a brother of Mr Pryce";
    json d1 = *window.document()->itemBody("D1");
    d1.erase("alternatives");
    d1["relationship"] = "full-sibling";
    alone["items"] = json::array({d1});
    const auto read = interchange::read_case(alone, window.document()->baseDir());
    QVERIFY(read.value);
    const double expected = evaluation::evaluate_case(*read.value).items.at(0).point.lr.log10();
    QCOMPARE(against(core_item(core_evaluation(window), "D1"), "Hd2").lr.log10(), expected);
    QVERIFY(expected < against(core_item(core_evaluation(window), "D1"), "Hd1").lr.log10());  // a brother shares more
  }

  // The guard tab lists the checks on how the case is set up after the wording findings: with
  // several alternatives, notes that weigh the findings against "Hd" name the alternatives it
  // leaves in doubt (core/guard/alternative_coverage.hpp, tested against its wording there).
  void guardTabListsTheChecksOnTheCase() {
    QTemporaryDir folder;
    json document = json::parse(file_bytes(QStringLiteral(COUNTERPOISE_DEMO_DIR "/harwick-vale-glass-alternatives.json")));
    document["items"][0]["notes"] = "The findings strongly support Hp rather than Hd.";
    const QString path = write_case(folder, "glass-alternatives.json", document);
    MainWindow window;
    QVERIFY(open_on_item(window, path, "G1"));
    window.showTab(MainWindow::GuardTab);
    QTreeWidget* list = window.guardPanel()->list();
    int found = -1;
    for (int row = 0; row < list->topLevelItemCount(); ++row)
      if (list->topLevelItem(row)->text(1) == "check on the case: single-alternative-wording") found = row;
    QVERIFY(found >= 0);
    QCOMPARE(list->topLevelItem(found)->text(0), QString("Item G1: notes"));
    QVERIFY(list->topLevelItem(found)->text(2).contains("Hd2 (\"The glass fragments came from the glazing workshop"));
    list->setCurrentItem(list->topLevelItem(found));
    QVERIFY(!window.guardPanel()->applySuggestion(found));  // a check has no one rewrite

    // Naming each alternative clears it.
    QVERIFY(window.edits()->setItemField("G1", "notes", json("The findings support Hp against each alternative.")));
    bool still = false;
    for (int row = 0; row < list->topLevelItemCount(); ++row)
      still = still || list->topLevelItem(row)->text(1) == "check on the case: single-alternative-wording";
    QVERIFY(!still);
  }

  // A two-proposition case opened and saved is the same file, also after a switch and back.
  void twoPropositionCaseUnchangedByteForByte() {
    QTemporaryDir folder;
    const QString path = write_case(folder, "two.json", two_propositions());
    const std::string original = file_bytes(path);
    MainWindow window;
    QVERIFY(open_on_item(window, path, "E1"));
    QCOMPARE(window.saveTo(path), QString());
    QCOMPARE(file_bytes(path), original);
    alternatives_of(window)->switchButton()->click();
    QVERIFY(alternatives(window).is_array());
    alternatives_of(window)->backButton()->click();
    QCOMPARE(window.saveTo(folder.filePath("again.json")), QString());
    QCOMPARE(file_bytes(folder.filePath("again.json")), original);
  }
};

QTEST_MAIN(AlternativesTest)
#include "alternatives_test.moc"
