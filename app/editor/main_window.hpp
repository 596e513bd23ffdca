#pragma once
// The main window: menus, the views as tabs (case, propositions, findings, weight, priors,
// guard, history), the status bar, recent files, demo cases, window state. It owns the
// CaseDocument, the QUndoStack and the EditFacade (see case_document.hpp for the ownership rules).

#include <QMainWindow>
#include <QUndoStack>

#include <memory>
#include <optional>

#include "app/editor/case_document.hpp"
#include "app/editor/edit_commands.hpp"
#include "app/editor/report_service.hpp"
#include "core/casefile/case_model.hpp"
#include "core/comparison/version_location.hpp"

class QAction;
class QLabel;
class QMenu;
class QPushButton;
class QTabWidget;
class QTableView;
class QSortFilterProxyModel;

namespace counterpoise::editor {

class ContributionChart;
class GuardPanel;
class HistoryPanel;
class ItemForm;
class ComparisonWindow;
class ItemTableModel;
class MethodValidationWindow;
class NetworkSensitivityWindow;
class PriorExplorer;
class SectionForm;
class WeightView;

class MainWindow : public QMainWindow {
  Q_OBJECT
 public:
  enum Tab { CaseTab, PropositionsTab, FindingsTab, WeightTab, PriorsTab, GuardTab, HistoryTab, TabCount };

  explicit MainWindow(QWidget* parent = nullptr);
  ~MainWindow() override;

  // Opens a file or a shared-store address postgresql://…/DB?case=REF (as File ▸ Open and
  // File ▸ Open from Shared Store do, without dialogs); returns "" or the message shown.
  QString openPath(const QString& path);
  // Saves as JSON or as a case file by the extension of `path`; returns "" or the message.
  QString saveTo(const QString& path);
  // Writes the contribution chart or the prior view as PNG/SVG; returns "" or the message.
  QString exportContributionChart(const QString& path);
  QString exportPriorView(const QString& path);
  // Report through reports/ when built: writes the PDF (a draft: nothing is sealed).
  QString exportReportPdf(const QString& path);
  // Issues the report: prepares the seal signed as `signing` says, renders the report with the
  // seal appendix and anchor, writes the seal, then the PDF. Returns "" or the message; when the
  // case changed between preparing and sealing, nothing is sealed or written.
  QString issueReport(const QString& path, const SealSigning& signing);
  bool reportsAvailable() const;
  // Before issuing: shows the issue checklist (core/casefile/issue_checklist) and what sealing
  // means, and asks for a confirmation; false when the scientist cancels or the checklist refuses.
  bool confirmIssuing();
  // Before issuing: the sealer's signing key (CaseDocument::sealerKey). Without one, a dialog
  // says in one sentence how to make it (the command) and offers to seal unsigned; nullopt when
  // the scientist cancels or nothing can be sealed (said in a message box).
  std::optional<SealSigning> chooseSealSigning();

  // The examiner's name for case files: the declared one (settings), else asks once and keeps
  // it. Returns "" when the user declines. With `change` it always asks (Edit ▸ Examiner Name).
  QString askExaminerName(bool change = false);
  // An examiner for this session only (the --examiner option), used instead of the setting.
  void setSessionExaminer(const QString& name) { session_examiner_ = name.trimmed(); }
  // Help ▸ User Guide; returns the window shown.
  QWidget* showUserGuide();

  void showTab(Tab tab);
  void selectItem(const std::string& id);

  CaseDocument* document() const { return document_; }
  QUndoStack* undoStack() const { return stack_; }
  EditFacade* edits() const { return edits_.get(); }
  ItemForm* itemForm() const { return item_form_; }
  ItemTableModel* itemModel() const { return items_model_; }
  WeightView* weightView() const { return weight_; }
  PriorExplorer* priorExplorer() const { return priors_; }
  GuardPanel* guardPanel() const { return guard_; }
  HistoryPanel* historyPanel() const { return history_; }
  SectionForm* caseForm() const { return case_form_; }
  SectionForm* propositionsForm() const { return propositions_form_; }
  QTabWidget* tabs() const { return tabs_; }
  QWidget* firstStepsPanel() const { return first_steps_; }
  // The status bar's busy bar, shown while the intervals are being computed.
  QWidget* intervalsProgress() const { return spread_busy_; }
  // Tools ▸ Method Validation: the window, created on first use and kept (nullptr before).
  MethodValidationWindow* methodValidationWindow() const { return validation_window_; }
  MethodValidationWindow* showMethodValidation();
  // Tools ▸ Compare With…, without dialogs: compares `other` (a case file, a shared-store
  // address, or either with @N for its sealed revision N; comparison::parse_version_location)
  // as A with the case as open as B, and shows the comparison window. Returns "" or the message.
  QString compareWith(const QString& other);
  // The comparison window (nullptr before the first comparison).
  ComparisonWindow* comparisonWindow() const { return comparison_window_; }
  // The network form's Sensitivity to the Tables…: computes the one-way sensitivity of network
  // item `item_id` as read off the GUI thread behind a progress dialog with Cancel, then shows
  // it in the sensitivity window. Returns "" or the message (cancelled: nothing is shown).
  QString showNetworkSensitivity(const QString& item_id);
  // The sensitivity window (nullptr before the first sensitivity shown).
  NetworkSensitivityWindow* networkSensitivityWindow() const { return sensitivity_window_; }
  // Shows a difference's place: its item and field on the Findings tab, or its section's field.
  void showDifference(const QString& section, const QString& item, const QString& field);
  // Writes the review memo of the comparison shown (the one compare -o writes) to `path`, built
  // off the GUI thread behind a progress dialog, naming comparisonReviewer() as its reviewer.
  // Returns "" or the message.
  QString writeComparisonMemo(const QString& path);
  // How the comparison names version A at `where`: a file by its file name ("case.json",
  // "case.cpcase@2"), as the window names the case as open; a shared-store address as given.
  static std::string versionLabel(const comparison::VersionLocation& where);
  // Who the memo names as reviewer: the examiner's name of this session or, before one is
  // given, the one kept in settings; empty when neither.
  QString comparisonReviewer() const;

