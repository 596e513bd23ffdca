// Tools ▸ Compare With…: the editor compares another version of the case (a sealed revision, a
// case file) with the case as open, shows each difference with its effect on the combined log10
// LR, and choosing a difference moves the editor to its item and field. The effects are checked
// against the core evaluating each version on its own (evaluate_case), not against the
// comparison's own arithmetic.

#include <QComboBox>
#include <QLabel>
#include <QProcess>
#include <QPushButton>
#include <QRegularExpression>
#include <QStandardPaths>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>

#include "app/editor/comparison_window.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/main_window.hpp"
#include "core/comparison/comparison_text.hpp"
#include "core/comparison/log10_change.hpp"
#include "core/validation/display_text.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/store/case_store.hpp"
#include "editor_test_support.hpp"

using namespace counterpoise;
using editor::ComparisonWindow;
using editor::MainWindow;
using namespace counterpoise::editor_test;

namespace {

const QString kProsecution = QStringLiteral(COUNTERPOISE_DEMO_DIR "/comparison/harwick-vale-grain-store-prosecution.json");
const QString kDefence = QStringLiteral(COUNTERPOISE_DEMO_DIR "/comparison/harwick-vale-grain-store-defence.json");
const QString kKestrelProsecution =
    QStringLiteral(COUNTERPOISE_DEMO_DIR "/comparison/harwick-vale-kestrel-street-prosecution.json");
const QString kKestrelDefence = QStringLiteral(COUNTERPOISE_DEMO_DIR "/comparison/harwick-vale-kestrel-street-defence.json");

// The case of a document as the core reads it on its own.
casefile::Case case_of(const nlohmann::json& document, const std::filesystem::path& base_dir) {
  auto read = interchange::read_case(document, base_dir);
  if (!read.value) throw std::runtime_error("the case does not read");
  return std::move(*read.value);
}

// Shows `window` with `b` open and `a` compared with it: the comparison window, or null when
// either step failed (the message is printed).
ComparisonWindow* compare_in(MainWindow& window, const QString& a, const QString& b) {
  window.show();
  QString problem = window.openPath(b);
  if (problem.isEmpty()) problem = window.compareWith(a);
  if (!problem.isEmpty()) qWarning("%s", qPrintable(problem));
  return problem.isEmpty() ? window.comparisonWindow() : nullptr;
}

// Text with every white space removed: a table cell may wrap anywhere in the PDF.
QString without_spaces(QString text) {
  text.remove(QRegularExpression("\\s"));
  return text;
}

// The combined log10 LR of a case document, as the core evaluates it on its own.
double combined_log10(const nlohmann::json& document, const std::filesystem::path& base_dir) {
  auto read = interchange::read_case(document, base_dir);
  if (!read.value) throw std::runtime_error("the case does not read");
  return evaluation::evaluate_case(*read.value).combined.lr.log10();
}

// The row of the table whose Where cell contains `place`, or -1.
int row_of(const ComparisonWindow& window, const QString& place) {
  for (int row = 0; row < window.differencesTable()->rowCount(); ++row)
    if (window.differencesTable()->item(row, ComparisonWindow::WhereColumn)->text().contains(place)) return row;
  return -1;
}

}  // namespace

class ComparisonWindowTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-test-comparison");
    editor::settings::set_examiner_name("Dr Imogen Tarrant");
    QVERIFY(temp_.isValid());
  }

  // Seal revision 1, edit one reported LR through the form, compare with the revision: one
  // difference, whose share is the whole change of the combined log10 LR between the two
  // versions as the core evaluates them; choosing it shows the item and the field.
  void sealedRevisionAgainstTheCaseAsOpen() {
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(kBreakIn), QString());
    const QString path = temp_.filePath("compared.cpcase");
    QCOMPARE(window.saveTo(path), QString());
    window.document()->caseStore()->seal_revision(store::ExaminerName("Dr Imogen Tarrant"), "invented report", "r1.pdf");
    window.selectItem("E3");
    window.showTab(MainWindow::FindingsTab);
    retype(window.itemForm()->reportedLrField(), "120");
    window.selectItem("E1");
    window.showTab(MainWindow::CaseTab);

    QCOMPARE(window.compareWith(path + "@1"), QString());
    ComparisonWindow* shown = window.comparisonWindow();
    QVERIFY(shown && shown->isVisible());
    QCOMPARE(shown->differencesTable()->rowCount(), 1);
    const auto& difference = shown->comparison().differences[shown->differenceAt(0)];
    QCOMPARE(difference.path.item_id, std::string("E3"));
    QCOMPARE(difference.path.field, std::string("lr"));
    // Each version is named as the window names the case as open: by its file name, never the
    // folder it sits in.
    QCOMPARE(shown->comparison().a.label, std::string("compared.cpcase@1"));
    QCOMPARE(shown->comparison().b.label, std::string("compared.cpcase (as open)"));
    QVERIFY(!shown->summaryText().contains(temp_.path()));

    const auto sealed = store::CaseStore::open(path.toStdString(), store::OpenMode::read_only);
    const std::filesystem::path base = QFileInfo(path).absolutePath().toStdString();
    const double before = combined_log10(nlohmann::json::parse(sealed.sealed_state_text(1)), base);
    const double after = combined_log10(window.document()->document(), base);
    // E3's reported LR 300 → 120 moves the combined log10 LR by log10(120/300).
    QVERIFY(std::abs((after - before) - std::log10(120.0 / 300.0)) < 1e-12);
    const QString expected = QString::fromStdString(
        comparison::change_for_readers(comparison::Log10Change::between(before, after)));
    QCOMPARE(shown->differencesTable()->item(0, ComparisonWindow::ShareColumn)->text(), expected);
    QCOMPARE(shown->differencesTable()->item(0, ComparisonWindow::AloneColumn)->text(), expected);
    QVERIFY2(shown->summaryText().contains(expected), qPrintable(shown->summaryText()));

    shown->chooseRow(0);
    QCOMPARE(window.itemForm()->item(), std::string("E3"));
    QCOMPARE(window.tabs()->currentIndex(), int(MainWindow::FindingsTab));
    QTRY_VERIFY(window.itemForm()->reportedLrField()->hasFocus());
  }

  // The demo pair: the defence's version open, the prosecution's compared with it. The combined
  // change is the difference of the two versions' combined LRs as the core evaluates each; every
  // difference is listed, and choosing an added item or a data file moves to that item.
  void demoPairEachDifferenceLeadsToItsItem() {
    MainWindow window;
    ComparisonWindow* shown = compare_in(window, kProsecution, kDefence);
    QVERIFY(shown);
    QCOMPARE(shown->differencesTable()->rowCount(), static_cast<int>(shown->comparison().differences.size()));
    const std::filesystem::path folder = QFileInfo(kDefence).absolutePath().toStdString();
    const double a = combined_log10(interchange::parse_json_text(file_text(kProsecution), "prosecution"), folder);
    const double b = combined_log10(window.document()->document(), folder);
    // Both are sums of the same item terms, added in another order: equal to rounding.
    QVERIFY(std::abs(shown->comparison().total_change.log10 - (b - a)) < 1e-12);
    QVERIFY(shown->comparison().band_changes());

    const int added = row_of(*shown, "G5");
    QVERIFY(added >= 0);
    shown->chooseRow(added);
    QCOMPARE(window.itemForm()->item(), std::string("G5"));
    const int data_file = row_of(*shown, "allele frequencies of G1");
    QVERIFY(data_file >= 0);
    shown->chooseRow(data_file);
    QCOMPARE(window.itemForm()->item(), std::string("G1"));
  }

  // With several alternatives to Hp, "Effects on" shows each difference's share of the LR
  // against one alternative or the weighted set. G2's P(E|Hd2) alone changed for G2 (0.2 → 0.3,
  // P(E|Hp) 0.3): its share against Hd2 is G2's change against Hd2, log10(0.2 / 0.3), and against
  // Hd1 nothing; the totals are the changes the core evaluating each version on its own gives.
  void effectsAgainstEachAlternative() {
    MainWindow window;
    ComparisonWindow* shown = compare_in(window, kKestrelProsecution, kKestrelDefence);
    QVERIFY(shown);
    QComboBox* target = shown->targetChoice();
    QVERIFY(target->isVisible());
    // The combined LR, Hd1, Hd2, Hd3, the weighted set.
    QCOMPARE(target->count(), 5);
    const std::filesystem::path folder = QFileInfo(kKestrelDefence).absolutePath().toStdString();
    const auto eval_a = evaluation::evaluate_case(
        case_of(interchange::parse_json_text(file_text(kKestrelProsecution), "prosecution"), folder));
    const auto eval_b = evaluation::evaluate_case(case_of(window.document()->document(), folder));

    target->setCurrentIndex(2);  // Hd2
    const int g2 = row_of(*shown, "G2");
    QVERIFY(g2 >= 0);
    const auto share_of = [&](int row) { return shown->differencesTable()->item(row, ComparisonWindow::ShareColumn)->text(); };
    QCOMPARE(share_of(g2), QString::fromStdString(comparison::change_for_readers(
                               comparison::Log10Change::finite_change(std::log10(0.2 / 0.3)))));
    const auto hd2_change = comparison::Log10Change::between(eval_a.combined.by_alternative[1].lr.log10(),
                                                             eval_b.combined.by_alternative[1].lr.log10());
    QVERIFY2(shown->findChild<QLabel*>("comparisonTargetLine")->text().contains(
                 QString::fromStdString(comparison::change_for_readers(hd2_change))),
             qPrintable(shown->findChild<QLabel*>("comparisonTargetLine")->text()));

    // The verbal expression of the LR against Hd2 in each version, as the core evaluating each
    // version on its own words it, and whether it changes.
    const auto& words_a = eval_a.combined.by_alternative[1].verbal;
    const auto& words_b = eval_b.combined.by_alternative[1].verbal;
    const QString line = shown->findChild<QLabel*>("comparisonTargetLine")->text();
    QVERIFY2(line.contains(QString::fromStdString(comparison::band_words(words_b, "Hd2"))), qPrintable(line));
    const bool band_changes = words_a.label != words_b.label || words_a.favours != words_b.favours;
    QVERIFY2(line.contains(band_changes ? QStringLiteral("The verbal expression changes: ") +
                                              QString::fromStdString(comparison::band_words(words_a, "Hd2"))
                                        : QStringLiteral("The verbal expression is the same in both versions")),
             qPrintable(line));

    target->setCurrentIndex(1);  // Hd1: G2's member changed only for Hd2
    QCOMPARE(share_of(row_of(*shown, "G2")), QStringLiteral("0.00"));

    target->setCurrentIndex(4);  // the weighted set
    const auto compound_change = comparison::Log10Change::between(eval_a.combined.compound->lr.log10(),
                                                                  eval_b.combined.compound->lr.log10());
    QVERIFY(shown->findChild<QLabel*>("comparisonTargetLine")->text().contains(
        QString::fromStdString(comparison::change_for_readers(compound_change))));
    // The weights changed (6 : 3 : 1 → 4 : 5 : 1): a share of the compound, none of any pairwise LR.
    const int weights = row_of(*shown, "alternatives");
    QVERIFY(weights >= 0);
    QVERIFY(share_of(weights) != QStringLiteral("—"));
    target->setCurrentIndex(2);
    QCOMPARE(share_of(row_of(*shown, "alternatives")), QStringLiteral("—"));
  }

  // Save Memo as PDF writes the memo compare -o writes: its text (pdftotext) lists every
  // difference the command's text lists, and the effects against each alternative.
  void memoPdfListsTheCommandsDifferences() {
    for (const auto& [a, b] : {std::pair{kProsecution, kDefence}, std::pair{kKestrelProsecution, kKestrelDefence}}) {
      MainWindow window;
      ComparisonWindow* shown = compare_in(window, a, b);
      QVERIFY(shown);
      QVERIFY(shown->memoButton()->isVisible());
      const QString pdf = temp_.filePath(QFileInfo(b).completeBaseName() + "-memo.pdf");
      QCOMPARE(window.writeComparisonMemo(pdf), QString());
      QProcess pdftotext;
      pdftotext.start("pdftotext", {pdf, "-"});
      QVERIFY(pdftotext.waitForFinished(60000));
      QCOMPARE(pdftotext.exitCode(), 0);
      const QString text = QString::fromUtf8(pdftotext.readAllStandardOutput());
      const QString flat = without_spaces(text);
      QVERIFY(flat.contains(without_spaces("Review memo: comparison of two versions of a case")));
      // The reviewer is the examiner's name kept in settings (initTestCase), as compare -o
      // --reviewer names it.
      QVERIFY2(flat.contains(without_spaces("Reviewer: Dr Imogen Tarrant")), qPrintable(text));
      const QString command = shown->summaryText();
      for (const auto& d : shown->comparison().differences) {
        const QString place = QString::fromStdString(validation::display_text(d.place));
        // The command's text lists it; so does the memo.
        QVERIFY2(command.contains(QString::fromStdString(comparison::kind_words(d.kind)) + ": " + place), qPrintable(place));
        QVERIFY2(flat.contains(without_spaces(place)), qPrintable(place));
      }
      QVERIFY(flat.contains(without_spaces(QString::fromStdString(
          comparison::change_for_readers(shown->comparison().total_change)))));
      if (!shown->comparison().alternatives.by_alternative.empty()) {
        QVERIFY(flat.contains(without_spaces("Effects against each alternative")));
        QVERIFY(flat.contains(without_spaces("Against Hd2: the log10 LR changes by")));
        QVERIFY(flat.contains(without_spaces("Verbal expression, A → B")));
      }
    }
  }

  // A version that cannot be read, or a revision written wrongly, is a message naming it.
  void unreadableVersionsAreNamed() {
    MainWindow window;
    QCOMPARE(window.openPath(kBreakIn), QString());
    const QString missing = temp_.filePath("no-such-case.json");
    const QString refused = window.compareWith(missing);
    QVERIFY2(refused.contains("no-such-case.json"), qPrintable(refused));
    QVERIFY(!window.compareWith(temp_.filePath("x.cpcase@two")).isEmpty());
  }

 private:
  static std::string file_text(const QString& path) {
    QFile file(path);
    if (!file.open(QIODevice::ReadOnly)) return {};
    return file.readAll().toStdString();
  }
  QTemporaryDir temp_;
};

QTEST_MAIN(ComparisonWindowTest)
#include "comparison_window_test.moc"
