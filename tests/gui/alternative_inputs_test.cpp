// GUI tests of the per-alternative inputs of the mixture, measurement, transfer, reported-LR and
// network forms (Qt Test, offscreen), in a case with several alternatives to Hp saved as a case
// file. Each edit made through the form's widgets is checked three ways: the value written to the
// item (the chosen alternative's entry, the others untouched), one undo step and one audit row;
// and the LR against the alternative is compared with the core reading the same inputs on its
// own as a two-proposition case (Hd = that alternative), or with the formula written out.

#include <QApplication>
#include <QCheckBox>
#include <QComboBox>
#include <QDir>
#include <QFile>
#include <QGroupBox>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QSpinBox>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>

#include <cmath>
#include <fstream>

#include "app/editor/alternative_chooser.hpp"
#include "app/editor/background_data_fields.hpp"
#include "app/editor/dna_mixture_form.hpp"
#include "app/editor/dropout_curve_chart.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/measurement_form.hpp"
#include "app/editor/network_form.hpp"
#include "app/editor/network_view.hpp"
#include "app/editor/point_evaluation.hpp"
#include "core/store/case_store.hpp"
#include "editor_test_support.hpp"

using namespace counterpoise;
using namespace counterpoise::editor_test;
using nlohmann::json;


namespace {

// Counts an edit: the undo steps and audit rows before it, checked after it for one of each.
struct OneEdit {
  const MainWindow& window;
  int steps = window.undoStack()->count();
  std::size_t rows = audit_rows(window);
  bool done() const { return window.undoStack()->count() == steps + 1 && audit_rows(window) == rows + 1; }
};

// Empties a line field and commits it, as the user does.
void clear_typed(QLineEdit* line) {
  line->setFocus();
  line->selectAll();
  QTest::keyClick(line, Qt::Key_Backspace);
  QTest::keyClick(line, Qt::Key_Return);
}

// Chooses alternative `index` in a form's chooser as the user does.
void choose(editor::AlternativeChooser* chooser, int index) {
  chooser->box()->setCurrentIndex(index);
  emit chooser->box()->activated(index);
}

// The item `id` of the window's case, its entry of alternative `alternative` merged into it, as
// the one item of a two-proposition case with that alternative as Hd; read and evaluated by the
// core on its own.
evaluation::ItemEvaluation alone(const MainWindow& window, const std::string& id, const std::string& alternative,
                                 const std::function<void(json&)>& network_hd = {}) {
  json document = window.document()->document();
  json item = *window.document()->itemBody(id);
  const json entry = item["alternatives"][alternative];
  item.erase("alternatives");
  for (auto it = entry.begin(); it != entry.end(); ++it) item[it.key()] = it.value();
  if (network_hd) network_hd(item);
  document["propositions"].erase("alternatives");
  document["propositions"]["hd"] = "The alternative " + alternative;
  document["items"] = json::array({item});
  const auto read = interchange::read_case(document, window.document()->baseDir());
  if (!read.value) {
    std::string problems;
    for (const auto& p : read.diagnostics.problems()) problems += " " + p.where.field + ": " + p.message;
    throw std::runtime_error("the case alone does not read:" + problems);
  }
  return evaluation::evaluate_case(*read.value).items.at(0);
}

// The mixture demo case (two propositions) with two alternatives: Ms Venn and an unknown
// person (Hd1, the demo's Hd), and Ms Venn and two unknown people (Hd2).
json mixture_case() {
  std::ifstream in(kMixture.toStdString());
  json document = json::parse(in);
  document["propositions"].erase("hd");
  document["propositions"]["alternatives"] = json::parse(R"([
    { "id": "Hd1", "text": "The DNA mixture came from Ms Venn and an unknown person unrelated to Mr Dray" },
    { "id": "Hd2", "text": "The DNA mixture came from Ms Venn and two unknown people" }])");
  json& item = document["items"][0];
  item["alternatives"] = json{{"Hd1", {{"hd", item["hd"]}}}};
  item.erase("hd");
  return document;
}

