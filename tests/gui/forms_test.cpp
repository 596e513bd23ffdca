// GUI tests of the item forms of the case editor (Qt Test, offscreen): the DNA profile form, the
// measurement form, every operation of the network form, and the print preview. Each test edits
// through the form's widgets as a user does and checks what the editor then holds and shows
// against the core evaluating the same case on its own, and against the published formula where
// one gives the number directly.

#include <QAction>
#include <QApplication>
#include <QComboBox>
#include <QFile>
#include <QFileDialog>
#include <QInputDialog>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QPrintPreviewDialog>
#include <QPushButton>
#include <QPrintPreviewWidget>
#include <QProcess>
#include <QProgressDialog>
#include <QRegularExpression>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>
#include <QUndoStack>

#include <cmath>

#include "app/editor/background_data_fields.hpp"
#include "app/editor/display_text.hpp"
#include "app/editor/dna_profile_form.hpp"
#include "app/editor/edit_commands.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/measurement_form.hpp"
#include "app/editor/network_form.hpp"
#include "app/editor/network_sensitivity_window.hpp"
#include "core/numbers/number_text.hpp"
#include "editor_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::editor_test;
using editor::DnaProfileForm;
using editor::FieldMessage;
using editor::MeasurementForm;
using nlohmann::json;

namespace {

double log10_lr_on_screen(const MainWindow& window, const std::string& id) {
  return table_raw(window, id, ItemTableModel::Log10LR);
}

// The allele count and database size of one allele in the demo's frequency file.
double demo_frequency(const std::string& locus, const std::string& allele) {
  QFile file(QStringLiteral(COUNTERPOISE_DEMO_DIR "/dna/vale-str-frequencies.csv"));
  if (!file.open(QIODevice::ReadOnly)) throw std::runtime_error("cannot read the demo frequency file");
  while (!file.atEnd()) {
    const QStringList cells = QString::fromUtf8(file.readLine()).trimmed().split(',');
    if (cells.size() == 4 && cells[0].toStdString() == locus && cells[1].toStdString() == allele)
      return cells[2].toDouble() / (2.0 * cells[3].toDouble());  // count / 2N
  }
  throw std::runtime_error("no allele " + allele + " at " + locus + " in the demo file");
}

}  // namespace

class FormsTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-forms-test");
    // The examiner is declared once per user; these tests are a user who has declared one
    // (Harwick Vale demo name).
    editor::settings::set_examiner_name("Dr Imogen Tarrant");
  }

  // The DNA form shows the demo profile locus by locus with the core's reading of each; theta
  // edited in the form gives the core's LR, and at theta = 0 the locus match probabilities are
  // the product rule's.
  void dnaFormShowsLociAndThetaEditIsTheCoresLr() {
    MainWindow window;
    QVERIFY(open_on_item(window, kDna, "D1"));
    DnaProfileForm* form = window.itemForm()->dnaForm();
    QVERIFY(form->isVisible());
    QCOMPARE(form->thetaField()->text(), QString("0.01"));
    QCOMPARE(form->relationshipBox()->currentData().toString(), QString("unrelated"));
    QVERIFY(form->frequencySource()->text().contains("dna/vale-str-frequencies.csv"));
    auto* table = form->profileTable();
    QCOMPARE(table->rowCount(), 16);  // 15 STR loci and Amelogenin
    const int th01 = form->rowOfLocus("TH01");
    QVERIFY(th01 >= 0);
    QCOMPARE(table->item(th01, DnaProfileForm::QuestionedColumn)->text(), QString("9.3, 9.3"));
    QVERIFY(table->item(th01, DnaProfileForm::ReadingColumn)->text().startsWith("used: match probability"));
    QVERIFY(table->item(form->rowOfLocus("Amelogenin"), DnaProfileForm::ReadingColumn)->text().contains("sex marker"));
    const double log10_lr_before = log10_lr_on_screen(window, "D1");
    QCOMPARE(log10_lr_before, core_item(core_evaluation(window), "D1").point.lr.log10());

    retype(form->thetaField(), "0");
    QCOMPARE(item_field(window, "D1", "theta"), std::optional<json>(0));
    const auto core = core_evaluation(window);
    QCOMPARE(log10_lr_on_screen(window, "D1"), core_item(core, "D1").point.lr.log10());
    QVERIFY(log10_lr_on_screen(window, "D1") > log10_lr_before);  // theta > 0 is the more cautious value
    // Product rule (NRC II 1996, "The Evaluation of Forensic DNA Evidence", eq. 4.1): a homozygote
    // has probability p^2, a heterozygote 2pq; p and q are count / 2N from the demo file.
    const double p = demo_frequency("TH01", "9.3");
    QTRY_COMPARE(table->item(th01, DnaProfileForm::ReadingColumn)->text(),
                 QString("used: match probability %1 (homozygote)").arg(editor::probability_text(std::log10(p * p))));
    const int d8 = form->rowOfLocus("D8S1179");
    const double p13 = demo_frequency("D8S1179", "13"), p14 = demo_frequency("D8S1179", "14");
    QCOMPARE(table->item(d8, DnaProfileForm::ReadingColumn)->text(),
             QString("used: match probability %1 (heterozygote)").arg(editor::probability_text(std::log10(2 * p13 * p14))));

    QCOMPARE(window.undoStack()->count(), 1);
    window.undoStack()->undo();
    QCOMPARE(item_field(window, "D1", "theta"), std::optional<json>(0.01));
    QCOMPARE(form->thetaField()->text(), QString("0.01"));
    QCOMPARE(log10_lr_on_screen(window, "D1"), log10_lr_before);
  }

  // Without a reference profile nothing is compared: every locus says so, the item has no LR
  // (the core's message under the table, naming the field), so neither has the combination it
  // is included in; undo brings the reference and the LR back.
  void dnaItemWithoutReferenceSaysSoPerLocus() {
    MainWindow window;
    QVERIFY(open_on_item(window, kDna, "D1"));
    DnaProfileForm* form = window.itemForm()->dnaForm();
    const double log10_lr_before = log10_lr_on_screen(window, "D1");
    QVERIFY(window.edits()->setItemField("D1", "reference_profile", std::nullopt));
    QVERIFY(!window.document()->points().item("D1")->evaluated);
    const auto problems = window.document()->problemsAt("D1", "reference_profile");
    QCOMPARE(problems.size(), std::size_t(1));
    QVERIFY2(problems.front().message.find("no reference profile is given") != std::string::npos, problems.front().message.c_str());
    QTRY_VERIFY2(any_contains(shown_messages(form), QString::fromStdString(problems.front().message)),
                 qPrintable(shown_messages(form).join(" | ")));
    auto* table = form->profileTable();
    QCOMPARE(table->rowCount(), 16);  // 15 STR loci and Amelogenin, as before
    for (int row = 0; row < table->rowCount(); ++row) {
      QCOMPARE(table->item(row, DnaProfileForm::ReferenceColumn)->text(), QString());
      QCOMPARE(table->item(row, DnaProfileForm::ReadingColumn)->text(), QString("no reference genotype: not compared, no LR"));
    }
    // The item is included in the demo case: with no LR there is no combined LR either, and why.
    QVERIFY(!window.document()->points().combined);
    QVERIFY(!window.document()->points().combined_problem.empty());

    window.undoStack()->undo();
    QVERIFY(window.document()->points().item("D1")->evaluated);
    QCOMPARE(log10_lr_on_screen(window, "D1"), log10_lr_before);
    QTRY_VERIFY(table->item(form->rowOfLocus("TH01"), DnaProfileForm::ReadingColumn)->text().startsWith("used: match probability"));
  }

  // A genotype, the relationship, a bad theta, and adding and removing a locus: each is one
  // undoable edit, the LR is the core's, and what the core refuses is said under the form.
  void dnaFormEditsProfilesRelationshipAndLoci() {
    MainWindow window;
    QVERIFY(open_on_item(window, kDna, "D1"));
    DnaProfileForm* form = window.itemForm()->dnaForm();
    const json original = *window.document()->itemBody("D1");
    auto* table = form->profileTable();

    // The reference differs at TH01: an exclusion, LR 0, read as such at the locus.
    const int th01 = form->rowOfLocus("TH01");
    table->item(th01, DnaProfileForm::ReferenceColumn)->setText("9.3, 10");
    QVERIFY((*item_field(window, "D1", "reference_profile"))["TH01"] == json::array({"9.3", "10"}));
    QVERIFY(core_item(core_evaluation(window), "D1").point.lr.is_zero());
    QVERIFY(window.document()->points().item("D1")->point.lr.is_zero());
    QTRY_VERIFY(form->profileTable()->item(th01, DnaProfileForm::ReadingColumn)->text().contains("differs"));
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("D1") == original);

    // A brother as the alternative donor: the core's LR, smaller than for an unrelated donor.
    const double unrelated = log10_lr_on_screen(window, "D1");
    form->relationshipBox()->setCurrentIndex(form->relationshipBox()->findData("full-sibling"));
    emit form->relationshipBox()->activated(form->relationshipBox()->currentIndex());
    QCOMPARE(item_field(window, "D1", "relationship"), std::optional<json>("full-sibling"));
    QCOMPARE(log10_lr_on_screen(window, "D1"), core_item(core_evaluation(window), "D1").point.lr.log10());
    QVERIFY(log10_lr_on_screen(window, "D1") < unrelated);
    // The same relationship as IBD coefficients (k0, k1, k2) = (1/4, 1/2, 1/4) gives the same LR
    // (Weir, Anderson & Hepler 2006, Nat. Rev. Genet. 7:771, Table 1 — from memory).
    const double sibling = log10_lr_on_screen(window, "D1");
    form->relationshipBox()->setCurrentIndex(form->relationshipBox()->findData("ibd"));
    emit form->relationshipBox()->activated(form->relationshipBox()->currentIndex());
    QVERIFY(*item_field(window, "D1", "relationship") == json::parse(R"({"ibd": [0.25, 0.5, 0.25]})"));
    QCOMPARE(log10_lr_on_screen(window, "D1"), sibling);
    window.undoStack()->undo();
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("D1") == original);

    // Theta outside [0, 1): the core's message, in place, naming the field; no LR for the item.
    retype(form->thetaField(), "1.5");
    QVERIFY(!window.document()->points().item("D1")->evaluated);
    const auto problems = window.document()->problemsAt("D1", "theta");
    QCOMPARE(problems.size(), std::size_t(1));
    QTRY_VERIFY2(any_contains(shown_messages(form), QString::fromStdString(problems.front().message)),
                 qPrintable(shown_messages(form).join(" | ")));
    window.undoStack()->undo();

    // A new locus starts empty, and the core names it as still to be typed; removing it is one step.
    const int undo_before = window.undoStack()->index();
    form->addLocus("Penta E");
    QVERIFY((*item_field(window, "D1", "profile")).contains("Penta E"));
    QTRY_VERIFY(form->rowOfLocus("Penta E") >= 0);
    QTRY_VERIFY2(any_contains(shown_messages(form), "Penta E") || any_contains(shown_messages(form), "allele"),
                 qPrintable(shown_messages(form).join(" | ")));
    form->removeLocusAt(form->rowOfLocus("Penta E"));
    QVERIFY(!(*item_field(window, "D1", "profile")).contains("Penta E"));
    QCOMPARE(window.undoStack()->index(), undo_before + 2);
    QCOMPARE(log10_lr_on_screen(window, "D1"), unrelated);

    // Renaming a locus to one already there is refused by the form, with a message; nothing changes.
    const int d8 = form->rowOfLocus("D8S1179");
    form->profileTable()->item(d8, DnaProfileForm::LocusColumn)->setText("TH01");
    QTRY_VERIFY2(any_contains(shown_messages(form), "already"), qPrintable(shown_messages(form).join(" | ")));
    QCOMPARE(window.undoStack()->index(), undo_before + 2);
    QTRY_COMPARE(form->profileTable()->item(d8, DnaProfileForm::LocusColumn)->text(), QString("D8S1179"));
  }

  // The measurement form on the glass demo: a recovered value edited gives the core's LR; a
  // value that is not a number is named in place; the within-source and population choices
  // switch and switch back without losing what was there; background data is taken from the
  // file and column given, and undo restores the item exactly.
  void measurementFormEditsAndSwitches() {
    MainWindow window;
    QVERIFY(open_on_item(window, kGlass, "G2"));
    MeasurementForm* form = window.itemForm()->measurementForm();
    QVERIFY(form->isVisible());
    const json original = *window.document()->itemBody("G2");
    QCOMPARE(form->controlField()->text(), QString("1.51991, 1.51995, 1.51988, 1.51993"));
    QCOMPARE(form->withinSdField()->text(), editor::value_text(json(3.5e-5)));
    QCOMPARE(form->normalMeanField()->text(), QString("1.5196"));
    QVERIFY2(form->readingLabel()->text().contains("Control: 4 measurement"), qPrintable(form->readingLabel()->text()));
    const double before = log10_lr_on_screen(window, "G2");
    QCOMPARE(before, core_item(core_evaluation(window), "G2").point.lr.log10());

    // Move the recovered mean away from the control: the core's LR, and smaller.
    retype(form->recoveredField(), "1.52010, 1.52016, 1.52012");
    QVERIFY(*item_field(window, "G2", "recovered") == json::array({1.5201, 1.52016, 1.52012}));
    QCOMPARE(log10_lr_on_screen(window, "G2"), core_item(core_evaluation(window), "G2").point.lr.log10());
    QVERIFY(log10_lr_on_screen(window, "G2") < before);
    window.undoStack()->undo();
    QCOMPARE(log10_lr_on_screen(window, "G2"), before);

    // A measurement that is not a number: the core refuses that entry (no LR); the form names
    // which value it is, as typed, in the user's words.
    form->recoveredField()->clearFocus();
    retype(form->recoveredField(), "1.51990, 1.5199x");
    QVERIFY(!window.document()->points().item("G2")->evaluated);
    const auto problems = window.document()->problemsAt("G2", "recovered");
    QVERIFY(!problems.empty());
    QCOMPARE(problems.front().where.field, std::string("recovered[1]"));
    QTRY_VERIFY2(any_contains(shown_messages(form), QString::fromUtf8("Recovered measurement 2 of 2, “1.5199x”, is not a number")),
                 qPrintable(shown_messages(form).join(" | ")));
    window.undoStack()->undo();
    form->recoveredField()->clearFocus();
    QVERIFY(*window.document()->itemBody("G2") == original);

    // Within-source spread from replicates, then back: the given value comes back unchanged.
    form->chooseWithin(MeasurementForm::Within::replicates);
    QVERIFY(!item_field(window, "G2", "within_sd"));
    QVERIFY(item_field(window, "G2", "within_replicates"));
    form->chooseWithin(MeasurementForm::Within::sd);
    QCOMPARE(item_field(window, "G2", "within_sd"), std::optional<json>(3.5e-5));
    QCOMPARE(log10_lr_on_screen(window, "G2"), before);

    // Background data instead of the normal population: the file and column the user chose.
    form->choosePopulation(MeasurementForm::Population::background);
    form->useBackgroundFile("glass/vale-glass-background.csv", "ri");
    QVERIFY(*item_field(window, "G2", "population") ==
            json::parse(R"({"kde": {"file": "glass/vale-glass-background.csv", "column": "ri"}})"));
    QCOMPARE(log10_lr_on_screen(window, "G2"), core_item(core_evaluation(window), "G2").point.lr.log10());
    QTRY_VERIFY2(form->readingLabel()->text().contains("kernel density of 320 background values"),
                 qPrintable(form->readingLabel()->text()));
    // A bandwidth that is not positive: refused by the core, named in place.
    retype(form->bandwidthField(), "-1");
    const auto bandwidth_problems = window.document()->problemsAt("G2", "population.kde.bandwidth");
    QCOMPARE(bandwidth_problems.size(), std::size_t(1));
    QTRY_VERIFY2(any_contains(shown_messages(form), QString::fromStdString(bandwidth_problems.front().message)),
                 qPrintable(shown_messages(form).join(" | ")));
    form->bandwidthField()->clearFocus();
    // Back to the normal population: the mean and standard deviation set aside come back.
    form->choosePopulation(MeasurementForm::Population::normal);
    QVERIFY(*item_field(window, "G2", "population") == original["population"]);

    while (window.undoStack()->canUndo()) window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("G2") == original);
    QCOMPARE(log10_lr_on_screen(window, "G2"), before);
  }

  // The import buttons as a user clicks them: the file dialog gets the demo's background file,
  // the column dialog offers the file's header (read by the core's CSV reader) and the user picks
  // "ri"; the case then holds the path relative to the case file and the column. The same for
  // the population of the recovered material's sources if Hd is true, with its own button.
  void measurementImportThroughTheDialogs() {
    MainWindow window;
    QVERIFY(open_on_item(window, kGlass, "G2"));
    MeasurementForm* form = window.itemForm()->measurementForm();
    // Clicks `import` and answers its dialogs: the file, then the column. Returns the columns
    // offered (empty when the file dialog did not come up).
    const auto import_through_dialogs = [](QPushButton* import) {
      QStringList offered;
      bool file_dialog_seen = false;
      // Each dialog is answered when it is up: first the file, then the column.
      QTimer answer;
      answer.setInterval(50);
      const auto shown = [](auto* none) {
        for (QWidget* top : QApplication::topLevelWidgets())
          if (auto* dialog = qobject_cast<decltype(none)>(top); dialog && dialog->isVisible()) return dialog;
        return none;
      };
      QObject::connect(&answer, &QTimer::timeout, [&] {
        if (auto* files = shown(static_cast<QFileDialog*>(nullptr))) {
          file_dialog_seen = true;
          // Typed into the dialog's file name field, as a user does (no wait for the folder listing).
          if (auto* name = files->findChild<QLineEdit*>("fileNameEdit"))
            name->setText(QStringLiteral(COUNTERPOISE_DEMO_DIR "/glass/vale-glass-background.csv"));
          static_cast<QDialog*>(files)->accept();  // QFileDialog::accept is protected; QDialog::accept is not
        } else if (auto* column = shown(static_cast<QInputDialog*>(nullptr))) {
          offered = column->comboBoxItems();
          column->setTextValue("ri");
          column->accept();
          answer.stop();
        }
      });
      // Should a dialog not be answered, it is closed after 20 s so the test fails instead of hanging.
      QTimer give_up;
      give_up.setSingleShot(true);
      QObject::connect(&give_up, &QTimer::timeout, [] {
        for (QWidget* top : QApplication::topLevelWidgets())
          if (auto* dialog = qobject_cast<QDialog*>(top); dialog && dialog->isVisible()) dialog->reject();
      });
      give_up.start(20000);
      answer.start();
      import->click();
      answer.stop();
      give_up.stop();
      return file_dialog_seen ? offered : QStringList();
    };
    form->choosePopulation(MeasurementForm::Population::background);
    QPushButton* import = form->backgroundFields()->importButton();
    QTRY_VERIFY(import->isVisible());
    QCOMPARE(import_through_dialogs(import), QStringList({"source_id", "category", "ri"}));
    QVERIFY(*item_field(window, "G2", "population") ==
            json::parse(R"({"kde": {"file": "glass/vale-glass-background.csv", "column": "ri"}})"));
    QCOMPARE(log10_lr_on_screen(window, "G2"), core_item(core_evaluation(window), "G2").point.lr.log10());

    // Hd's own background data: the population above is background data, so it starts from it;
    // the import then sets the file and column, one edit, keeping the bandwidth typed.
    form->chooseHdPopulation(MeasurementForm::HdPopulation::background);
    SAME_JSON(*item_field(window, "G2", "population_hd"), json::parse(R"({"kde": {"file": "glass/vale-glass-background.csv", "column": "ri"}})"));
    retype(form->hdBackgroundFields()->bandwidthField(), "0.0004");
    retype(form->hdBackgroundFields()->columnField(), "category");
    SAME_JSON(*item_field(window, "G2", "population_hd"),
              json::parse(R"({"kde": {"file": "glass/vale-glass-background.csv", "column": "category", "bandwidth": 0.0004}})"));
    QPushButton* hd_import = form->hdBackgroundFields()->importButton();
    QTRY_VERIFY(hd_import->isVisible());
    const int steps = window.undoStack()->count();
    QCOMPARE(import_through_dialogs(hd_import), QStringList({"source_id", "category", "ri"}));
    QCOMPARE(window.undoStack()->count(), steps + 1);
    SAME_JSON(*item_field(window, "G2", "population_hd"),
              json::parse(R"({"kde": {"file": "glass/vale-glass-background.csv", "column": "ri", "bandwidth": 0.0004}})"));
    QCOMPARE(log10_lr_on_screen(window, "G2"), core_item(core_evaluation(window), "G2").point.lr.log10());
  }

  // Sensitivity to the Tables… computes the network's one-way sensitivity off the GUI thread
  // behind the progress dialog of long work: Cancel shows nothing; otherwise every entry that can
  // affect the LR has a row, largest move first, its ends as Bayes' theorem written out gives
  // them. A network the core refuses has no sensitivity to ask for.
  void networkSensitivityShowsProgressAndCancels() {
    QFile demo(kNetwork);
    QVERIFY(demo.open(QIODevice::ReadOnly));
    json document = json::parse(demo.readAll().toStdString());
    // Activity → Trace with point entries: P(found | struggle) = a = 0.6, P(found | not
    // involved) = b = 0.02, so LR = a / b = 30 (one finding, Bayes' theorem written out).
    for (auto& item : document["items"])
      if (item["id"] == "N1") {
        item["nodes"] = json::parse(R"([
          {"name": "Activity", "states": ["struggle", "not involved"]},
          {"name": "Trace", "states": ["found", "not found"], "parents": ["Activity"],
           "cpt": [[0.6, "complement"], [0.02, "complement"]]}])");
        item["observed"] = {{"Trace", "found"}};
      }
    QTemporaryDir dir;
    const QString path = write_case(dir, "trace-network.json", document);
    MainWindow window;
    window.show();
    QVERIFY(open_on_item(window, path, "N1"));
    auto* form = window.itemForm()->networkForm();
    QTRY_VERIFY(form->sensitivityButton()->isVisible());
    QVERIFY(form->sensitivityButton()->isEnabled());

    // Cancelled: the progress dialog was up, nothing is shown.
    auto connection = connect(&window, &MainWindow::progressShown, &window, [&window] {
      window.findChild<QProgressDialog*>("workProgress")->cancel();
    });
    QCOMPARE(window.showNetworkSensitivity("N1"), QString("Cancelled: the sensitivity of N1 was not computed."));
    disconnect(connection);
    QVERIFY(window.networkSensitivityWindow() == nullptr);

    // Asked for from the form, as a user does: the same dialog, then the rows.
    QSignalSpy shown(&window, &MainWindow::progressShown);
    form->sensitivityButton()->click();
    QCOMPARE(shown.count(), 1);
    QCOMPARE(shown.front().front().toString(), QString("Network sensitivity"));
    auto* sensitivity = window.networkSensitivityWindow();
    QVERIFY(sensitivity != nullptr);
    QTRY_VERIFY(sensitivity->isVisible());
    auto* table = sensitivity->table();
    // Trace's two rows of two states; Activity, a root without a table, has none.
    QCOMPARE(table->rowCount(), 4);
    // Each point entry x is tried over x ± 0.1·min(x, 1 − x), the row's other entry co-varied to
    // keep the row summing to one. b = 0.02 over [0.018, 0.022] moves log10 LR by log10(0.02 /
    // 0.018) = 0.046, more than a = 0.6 over [0.56, 0.64] does (log10(0.6 / 0.56) = 0.030), so
    // b's rows come first (both states of its row move b across the same range, so either may
    // lead): at the low end of "found" LR = 0.6 / 0.018, at its high end 0.6 / 0.022.
    const auto log10_shown = [](double lr) { return QString::fromStdString(numbers::log10_for_readers(std::log10(lr))); };
    using editor::NetworkSensitivityWindow;
    const auto row_of = [table](const QString& given, const QString& state) {
      for (int row = 0; row < table->rowCount(); ++row)
        if (table->item(row, NetworkSensitivityWindow::GivenColumn)->text() == given &&
            table->item(row, NetworkSensitivityWindow::StateColumn)->text() == state)
          return row;
      return -1;
    };
    for (int row = 0; row < 4; ++row) QCOMPARE(table->item(row, NetworkSensitivityWindow::NodeColumn)->text(), QString("Trace"));
    const int b_found = row_of("Activity=not involved", "found"), b_not_found = row_of("Activity=not involved", "not found");
    QVERIFY(b_found >= 0 && b_found < 2);
    QVERIFY(b_not_found >= 0 && b_not_found < 2);
    QCOMPARE(table->item(b_found, NetworkSensitivityWindow::LowEndColumn)->text(), log10_shown(0.6 / 0.018));
    QCOMPARE(table->item(b_found, NetworkSensitivityWindow::HighEndColumn)->text(), log10_shown(0.6 / 0.022));
    // The complement moves b the other way: at its low end (not found = 0.978) b = 0.022.
    QCOMPARE(table->item(b_not_found, NetworkSensitivityWindow::LowEndColumn)->text(), log10_shown(0.6 / 0.022));
    // Then a's rows: at a = 0.56 and 0.64 the LR is 0.56 / 0.02 and 0.64 / 0.02.
    const int a_found = row_of("Activity=struggle", "found");
    QVERIFY(a_found >= 2);
    QCOMPARE(table->item(a_found, NetworkSensitivityWindow::LowEndColumn)->text(), log10_shown(0.56 / 0.02));
    QCOMPARE(table->item(a_found, NetworkSensitivityWindow::HighEndColumn)->text(), log10_shown(0.64 / 0.02));
    QVERIFY(sensitivity->summary()->text().contains(log10_shown(0.6 / 0.02)));

    // A network the core refuses (an entry above 1) offers no sensitivity.
    auto nodes = *item_field(window, "N1", "nodes");
    nodes[1]["cpt"][0][0] = 1.5;
    window.edits()->setItemField("N1", "nodes", nodes);
    QTRY_VERIFY(!form->sensitivityButton()->isEnabled());
    QVERIFY(window.showNetworkSensitivity("N1").startsWith("Item N1 has no network that reads without problems"));
  }

  // Every operation of the network form, each one undoable edit: renaming a node carries the
  // new name into parents, observations and the propositions and leaves the LR as it was;
  // adding a state reshapes the children's tables; a parent doubles the rows; an observation
  // and the proposition states change the LR to the core's; a node added and removed.
  void networkFormOperations() {
    MainWindow window;
    QVERIFY(open_on_item(window, kNetwork, "N1"));
    auto* form = window.itemForm()->networkForm();
    const json original = *window.document()->itemBody("N1");
    const double before = log10_lr_on_screen(window, "N1");
    auto nodes = [&] { return (*item_field(window, "N1", "nodes")); };

    // Rename Contact (node 1).
    form->selectNode(1);
    auto* name = form->findChild<QLineEdit*>("network_name");
    QCOMPARE(name->text(), QString("Contact"));
    name->setText("Close contact");
    emit name->editingFinished();
    QVERIFY(nodes()[1]["name"] == json("Close contact"));
    QVERIFY(nodes()[2]["parents"] == json::array({"Close contact"}));
    QVERIFY(nodes()[3]["parents"] == json::array({"Close contact"}));
    QCOMPARE(log10_lr_on_screen(window, "N1"), before);
    QCOMPARE(log10_lr_on_screen(window, "N1"), core_item(core_evaluation(window), "N1").point.lr.log10());
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("N1") == original);

    // A third state of Contact: the children's tables get a row for it, to be filled in; the
    // core names the rows that do not sum to one.
    QTRY_COMPARE(form->nodeList()->count(), 4);
    form->selectNode(1);
    auto* states = form->findChild<QLineEdit*>("network_states");
    states->setText("close contact, no close contact, brief contact");
    emit states->editingFinished();
    QVERIFY(nodes()[1]["states"].size() == std::size_t(3));
    QVERIFY(nodes()[2]["cpt"].size() == std::size_t(3));
    QVERIFY(nodes()[3]["cpt"].size() == std::size_t(3));
    QVERIFY(!window.document()->points().item("N1")->evaluated);
    QTRY_VERIFY2(any_contains(shown_messages(form), "Fibres") || any_contains(shown_messages(form), "Contact"),
                 qPrintable(shown_messages(form).join(" | ")));
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("N1") == original);

    // Activity as a second parent of Fibres: two parents of two states each, four rows.
    QTRY_COMPARE(form->nodeList()->count(), 4);
    form->selectNode(2);
    auto* parents = form->findChild<QListWidget*>("network_parents");
    QListWidgetItem* activity = parents->findItems("Activity", Qt::MatchExactly).at(0);
    activity->setCheckState(Qt::Checked);
    QVERIFY(nodes()[2]["parents"] == json::array({"Activity", "Contact"}));
    QVERIFY(nodes()[2]["cpt"].size() == std::size_t(4));
    QTRY_COMPARE(form->tableWidget()->rowCount(), 4);
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("N1") == original);

    // No glass found instead: the core's LR, and lower, since glass was evidence for contact.
    QTRY_COMPARE(form->nodeList()->count(), 4);
    form->selectNode(3);
    auto* observed = form->findChild<QComboBox*>("network_observed");
    QTRY_COMPARE(observed->currentText(), QString("matching glass found"));
    observed->setCurrentIndex(observed->findText("none found"));
    emit observed->activated(observed->currentIndex());
    QVERIFY((*item_field(window, "N1", "observed"))["Glass"] == json("none found"));
    QCOMPARE(log10_lr_on_screen(window, "N1"), core_item(core_evaluation(window), "N1").point.lr.log10());
    QVERIFY(log10_lr_on_screen(window, "N1") < before);
    window.undoStack()->undo();

    // Hp and Hd states exchanged: the LR becomes its reciprocal (log10 LR changes sign).
    auto* hp_state = form->findChild<QComboBox*>("network_hp_state");
    auto* hd_state = form->findChild<QComboBox*>("network_hd_state");
    QCOMPARE(hp_state->currentText(), QString("struggle"));
    hp_state->setCurrentIndex(hp_state->findText("not involved"));
    hd_state->setCurrentIndex(hd_state->findText("struggle"));
    emit hd_state->activated(hd_state->currentIndex());
    QVERIFY((*item_field(window, "N1", "proposition"))["hp"] == json("not involved"));
    QVERIFY((*item_field(window, "N1", "proposition"))["hd"] == json("struggle"));
    // The definition of the likelihood ratio: LR(Hd, Hp) = 1 / LR(Hp, Hd) (DOMAIN.md).
    QCOMPARE(log10_lr_on_screen(window, "N1"), core_item(core_evaluation(window), "N1").point.lr.log10());
    QVERIFY(std::abs(log10_lr_on_screen(window, "N1") + before) < 1e-12);
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("N1") == original);

    // A new node, then removed: the network is as it was, two undo steps.
    QTRY_COMPARE(form->nodeList()->count(), 4);
    const int steps = window.undoStack()->index();
    QPushButton* add = nullptr;
    QPushButton* remove = nullptr;
    for (auto* button : form->findChildren<QPushButton*>()) {
      if (button->text() == "Add node") add = button;
      if (button->text() == "Remove node") remove = button;
    }
    QVERIFY(add && remove);
    add->click();
    QVERIFY(nodes().size() == std::size_t(5));
    QVERIFY(nodes()[4]["name"] == json("Node 5"));
    QCOMPARE(log10_lr_on_screen(window, "N1"), before);  // a node with no findings changes nothing
    QTRY_COMPARE(form->nodeList()->count(), 5);
    QTRY_COMPARE(form->nodeList()->currentRow(), 4);
    remove->click();
    QVERIFY(*window.document()->itemBody("N1") == original);
    QCOMPARE(window.undoStack()->index(), steps + 2);
  }

  // The print preview paints the report model itself (no rasterised PDF): it has the pages of
  // the exported PDF (pdfinfo, poppler-utils).
  void printPreviewHasTheReportsPages() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    if (!window.reportsAvailable()) QSKIP("built without the report module");
    QTemporaryDir dir;
    const QString pdf = dir.filePath("report.pdf");
    QCOMPARE(window.exportReportPdf(pdf), QString());
    QProcess info;
    info.start("pdfinfo", {pdf});
    QVERIFY(info.waitForFinished(30000));
    const auto match = QRegularExpression("Pages:\\s+(\\d+)").match(QString::fromUtf8(info.readAllStandardOutput()));
    QVERIFY(match.hasMatch());
    const int pdf_pages = match.captured(1).toInt();
    QVERIFY(pdf_pages > 1);

    QAction* preview = nullptr;
    for (auto* action : window.findChildren<QAction*>())
      if (action->shortcut() == QKeySequence(QKeySequence::Print)) preview = action;
    QVERIFY(preview);
    int preview_pages = -1;
    QString title;
    // The report is built behind a progress dialog first; the preview opens when it is done.
    // A polling timer (not a nested wait) answers it, so the progress dialog's loop can end.
    QSignalSpy progress(&window, &MainWindow::progressShown);
    QTimer poll;
    connect(&poll, &QTimer::timeout, &window, [&] {
      auto* dialog = qobject_cast<QPrintPreviewDialog*>(QApplication::activeModalWidget());
      if (!dialog) return;
      poll.stop();
      title = dialog->windowTitle();
      auto* widget = dialog->findChild<QPrintPreviewWidget*>();
      if (widget) {
        widget->updatePreview();
        preview_pages = widget->pageCount();
      }
      dialog->reject();
    });
    poll.start(50);
    preview->trigger();
    QCOMPARE(progress.count(), 1);
    QCOMPARE(progress.front().front().toString(), QString("Report print preview"));
    QVERIFY2(title.contains("Report print preview"), qPrintable(title));
    QCOMPARE(preview_pages, pdf_pages);
  }
};

QTEST_MAIN(FormsTest)
#include "forms_test.moc"