 signals:
  // A progress dialog for long work is shown (its title).
  void progressShown(const QString& title);

 protected:
  void closeEvent(QCloseEvent* event) override;

 private:
  void buildActions();
  void buildMenus();
  void buildFindingsTab();
  void buildStatusBar();
  void updateTitle();
  void updateStatus();
  // "Combined LR …" for the status bar; with several alternatives, against each and the set.
  QString combinedStatusText(const PointSnapshot& points, const std::optional<uncertainty::SpreadSummary>& spread) const;
  void updateRecentMenu();
  void showRecoveryOffer();
  // Names the data files the opened case was refused (outside its folder and the laboratory
  // data folders) and reads them only if the user allows it, for this session.
  void askAboutOutsideDataFiles();
  bool confirmDiscard();
  void newCase();
  void openDialog();
  void openSharedStoreDialog();
  void compareDialog();
  // Where a file made from the case is suggested: beside the case's file, else in the last
  // folder used, named after the case (CaseDocument::baseName) or `fallback_name`.
  QString suggestedPath(const QString& fallback_name, const QString& suffix) const;
  bool saveCase();
  bool saveAsDialog();
  bool saveAsCaseFileDialog();
  void exportJsonDialog();
  void exportFigureDialog(bool chart);
  void saveComparisonMemoDialog();
  void addItem(const std::string& model);
  void removeSelectedItem();
  void moveSelectedItem(int delta);
  std::string selectedItem() const;
  void showField(const TextFieldRef& where);
  void reportPreview();
  void reportExportDialog(bool issue);
  // Writes the report to `path`; with `issue` prepares the seal first and writes it before the PDF.
  QString writeReport(const QString& path, const std::optional<SealSigning>& issue);
  void showInfo(const QString& html, const QString& action_text = {}, std::function<void()> action = {});

  CaseDocument* document_;
  QUndoStack* stack_;
  std::unique_ptr<EditFacade> edits_;
  std::unique_ptr<ReportService> reports_;
  ItemTableModel* items_model_;
  QSortFilterProxyModel* items_proxy_;

  QTabWidget* tabs_;
  SectionForm* case_form_;
  SectionForm* propositions_form_;
  QTableView* items_view_;
  ItemForm* item_form_;
  WeightView* weight_;
  PriorExplorer* priors_;
  GuardPanel* guard_;
  HistoryPanel* history_;

  QWidget* info_bar_;
  QLabel* info_text_;
  QPushButton* info_action_;
  std::function<void()> info_callback_;

  QLabel* status_file_;
  QLabel* status_lr_;
  QLabel* status_guard_;
  QWidget* spread_busy_;

  QMenu* recent_menu_ = nullptr;
  MethodValidationWindow* validation_window_ = nullptr;
  ComparisonWindow* comparison_window_ = nullptr;
  NetworkSensitivityWindow* sensitivity_window_ = nullptr;
  // The case details of the second version of the comparison shown (for the memo's heading).
  casefile::CaseDetails compared_details_;
  QAction *new_, *open_, *open_shared_, *save_, *save_as_, *export_json_, *export_chart_, *export_prior_, *preview_, *export_pdf_,
      *issue_, *quit_, *undo_, *redo_, *cut_, *copy_, *paste_, *examiner_, *user_guide_, *add_item_, *remove_item_,
      *move_up_, *move_down_;
  QWidget* user_guide_window_ = nullptr;
  QWidget* first_steps_ = nullptr;
  QString session_examiner_;
};

}  // namespace counterpoise::editor
