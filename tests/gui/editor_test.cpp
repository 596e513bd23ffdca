// GUI tests of the case editor (Qt Test, offscreen). Each test drives the real MainWindow the
// way a user does (typing into fields, undo, save, reopen) and checks what is on screen against
// the core computing the same case independently of the editor.

#include <QAbstractButton>
#include <QAction>
#include <QApplication>
#include <QCheckBox>
#include <QComboBox>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QGroupBox>
#include <QImage>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QMenuBar>
#include <QMessageBox>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTabWidget>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>
#include <QTreeWidget>
#include <QUndoStack>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <memory>

#include "app/editor/case_document.hpp"
#include "app/editor/contribution_chart.hpp"
#include "app/editor/display_text.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/guard_panel.hpp"
#include "app/editor/history_panel.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/item_table_model.hpp"
#include "app/editor/main_window.hpp"
#include "app/editor/network_form.hpp"
#include "app/editor/network_view.hpp"
#include "app/editor/prior_explorer.hpp"
#include "app/editor/probability_editor.hpp"
#include "app/editor/section_form.hpp"
#include "app/editor/spread_runner.hpp"
#include "app/editor/weight_growth_plot.hpp"
#include "app/editor/weight_view.hpp"
#include "core/casefile/issue_checklist.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/wording_checker.hpp"
#include "core/interchange/case_json.hpp"
#include "core/numbers/posterior.hpp"
#include "core/numbers/number_text.hpp"
#include "core/reading/data_access.hpp"
#include "core/store/anchor_check.hpp"
#include "core/store/case_location.hpp"
#include "core/store/case_store.hpp"
#include "core/store/examiner_key.hpp"
#include "core/store/report_anchor.hpp"
#include "editor_test_support.hpp"

#include <sys/stat.h>

using namespace counterpoise;
using editor::ItemTableModel;
using editor::MainWindow;

using namespace counterpoise::editor_test;

namespace {

// The glass demo case weighed against three alternatives with the fact-finder's weights.
const QString kGlassAlternatives = QStringLiteral(COUNTERPOISE_DEMO_DIR "/harwick-vale-glass-alternatives.json");

// Answers the next message box, which must be `name`, with `button`, keeping its texts in `shown`.
void answer_box(const QString& name, const QString& button, QString* shown) {
  QTimer::singleShot(0, [name, button, shown] {
    QTRY_VERIFY(qobject_cast<QMessageBox*>(QApplication::activeModalWidget()));
    auto* box = qobject_cast<QMessageBox*>(QApplication::activeModalWidget());
    QCOMPARE(box->objectName(), name);
    *shown = box->text() + "\n" + box->informativeText();
    for (QAbstractButton* b : box->buttons())
      if (b->text().remove('&') == button) b->click();
  });
}

// Closes any message box that shows within a second, keeping its text in `shown`: for a step
// that must not ask (without this a dialog would wait for the test's timeout).
std::unique_ptr<QTimer> refuse_any_box(QString* shown) {
  auto timer = std::make_unique<QTimer>();
  QObject::connect(timer.get(), &QTimer::timeout, [shown] {
    if (auto* box = qobject_cast<QMessageBox*>(QApplication::activeModalWidget())) {
      *shown = box->text();
      box->reject();
    }
  });
  timer->start(50);
  return timer;
}

store::SealAnchor report_anchor(const QString& pdf) {
  return store::read_report_anchor(file_bytes(pdf), pdf.toStdString());
}

// What `counterpoise-cli verify STORE --against REPORT.pdf` checks, on a read-only open.
store::AnchorCheck check_store_against_pdf(const QString& store_path, const QString& pdf) {
  const auto opened = store::open_case_store(store_path.toStdString(), store::OpenMode::read_only);
  return store::check_against_report(opened, report_anchor(pdf), file_bytes(pdf));
}

}  // namespace

class EditorTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-test");
    // The examiner is declared once per user; these tests are a user who has declared one
    // (Harwick Vale demo name).
    editor::settings::set_examiner_name("Dr Imogen Tarrant");
    QVERIFY(temp_.isValid());
  }

  // Open a demo case, edit a probability: the displayed LR is the core's; undo restores it.
  void editProbabilityShowsCoreLrAndUndoRestores() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.selectItem("E4");
    window.showTab(MainWindow::FindingsTab);
    auto* p_hp = window.itemForm()->probabilityEditor(true);
    QCOMPARE(p_hp->form(), editor::ProbabilityEditor::Form::point);
    QCOMPARE(p_hp->pointField()->text(), QString("0.6"));

    retype(p_hp->pointField(), "0.8");
    QCOMPARE(item_field(window, "E4", "p_given_hp"), std::optional<nlohmann::json>(0.8));
    // LR = P(E|Hp) / P(E|Hd) = 0.8 / 0.5 (the definition of the likelihood ratio; DOMAIN.md).
    const auto core = core_evaluation(window);
    const auto& e4 = core_item(core, "E4");
    QCOMPARE(e4.point.lr.log10(), std::log10(0.8 / 0.5));
    // On screen: the table's raw value is the core's log10 LR, the text the core's reader format.
    QCOMPARE(table_raw(window, "E4", ItemTableModel::Log10LR), e4.point.lr.log10());
    QCOMPARE(table_text(window, "E4", ItemTableModel::LR),
             QString::fromStdString(numbers::lr_for_readers(e4.point.lr)));
    QVERIFY2(window.itemForm()->resultLabel()->text().contains("LR 1.6"), qPrintable(window.itemForm()->resultLabel()->text()));
    // E4 is left out of the combination, so the combined LR is unchanged and still the core's.
    QCOMPARE(window.document()->points().combined->log10(), core.combined.lr.log10());

    // The three keystrokes are one undo step.
    QCOMPARE(window.undoStack()->count(), 1);
    window.undoStack()->undo();
    QCOMPARE(item_field(window, "E4", "p_given_hp"), std::optional<nlohmann::json>(0.6));
    QCOMPARE(p_hp->pointField()->text(), QString("0.6"));
    QCOMPARE(table_raw(window, "E4", ItemTableModel::Log10LR), std::log10(0.6 / 0.5));
    window.undoStack()->redo();
    QCOMPARE(item_field(window, "E4", "p_given_hp"), std::optional<nlohmann::json>(0.8));
  }

  // The combined LR on screen follows an edit of an included item as the user types.
  void combinedLrFollowsTyping() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.selectItem("E3");
    window.showTab(MainWindow::FindingsTab);
    const double before = window.document()->points().combined->log10();
    retype(window.itemForm()->reportedLrField(), "600");
    const auto core = core_evaluation(window);
    QCOMPARE(window.document()->points().combined->log10(), core.combined.lr.log10());
    // Doubling one independent item's LR adds log10 2 to the combined log10 LR (sum of logs).
    QVERIFY(std::abs(window.document()->points().combined->log10() - before - std::log10(2.0)) < 1e-12);
    // The intervals arrive from the background run and are the core's.
    QVERIFY(window.document()->waitForSpread(30000));
    QCOMPARE(window.document()->spread().evaluation->combined.spread->low_log10, core.combined.spread->low_log10);
    // The Weight tab was hidden during the edit; shown, it has the core's combined LR and interval.
    window.showTab(MainWindow::WeightTab);
    const QString shown = window.weightView()->combinedLabel()->text();
    QVERIFY2(shown.contains(editor::lr_text(core.combined.lr, core.combined.spread)), qPrintable(shown));
    QVERIFY(shown.contains("Interval " + editor::interval_text(core.combined.spread)));
  }

  // A value the core refuses is marked in place, in the user's words; nothing modal.
  void invalidValueMarkedWithCoreMessage() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.selectItem("E4");
    window.showTab(MainWindow::FindingsTab);
    retype(window.itemForm()->probabilityEditor(false)->pointField(), "1.5");
    auto read = interchange::read_case(window.document()->document(), window.document()->baseDir());
    QVERIFY(!read.value);
    const auto& problem = read.diagnostics.problems().front();
    QCOMPARE(problem.where.item, std::string("E4"));
    // The message is in the user's words (not the file format's list of JSON forms), with an
    // example, under the field.
    const auto messages = window.itemForm()->findChildren<editor::FieldMessage*>();
    bool shown = false;
    for (auto* label : messages)
      if (label->isVisible() &&
          label->text() == "The probability 1.5 is not between 0 and 1: enter a number between 0 and 1, for example 0.25.")
        shown = true;
    QVERIFY2(shown, problem.message.c_str());
    retype(window.itemForm()->probabilityEditor(false)->pointField(), "half");
    shown = false;
    for (auto* label : messages)
      if (label->isVisible() &&
          label->text() == QString::fromUtf8("The probability “half” is not a number: enter a number between 0 and 1, for example 0.25."))
        shown = true;
    QVERIFY(shown);
    for (auto* label : messages) QVERIFY2(!label->text().contains("\"interval\""), qPrintable(label->text()));
    QVERIFY(QApplication::activeModalWidget() == nullptr);
    // The other items are still evaluated. E4 is left out of the combination in the demo case,
    // so its bad value does not stop the combined LR: it is the core's for the case without E4,
    // and E4 is still shown as left out.
    QVERIFY(window.document()->points().item("E1")->evaluated);
    QVERIFY(!window.document()->points().item("E4")->included);
    QVERIFY(window.document()->points().combined.has_value());
    nlohmann::json without_e4 = window.document()->document();
    auto& items = without_e4["items"];
    items.erase(std::remove_if(items.begin(), items.end(), [](const nlohmann::json& i) { return i["id"] == "E4"; }), items.end());
    const auto core = evaluation::evaluate_case(*interchange::read_case(without_e4, window.document()->baseDir()).value);
    QCOMPARE(window.document()->points().combined->log10(), core.combined.lr.log10());

    // An included item with a bad value does stop the combination, and says why.
    window.selectItem("E3");
    retype(window.itemForm()->reportedLrField(), "three hundred");
    QVERIFY(!window.document()->points().combined);
    QVERIFY(!window.document()->points().combined_problem.empty());
  }

  // Save as a case file, edit (autosaved: a committed transaction), reopen: the value persisted,
  // and the history shows the audit rows and verifies.
  void caseFileAutosavesAndReopens() {
    const QString path = temp_.filePath("autosave.cpcase");
    {
      MainWindow window;
      window.show();
      QCOMPARE(window.openPath(kBreakIn), QString());
      QCOMPARE(window.saveTo(path), QString());
      QCOMPARE(window.document()->fileKind(), editor::FileKind::case_store);
      window.selectItem("E4");
      window.showTab(MainWindow::FindingsTab);
      retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.9");
      QVERIFY(!window.document()->modified());  // nothing waits to be saved
      window.showTab(MainWindow::HistoryTab);
      QVERIFY(window.historyPanel()->verifyNow());
      QVERIFY(window.historyPanel()->auditTable()->rowCount() >= 2);
    }
    // The file as the core's store sees it, without the editor.
    {
      auto store = store::CaseStore::open(path.toStdString(), store::OpenMode::read_only);
      QCOMPARE(store.state().value_at(store::EntityRef::item("E4"), "p_given_hp"), std::optional<nlohmann::json>(0.9));
      QVERIFY(store.verify().ok());
    }
    MainWindow reopened;
    QCOMPARE(reopened.openPath(path), QString());
    reopened.selectItem("E4");
    QCOMPARE(reopened.itemForm()->probabilityEditor(true)->pointField()->text(), QString("0.9"));
    QCOMPARE(table_raw(reopened, "E4", ItemTableModel::Log10LR), core_item(core_evaluation(reopened), "E4").point.lr.log10());
  }

  // Save as JSON and reopen: the value persisted and the file reads in the core.
  void jsonSaveAndReopen() {
    const QString path = temp_.filePath("saved.json");
    {
      MainWindow window;
      QCOMPARE(window.openPath(kBreakIn), QString());
      window.selectItem("E4");
      retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.7");
      QVERIFY(window.document()->modified());
      QCOMPARE(window.saveTo(path), QString());
      QVERIFY(!window.document()->modified());
    }
    auto read = interchange::read_case_file(path.toStdString());
    QVERIFY(read.value.has_value());
    MainWindow reopened;
    QCOMPARE(reopened.openPath(path), QString());
    QCOMPARE(item_field(reopened, "E4", "p_given_hp"), std::optional<nlohmann::json>(0.7));
  }

  // Unsaved edits of a JSON file survive the program ending: the next session offers them.
  void recoveryOfUnsavedEdits() {
    const QString path = temp_.filePath("recover.json");
    QFile::copy(kBreakIn, path);
    {
      MainWindow window;
      QCOMPARE(window.openPath(path), QString());
      window.selectItem("E4");
      retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.65");
      // The window goes away without saving (as after a crash: no close event).
    }
    MainWindow next;
    QCOMPARE(next.openPath(path), QString());
    auto snapshot = next.document()->recoverySnapshot();
    QVERIFY(snapshot.has_value());
    QVERIFY(next.edits()->replaceDocument(*snapshot, "Restore unsaved edits"));
    QCOMPARE(item_field(next, "E4", "p_given_hp"), std::optional<nlohmann::json>(0.65));
    next.undoStack()->undo();
    QCOMPARE(item_field(next, "E4", "p_given_hp"), std::optional<nlohmann::json>(0.6));
    next.document()->discardRecovery();
  }

  // A sentence the guard flags is highlighted in its text field and listed; applying the
  // suggestion is one undoable edit.
  void flaggedSentenceHighlighted() {
    const std::string sentence = "The chance that the glass on his jacket got there by coincidence is 1 in 1,000.";
    // Precondition from the core itself: the checker flags this sentence (corpus line, project).
    const auto checker = guard::WordingChecker::load_default();
    QVERIFY(guard::has_flagged(checker.check(sentence)));

    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.selectItem("E1");
    window.showTab(MainWindow::FindingsTab);
    auto* description = window.itemForm()->descriptionField();
    description->setFocus();
    description->selectAll();
    QTest::keyClicks(description, QString::fromStdString(sentence));
    QTRY_VERIFY_WITH_TIMEOUT(item_field(window, "E1", "description") == std::optional<nlohmann::json>(sentence), 3000);
    QVERIFY(!description->highlighter()->spans().empty());
    const auto [begin, end] = description->highlighter()->spans().front();
    QVERIFY(begin >= 0 && end > begin && end <= static_cast<int>(sentence.size()));
    // The highlighted words carry the highlight format in the text document.
    const QTextBlock block = description->document()->findBlock(begin);
    bool formatted = false;
    for (const auto& range : block.layout()->formats())
      if (range.start <= begin - block.position() && range.format.underlineStyle() == QTextCharFormat::WaveUnderline) formatted = true;
    QVERIFY(formatted);

    window.showTab(MainWindow::GuardTab);
    QVERIFY(window.guardPanel()->list()->topLevelItemCount() >= 1);
    const int steps = window.undoStack()->count();
    QVERIFY(window.guardPanel()->applySuggestion(0));
    QCOMPARE(window.undoStack()->count(), steps + 1);
    const auto rewritten = item_field(window, "E1", "description");
    QVERIFY(rewritten && *rewritten != nlohmann::json(sentence));
    window.undoStack()->undo();
    QCOMPARE(item_field(window, "E1", "description"), std::optional<nlohmann::json>(sentence));
  }

  // The contribution chart and the prior view export as PNG and SVG.
  void exportFigures() {
    MainWindow window;
    QCOMPARE(window.openPath(kBreakIn), QString());
    QVERIFY(window.document()->waitForSpread(30000));
    const QString png = temp_.filePath("contributions.png");
    QCOMPARE(window.exportContributionChart(png), QString());
    QImage image(png);
    QVERIFY(!image.isNull());
    QCOMPARE(image.size(), QSize(1800, 960));  // 900 × 480 at twice the resolution
    int coloured = 0;
    for (int y = 0; y < image.height(); y += 4)
      for (int x = 0; x < image.width(); x += 4)
        if (image.pixelColor(x, y) != QColor(Qt::white)) ++coloured;
    QVERIFY(coloured > 1000);
    const QString svg = temp_.filePath("priors.svg");
    QCOMPARE(window.exportPriorView(svg), QString());
    QFile file(svg);
    QVERIFY(file.open(QIODevice::ReadOnly));
    const QByteArray text = file.readAll();
    QVERIFY(text.contains("<svg"));
    QVERIFY(text.contains("<path") || text.contains("<polyline"));
    QCOMPARE(window.exportPriorView(temp_.filePath("priors.bmp")).isEmpty(), false);
  }

  // The report exports to PDF (when the report module is built) and issuing seals a revision.
  void exportReportPdf() {
    MainWindow window;
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    QCOMPARE(window.openPath(kBreakIn), QString());
    const QString pdf = temp_.filePath("report.pdf");
    QCOMPARE(window.exportReportPdf(pdf), QString());
    QFile file(pdf);
    QVERIFY(file.open(QIODevice::ReadOnly));
    QVERIFY(file.read(5) == "%PDF-");
    // The report holds case content: the case store's permissions, whatever the umask.
    struct stat info {};
    QCOMPARE(::stat(pdf.toUtf8().constData(), &info), 0);
    QCOMPARE(info.st_mode & 07777, mode_t(0600));
    const editor::SealSigning unsigned_seal{nullptr};
    QVERIFY(!window.issueReport(temp_.filePath("issued.pdf"), unsigned_seal).isEmpty());  // JSON: no revision to seal
    QCOMPARE(window.saveTo(temp_.filePath("issued.cpcase")), QString());
    QCOMPARE(window.issueReport(temp_.filePath("issued.pdf"), unsigned_seal), QString());
    QVERIFY(window.document()->caseStore()->latest_seal().has_value());
  }

  // With the examiner's key in the key folder the editor signs the seal without asking, and the
  // report it issues carries the seal: the check of the store against the report
  // (`verify --against`, store::check_against_report) passes, the Ed25519 signatures (RFC 8032,
  // checked by OpenSSL) verifying with the public key the report prints, which is the examiner's.
  void issuedReportIsSignedAndMatchesItsStore() {
    QTemporaryDir keys;
    const KeyFolder folder(keys.path());
    const auto public_key = store::create_examiner_key(keys.path().toStdString(), store::ExaminerName("Dr Imogen Tarrant"));
    MainWindow window;
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    QCOMPARE(window.openPath(kBreakIn), QString());
    const QString cpcase = temp_.filePath("signed.cpcase");
    QCOMPARE(window.saveTo(cpcase), QString());
    QString asked;
    const auto closer = refuse_any_box(&asked);  // a key is there: no dialog may appear
    const auto signing = window.chooseSealSigning();
    QVERIFY2(asked.isEmpty(), qPrintable(asked));
    QVERIFY(signing && signing->key);
    const QString pdf = temp_.filePath("signed.pdf");
    QCOMPARE(window.issueReport(pdf, *signing), QString());

    const auto seal = window.document()->caseStore()->latest_seal();
    QVERIFY(seal && seal->signed_seal());
    QCOMPARE(seal->public_key, public_key.hex());
    const auto check = check_store_against_pdf(cpcase, pdf);
    QVERIFY2(check.ok(), check.problem ? check.problem->c_str() : "");
    QVERIFY(report_anchor(pdf).is_signed());
    QCOMPARE(report_anchor(pdf).statement.public_key, public_key.hex());
  }

  // Without a key the editor says how to make one (the command) and seals only when the user
  // chooses an unsigned seal; the report then carries the seal as unsigned and still matches its
  // store. Cancel seals nothing.
  void withoutKeyTheSealIsUnsignedOnlyByChoice() {
    QTemporaryDir keys;
    const KeyFolder folder(keys.path());
    MainWindow window;
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    QCOMPARE(window.openPath(kBreakIn), QString());
    const QString cpcase = temp_.filePath("unsigned.cpcase");
    QCOMPARE(window.saveTo(cpcase), QString());
    QString shown;
    answer_box("noSigningKey", "Cancel", &shown);
    QVERIFY(!window.chooseSealSigning());
    QVERIFY2(shown.contains("counterpoise-cli key create --examiner \"Dr Imogen Tarrant\""), qPrintable(shown));
    QVERIFY(shown.contains("no signing key for Dr Imogen Tarrant in " + keys.path()));
    QVERIFY(shown.contains("unsigned"));
    QVERIFY(!window.document()->caseStore()->latest_seal());

    answer_box("noSigningKey", "Seal Unsigned", &shown);
    const auto signing = window.chooseSealSigning();
    QVERIFY(signing && !signing->key);
    const QString pdf = temp_.filePath("unsigned.pdf");
    QCOMPARE(window.issueReport(pdf, *signing), QString());
    const auto seal = window.document()->caseStore()->latest_seal();
    QVERIFY(seal && !seal->signed_seal());
    QVERIFY(!report_anchor(pdf).is_signed());
    const auto check = check_store_against_pdf(cpcase, pdf);
    QVERIFY2(check.ok(), check.problem ? check.problem->c_str() : "");
  }

  // An edit that lands while the report is being rendered (after the seal was prepared) leaves
  // nothing sealed and no report written, and the message says the case changed.
  void caseChangedWhileIssuingSealsNothing() {
    MainWindow window;
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    QCOMPARE(window.openPath(kBreakIn), QString());
    QCOMPARE(window.saveTo(temp_.filePath("moved.cpcase")), QString());
    auto connection = connect(&window, &MainWindow::progressShown, &window, [&window] {
      window.document()->setField(store::EntityRef::item("E2"), "title", nlohmann::json("Edited while issuing"));
    });
    const QString pdf = temp_.filePath("moved.pdf");
    const QString problem = window.issueReport(pdf, editor::SealSigning{nullptr});
    disconnect(connection);
    QVERIFY2(problem.contains("the case changed after the seal was prepared"), qPrintable(problem));
    QVERIFY(!QFileInfo::exists(pdf));
    QVERIFY(!window.document()->caseStore()->latest_seal());
    QCOMPARE(item_field(window, "E2", "title"), std::optional<nlohmann::json>("Edited while issuing"));
  }

  // Before issuing, the editor shows the issue checklist with what sealing means, and issues only
  // when the scientist confirms (the same list as the command line: core/casefile/issue_checklist).
  void issueChecklistIsShownBeforeSealing() {
    MainWindow window;
    auto document = nlohmann::json::parse(std::ifstream(kBreakIn.toStdString()));
    document["case"].erase("laboratory");
    const QString path = temp_.filePath("no-laboratory.json");
    std::ofstream(path.toStdString()) << document.dump();
    QCOMPARE(window.openPath(path), QString());
    const auto answer = [](const QString& button, QString* shown) { answer_box("issueChecklist", button, shown); };
    QString shown;
    answer("Cancel", &shown);
    QVERIFY(!window.confirmIssuing());
    QVERIFY(shown.contains("The laboratory is not recorded."));
    QVERIFY(shown.contains(QString::fromStdString(casefile::sealing_explanation())));
    answer("Issue and Seal", &shown);
    QVERIFY(window.confirmIssuing());
  }

  // The prior explorer shows the core's posterior and its exact complement.
  void priorExplorerShowsCorePosterior() {
    MainWindow window;
    QCOMPARE(window.openPath(kBreakIn), QString());
    window.priorExplorer()->setPriorLog10Odds(-6.0);
    const auto lr = *window.document()->points().combined;
    const auto posterior = numbers::posterior_from(-6.0, lr);
    QCOMPARE(window.priorExplorer()->posteriorLabel()->text(), QString::fromStdString(numbers::posterior_for_readers(posterior)));
    QCOMPARE(window.priorExplorer()->complementLabel()->text(),
             QString::fromStdString(numbers::probability_for_readers(posterior.log10_complement)));
    // One of N possible sources: prior odds 1 / (N - 1).
    auto* n = window.priorExplorer()->findChild<QLineEdit*>();
    QVERIFY(n);
    n->setFocus();
    QTest::keyClicks(n, "1001");
    QCOMPARE(window.priorExplorer()->priorLog10Odds(), -std::log10(1000.0));
  }

  // Several weighted alternatives: the prior view shows the posterior of Hp as one alternative's
  // weight goes from 0 to its stated value, the core's values (sensitivity::hp_as_weight_grows)
  // checked here against Bayes' theorem for exclusive propositions written out (common practice):
  // P(Hp|E) = O / (O + sum_i w_i / LR_i), O the prior odds of Hp against the set, w_i the
  // normalised weights with the chosen one scaled by the fraction, LR_i = P(E|Hp) / P(E|Hd_i).
  void priorViewShowsWeightOfOneAlternative() {
    MainWindow window;
    window.resize(1100, 900);
    window.show();
    QCOMPARE(window.openPath(kGlassAlternatives), QString());
    QVERIFY(window.document()->waitForSpread(30000));
    window.showTab(MainWindow::PriorsTab);
    auto* explorer = window.priorExplorer();
    explorer->setPriorLog10Odds(-1.0);
    QVERIFY(explorer->weightGrowthBox()->isVisible());
    const auto core = core_evaluation(window);
    const auto& weights = core.combined.compound->weights;
    QCOMPARE(explorer->weightAlternative()->count(), static_cast<int>(weights.size()));
    for (int chosen = 0; chosen < explorer->weightAlternative()->count(); ++chosen) {
      explorer->weightAlternative()->setCurrentIndex(chosen);
      const auto& data = explorer->weightGrowthPlot()->data();
      QCOMPARE(data.fractions.size(), std::size_t(101));
      for (std::size_t k : {std::size_t(0), std::size_t(37), std::size_t(100)}) {
        double sum = 0.0;
        for (std::size_t i = 0; i < weights.size(); ++i) {
          const double w = weights[i] * (static_cast<int>(i) == chosen ? data.fractions[k] : 1.0);
          sum += w / std::pow(10.0, core.combined.by_alternative[i].lr.log10());
        }
        const double expected = 0.1 / (0.1 + sum);
        QVERIFY2(std::abs(data.hp[k] - expected) <= 1e-12 * expected, qPrintable(QString::number(data.hp[k], 'g', 17)));
      }
      // At the stated weight every alternative's curve ends at the same posterior: the case's own.
      const double at_stated = data.hp.back();
      const auto posterior = numbers::posterior_from(-1.0, core.combined.compound->lr);
      QVERIFY(std::abs(at_stated - posterior.probability()) <= 1e-12 * at_stated);
      QVERIFY(explorer->weightGrowthSummary()->text().contains(
          QString::fromStdString(numbers::posterior_for_readers(posterior))));
    }
    // A two-proposition case has no such view.
    QCOMPARE(window.openPath(kBreakIn), QString());
    QVERIFY(window.document()->waitForSpread(30000));
    explorer->setPriorLog10Odds(-1.0);
    QVERIFY(!explorer->weightGrowthBox()->isVisible());
  }

  // Items: add, move, remove are undoable edits; the table sorts by value through its proxy.
  void addMoveRemoveAndSort() {
    MainWindow window;
    QCOMPARE(window.openPath(kBreakIn), QString());
    const std::string id = window.edits()->addItem("reported-lr");
    QCOMPARE(id, std::string("E5"));
    QCOMPARE(window.document()->itemIds().back(), std::string("E5"));
    QVERIFY(window.edits()->moveItem("E5", 0));
    QCOMPARE(window.document()->itemIds().front(), std::string("E5"));
    QVERIFY(window.edits()->removeItem("E5"));
    QCOMPARE(window.document()->itemIds().size(), std::size_t(4));
    window.undoStack()->undo();  // the removal: back where it was
    QCOMPARE(window.document()->itemIds().front(), std::string("E5"));
    window.undoStack()->undo();  // the move
    QCOMPARE(window.document()->itemIds().back(), std::string("E5"));
    window.undoStack()->undo();  // the addition
    QCOMPARE(window.document()->itemIds().size(), std::size_t(4));
    QVERIFY(!window.document()->state().item_position("E5"));

    auto* table = window.weightView()->table();
    table->sortByColumn(ItemTableModel::Log10LR, Qt::DescendingOrder);
    // E3 (LR 300) carries the most weight in the demo case, E4 (1.2) the least.
    QCOMPARE(table->model()->index(0, ItemTableModel::Id).data().toString(), QString("E3"));
    QCOMPARE(table->model()->index(3, ItemTableModel::Id).data().toString(), QString("E4"));
  }

  // Undo and redo use the platform's shortcuts.
  void undoRedoShortcuts() {
    MainWindow window;
    bool undo = false, redo = false;
    for (QAction* a : window.findChildren<QAction*>()) {
      if (a->shortcut() == QKeySequence(QKeySequence::Undo)) undo = true;
      if (a->shortcut() == QKeySequence(QKeySequence::Redo)) redo = true;
    }
    QVERIFY(undo && redo);
  }

  // Case details edits go through the facade and show the core's message for a bad mode.
  void caseDetailsEdit() {
    MainWindow window;
    QCOMPARE(window.openPath(kBreakIn), QString());
    auto* reference = window.caseForm()->findChild<QLineEdit*>("case.reference");
    QVERIFY(reference);
    retype(reference, "VFL-2026-0999");
    QCOMPARE(window.document()->value(store::EntityRef::section("case"), "reference"),
             std::optional<nlohmann::json>("VFL-2026-0999"));
    window.undoStack()->undo();
    QCOMPARE(reference->text(), QString("VFL-2026-0417"));
  }

  // Background runs: a burst of requests delivers only the latest generation.
  void staleRunsAreDropped() {
    auto read = interchange::read_case_file(kBreakIn.toStdString());
    QVERIFY(read.value);
    editor::SpreadRunner runner;
    std::vector<std::uint64_t> delivered;
    connect(&runner, &editor::SpreadRunner::finished, this,
            [&](const editor::SpreadResult& result) { delivered.push_back(result.generation); });
    for (std::uint64_t g = 1; g <= 10; ++g) runner.request(g, *read.value);
    QTRY_VERIFY_WITH_TIMEOUT(runner.idle(), 30000);
    QCOMPARE(delivered, std::vector<std::uint64_t>{10});
  }

  // A network item: the drawing beside its fields shows every node of the file, each child's box
  // below its parents' (arrows point down the layers), renders to a non-empty image, and follows
  // an edit of the fields and its undo.
  void networkItemIsDrawn() {
    MainWindow window;
    window.resize(1200, 800);
    window.show();
    QCOMPARE(window.openPath(kNetwork), QString());
    window.showTab(MainWindow::FindingsTab);
    window.selectItem("N1");
    auto* view = window.itemForm()->networkView();
    QVERIFY(view->isVisible());

    // The expected names are the file's own, read here without the editor's code.
    const nlohmann::json body = *window.document()->itemBody("N1");
    QStringList expected;
    for (const auto& node : body["nodes"]) expected << QString::fromStdString(node["name"].get<std::string>());
    QCOMPARE(expected.size(), 4);
    QCOMPARE(view->nodeNames(), expected);

    const auto rects = view->nodeRects();
    QCOMPARE(static_cast<qsizetype>(rects.size()), expected.size());
    for (std::size_t i = 0; i < rects.size(); ++i) {
      QVERIFY(!rects[i].isEmpty());
      QVERIFY2(view->rect().contains(rects[i].toAlignedRect()), qPrintable(expected[static_cast<int>(i)]));
      for (std::size_t j = i + 1; j < rects.size(); ++j) QVERIFY(!rects[i].intersects(rects[j]));
    }
    for (std::size_t child = 0; child < rects.size(); ++child)
      for (const auto& parent : body["nodes"][child].value("parents", nlohmann::json::array())) {
        const auto p = static_cast<std::size_t>(expected.indexOf(QString::fromStdString(parent.get<std::string>())));
        QVERIFY(rects[p].bottom() < rects[child].top());
      }

    // Renders: the image holds more than the background colour.
    const QImage image = view->grab().toImage();
    QVERIFY(!image.isNull());
    if (qEnvironmentVariableIsSet("COUNTERPOISE_TEST_IMAGE")) image.save(qEnvironmentVariable("COUNTERPOISE_TEST_IMAGE"));
    const QRgb background = image.pixel(1, 1);
    int inked = 0;
    for (int y = 0; y < image.height(); y += 2)
      for (int x = 0; x < image.width(); x += 2)
        if (image.pixel(x, y) != background) ++inked;
    QVERIFY2(inked > 100, qPrintable(QString::number(inked)));

    // Re-renders on a document change: rename a node (and its observation), then undo.
    nlohmann::json fields;
    for (const char* key : {"nodes", "proposition", "observed", "covers"}) fields[key] = body[key];
    fields["nodes"][3]["name"] = "Glass fragments";
    fields["observed"]["Glass fragments"] = fields["observed"]["Glass"];
    fields["observed"].erase("Glass");
    QVERIFY(window.edits()->setItemModelFields("N1", fields));
    QCOMPARE(view->nodeNames().at(3), QString("Glass fragments"));
    window.undoStack()->undo();
    QCOMPARE(view->nodeNames(), expected);

    // A network the core rejects (a parent that does not exist) is not drawn.
    fields = nlohmann::json::object();
    for (const char* key : {"nodes", "proposition", "observed", "covers"}) fields[key] = body[key];
    fields["nodes"][1]["parents"] = nlohmann::json::array({"Nowhere"});
    QVERIFY(window.edits()->setItemModelFields("N1", fields));
    QVERIFY(view->nodeNames().isEmpty());
    window.undoStack()->undo();
    QCOMPARE(view->nodeNames(), expected);
  }

  // The network form: a table entry edited in the form is one undoable edit of the item's
  // fields, the LR shown is the core's evaluation of the edited case, a row that does not sum to
  // one is reported under the form naming the node and the row, and undo restores the value.
  void networkFormEditsTableEntry() {
    MainWindow window;
    window.resize(1200, 900);
    window.show();
    QCOMPARE(window.openPath(kNetwork), QString());
    window.showTab(MainWindow::FindingsTab);
    window.selectItem("N1");
    auto* form = window.itemForm()->networkForm();
    QVERIFY(form->isVisible());
    const nlohmann::json original = *item_field(window, "N1", "nodes");
    QCOMPARE(form->nodeList()->count(), static_cast<int>(original.size()));
    const double log10_lr_before = table_raw(window, "N1", ItemTableModel::Log10LR);
    QCOMPARE(log10_lr_before, core_item(core_evaluation(window), "N1").point.lr.log10());

    // Fibres (node 2), row "Contact=no close contact" (row 1): the chance-presence entry.
    form->selectNode(2);
    auto* table = form->tableWidget();
    QCOMPARE(table->rowCount(), 2);
    QVERIFY(table->verticalHeaderItem(1)->text().contains("no close contact"));
    table->item(1, 0)->setText("0.05");
    QVERIFY((*item_field(window, "N1", "nodes"))[2]["cpt"][1][0] == nlohmann::json(0.05));
    QCOMPARE(window.undoStack()->count(), 1);
    const double log10_lr_after = table_raw(window, "N1", ItemTableModel::Log10LR);
    QCOMPARE(log10_lr_after, core_item(core_evaluation(window), "N1").point.lr.log10());
    QVERIFY(log10_lr_after != log10_lr_before);
    QTRY_COMPARE(form->tableWidget()->item(1, 0)->text(), QString("0.05"));

    // A row that no longer sums to one: the core's message names the node and the row.
    form->tableWidget()->item(1, 1)->setText("0.5");
    QVERIFY((*item_field(window, "N1", "nodes"))[2]["cpt"][1][1] == nlohmann::json(0.5));
    QString shown;
    QTRY_VERIFY2((shown = form->findChild<editor::FieldMessage*>()->text()).contains("Fibres"), qPrintable(shown));
    QVERIFY2(shown.contains("no close contact") || shown.contains("row"), qPrintable(shown));

    window.undoStack()->undo();
    window.undoStack()->undo();
    QVERIFY(*item_field(window, "N1", "nodes") == original);
    QCOMPARE(table_raw(window, "N1", ItemTableModel::Log10LR), log10_lr_before);
    QTRY_COMPARE(form->tableWidget()->item(1, 0)->text(), QString::fromStdString(original[2]["cpt"][1][0].dump()));
  }

  // A case naming a data file outside its folder (a file of another folder, its name holding an
  // escape sequence): on opening, the editor names the item, the field and the file, escaped, and
  // reads it only when the user allows it; refused, the item is not evaluated.
  void outsideDataFileIsNamedAndReadOnlyWhenAllowed() {
    const QString case_folder = temp_.filePath("outside-case"), data_folder = temp_.filePath("outside-data");
    QVERIFY(QDir().mkpath(case_folder) && QDir().mkpath(data_folder));
    const QString table = data_folder + "/freq\x1b[2J.csv";
    QVERIFY(QFile::copy(QStringLiteral(COUNTERPOISE_DEMO_DIR "/dna/vale-str-frequencies.csv"), table));
    auto document = nlohmann::json::parse(file_bytes(kDna));
    for (auto& item : document["items"]) item["frequencies"]["file"] = table.toStdString();
    const QString path = case_folder + "/outside.json";
    {
      std::ofstream out(path.toStdString());
      out << document.dump(1);
    }

    QString shown;
    {
      MainWindow window;
      answer_box("outsideDataFiles", "Do not read them", &shown);
      QCOMPARE(window.openPath(path), QString());
      const QString written = QString::fromStdString(document["items"][0]["frequencies"]["file"].get<std::string>());
      QVERIFY2(shown.contains("item D1, field frequencies.file: " + QString(written).replace(QChar(0x1b), "\\x1b")),
               qPrintable(shown));
      QVERIFY(!shown.contains(QChar(0x1b)));  // the escape sequence is shown, never sent
      QVERIFY(shown.contains("D2"));          // every item naming it
      const auto& points = window.document()->points();
      QVERIFY(std::find(points.refused_items.begin(), points.refused_items.end(), "D1") != points.refused_items.end());
      // The refusal in the form names the file escaped too, never with the raw escape character.
      window.selectItem("D1");
      const QStringList messages = shown_messages(window.itemForm());
      QVERIFY2(any_contains(messages, "lies outside the case's folder"), qPrintable(messages.join('\n')));
      QVERIFY(any_contains(messages, "freq\\x1b[2J.csv"));
      for (const QString& message : messages) QVERIFY(!message.contains(QChar(0x1b)));
    }
    {
      MainWindow window;
      answer_box("outsideDataFiles", "Read these files for this session", &shown);
      QCOMPARE(window.openPath(path), QString());
      QVERIFY(window.document()->refusedDataFiles().empty());
      QVERIFY(window.document()->points().refused_items.empty());
      QVERIFY(window.document()->points().combined.has_value());
    }
    reading::reset_data_permissions();
  }

 private:
  QTemporaryDir temp_;
};

QTEST_MAIN(EditorTest)
#include "editor_test.moc"