// An invented glass and fibres case (Harwick Vale scenario) with two alternatives to Hp.
json several_models_case() {
  return json::parse(R"({ "format": "counterpoise.case", "version": 1,
    "case": { "reference": "VFL-TEST-ALTIN", "title": "Glass and fibres from the Mill Street shop, a test case" },
    "mode": "casework",
    "propositions": { "level": "activity", "hp": "Mr Wren broke the window of the Mill Street shop",
      "alternatives": [
        { "id": "Hd1", "text": "Mr Wren was not at the shop" },
        { "id": "Hd2", "text": "Mr Wren stood beside the window when another man broke it" } ] },
    "items": [
      { "id": "T1", "title": "Fibres", "model": "transfer", "t0": 0.1, "tn": 0.3, "p0": 0.9, "p1": 0.08, "sn": 0.4,
        "gamma": 0.05, "alternatives": { "Hd1": {}, "Hd2": { "t0_hd": 0.6 , "tn_hd": 0.1 } } },
      { "id": "R1", "title": "Paint", "model": "reported-lr", "method": "Vale paint comparison",
        "alternatives": { "Hd1": { "lr": 300 }, "Hd2": { "lr": 40 } } },
      { "id": "G1", "title": "Refractive index", "model": "continuous-two-level",
        "control": [1.51991, 1.51995, 1.51988, 1.51993], "recovered": [1.5199, 1.51996, 1.51992], "within_sd": 3.5e-05,
        "population": { "normal": { "mean": 1.5196, "sd": 0.0033 } }, "alternatives": { "Hd1": {}, "Hd2": {} } },
      { "id": "N1", "title": "Glass on the jacket", "model": "network",
        "nodes": [
          { "name": "Where", "states": ["broke it", "elsewhere", "beside it"] },
          { "name": "Glass", "states": ["found", "none"], "parents": ["Where"],
            "cpt": [[0.6, 0.4], [0.02, 0.98], [0.2, 0.8]] } ],
        "observed": { "Glass": "found" },
        "proposition": { "node": "Where", "hp": "broke it" },
        "alternatives": { "Hd1": { "hd": "elsewhere" }, "Hd2": { "hd": "elsewhere" } } }
    ] })");
}

}  // namespace

class AlternativeInputsTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-alternative-inputs-test");
    editor::settings::set_examiner_name("Dr Imogen Tarrant");  // Harwick Vale demo name
  }

  // The mixture form's Hd column, counts and curve follow the chosen alternative.
  void mixtureContributorsPerAlternative() {
    QTemporaryDir folder;
    MainWindow window;
    // The frequencies file beside the case, as the demo case names it.
    QVERIFY(QDir(folder.path()).mkpath("dna"));
    QVERIFY(QFile::copy(COUNTERPOISE_DEMO_DIR "/dna/vale-str-frequencies.csv", folder.filePath("dna/vale-str-frequencies.csv")));
    QVERIFY(open_on_item(window, write_case(folder, "mixture.json", mixture_case()), "M1"));
    QCOMPARE(window.saveTo(folder.filePath("mixture.cpcase")), QString());
    window.selectItem("M1");
    editor::DnaMixtureForm* form = window.itemForm()->mixtureForm();
    editor::AlternativeChooser* chooser = form->alternativeChooser();
    QTRY_VERIFY(chooser->isVisible());
    QCOMPARE(chooser->box()->count(), 2);
    QVERIFY(chooser->box()->itemText(1).startsWith("Hd2: The DNA mixture came from Ms Venn and two unknown people"));
    // Against Hd1: its own contributors shown, enabled.
    QCheckBox* venn_hd = form->contributorBox("hd", "Ms Venn");
    QVERIFY(venn_hd && venn_hd->isEnabled() && venn_hd->isChecked());
    QCOMPARE(form->unknownsBox("hd")->value(), 1);

    // Hd2 has no entry yet: nothing under it, and the core says it needs its own value.
    choose(chooser, 1);
    QTRY_VERIFY(form->curveChart()->parentWidget()->property("title").toString().contains("against Hd2"));
    QVERIFY(!form->contributorBox("hd", "Ms Venn")->isChecked());
    // The item is refused until Hd2 has contributors: no curve, the message names the alternative.
    QTRY_VERIFY2(any_contains(shown_messages(window.itemForm()), "Alternative 2 (Hd2): missing: alternative Hd2 needs its own value"),
                 qPrintable(shown_messages(window.itemForm()).join('|')));
    QVERIFY(form->curveSummary()->text().isEmpty());

    const json hd1_entry = (*item_field(window, "M1", "alternatives"))["Hd1"];
    {
      OneEdit edit{window};
      form->contributorBox("hd", "Ms Venn")->click();
      SAME_JSON((*item_field(window, "M1", "alternatives"))["Hd2"], json::parse(R"({ "hd": { "contributors": ["Ms Venn"] } })"));
      QVERIFY(edit.done());
    }
    {
      OneEdit edit{window};
      QTRY_COMPARE(form->unknownsBox("hd")->value(), 0);
      form->unknownsBox("hd")->setValue(2);
      SAME_JSON((*item_field(window, "M1", "alternatives"))["Hd2"],
                json::parse(R"({ "hd": { "contributors": ["Ms Venn"], "unknowns": 2 } })"));
      QVERIFY(edit.done());
    }
    SAME_JSON((*item_field(window, "M1", "alternatives"))["Hd1"], hd1_entry);  // the other entry untouched
    // Undo takes back the last change only, redo gives it again.
    window.undoStack()->undo();
    SAME_JSON((*item_field(window, "M1", "alternatives"))["Hd2"], json::parse(R"({ "hd": { "contributors": ["Ms Venn"] } })"));
    window.undoStack()->redo();
    QTRY_COMPARE(form->unknownsBox("hd")->value(), 2);
    QVERIFY(chooser->chosen() == "Hd2");  // the choice survives the re-render

    // The LR against Hd2 and the curve shown are the core's for the same inputs on their own.
    const auto core_alone = alone(window, "M1", "Hd2");
    QCOMPARE(against(core_item(core_evaluation(window), "M1"), "Hd2").lr.log10(), core_alone.point.lr.log10());
    const auto expected = editor::DropoutCurveData::from_detail(core_alone.point.detail);
    QTRY_VERIFY(form->curveSummary()->text().startsWith("Against Hd2: "));
    const auto& shown = form->curveChart()->data();
    QVERIFY(expected.minimum && shown.minimum);
    QCOMPARE(shown.minimum->log10_lr, expected.minimum->log10_lr);
    QCOMPARE(shown.finite.size(), expected.finite.size());
    for (std::size_t i = 0; i < shown.finite.size(); ++i) QCOMPARE(shown.finite[i].log10_lr, expected.finite[i].log10_lr);
    // ...and not Hd1's: two unknowns explain the profile otherwise than one.
    const auto hd1_curve = editor::DropoutCurveData::from_detail(alone(window, "M1", "Hd1").point.detail);
    double largest_difference = 0;
    for (std::size_t i = 0; i < std::min(shown.finite.size(), hd1_curve.finite.size()); ++i)
      largest_difference = std::max(largest_difference, std::abs(shown.finite[i].log10_lr - hd1_curve.finite[i].log10_lr));
    QVERIFY(largest_difference > 0.1);
    const int lr_column = form->lrColumn();
    QVERIFY(form->lociTable()->horizontalHeaderItem(lr_column)->text().contains("against Hd2"));
    // Back to Hd1: its curve, named.
    choose(chooser, 0);
    QTRY_VERIFY(form->curveSummary()->text().startsWith("Against Hd1: "));
    QCOMPARE(form->curveChart()->data().minimum->log10_lr,
             editor::DropoutCurveData::from_detail(alone(window, "M1", "Hd1").point.detail).minimum->log10_lr);
  }

  // Transfer under each alternative, a reported interval per alternative, a network state per
  // alternative and a population per alternative.
  void otherFormsPerAlternative() {
    QTemporaryDir folder;
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "several.json", several_models_case()), "T1"));
    QCOMPARE(window.saveTo(folder.filePath("several.cpcase")), QString());
    editor::ItemForm* form = window.itemForm();

    // Transfer: the Hd fields of the two-proposition form give way to one pair per alternative.
    window.selectItem("T1");
    QLineEdit* t0_hd2 = form->alternativeTransferField("Hd2", "t0_hd");
    QVERIFY(t0_hd2);
    QTRY_VERIFY(t0_hd2->isVisible());
    QVERIFY(!form->findChild<QLineEdit*>("transfer_t0_hd")->isVisible());
    QCOMPARE(t0_hd2->text(), QString("0.6"));
    QCOMPARE(form->alternativeTransferField("Hd1", "t0_hd")->text(), QString());
    {
      OneEdit edit{window};
      retype(t0_hd2, "0.5");
      SAME_JSON(*item_field(window, "T1", "alternatives"), json::parse(R"({ "Hd1": {}, "Hd2": { "t0_hd": 0.5, "tn_hd": 0.1 } })"));
      QVERIFY(edit.done());
    }
    // Evett's formula written out for one group found (DOMAIN, transfer evidence): under Hp
    // t0 P1 Sn γ + tn P0, under an alternative with its own transfer t0' P1 Sn γ + tn' P0.
    const double hp = 0.1 * 0.08 * 0.4 * 0.05 + 0.3 * 0.9, hd2 = 0.5 * 0.08 * 0.4 * 0.05 + 0.1 * 0.9;
    const double hd1 = 1.0 * 0.08 * 0.4 * 0.05;
    const auto t1 = core_item(core_evaluation(window), "T1");
    // 1e-12 in log10: a few roundings of double arithmetic in log space.
    QVERIFY(std::abs(against(t1, "Hd2").lr.log10() - std::log10(hp / hd2)) < 1e-12);
    QVERIFY(std::abs(against(t1, "Hd1").lr.log10() - std::log10(hp / hd1)) < 1e-12);
    {
      OneEdit edit{window};
      clear_typed(form->alternativeTransferField("Hd2", "tn_hd"));
      SAME_JSON((*item_field(window, "T1", "alternatives"))["Hd2"], json::parse(R"({ "t0_hd": 0.5 })"));
      QVERIFY(edit.done());
    }
    // The core names the missing half at the entry, shown on the form.
    QTRY_VERIFY2(any_contains(shown_messages(form), "Alternative 2 (Hd2), tn_hd: "), qPrintable(shown_messages(form).join('|')));
    retype(form->alternativeTransferField("Hd2", "tn_hd"), "0.1");
    QTRY_VERIFY(shown_messages(form).isEmpty());

    // Reported LR: the interval against each alternative.
    window.selectItem("R1");
    const auto [low, high] = form->alternativeIntervalFields("Hd2");
    QVERIFY(low && high);
    QTRY_VERIFY(low->isVisible());
    // Each end is a change of its own, as in the two-proposition form.
    {
      OneEdit edit{window};
      retype(low, "20");
      SAME_JSON((*item_field(window, "R1", "alternatives"))["Hd2"], json::parse(R"({ "lr": 40, "interval": [20, ""] })"));
      QVERIFY(edit.done());
    }
    QTRY_VERIFY2(any_contains(shown_messages(form), "Alternative 2 (Hd2), interval"), qPrintable(shown_messages(form).join('|')));
    {
      OneEdit edit{window};
      retype(high, "80");
      SAME_JSON((*item_field(window, "R1", "alternatives"))["Hd2"], json::parse(R"({ "lr": 40, "interval": [20, 80] })"));
      QVERIFY(edit.done());
    }
    SAME_JSON((*item_field(window, "R1", "alternatives"))["Hd1"], json::parse(R"({ "lr": 300 })"));
    QTRY_VERIFY2(shown_messages(form).isEmpty(), qPrintable(shown_messages(form).join('|')));
    QCOMPARE(against(core_item(core_evaluation(window), "R1"), "Hd2").lr.log10(), alone(window, "R1", "Hd2").point.lr.log10());
    clear_typed(low);
    clear_typed(high);
    SAME_JSON((*item_field(window, "R1", "alternatives"))["Hd2"], json::parse(R"({ "lr": 40 })"));

    // Network: the state or states of the proposition node per alternative, a check box each.
    window.selectItem("N1");
    editor::NetworkForm* network = form->networkForm();
    QCheckBox* elsewhere_hd2 = network->alternativeStateBox("Hd2", "elsewhere");
    QVERIFY(elsewhere_hd2);
    QTRY_VERIFY(elsewhere_hd2->isVisible());
    QVERIFY(!network->findChild<QComboBox*>("network_hd_state")->isVisible());
    QVERIFY(elsewhere_hd2->isChecked());
    QVERIFY(!network->alternativeStateBox("Hd2", "beside it")->isChecked());
    QVERIFY(!network->alternativeStateBox("Hd2", "broke it")->isChecked());
    // The network is drawn though its Hd states are per alternative.
    QTRY_COMPARE(form->networkView()->nodeNames(), QStringList({"Where", "Glass"}));
    {
      // A second state checked: the entry lists both, in the node's order.
      OneEdit edit{window};
      network->alternativeStateBox("Hd2", "beside it")->click();
      SAME_JSON(*item_field(window, "N1", "alternatives"),
                json::parse(R"({ "Hd1": { "hd": "elsewhere" }, "Hd2": { "hd": ["elsewhere", "beside it"] } })"));
      QVERIFY(edit.done());
    }
    // Hd2 groups two states of a root node without a table (even prior): P(found | Hd2) =
    // (0.02 + 0.2) / 2 by the law of total probability.
    QVERIFY(std::abs(against(core_item(core_evaluation(window), "N1"), "Hd2").lr.log10() - std::log10(0.6 / 0.11)) < 1e-12);
    QTRY_VERIFY(network->alternativeStateBox("Hd2", "beside it") && network->alternativeStateBox("Hd2", "beside it")->isChecked());
    {
      OneEdit edit{window};
      network->alternativeStateBox("Hd2", "elsewhere")->click();
      SAME_JSON(*item_field(window, "N1", "alternatives"),
                json::parse(R"({ "Hd1": { "hd": "elsewhere" }, "Hd2": { "hd": "beside it" } })"));
      QVERIFY(edit.done());
    }
    // P(found | broke it) / P(found | beside it) = 0.6 / 0.2, read off the table.
    const auto n1 = core_item(core_evaluation(window), "N1");
    QVERIFY(std::abs(against(n1, "Hd2").lr.log10() - std::log10(0.6 / 0.2)) < 1e-12);
    QVERIFY(std::abs(against(n1, "Hd1").lr.log10() - std::log10(0.6 / 0.02)) < 1e-12);
    // The editor's point evaluation against each alternative, computed once per edit, is the core's.
    for (const char* item : {"T1", "R1", "N1"}) {
      const editor::ItemPoint* point = window.document()->points().item(item);
      QVERIFY(point && point->by_alternative.size() == 2);
      const auto core = core_item(core_evaluation(window), item);
      QCOMPARE(point->by_alternative[0].lr.log10(), against(core, "Hd1").lr.log10());
      QCOMPARE(point->by_alternative[1].lr.log10(), against(core, "Hd2").lr.log10());
    }

    // Measurements: the population of the recovered material's sources under Hd2.
    window.selectItem("G1");
    editor::MeasurementForm* measurement = form->measurementForm();
    QTRY_VERIFY(measurement->alternativeChooser()->isVisible());
    choose(measurement->alternativeChooser(), 1);
    QTRY_COMPARE(measurement->alternativeChooser()->chosen(), std::string("Hd2"));
    QCOMPARE(measurement->hdPopulationKind()->currentIndex(), 0);  // the population above
    QVERIFY(!measurement->hdMeanField()->isVisible());
    {
      OneEdit edit{window};
      measurement->hdPopulationKind()->setCurrentIndex(1);
      emit measurement->hdPopulationKind()->activated(1);
      // Starts from the population above.
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"],
                json::parse(R"({ "population_hd": { "normal": { "mean": 1.5196, "sd": 0.0033 } } })"));
      QVERIFY(edit.done());
    }
    QTRY_VERIFY(measurement->hdMeanField()->isVisible());
    {
      OneEdit edit{window};
      retype(measurement->hdMeanField(), "1.5205");
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"]["population_hd"]["normal"]["mean"], json(1.5205));
      QVERIFY(edit.done());
    }
    SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd1"], json::object());
    QCOMPARE(against(core_item(core_evaluation(window), "G1"), "Hd2").lr.log10(), alone(window, "G1", "Hd2").point.lr.log10());
    QTRY_VERIFY2(measurement->readingLabel()->text().contains("Sources of the recovered material if Hd2 is true: normal, mean 1.5205"),
                 qPrintable(measurement->readingLabel()->text()));
    // Back to the population above: the entry is left empty.
    {
      OneEdit edit{window};
      measurement->hdPopulationKind()->setCurrentIndex(0);
      emit measurement->hdPopulationKind()->activated(0);
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"], json::object());
      QVERIFY(edit.done());
    }
  }

  // A network's entry that names several states for an alternative, as the case file has it, is
  // shown as checked states and survives other edits of the item byte for byte.
  void networkSeveralStatesSurvive() {
    QTemporaryDir folder;
    json document = several_models_case();
    document["items"][3]["alternatives"]["Hd2"] = json::parse(R"({ "hd": ["beside it", "elsewhere"] })");
    const QString path = write_case(folder, "network.json", document);
    const std::string original = file_bytes(path);
    MainWindow window;
    QVERIFY(open_on_item(window, path, "N1"));
    QCOMPARE(window.saveTo(folder.filePath("network.cpcase")), QString());
    window.selectItem("N1");
    editor::NetworkForm* network = window.itemForm()->networkForm();
    QTRY_VERIFY(network->alternativeStateBox("Hd2", "elsewhere") && network->alternativeStateBox("Hd2", "elsewhere")->isVisible());
    QVERIFY(network->alternativeStateBox("Hd2", "elsewhere")->isChecked());
    QVERIFY(network->alternativeStateBox("Hd2", "beside it")->isChecked());
    QVERIFY(!network->alternativeStateBox("Hd2", "broke it")->isChecked());
    QVERIFY(network->alternativeStateBox("Hd1", "elsewhere")->isChecked());
    QVERIFY(!network->alternativeStateBox("Hd1", "beside it")->isChecked());
    // Another field of the item, and a table entry through the network form.
    {
      OneEdit edit{window};
      retype(window.itemForm()->findChild<QLineEdit*>("itemTitle"), "Glass on the jacket, two alternatives");
      QVERIFY(edit.done());
    }
    network->selectNode(1);
    {
      OneEdit edit{window};
      network->tableWidget()->item(0, 1)->setText("complement");
      SAME_JSON((*window.document()->itemBody("N1"))["nodes"][1]["cpt"][0], json::parse(R"([0.6, "complement"])"));
      QVERIFY(edit.done());
    }
    QCOMPARE(window.saveTo(folder.filePath("saved.json")), QString());
    // The alternatives' entries as written, byte for byte, in the file saved (the file's members
    // in name order: the item's alternatives just before its id).
    const auto entries_text = [](const std::string& text) {
      const auto start = text.rfind("\"alternatives\"", text.find("\"id\": \"N1\""));
      return start == std::string::npos ? std::string() : text.substr(start, text.find('}', text.find("\"Hd2\"", start)) - start + 1);
    };
    QVERIFY(!entries_text(original).empty());
    QCOMPARE(entries_text(file_bytes(folder.filePath("saved.json"))), entries_text(original));
    // P(found | broke it) = 0.6; P(found | Hd2) = (0.02 + 0.2) / 2, the even prior of a root node
    // without a table over Hd2's two states (law of total probability).
    QVERIFY(std::abs(against(core_item(core_evaluation(window), "N1"), "Hd2").lr.log10() - std::log10(0.6 / 0.11)) < 1e-12);
  }

  // With two propositions, Hd written as several states of the proposition node is shown as
  // written and kept when Hp's state changes; choosing a state for Hd replaces it.
  void networkSeveralHdStatesWithTwoPropositions() {
    QTemporaryDir folder;
    json document = several_models_case();
    document["propositions"].erase("alternatives");
    document["propositions"]["hd"] = "Mr Wren did not break the window";
    json network = document["items"][3];
    network.erase("alternatives");
    network["nodes"][0]["states"] = json::parse(R"(["broke it", "elsewhere", "beside it", "across the street"])");
    network["nodes"][1]["cpt"] = json::parse(R"([[0.6, 0.4], [0.02, 0.98], [0.2, 0.8], [0.05, 0.95]])");
    network["proposition"] = json::parse(R"({ "node": "Where", "hp": "broke it", "hd": ["elsewhere", "beside it"] })");
    document["items"] = json::array({network});
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "two.json", document), "N1"));
    QCOMPARE(window.saveTo(folder.filePath("two.cpcase")), QString());
    window.selectItem("N1");
    editor::NetworkForm* form = window.itemForm()->networkForm();
    auto* hp_state = form->findChild<QComboBox*>("network_hp_state");
    auto* hd_state = form->findChild<QComboBox*>("network_hd_state");
    QTRY_VERIFY(hd_state->isVisible());
    QCOMPARE(hd_state->currentText(), QString("states elsewhere, beside it as written"));
    {
      OneEdit edit{window};
      hp_state->setCurrentIndex(hp_state->findText("across the street"));
      emit hp_state->activated(hp_state->currentIndex());
      SAME_JSON(*item_field(window, "N1", "proposition"),
                json::parse(R"({ "node": "Where", "hp": "across the street", "hd": ["elsewhere", "beside it"] })"));
      QVERIFY(edit.done());
    }
    // P(found | across the street) / P(found | elsewhere or beside it) with the even prior of a
    // root node without a table: 0.05 / ((0.02 + 0.2) / 2).
    QVERIFY(std::abs(core_item(core_evaluation(window), "N1").point.lr.log10() - std::log10(0.05 / 0.11)) < 1e-12);
    {
      OneEdit edit{window};
      QTRY_COMPARE(hd_state->currentText(), QString("states elsewhere, beside it as written"));
      hd_state->setCurrentIndex(hd_state->findText("elsewhere"));
      emit hd_state->activated(hd_state->currentIndex());
      SAME_JSON((*item_field(window, "N1", "proposition"))["hd"], json("elsewhere"));
      QVERIFY(edit.done());
    }
  }

  // The population of the recovered material's sources under an alternative from background
  // data: file, column, bandwidth and summation edited on the form, each one edit.
  void measurementBackgroundPerAlternative() {
    QTemporaryDir folder;
    QVERIFY(QDir(folder.path()).mkpath("glass"));
    QVERIFY(QFile::copy(COUNTERPOISE_DEMO_DIR "/glass/vale-glass-background.csv", folder.filePath("glass/vale-glass-background.csv")));
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "several.json", several_models_case()), "G1"));
    QCOMPARE(window.saveTo(folder.filePath("several.cpcase")), QString());
    window.selectItem("G1");
    editor::MeasurementForm* measurement = window.itemForm()->measurementForm();
    editor::BackgroundDataFields* fields = measurement->hdBackgroundFields();
    QTRY_VERIFY(measurement->alternativeChooser()->isVisible());
    choose(measurement->alternativeChooser(), 1);
    QTRY_COMPARE(measurement->alternativeChooser()->chosen(), std::string("Hd2"));
    QVERIFY(!fields->isVisible());
    {
      // The population above is normal: the background data start empty, the core asks for the file.
      OneEdit edit{window};
      measurement->hdPopulationKind()->setCurrentIndex(2);
      emit measurement->hdPopulationKind()->activated(2);
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"], json::parse(R"({ "population_hd": { "kde": {} } })"));
      QVERIFY(edit.done());
    }
    QTRY_VERIFY(fields->isVisible());
    QTRY_VERIFY2(any_contains(shown_messages(window.itemForm()), "Alternative 2 (Hd2), population_hd.kde"),
                 qPrintable(shown_messages(window.itemForm()).join('|')));
    {
      // What the import button leads to: the file chosen and its column, as one edit.
      OneEdit edit{window};
      measurement->useHdBackgroundFile("glass/vale-glass-background.csv", "ri");
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"],
                json::parse(R"({ "population_hd": { "kde": { "file": "glass/vale-glass-background.csv", "column": "ri" } } })"));
      QVERIFY(edit.done());
    }
    QTRY_COMPARE(fields->fileLabel()->text(), QString("glass/vale-glass-background.csv"));
    QCOMPARE(fields->columnField()->text(), QString("ri"));
    {
      OneEdit edit{window};
      retype(fields->bandwidthField(), "0.0004");
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"]["population_hd"]["kde"]["bandwidth"], json(0.0004));
      QVERIFY(edit.done());
    }
    {
      OneEdit edit{window};
      QComboBox* summation = fields->summationBox();
      summation->setCurrentIndex(summation->findData("exact"));
      emit summation->activated(summation->currentIndex());
      SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"],
                json::parse(R"({ "population_hd": { "kde": { "file": "glass/vale-glass-background.csv", "column": "ri",
                                                              "bandwidth": 0.0004, "method": "exact" } } })"));
      QVERIFY(edit.done());
    }
    SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd1"], json::object());
    QTRY_VERIFY2(shown_messages(window.itemForm()).isEmpty(), qPrintable(shown_messages(window.itemForm()).join('|')));
    QCOMPARE(against(core_item(core_evaluation(window), "G1"), "Hd2").lr.log10(), alone(window, "G1", "Hd2").point.lr.log10());
    QTRY_VERIFY2(measurement->readingLabel()->text().contains(
                     "Sources of the recovered material if Hd2 is true: kernel density of 320 background values, bandwidth 0.0004"),
                 qPrintable(measurement->readingLabel()->text()));
    // A normal population and back: the background data set aside come back.
    const json kde = (*item_field(window, "G1", "alternatives"))["Hd2"];
    measurement->chooseHdPopulation(editor::MeasurementForm::HdPopulation::normal);
    QVERIFY((*item_field(window, "G1", "alternatives"))["Hd2"]["population_hd"].contains("normal"));
    measurement->chooseHdPopulation(editor::MeasurementForm::HdPopulation::background);
    SAME_JSON((*item_field(window, "G1", "alternatives"))["Hd2"], kde);
    // Hd1's population is still the one above.
    choose(measurement->alternativeChooser(), 0);
    QTRY_COMPARE(measurement->hdPopulationKind()->currentIndex(), 0);
    QVERIFY(!fields->isVisible());
  }

  // A case opened with background data of their own under the first alternative: shown in
  // their fields, every row of the form laid out (regression: a word-wrapped file name once
  // squeezed the "Drawn from" row to nothing).
  void measurementBackgroundAsOpened() {
    QTemporaryDir folder;
    QVERIFY(QDir(folder.path()).mkpath("glass"));
    QVERIFY(QFile::copy(COUNTERPOISE_DEMO_DIR "/glass/vale-glass-background.csv", folder.filePath("glass/vale-glass-background.csv")));
    json document = several_models_case();
    document["items"][2]["alternatives"]["Hd1"] =
        json::parse(R"({ "population_hd": { "kde": { "file": "glass/vale-glass-background.csv", "column": "ri", "bandwidth": 0.0004 } } })");
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "opened.json", document), "G1"));
    editor::MeasurementForm* measurement = window.itemForm()->measurementForm();
    editor::BackgroundDataFields* fields = measurement->hdBackgroundFields();
    QTRY_VERIFY(fields->isVisible());
    QCOMPARE(measurement->hdPopulationKind()->currentIndex(), static_cast<int>(editor::MeasurementForm::HdPopulation::background));
    QCOMPARE(fields->fileLabel()->text(), QString("glass/vale-glass-background.csv"));
    QCOMPARE(fields->columnField()->text(), QString("ri"));
    QCOMPARE(fields->bandwidthField()->text(), QString("4e-04"));
    QTRY_VERIFY(measurement->hdPopulationKind()->height() >= measurement->hdPopulationKind()->minimumSizeHint().height());
    QVERIFY(fields->height() >= fields->minimumSizeHint().height());
  }

  // The DNA profile item: the donor under an alternative as IBD coefficients of its own, typed on
  // the form; its LR the core's for the relationship with those coefficients (half siblings
  // (k0, k1, k2) = (1/2, 1/2, 0), DOMAIN), read as a two-proposition case on its own.
  void dnaIbdPerAlternative() {
    QTemporaryDir folder;
    std::ifstream in(kDna.toStdString());
    json document = json::parse(in);
    document["propositions"].erase("hd");
    document["propositions"]["alternatives"] = json::parse(R"([
      { "id": "Hd1", "text": "The DNA came from an unknown person unrelated to Mr Pryce" },
      { "id": "Hd2", "text": "The DNA came from a relative of Mr Pryce" }])");
    json item = document["items"][0];
    item.erase("relationship");
    item["alternatives"] = json::parse(R"({ "Hd1": { "relationship": "unrelated" }, "Hd2": { "relationship": "full-sibling" } })");
    document["items"] = json::array({item});
    QVERIFY(QDir(folder.path()).mkpath("dna"));
    QVERIFY(QFile::copy(COUNTERPOISE_DEMO_DIR "/dna/vale-str-frequencies.csv", folder.filePath("dna/vale-str-frequencies.csv")));
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "dna.json", document), "D1"));
    QCOMPARE(window.saveTo(folder.filePath("dna.cpcase")), QString());
    editor::ItemForm* form = window.itemForm();
    QComboBox* donor = form->alternativeRelationship("Hd2");
    QLineEdit* ibd = form->alternativeIbdField("Hd2");
    QVERIFY(donor && ibd);
    QTRY_VERIFY(donor->isVisible());
    QVERIFY(!ibd->isEnabled());
    {
      // Choosing coefficients starts from the relationship's (full siblings 1/4, 1/2, 1/4).
      OneEdit edit{window};
      const int other = donor->findData("ibd");
      donor->setCurrentIndex(other);
      emit donor->activated(other);
      SAME_JSON((*item_field(window, "D1", "alternatives"))["Hd2"], json::parse(R"({ "relationship": { "ibd": [0.25, 0.5, 0.25] } })"));
      QVERIFY(edit.done());
    }
    QTRY_VERIFY(ibd->isEnabled());
    {
      OneEdit edit{window};
      retype(ibd, "0.5, 0.5, 0");
      SAME_JSON((*item_field(window, "D1", "alternatives"))["Hd2"], json::parse(R"({ "relationship": { "ibd": [0.5, 0.5, 0] } })"));
      QVERIFY(edit.done());
    }
    SAME_JSON((*item_field(window, "D1", "alternatives"))["Hd1"], json::parse(R"({ "relationship": "unrelated" })"));
    json document_named = window.document()->document();
    document_named["propositions"].erase("alternatives");
    document_named["propositions"]["hd"] = "The DNA came from a half brother of Mr Pryce";
    json half = *window.document()->itemBody("D1");
    half.erase("alternatives");
    half["relationship"] = "half-sibling";
    document_named["items"] = json::array({half});
    const auto read = interchange::read_case(document_named, window.document()->baseDir());
    QVERIFY(read.value);
    const double expected = evaluation::evaluate_case(*read.value).items.at(0).point.lr.log10();
    // 1e-12 in log10: the same sums, the coefficients given as numbers rather than by name.
    QVERIFY(std::abs(against(core_item(core_evaluation(window), "D1"), "Hd2").lr.log10() - expected) < 1e-12);
    // Back to a named relationship: the coefficients give way.
    {
      OneEdit edit{window};
      const int sibling = donor->findData("full-sibling");
      donor->setCurrentIndex(sibling);
      emit donor->activated(sibling);
      SAME_JSON((*item_field(window, "D1", "alternatives"))["Hd2"], json::parse(R"({ "relationship": "full-sibling" })"));
      QVERIFY(edit.done());
    }
    QTRY_VERIFY(!ibd->isEnabled());
    QCOMPARE(ibd->text(), QString());
  }

  // With two propositions the measurement and transfer forms edit population_hd, t0_hd and tn_hd.
  void hdInputsWithTwoPropositions() {
    QTemporaryDir folder;
    json document = several_models_case();
    document["propositions"].erase("alternatives");
    document["propositions"]["hd"] = "Mr Wren was not at the shop";
    document["items"] = json::array({document["items"][0], document["items"][2]});
    for (auto& item : document["items"]) item.erase("alternatives");
    MainWindow window;
    QVERIFY(open_on_item(window, write_case(folder, "two.json", document), "T1"));
    QCOMPARE(window.saveTo(folder.filePath("two.cpcase")), QString());
    editor::ItemForm* form = window.itemForm();
    QLineEdit* t0_hd = form->findChild<QLineEdit*>("transfer_t0_hd");
    QTRY_VERIFY(t0_hd->isVisible());
    {
      OneEdit edit{window};
      retype(t0_hd, "0.7");
      SAME_JSON(*item_field(window, "T1", "t0_hd"), json(0.7));
      QVERIFY(edit.done());
    }
    window.selectItem("G1");
    editor::MeasurementForm* measurement = form->measurementForm();
    QTRY_VERIFY(measurement->hdPopulationKind()->isVisible());
    QVERIFY(!measurement->alternativeChooser()->isVisible());
    {
      OneEdit edit{window};
      measurement->hdPopulationKind()->setCurrentIndex(1);
      emit measurement->hdPopulationKind()->activated(1);
      SAME_JSON(*item_field(window, "G1", "population_hd"), json::parse(R"({ "normal": { "mean": 1.5196, "sd": 0.0033 } })"));
      QVERIFY(edit.done());
    }
    // Background data of its own, as under an alternative.
    measurement->chooseHdPopulation(editor::MeasurementForm::HdPopulation::background);
    QTRY_VERIFY(measurement->hdBackgroundFields()->isVisible());
    {
      OneEdit edit{window};
      measurement->useHdBackgroundFile("glass/vale-glass-background.csv", "ri");
      SAME_JSON(*item_field(window, "G1", "population_hd"),
                json::parse(R"({ "kde": { "file": "glass/vale-glass-background.csv", "column": "ri" } })"));
      QVERIFY(edit.done());
    }
  }
};

QTEST_MAIN(AlternativeInputsTest)
#include "alternative_inputs_test.moc"
