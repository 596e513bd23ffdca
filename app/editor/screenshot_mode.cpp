#include "app/editor/screenshot_mode.hpp"

#include <QApplication>
#include <QComboBox>
#include <QDialog>
#include <QMessageBox>
#include <QTimer>
#include <QTreeWidget>
#include <QUndoStack>
#include <QDir>
#include <QPixmap>
#include <QTabWidget>
#include <QTextStream>

#include <functional>

#include "app/editor/edit_commands.hpp"
#include "app/editor/guard_panel.hpp"
#include "app/editor/history_panel.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/comparison_window.hpp"
#include "app/editor/main_window.hpp"
#include "app/editor/method_validation_window.hpp"
#include "app/editor/network_sensitivity_window.hpp"
#include "app/editor/prior_explorer.hpp"

namespace counterpoise::editor {

namespace {
void settle(CaseDocument* document) {
  document->waitForSpread(20000);
  for (int i = 0; i < 5; ++i) QApplication::processEvents();
}
}  // namespace

int take_screenshots(MainWindow& window, const QString& folder, const QString& case_path) {
  QTextStream err(stderr);
  QDir().mkpath(folder);
  window.resize(1280, 820);
  window.show();
  // A case naming data files outside its folder is asked about on opening: the question is
  // grabbed (outside-data-files.png) and answered "Do not read them", so the run never waits.
  QTimer outside_prompt;
  QObject::connect(&outside_prompt, &QTimer::timeout, &window, [&] {
    auto* box = qobject_cast<QMessageBox*>(QApplication::activeModalWidget());
    if (!box || box->objectName() != "outsideDataFiles") return;
    outside_prompt.stop();
    if (!box->grab().save(QDir(folder).filePath("outside-data-files.png"), "PNG")) err << "cannot write the prompt\n";
    box->reject();
  });
  outside_prompt.start(100);
  if (const QString problem = window.openPath(case_path); !problem.isEmpty()) {
    err << problem << "\n";
    return 1;
  }
  settle(window.document());
  struct Shot {
    MainWindow::Tab tab;
    const char* name;
  };
  const Shot shots[] = {{MainWindow::CaseTab, "case-details"},  {MainWindow::PropositionsTab, "propositions"},
                        {MainWindow::FindingsTab, "findings"},  {MainWindow::WeightTab, "weight"},
                        {MainWindow::PriorsTab, "priors"},      {MainWindow::FindingsTab, "findings-flagged"},
                        {MainWindow::GuardTab, "guard"},        {MainWindow::HistoryTab, "history"}};
  int failures = 0;
  const auto ids = window.document()->itemIds();
  // The first item's whole form, below the part the window shows (the scroll area cut away),
  // before the guard's example edits the item.
  if (!ids.empty()) {
    window.showTab(MainWindow::FindingsTab);
    window.selectItem(ids.front());
    settle(window.document());
    if (!window.itemForm()->grab().save(QDir(folder).filePath("item-form.png"), "PNG")) ++failures;
  }
  // The issue checklist with what sealing means, as it shows before a report is issued and its
  // revision sealed (answered Cancel: nothing is sealed).
  if (window.document()->fileKind() == FileKind::case_store && !window.document()->readOnly()) {
    QTimer::singleShot(300, &window, [&] {
      if (auto* box = qobject_cast<QMessageBox*>(QApplication::activeModalWidget())) {
        if (!box->grab().save(QDir(folder).filePath("issue-checklist.png"), "PNG")) ++failures;
        box->reject();
      }
    });
    window.confirmIssuing();
  }
  for (const auto& shot : shots) {
    if (QString(shot.name) == "findings-flagged" && !ids.empty() && !window.document()->readOnly()) {
      // Show the guard at work: a sentence that transposes the conditional, typed into the first
      // item's description (an ordinary undoable edit, as a user would make it).
      window.selectItem(ids.front());
      const auto description = window.document()->value(store::EntityRef::item(ids.front()), "description");
      const std::string flagged = "The chance that the glass on his jacket got there by coincidence is 1 in 1,000. ";
      window.edits()->setItemField(ids.front(), "description",
                                   flagged + (description && description->is_string() ? description->get<std::string>() : ""));
    }
    window.showTab(shot.tab);
    if (shot.tab == MainWindow::PriorsTab) window.priorExplorer()->setPriorLog10Odds(-4.0);
    settle(window.document());
    const QString path = QDir(folder).filePath(QString("%1.png").arg(shot.name));
    if (!window.grab().save(path, "PNG")) {
      err << "cannot write " << path << "\n";
      ++failures;
    }
  }
  // The network form's Sensitivity to the Tables… on the case's first network item.
  for (const auto& id : ids) {
    const auto body = window.document()->itemBody(id);
    if (!body || body->value("model", std::string()) != "network") continue;
    if (const QString problem = window.showNetworkSensitivity(QString::fromStdString(id)); !problem.isEmpty()) {
      err << problem << "\n";
      ++failures;
    } else {
      for (int i = 0; i < 5; ++i) QApplication::processEvents();
      if (!window.networkSensitivityWindow()->grab().save(QDir(folder).filePath("network-sensitivity.png"), "PNG")) ++failures;
      window.networkSensitivityWindow()->close();
    }
    break;
  }
  // The guard's rewrite as it is previewed before it is applied (the dialog, answered Cancel).
  if (window.guardPanel()->list()->topLevelItemCount() > 0) {
    window.showTab(MainWindow::GuardTab);
    QTimer::singleShot(300, &window, [&] {
      if (QWidget* dialog = QApplication::activeModalWidget()) {
        const QString path = QDir(folder).filePath("guard-rewrite.png");
        if (!dialog->grab().save(path, "PNG")) ++failures;
        if (auto* modal = qobject_cast<QDialog*>(dialog)) modal->reject();
      }
    });
    window.guardPanel()->previewSuggestion(0);
  }
  // The screenshots leave no recovery snapshot behind for a JSON case.
  window.document()->discardRecovery();
  // A new case: no level chosen, and the first steps.
  window.document()->newCase();
  window.undoStack()->clear();
  window.showTab(MainWindow::CaseTab);
  settle(window.document());
  if (!window.grab().save(QDir(folder).filePath("new-case.png"), "PNG")) ++failures;
  window.document()->discardRecovery();
  // Tools ▸ Method Validation on the demo results with the demo criteria.
  MethodValidationWindow* validation = window.showMethodValidation();
  validation->resize(900, 1000);
  const QString results = QStringLiteral(COUNTERPOISE_DEMO "/method-validation/vale-glass-lrs.csv");
  if (!validation->openResults(results) ||
      !validation->setCriteriaFile(QStringLiteral(COUNTERPOISE_DEMO "/method-validation/vale-criteria.json"))) {
    err << validation->problemText() << "\n";
    ++failures;
  }
  for (int i = 0; i < 5; ++i) QApplication::processEvents();
  if (!validation->grab().save(QDir(folder).filePath("method-validation.png"), "PNG")) ++failures;
  validation->close();
  // Tools ▸ Compare With… on a demo pair: the defence's version open, the prosecution's as A;
  // `choose` sets the window up before it is taken.
  const auto compare_pair = [&](const char* pair, const QString& file, const std::function<void(ComparisonWindow&)>& choose) {
    const QString folder_of_pair = QStringLiteral(COUNTERPOISE_DEMO "/comparison/");
    if (const QString problem = window.openPath(folder_of_pair + pair + "-defence.json"); !problem.isEmpty()) {
      err << problem << "\n";
      ++failures;
    } else if (const QString compared = window.compareWith(folder_of_pair + pair + "-prosecution.json"); !compared.isEmpty()) {
      err << compared << "\n";
      ++failures;
    } else {
      choose(*window.comparisonWindow());
      for (int i = 0; i < 5; ++i) QApplication::processEvents();
      if (!window.comparisonWindow()->grab().save(QDir(folder).filePath(file), "PNG")) ++failures;
      window.comparisonWindow()->close();
    }
  };
  compare_pair("harwick-vale-grain-store", "comparison.png", [](ComparisonWindow&) {});
  // The pair with several alternatives to Hp: the effects on the compound LR against the weighted set.
  compare_pair("harwick-vale-kestrel-street", "comparison-alternatives.png",
               [](ComparisonWindow& shown) { shown.targetChoice()->setCurrentIndex(shown.targetChoice()->count() - 1); });
  return failures == 0 ? 0 : 1;
}

}  // namespace counterpoise::editor
