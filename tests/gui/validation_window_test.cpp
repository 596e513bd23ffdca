// GUI test of the method-validation window (Qt Test, offscreen): it opens the demo results as
// a user does from Tools ▸ Method Validation, shows the validation report in its preview,
// judges the laboratory's criteria, calibrates raw scores, names the file, row and column of a
// bad results file while keeping the last good run, and writes the PDF. The Cllr it shows is
// checked against the published formula computed here on its own:
//   Cllr = 1/(2 Np) Σ_Hp log2(1 + 1/LR) + 1/(2 Nd) Σ_Hd log2(1 + LR)
// (Brümmer & du Preez 2006, Computer Speech and Language 20:230, eq. 6 in their notation).

#include <QAction>
#include <QApplication>
#include <QComboBox>
#include <QFile>
#include <QMenuBar>
#include <QPrintPreviewWidget>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>

#include "app/editor/editor_settings.hpp"
#include "app/editor/main_window.hpp"
#include "app/editor/method_validation_window.hpp"
#include "core/method_validation/results_file.hpp"

using namespace counterpoise;
using editor::MainWindow;
using editor::MethodValidationWindow;

namespace {

const QString kDemo = QStringLiteral(COUNTERPOISE_DEMO_DIR "/method-validation");

// The Cllr of log10 LRs by the published formula, summed here without the core's code.
double cllr_by_formula(const method_validation::ValidationSet& set) {
  double hp = 0, hd = 0;
  for (double l : set.hp_log10_lr) hp += std::log2(1 + std::pow(10.0, -l));
  for (double l : set.hd_log10_lr) hd += std::log2(1 + std::pow(10.0, l));
  return hp / (2.0 * static_cast<double>(set.hp_log10_lr.size())) + hd / (2.0 * static_cast<double>(set.hd_log10_lr.size()));
}

QAction* menu_action(MainWindow& window, const QString& menu_text, const QString& action_text) {
  for (QAction* menu : window.menuBar()->actions())
    if (menu->text() == menu_text && menu->menu())
      for (QAction* a : menu->menu()->actions())
        if (a->text() == action_text) return a;
  return nullptr;
}

}  // namespace

class ValidationWindowTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-validation-window-test");
    editor::settings::set_examiner_name("Dr Imogen Tarrant");
  }

  // Tools ▸ Method Validation opens the window; the demo LRs give the formula's Cllr, and the
  // report is in the preview.
  void opensResultsAndShowsTheReport() {
    MainWindow window;
    QAction* open = menu_action(window, "&Tools", "&Method Validation…");
    QVERIFY(open);
    open->trigger();
    MethodValidationWindow* v = window.methodValidationWindow();
    QVERIFY(v);
    QVERIFY(v->isVisible());
    QVERIFY(v->lastRun() == nullptr);

    QVERIFY(v->openResults(kDemo + "/vale-glass-lrs.csv"));
    QVERIFY(v->problemText().isEmpty());
    const auto* run = v->lastRun();
    QVERIFY(run);
    const auto table = method_validation::read_results_file((kDemo + "/vale-glass-lrs.csv").toStdString());
    QCOMPARE(run->summary.hp_count, table.all.hp_log10_lr.size());
    QCOMPARE(run->summary.hd_count, table.all.hd_log10_lr.size());
    QVERIFY(std::abs(run->summary.cllr - cllr_by_formula(table.all)) < 1e-12);
    QVERIFY(v->preview()->pageCount() >= 2);  // measures, criteria and plots take more than a page
  }

  // The laboratory's criteria are judged; a bad criteria file is named and changes nothing.
  void criteriaAreJudgedAndABadFileIsNamed() {
    MethodValidationWindow v;
    QVERIFY(v.openResults(kDemo + "/vale-glass-lrs.csv"));
    QVERIFY(v.setCriteriaFile(kDemo + "/vale-criteria.json"));
    QCOMPARE(v.lastRun()->criteria.size(), std::size_t{4});
    for (const auto& c : v.lastRun()->criteria) {
      // Each pass or fail is the value against the bound the file sets.
      const bool within = (!c.criterion.at_most || c.value <= *c.criterion.at_most) &&
                          (!c.criterion.at_least || c.value >= *c.criterion.at_least);
      QCOMPARE(c.pass, within);
    }
    QTemporaryDir dir;
    const QString bad = dir.filePath("criteria.json");
    QFile f(bad);
    QVERIFY(f.open(QIODevice::WriteOnly));
    f.write(R"({"criteria": [{"characteristic": "accuracy", "metric": "no-such-metric", "at_most": 1}]})");
    f.close();
    QVERIFY(!v.setCriteriaFile(bad));
    QVERIFY(v.problemText().contains(bad));
    QVERIFY(v.problemText().contains("no-such-metric"));
    QCOMPARE(v.lastRun()->criteria.size(), std::size_t{4});  // the last good run stays
  }

  // Raw scores need a calibration: without one the window says so; with the training set and
  // the linear calibration they are judged as LRs.
  void rawScoresAreCalibratedOnTheTrainingSet() {
    MethodValidationWindow v;
    QVERIFY(!v.openResults(kDemo + "/vale-glass-scores-test.csv"));
    QVERIFY(v.problemText().contains("vale-glass-scores-test.csv"));
    QVERIFY(v.lastRun() == nullptr);
    QVERIFY(v.setCalibration(method_validation::Calibration::linear));
    QVERIFY(v.setTrainingFile(kDemo + "/vale-glass-scores-train.csv"));
    QVERIFY(v.openResults(kDemo + "/vale-glass-scores-test.csv"));
    QVERIFY(v.lastRun());
    QCOMPARE(v.lastRun()->calibration, method_validation::Calibration::linear);
    QCOMPARE(v.calibrationBox()->currentData().toInt(), static_cast<int>(method_validation::Calibration::linear));
    QVERIFY(std::isfinite(v.lastRun()->summary.cllr));
  }

  // A damaged results file is named with its line and column; the last good run stays; the
  // report is written as a PDF.
  void badResultsAreNamedAndTheReportIsWritten() {
    MethodValidationWindow v;
    QVERIFY(v.openResults(kDemo + "/vale-glass-lrs.csv"));
    const double cllr = v.lastRun()->summary.cllr;
    QTemporaryDir dir;
    const QString bad = dir.filePath("results.csv");
    QFile f(bad);
    QVERIFY(f.open(QIODevice::WriteOnly));
    f.write("truth,lr\nhp,120\nhd,-3\n");
    f.close();
    QVERIFY(!v.openResults(bad));
    QVERIFY(v.problemText().contains(bad));
    QVERIFY(v.problemText().contains("lr"));
    QVERIFY(v.problemText().contains("3"));  // the line of the negative LR
    QCOMPARE(v.lastRun()->summary.cllr, cllr);

    QVERIFY(v.openResults(kDemo + "/vale-glass-lrs.csv"));
    const QString pdf = dir.filePath("validation.pdf");
    QVERIFY(v.saveReport(pdf));
    QFile written(pdf);
    QVERIFY(written.open(QIODevice::ReadOnly));
    QCOMPARE(written.read(5), QByteArray("%PDF-"));
  }
};

QTEST_MAIN(ValidationWindowTest)
#include "validation_window_test.moc"
