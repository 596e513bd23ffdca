// GUI tests of the DNA mixture form of the case editor (Qt Test, offscreen), on the demo
// mixture case: the table shows the observed alleles and the reference profiles as the file
// writes them; the LR of each locus and the curve over the drop-out probability are the core's
// own numbers (the model read from the item without the editor); an allele and a contributor
// edited through the form change the case's JSON as one undoable edit and one audit row; a bad
// allele is named with its locus; the wheel leaves an unfocused spin box alone.

#include <QApplication>
#include <QCheckBox>
#include <QComboBox>
#include <QDir>
#include <QFile>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QSpinBox>
#include <QStandardPaths>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>
#include <QWheelEvent>

#include <algorithm>
#include <cmath>
#include <memory>

#include "app/editor/display_text.hpp"
#include "app/editor/dna_mixture_form.hpp"
#include "app/editor/dropout_curve_chart.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/history_panel.hpp"
#include "app/editor/item_form.hpp"
#include "core/models/dna_mixture/dna_mixture_model.hpp"
#include "core/numbers/number_text.hpp"
#include "core/store/case_store.hpp"
#include "editor_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::editor_test;
using editor::DnaMixtureForm;
using nlohmann::json;

namespace {

// The demo case as the file holds it, read without the editor.
json demo_item() {
  QFile file(kMixture);
  if (!file.open(QIODevice::ReadOnly)) throw std::runtime_error("cannot read the demo mixture case");
  const json document = json::parse(file.readAll().toStdString());
  for (const auto& item : document["items"])
    if (item["id"] == "M1") return item;
  throw std::runtime_error("no item M1 in the demo mixture case");
}

// The core's mixture model of item M1 as the editor now holds it, read by the core's own reader.
std::shared_ptr<const models::dna_mixture::DnaMixtureModel> core_model(const MainWindow& window) {
  const json item = *window.document()->itemBody("M1");
  const auto model = models::dna_mixture::read_dna_mixture_model(
      item, models::ReadContext{window.document()->baseDir(), validation::Location{"M1", ""}});
  return std::dynamic_pointer_cast<const models::dna_mixture::DnaMixtureModel>(model);
}

QString comma_joined(const json& alleles) {
  QStringList parts;
  for (const auto& a : alleles) parts << QString::fromStdString(a.get<std::string>());
  return parts.join(", ");
}

}  // namespace

class MixtureFormTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-mixture-form-test");
    editor::settings::set_examiner_name("Dr Imogen Tarrant");  // Harwick Vale demo name
  }

  // The settings, the observed alleles and the references as the file writes them, one column
  // per reference named by the person.
  void showsTheCaseAsTheFileWritesIt() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    QVERIFY(form->isVisible());
    const json item = demo_item();
    QCOMPARE(form->thetaField()->text(), editor::value_text(item["theta"]));
    QCOMPARE(form->dropinField()->text(), editor::value_text(item["dropin"]));
    QVERIFY2(json::parse(form->dropoutField()->text().toStdString(), nullptr, false) == item["dropout"],
             qPrintable(form->dropoutField()->text()));
    QVERIFY2(form->dropoutWords()->text().contains("averages over it"), qPrintable(form->dropoutWords()->text()));
    QVERIFY(form->frequencySource()->text().contains("dna/vale-str-frequencies.csv"));

    QTableWidget* table = form->lociTable();
    QCOMPARE(table->rowCount(), static_cast<int>(item["observed"].size()));
    for (auto locus = item["observed"].begin(); locus != item["observed"].end(); ++locus) {
      const int row = form->rowOfLocus(QString::fromStdString(locus.key()));
      QVERIFY2(row >= 0, locus.key().c_str());
      QCOMPARE(table->item(row, DnaMixtureForm::ObservedColumn)->text(), comma_joined(locus.value()));
      for (auto person = item["references"].begin(); person != item["references"].end(); ++person) {
        const int column = form->columnOfReference(QString::fromStdString(person.key()));
        QVERIFY(column >= DnaMixtureForm::FirstReferenceColumn);
        QCOMPARE(table->horizontalHeaderItem(column)->text(), QString::fromStdString(person.key()));
        QCOMPARE(table->item(row, column)->text(), comma_joined(person.value()[locus.key()]));
      }
    }
    // Contributors: Hp names both people, Hd only Ms Venn with one unknown.
    QVERIFY(form->contributorBox("hp", "Mr Dray")->isChecked());
    QVERIFY(form->contributorBox("hp", "Ms Venn")->isChecked());
    QVERIFY(!form->contributorBox("hd", "Mr Dray")->isChecked());
    QVERIFY(form->contributorBox("hd", "Ms Venn")->isChecked());
    QCOMPARE(form->unknownsBox("hp")->value(), item["hp"]["unknowns"].get<int>());
    QCOMPARE(form->unknownsBox("hd")->value(), item["hd"]["unknowns"].get<int>());
  }

  // The LR of each locus is the core's at the point drop-out (the mean of d's distribution),
  // computed here from the model's own per-locus likelihoods; the curve and its lowest point
  // are the model's; the item's LR is the core's evaluation.
  void locusReadingsAndCurveAreTheCores() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    const auto model = core_model(window);
    QVERIFY(model);
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), core_item(core_evaluation(window), "M1").point.lr.log10());
    const models::dna_mixture::Dropout point{model->point_dropout(), model->settings().dropout_homozygote, {}};
    QTableWidget* table = form->lociTable();
    QVERIFY(table->horizontalHeaderItem(form->lrColumn())->text().contains(
        QString::fromStdString(numbers::entered_for_readers(model->point_dropout()))));
    int compared = 0;
    for (const auto& locus : model->loci()) {
      const int row = form->rowOfLocus(QString::fromStdString(locus.locus));
      QVERIFY(row >= 0);
      const double log10_lr = std::log10(locus.hp.probability(point)) - std::log10(locus.hd.probability(point));
      QTableWidgetItem* cell = table->item(row, form->lrColumn());
      QCOMPARE(cell->data(Qt::UserRole).toDouble(), log10_lr);
      QVERIFY2(cell->text().startsWith(editor::lr_text(numbers::LikelihoodRatio::from_log10(log10_lr), std::nullopt)),
               qPrintable(cell->text()));
      // Under Hd the one unknown's genotype is summed over: more than one set wherever the
      // observed alleles leave a choice; under Hp both people are named, one set.
      QVERIFY2(table->item(row, form->genotypeSetsColumn())->text().startsWith("Hp: 1 set"),
               qPrintable(table->item(row, form->genotypeSetsColumn())->text()));
      ++compared;
    }
    QCOMPARE(compared, 15);  // the 15 STR loci of the demo; Amelogenin is a sex marker
    QVERIFY(table->item(form->rowOfLocus("Amelogenin"), form->lrColumn())->text().contains("sex marker"));

    const auto& curve = form->curveChart()->data();
    QCOMPARE(curve.finite.size() + curve.zero.size() + curve.other.size(), model->curve().points.size());
    for (const auto& point : model->curve().points) {
      const auto drawn = std::find_if(curve.finite.begin(), curve.finite.end(), [&](const auto& p) { return p.d == point.d; });
      if (point.log10_lr && std::isfinite(*point.log10_lr)) QVERIFY(drawn != curve.finite.end() && drawn->log10_lr == *point.log10_lr);
    }
    QVERIFY(curve.minimum);
    QCOMPARE(curve.minimum->d, model->curve().minimum.d);
    QVERIFY(curve.minimum->log10_lr == *model->curve().minimum.log10_lr);
    QVERIFY(form->curveSummary()->text().contains(QString::fromStdString(numbers::entered_for_readers(model->curve().minimum.d))));
  }

  // An observed allele edited in the table is one undoable change of "observed", and the LR is
  // the core's for the new profile; a bad allele (listed twice) is named with its locus.
  void alleleEditIsOneUndoStepAndBadAlleleIsNamed() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    const json original = *window.document()->itemBody("M1");
    const double before = table_raw(window, "M1", ItemTableModel::Log10LR);
    QTableWidget* table = form->lociTable();

    // Mr Dray's 13 at D18S51 seen after all: no drop-out is needed there under Hp.
    const int d18 = form->rowOfLocus("D18S51");
    table->item(d18, DnaMixtureForm::ObservedColumn)->setText("13, 15, 16, 17");
    QVERIFY((*item_field(window, "M1", "observed"))["D18S51"] == json::array({"13", "15", "16", "17"}));
    QCOMPARE(window.undoStack()->count(), 1);
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), core_item(core_evaluation(window), "M1").point.lr.log10());
    QVERIFY(table_raw(window, "M1", ItemTableModel::Log10LR) != before);
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("M1") == original);
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), before);

    // An allele listed twice: the core refuses it; the form names the locus and tints the cell.
    QTRY_VERIFY(form->rowOfLocus("D8S1179") >= 0);
    const int d8 = form->rowOfLocus("D8S1179");
    table->item(d8, DnaMixtureForm::ObservedColumn)->setText("12, 12, 13, 14, 15");
    QVERIFY(!window.document()->points().item("M1")->evaluated);
    const auto problems = window.document()->problemsAt("M1", "observed");
    QCOMPARE(problems.size(), std::size_t(1));
    QVERIFY(problems.front().where.field.rfind("observed.D8S1179", 0) == 0);
    QTRY_VERIFY2(any_contains(shown_messages(form), "D8S1179") &&
                     any_contains(shown_messages(form), QString::fromStdString(problems.front().message)),
                 qPrintable(shown_messages(form).join(" | ")));
    QTRY_VERIFY(form->lociTable()->item(d8, DnaMixtureForm::ObservedColumn)->toolTip().contains("D8S1179"));
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("M1") == original);
    QTRY_VERIFY(shown_messages(form).isEmpty());
  }

  // A contributor check box and the number of unknowns, in a case file: each one undoable edit
  // and one audit row of the proposition, named in words in the history. Naming Mr Dray under
  // Hd with no unknown makes Hd the same as Hp, so the LR is exactly 1: the same probability of
  // the findings under both propositions (common practice).
  void contributorsEditAsOneAuditRowEach() {
    QTemporaryDir temp;
    const QString path = temp.filePath("mixture.cpcase");
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    // The case file keeps the frequency table's path relative to it: the table goes beside it.
    QVERIFY(QDir().mkpath(temp.filePath("dna")));
    QVERIFY(QFile::copy(QStringLiteral(COUNTERPOISE_DEMO_DIR "/dna/vale-str-frequencies.csv"),
                        temp.filePath("dna/vale-str-frequencies.csv")));
    QCOMPARE(window.saveTo(path), QString());
    window.selectItem("M1");
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    const json original = *window.document()->itemBody("M1");
    const std::size_t rows_before = window.document()->caseStore()->audit_rows().size();

    QCheckBox* dray_under_hd = form->contributorBox("hd", "Mr Dray");
    QVERIFY(dray_under_hd && dray_under_hd->isVisible());
    // The box may lie below the window's bottom edge (the form scrolls): clicked as a user would
    // after scrolling to it.
    dray_under_hd->click();
    QVERIFY((*item_field(window, "M1", "hd"))["contributors"] == json::array({"Ms Venn", "Mr Dray"}));
    QCOMPARE(window.undoStack()->count(), 1);
    QCOMPARE(window.document()->caseStore()->audit_rows().size(), rows_before + 1);
    QCOMPARE(window.document()->caseStore()->audit_rows().back().field, std::string("hd"));
    // Three people under Hd now, but two stated: the core's message under the contributors.
    const auto problems = window.document()->problemsAt("M1", "hd");
    QCOMPARE(problems.size(), std::size_t(1));
    QTRY_VERIFY2(any_contains(shown_messages(form), QString::fromStdString(problems.front().message)),
                 qPrintable(shown_messages(form).join(" | ")));

    form->unknownsBox("hd")->setValue(0);
    QVERIFY((*item_field(window, "M1", "hd"))["unknowns"] == json(0));
    QCOMPARE(window.undoStack()->count(), 2);
    QCOMPARE(window.document()->caseStore()->audit_rows().size(), rows_before + 2);
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), core_item(core_evaluation(window), "M1").point.lr.log10());
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), 0.0);

    window.showTab(MainWindow::HistoryTab);
    auto* audit = window.historyPanel()->auditTable();
    QTRY_VERIFY(audit->rowCount() == static_cast<int>(rows_before + 2));
    QCOMPARE(audit->item(0, editor::HistoryPanel::WhatColumn)->text(), QString("Hd of M1"));

    window.undoStack()->undo();
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("M1") == original);
  }

  // A locus and a person added by name and removed with the buttons under the table: each one
  // undoable edit; removing a person also takes them out of both propositions and their own
  // drop-out probability; a new locus or person without alleles is named by the core's message.
  void lociAndPeopleAreAddedAndRemoved() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    const json original = *window.document()->itemBody("M1");
    QTableWidget* table = form->lociTable();
    const int rows = table->rowCount();

    QVERIFY(!form->addLocusButton()->isEnabled());
    form->newLocusField()->setEditText("SE33");
    QVERIFY(form->addLocusButton()->isEnabled());
    QTest::mouseClick(form->addLocusButton(), Qt::LeftButton);
    QCOMPARE(window.undoStack()->count(), 1);
    QVERIFY((*item_field(window, "M1", "observed"))["SE33"] == json::array());
    QTRY_COMPARE(table->rowCount(), rows + 1);
    // The people are not typed at SE33: the core names the locus and the person.
    QTRY_VERIFY2(any_contains(shown_messages(form), "SE33"), qPrintable(shown_messages(form).join(" | ")));
    form->newLocusField()->setEditText("SE33");
    QVERIFY(!form->addLocusButton()->isEnabled());  // already there

    // Removing the selected row's locus takes it out of the profile and every reference.
    table->setCurrentCell(form->rowOfLocus("TH01"), DnaMixtureForm::ObservedColumn);
    QVERIFY(form->removeLocusButton()->isEnabled());
    QTest::mouseClick(form->removeLocusButton(), Qt::LeftButton);
    QCOMPARE(window.undoStack()->count(), 2);
    QVERIFY(!item_field(window, "M1", "observed")->contains("TH01"));
    // Held in a local: a range over *item_field(...) would outlive the optional it points into.
    const auto references = item_field(window, "M1", "references");
    QVERIFY(references);
    for (const auto& profile : *references) QVERIFY(!profile.contains("TH01"));
    window.undoStack()->undo();
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("M1") == original);

    // A person added, then Mr Dray removed: out of the references, of Hp and of his own rate.
    json with_own_rate = original;
    with_own_rate["dropout_by_contributor"] = {{"Mr Dray", 0.2}};
    QVERIFY(window.edits()->setItemField("M1", "dropout_by_contributor", with_own_rate["dropout_by_contributor"]));
    const int undo_base = window.undoStack()->count();
    form->newPersonField()->setText("Mr Oakes");
    QTest::mouseClick(form->addPersonButton(), Qt::LeftButton);
    QCOMPARE(window.undoStack()->count(), undo_base + 1);
    QVERIFY((*item_field(window, "M1", "references"))["Mr Oakes"] == json::object());
    QTRY_VERIFY(form->columnOfReference("Mr Oakes") >= DnaMixtureForm::FirstReferenceColumn);
    QTRY_VERIFY(form->contributorBox("hp", "Mr Oakes") != nullptr);

    table->setCurrentCell(0, form->columnOfReference("Mr Dray"));
    QVERIFY(form->removePersonButton()->isEnabled());
    QTest::mouseClick(form->removePersonButton(), Qt::LeftButton);
    QCOMPARE(window.undoStack()->count(), undo_base + 2);
    QVERIFY(!item_field(window, "M1", "references")->contains("Mr Dray"));
    QVERIFY((*item_field(window, "M1", "hp"))["contributors"] == json::array({"Ms Venn"}));
    QVERIFY(!item_field(window, "M1", "dropout_by_contributor").has_value());
    window.undoStack()->undo();
    QVERIFY(item_field(window, "M1", "references")->contains("Mr Dray"));
    QVERIFY(*item_field(window, "M1", "dropout_by_contributor") == with_own_rate["dropout_by_contributor"]);
    if (qEnvironmentVariableIsSet("COUNTERPOISE_SCREENSHOTS")) {
      window.resize(1400, 1000);
      QTest::qWait(50);  // widgets added to a shown layout appear once the event loop runs
      form->grab().save(qEnvironmentVariable("COUNTERPOISE_SCREENSHOTS") + "/mixture-form-buttons.png");
    }
  }

  // Ms Venn's own drop-out probability and an allele marked uncertain, typed in the form: each one
  // undoable edit of its field, the LR the core's; a bad own rate is named under the contributors.
  void ownDropoutAndUncertainAllelesAreEdited() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    const json original = *window.document()->itemBody("M1");
    QLineEdit* venn = form->ownDropoutField("Ms Venn");
    QVERIFY(venn && venn->text().isEmpty());
    retype(venn, "0.02");
    QVERIFY(*item_field(window, "M1", "dropout_by_contributor") == json({{"Ms Venn", 0.02}}));
    QCOMPARE(window.undoStack()->count(), 1);
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), core_item(core_evaluation(window), "M1").point.lr.log10());

    // Mr Dray's missing 13 at D18S51 as a peak below the threshold: no longer a drop-out under Hp.
    QTableWidget* table = form->lociTable();
    const int d18 = form->rowOfLocus("D18S51");
    const double before = table->item(d18, form->lrColumn())->data(Qt::UserRole).toDouble();
    table->item(d18, DnaMixtureForm::UncertainColumn)->setText("13");
    QVERIFY(*item_field(window, "M1", "uncertain") == json({{"D18S51", {"13"}}}));
    QCOMPARE(window.undoStack()->count(), 2);
    QTRY_VERIFY(form->lociTable()->item(form->rowOfLocus("D18S51"), form->lrColumn())->data(Qt::UserRole).toDouble() > before);
    QCOMPARE(table_raw(window, "M1", ItemTableModel::Log10LR), core_item(core_evaluation(window), "M1").point.lr.log10());

    retype(form->ownDropoutField("Ms Venn"), "1.5");
    const auto problems = window.document()->problemsAt("M1", "dropout_by_contributor");
    QCOMPARE(problems.size(), std::size_t(1));
    QTRY_VERIFY2(any_contains(shown_messages(form), QString::fromStdString(problems.front().message)),
                 qPrintable(shown_messages(form).join(" | ")));
    window.undoStack()->undo();
    window.undoStack()->undo();
    window.undoStack()->undo();
    QVERIFY(*window.document()->itemBody("M1") == original);
  }

  // A new item of the mixture model starts as a valid two-person mixture the form shows.
  void newMixtureItemStartsValid() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    const std::string id = window.edits()->addItem("dna-mixture");
    QVERIFY(!id.empty());
    window.selectItem(id);
    QVERIFY(window.document()->points().item(id)->evaluated);
    QCOMPARE(table_raw(window, id, ItemTableModel::Log10LR), core_item(core_evaluation(window), id).point.lr.log10());
    DnaMixtureForm* form = window.itemForm()->mixtureForm();
    QTRY_VERIFY(form->isVisible());
    QCOMPARE(form->lociTable()->rowCount(), 1);
    QVERIFY(form->contributorBox("hp", "suspect")->isChecked());
    QVERIFY(!form->contributorBox("hd", "suspect")->isChecked());
    QCOMPARE(form->unknownsBox("hd")->value(), 1);
  }

  // The wheel over the unknowns' spin box changes nothing while it has no focus.
  void wheelLeavesAnUnfocusedSpinBoxAlone() {
    MainWindow window;
    QVERIFY(open_on_item(window, kMixture, "M1"));
    QSpinBox* unknowns = window.itemForm()->mixtureForm()->unknownsBox("hd");
    window.itemForm()->mixtureForm()->thetaField()->setFocus();
    QTRY_VERIFY(!unknowns->hasFocus());
    const int before = unknowns->value();
    const QPointF centre = QRectF(unknowns->rect()).center();
    QWheelEvent wheel(centre, unknowns->mapToGlobal(centre), QPoint(), QPoint(0, 120), Qt::NoButton, Qt::NoModifier,
                      Qt::NoScrollPhase, false);
    QApplication::sendEvent(unknowns, &wheel);
    QCOMPARE(unknowns->value(), before);
    QCOMPARE(window.undoStack()->count(), 0);
  }
};

QTEST_MAIN(MixtureFormTest)
#include "mixture_form_test.moc"
