#include "app/editor/main_window.hpp"

#include <QAction>
#include <QApplication>
#include <QCloseEvent>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QInputDialog>
#include <QLabel>
#include <QMenu>
#include <QMenuBar>
#include <QMessageBox>
#include <QProgressBar>
#include <QPushButton>
#include <QScrollArea>
#include <QSortFilterProxyModel>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
#include <QTableView>
#include <QToolBar>
#include <QToolButton>
#include <QVBoxLayout>

#include <filesystem>

#include "app/editor/case_panels.hpp"
#include "app/editor/contribution_chart.hpp"
#include "app/editor/display_text.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/field_widgets.hpp"
#include "app/editor/figure_export.hpp"
#include "app/editor/guard_panel.hpp"
#include "app/editor/help_window.hpp"
#include "app/editor/history_panel.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/item_table_model.hpp"
#include "app/editor/method_validation_window.hpp"
#include "app/editor/network_form.hpp"
#include "app/editor/network_sensitivity_window.hpp"
#include "app/editor/prior_explorer.hpp"
#include "app/editor/report_service.hpp"
#include "core/casefile/issue_checklist.hpp"
#include "core/interchange/case_json.hpp"
#include "app/editor/weight_view.hpp"
#include "app/editor/work_progress.hpp"
#include "core/models/model_registry.hpp"
#include "core/models/network/network_model.hpp"
#include "core/numbers/vector_state.hpp"
#include "core/platform/private_file.hpp"
#include "core/platform/shipped_data.hpp"
#include "app/editor/comparison_window.hpp"
#include "core/comparison/case_comparison.hpp"
#include "core/comparison/version_location.hpp"
#include "core/reading/data_access.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/examiner_key.hpp"
#include "core/validation/display_text.hpp"
#include "reports/pdf_writer.hpp"

namespace counterpoise::editor {

namespace {

QScrollArea* scrolled(QWidget* inner, QWidget* parent) {
  auto* area = new QScrollArea(parent);
  area->setWidget(inner);
  area->setWidgetResizable(true);
  area->setFrameShape(QFrame::NoFrame);
  return area;
}

const char* kFileFilter = "Cases (*.cpcase *.json);;Case files (*.cpcase);;Interchange files (*.json);;All files (*)";

}  // namespace

MainWindow::MainWindow(QWidget* parent)
    : QMainWindow(parent), document_(new CaseDocument(this)), stack_(new QUndoStack(this)),
      edits_(std::make_unique<EditFacade>(document_, stack_)), reports_(make_report_service()) {
  setObjectName("counterpoiseMainWindow");
  qApp->installEventFilter(new WheelGuard(this));
  items_model_ = new ItemTableModel(document_, this);
  items_proxy_ = new QSortFilterProxyModel(this);
  items_proxy_->setSourceModel(items_model_);
  items_proxy_->setSortRole(ItemTableModel::RawValueRole);

  auto* central = new QWidget(this);
  auto* central_layout = new QVBoxLayout(central);
  central_layout->setContentsMargins(4, 4, 4, 0);
  info_bar_ = new QWidget(central);
  info_bar_->setObjectName("infoBar");
  info_bar_->setStyleSheet("#infoBar { background: #fff4d6; border: 1px solid #e0c070; }");
  auto* info_layout = new QHBoxLayout(info_bar_);
  info_text_ = new QLabel(info_bar_);
  info_text_->setWordWrap(true);
  info_action_ = new QPushButton(info_bar_);
  auto* info_close = new QToolButton(info_bar_);
  info_close->setText(QStringLiteral("×"));
  info_close->setToolTip(tr("Dismiss"));
  info_layout->addWidget(info_text_, 1);
  info_layout->addWidget(info_action_);
  info_layout->addWidget(info_close);
  info_bar_->hide();
  connect(info_close, &QToolButton::clicked, info_bar_, &QWidget::hide);
  connect(info_action_, &QPushButton::clicked, this, [this] {
    info_bar_->hide();
    if (info_callback_) info_callback_();
  });
  central_layout->addWidget(info_bar_);

  tabs_ = new QTabWidget(central);
  tabs_->setDocumentMode(true);
  case_form_ = make_case_details_panel(document_, edits_.get(), nullptr);
  propositions_form_ = make_propositions_panel(document_, edits_.get(), nullptr);
  auto* case_page = new QWidget(tabs_);
  auto* case_layout = new QVBoxLayout(case_page);
  case_layout->setContentsMargins(0, 0, 0, 0);
  first_steps_ = make_first_steps_panel(
      [this](int step) {
        if (step < 0) reportPreview();
        else showTab(static_cast<Tab>(step));
      },
      case_page);
  case_layout->addWidget(first_steps_);
  case_layout->addWidget(case_form_, 1);
  tabs_->addTab(scrolled(case_page, tabs_), tr("&Case"));
  tabs_->addTab(scrolled(propositions_form_, tabs_), tr("&Propositions"));
  buildFindingsTab();
  weight_ = new WeightView(document_, items_model_, tabs_);
  tabs_->addTab(weight_, tr("&Weight"));
  priors_ = new PriorExplorer(document_, tabs_);
  tabs_->addTab(priors_, tr("P&riors"));
  guard_ = new GuardPanel(document_, edits_.get(), tabs_);
  tabs_->addTab(guard_, tr("&Guard"));
  history_ = new HistoryPanel(document_, tabs_);
  tabs_->addTab(history_, tr("&History"));
  central_layout->addWidget(tabs_, 1);
  setCentralWidget(central);

  connect(weight_, &WeightView::itemActivated, this, [this](const QString& id) {
    selectItem(id.toStdString());
    showTab(FindingsTab);
  });
  connect(guard_, &GuardPanel::showField, this, &MainWindow::showField);

  buildActions();
  buildMenus();
  buildStatusBar();

  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & Change::file) updateTitle();
    // The first steps are for a case just begun; a case from a file has been started already.
    if (what & Change::file) first_steps_->setVisible(document_->fileKind() == FileKind::none);
    updateStatus();
  });
  connect(document_, &CaseDocument::editFailed, this, [this](const QString& message) { statusBar()->showMessage(message, 8000); });
  // Undo back to the state last saved: nothing is unsaved any more.
  connect(stack_, &QUndoStack::cleanChanged, document_, [this](bool clean) {
    if (clean) document_->markSaved();
    updateTitle();
    updateStatus();
  });

  document_->newCase();
  stack_->clear();
  selectItem("E1");
  resize(1180, 800);
  if (const auto geometry = settings::window_geometry(); !geometry.isEmpty()) restoreGeometry(geometry);
  if (const auto state = settings::window_state(); !state.isEmpty()) restoreState(state);
  updateTitle();
  updateStatus();
}

MainWindow::~MainWindow() {
  // Typing still pending is committed now, while the document exists (the focus leaving the
  // field as the window goes away would otherwise report it to a document already gone).
  commit_pending_typing(this);
  // The undo stack outlives the document among the children; it must not call back into either.
  stack_->disconnect();
}

void MainWindow::buildFindingsTab() {
  auto* splitter = new QSplitter(Qt::Horizontal, tabs_);
  auto* left = new QWidget(splitter);
  auto* left_layout = new QVBoxLayout(left);
  left_layout->setContentsMargins(0, 0, 0, 0);
  items_view_ = new QTableView(left);
  items_view_->setObjectName("itemsTable");
  items_view_->setModel(items_proxy_);
  items_view_->setSortingEnabled(true);
  items_view_->sortByColumn(-1, Qt::AscendingOrder);
  items_view_->setSelectionBehavior(QAbstractItemView::SelectRows);
  items_view_->setSelectionMode(QAbstractItemView::SingleSelection);
  items_view_->setEditTriggers(QAbstractItemView::NoEditTriggers);
  items_view_->verticalHeader()->hide();
  items_view_->horizontalHeader()->setStretchLastSection(true);
  for (int c : {ItemTableModel::Model, ItemTableModel::PGivenHp, ItemTableModel::PGivenHd, ItemTableModel::Log10LR,
                ItemTableModel::Interval, ItemTableModel::Verbal, ItemTableModel::Included})
    items_view_->hideColumn(c);
  items_view_->horizontalHeader()->setSectionResizeMode(ItemTableModel::Title, QHeaderView::Stretch);
  items_view_->horizontalHeader()->setStretchLastSection(false);
  items_view_->setColumnWidth(ItemTableModel::Id, 50);
  items_view_->setColumnWidth(ItemTableModel::LR, 90);
  left_layout->addWidget(items_view_, 1);
  auto* buttons = new QHBoxLayout;
  auto* add = new QPushButton(tr("Add"), left);
  auto* add_menu = new QMenu(add);
  for (const auto& entry : models::all_models()) {
    const std::string name(entry.name);
    add_menu->addAction(QString::fromStdString(name), this, [this, name] { addItem(name); })
        ->setToolTip(QString::fromUtf8(entry.summary.data(), static_cast<int>(entry.summary.size())));
  }
  add->setMenu(add_menu);
  auto* remove = new QPushButton(tr("Remove"), left);
  auto* up = new QPushButton(tr("Up"), left);
  auto* down = new QPushButton(tr("Down"), left);
  for (auto* b : {add, remove, up, down}) buttons->addWidget(b);
  left_layout->addLayout(buttons);
  connect(remove, &QPushButton::clicked, this, &MainWindow::removeSelectedItem);
  connect(up, &QPushButton::clicked, this, [this] { moveSelectedItem(-1); });
  connect(down, &QPushButton::clicked, this, [this] { moveSelectedItem(+1); });

  item_form_ = new ItemForm(document_, edits_.get(), nullptr);
  splitter->addWidget(left);
  splitter->addWidget(scrolled(item_form_, splitter));
  splitter->setStretchFactor(0, 2);
  splitter->setStretchFactor(1, 5);
  splitter->setSizes({330, 820});
  tabs_->addTab(splitter, tr("&Findings"));
  connect(item_form_->networkForm(), &NetworkForm::sensitivityRequested, this, [this](const QString& id) {
    if (const QString problem = showNetworkSensitivity(id); !problem.isEmpty())
      statusBar()->showMessage(problem, 8000);
  });

  connect(items_view_->selectionModel(), &QItemSelectionModel::currentRowChanged, this, [this](const QModelIndex& current) {
    if (current.isValid()) item_form_->setItem(current.data(ItemTableModel::ItemIdRole).toString().toStdString());
  });
  // The model resets on every change: keep the selected item selected.
  connect(items_model_, &QAbstractItemModel::modelReset, this, [this] {
    const std::string id = item_form_->item();
    if (document_->state().item_position(id)) selectItem(id);
    else if (!document_->itemIds().empty()) selectItem(document_->itemIds().front());
    else item_form_->setItem({});
  });
}

void MainWindow::buildActions() {
  new_ = new QAction(tr("&New Case"), this);
  new_->setShortcut(QKeySequence::New);
  connect(new_, &QAction::triggered, this, &MainWindow::newCase);
  open_ = new QAction(tr("&Open…"), this);
  open_->setShortcut(QKeySequence::Open);
  connect(open_, &QAction::triggered, this, &MainWindow::openDialog);
  open_shared_ = new QAction(tr("Open from S&hared Store…"), this);
  connect(open_shared_, &QAction::triggered, this, &MainWindow::openSharedStoreDialog);
  save_ = new QAction(tr("&Save"), this);
  save_->setShortcut(QKeySequence::Save);
  connect(save_, &QAction::triggered, this, &MainWindow::saveCase);
  save_as_ = new QAction(tr("Save &As…"), this);
  // Some platforms have no standard Save As key: Ctrl+Shift+S then.
  save_as_->setShortcuts(QKeySequence::keyBindings(QKeySequence::SaveAs).isEmpty()
                             ? QList<QKeySequence>{QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_S)}
                             : QKeySequence::keyBindings(QKeySequence::SaveAs));
  connect(save_as_, &QAction::triggered, this, &MainWindow::saveAsDialog);
  export_json_ = new QAction(tr("Export Interchange &JSON…"), this);
  connect(export_json_, &QAction::triggered, this, &MainWindow::exportJsonDialog);
  export_chart_ = new QAction(tr("Export Contribution &Chart…"), this);
  connect(export_chart_, &QAction::triggered, this, [this] { exportFigureDialog(true); });
  export_prior_ = new QAction(tr("Export P&rior View…"), this);
  connect(export_prior_, &QAction::triggered, this, [this] { exportFigureDialog(false); });
  preview_ = new QAction(tr("Report Print Pre&view…"), this);
  preview_->setShortcut(QKeySequence::Print);
  connect(preview_, &QAction::triggered, this, &MainWindow::reportPreview);
  export_pdf_ = new QAction(tr("Export Report as &PDF…"), this);
  connect(export_pdf_, &QAction::triggered, this, [this] { reportExportDialog(false); });
  issue_ = new QAction(tr("&Issue Report and Seal Revision…"), this);
  connect(issue_, &QAction::triggered, this, [this] { reportExportDialog(true); });
  for (QAction* a : {preview_, export_pdf_, issue_}) {
    a->setEnabled(reports_->available());
    if (!reports_->available()) a->setToolTip(reports_->unavailableReason());
  }
  quit_ = new QAction(tr("&Quit"), this);
  quit_->setShortcut(QKeySequence::Quit);
  connect(quit_, &QAction::triggered, this, &QWidget::close);

  // Undo and redo commit pending typing first (so Ctrl+Z while typing takes back what was
  // typed). The menu names the step; the toolbar button keeps a fixed label (iconText) so the
  // buttons after it do not move as the step's name changes.
  undo_ = new QAction(tr("&Undo"), this);
  undo_->setIconText(tr("Undo"));
  undo_->setShortcut(QKeySequence::Undo);
  redo_ = new QAction(tr("&Redo"), this);
  redo_->setIconText(tr("Redo"));
  redo_->setShortcut(QKeySequence::Redo);
  connect(undo_, &QAction::triggered, this, [this] {
    commit_pending_typing(this);
    stack_->undo();
  });
  connect(redo_, &QAction::triggered, this, [this] {
    commit_pending_typing(this);
    stack_->redo();
  });
  auto name_step = [](QAction* action, const QString& verb, const QString& step) {
    action->setText(step.isEmpty() ? verb : tr("%1 %2").arg(verb, step));
    action->setToolTip(step.isEmpty() ? verb.mid(1).remove('&') : tr("%1: %2").arg(QString(verb).remove('&'), step));
  };
  connect(stack_, &QUndoStack::undoTextChanged, this, [this, name_step](const QString& step) { name_step(undo_, tr("&Undo"), step); });
  connect(stack_, &QUndoStack::redoTextChanged, this, [this, name_step](const QString& step) { name_step(redo_, tr("&Redo"), step); });
  connect(stack_, &QUndoStack::canUndoChanged, undo_, &QAction::setEnabled);
  connect(stack_, &QUndoStack::canRedoChanged, redo_, &QAction::setEnabled);
  undo_->setEnabled(false);
  redo_->setEnabled(false);
  // Cut, copy and paste act on the field with the keyboard focus.
  auto on_focus = [this](const char* slot) {
    if (QWidget* focus = QApplication::focusWidget()) QMetaObject::invokeMethod(focus, slot);
  };
  cut_ = new QAction(tr("Cu&t"), this);
  cut_->setShortcut(QKeySequence::Cut);
  connect(cut_, &QAction::triggered, this, [on_focus] { on_focus("cut"); });
  copy_ = new QAction(tr("&Copy"), this);
  copy_->setShortcut(QKeySequence::Copy);
  connect(copy_, &QAction::triggered, this, [on_focus] { on_focus("copy"); });
  paste_ = new QAction(tr("&Paste"), this);
  paste_->setShortcut(QKeySequence::Paste);
  connect(paste_, &QAction::triggered, this, [on_focus] { on_focus("paste"); });
  examiner_ = new QAction(tr("E&xaminer Name…"), this);
  examiner_->setToolTip(tr("The name recorded with every edit and seal of a case file."));
  connect(examiner_, &QAction::triggered, this, [this] { askExaminerName(true); });
  add_item_ = new QAction(tr("&Add Item (assigned probabilities)"), this);
  add_item_->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_N));
  connect(add_item_, &QAction::triggered, this, [this] { addItem("assigned"); });
  remove_item_ = new QAction(tr("Re&move Item"), this);
  connect(remove_item_, &QAction::triggered, this, &MainWindow::removeSelectedItem);
  move_up_ = new QAction(tr("Move Item &Up"), this);
  move_up_->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Up));
  connect(move_up_, &QAction::triggered, this, [this] { moveSelectedItem(-1); });
  move_down_ = new QAction(tr("Move Item &Down"), this);
  move_down_->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Down));
  connect(move_down_, &QAction::triggered, this, [this] { moveSelectedItem(+1); });
}

void MainWindow::buildMenus() {
  QMenu* file = menuBar()->addMenu(tr("&File"));
  file->addAction(new_);
  file->addAction(open_);
  file->addAction(open_shared_);
  recent_menu_ = file->addMenu(tr("Open &Recent"));
  connect(recent_menu_, &QMenu::aboutToShow, this, &MainWindow::updateRecentMenu);
  file->addSeparator();
  file->addAction(save_);
  file->addAction(save_as_);
  file->addAction(export_json_);
  file->addSeparator();
  file->addAction(export_chart_);
  file->addAction(export_prior_);
  file->addSeparator();
  file->addAction(preview_);
  file->addAction(export_pdf_);
  file->addAction(issue_);
  file->addSeparator();
  file->addAction(quit_);

  QMenu* edit = menuBar()->addMenu(tr("&Edit"));
  edit->addAction(undo_);
  edit->addAction(redo_);
  edit->addSeparator();
  edit->addAction(cut_);
  edit->addAction(copy_);
  edit->addAction(paste_);
  edit->addSeparator();
  edit->addAction(add_item_);
  edit->addAction(remove_item_);
  edit->addAction(move_up_);
  edit->addAction(move_down_);
  edit->addSeparator();
  edit->addAction(examiner_);

  QMenu* view = menuBar()->addMenu(tr("&View"));
  const QStringList names{tr("Case"), tr("Propositions"), tr("Findings"), tr("Weight"), tr("Priors"), tr("Guard"), tr("History")};
  for (int i = 0; i < TabCount; ++i) {
    QAction* a = view->addAction(names[i], this, [this, i] { showTab(static_cast<Tab>(i)); });
    a->setShortcut(QKeySequence(Qt::ALT | static_cast<Qt::Key>(Qt::Key_1 + i)));
  }

  QMenu* tools = menuBar()->addMenu(tr("&Tools"));
  tools->addAction(tr("&Compare With…"), this, [this] { compareDialog(); });
  tools->addAction(tr("&Method Validation…"), this, [this] { showMethodValidation(); })
      ->setToolTip(tr("Judge an LR method from results whose ground truth is known (Cllr, misleading evidence, "
                      "Tippett and cross-entropy plots, the laboratory's criteria)."));

  QMenu* help = menuBar()->addMenu(tr("&Help"));
  user_guide_ = help->addAction(tr("&User Guide"), this, [this] { showUserGuide(); });
  user_guide_->setShortcut(QKeySequence::HelpContents);
  QMenu* demos = help->addMenu(tr("&Demo Cases"));
  // Installed, the demo cases are beside the shipped data; run from the build folder, in the source tree.
  const auto installed_demos = platform::shipped_data_dir() / "casefiles_demo";
  const QDir demo_dir(std::filesystem::is_directory(installed_demos) ? QString::fromStdString(installed_demos.string())
                                                                     : QStringLiteral(COUNTERPOISE_DEMO));
  for (const QFileInfo& info : demo_dir.entryInfoList({"*.json", "*.cpcase"}, QDir::Files, QDir::Name)) {
    const QString path = info.absoluteFilePath();
    demos->addAction(info.completeBaseName(), this, [this, path] {
      if (!confirmDiscard()) return;
      const QString problem = openPath(path);
      if (!problem.isEmpty()) QMessageBox::warning(this, tr("Open demo case"), problem);
    });
  }
  if (demos->isEmpty()) demos->addAction(tr("(no demo cases found)"))->setEnabled(false);
  help->addSeparator();
  help->addAction(tr("&About Counterpoise"), this, [this] { QMessageBox::about(this, tr("About Counterpoise"), about_text()); });

  auto* toolbar = addToolBar(tr("Main"));
  toolbar->setObjectName("mainToolbar");
  toolbar->setMovable(false);
  for (QAction* a : {new_, open_, save_}) toolbar->addAction(a);
  toolbar->addSeparator();
  toolbar->addAction(undo_);
  toolbar->addAction(redo_);
  toolbar->addSeparator();
  toolbar->addAction(add_item_);
  toolbar->addSeparator();
  toolbar->addAction(preview_);
}

void MainWindow::buildStatusBar() {
  status_file_ = new QLabel(this);
  status_file_->setObjectName("statusFile");
  status_lr_ = new QLabel(this);
  status_lr_->setObjectName("statusLr");
  status_guard_ = new QLabel(this);
  // The intervals (lattice convolution or Monte Carlo) are computed off the GUI thread after each
  // change: a busy bar says so until they arrive, and the window stays usable meanwhile.
  auto* busy = new QProgressBar(this);
  busy->setRange(0, 0);
  busy->setTextVisible(false);
  spread_busy_ = busy;
  spread_busy_->setObjectName("intervalsProgress");
  spread_busy_->setMaximumWidth(90);
  spread_busy_->setMaximumHeight(14);
  spread_busy_->setToolTip(tr("Computing the intervals of the LRs…"));
  spread_busy_->hide();
  statusBar()->addPermanentWidget(spread_busy_);
  statusBar()->addPermanentWidget(status_guard_);
  statusBar()->addPermanentWidget(status_lr_);
  statusBar()->addPermanentWidget(status_file_);
}

void MainWindow::updateTitle() {
  const bool dirty = document_->modified();
  setWindowModified(dirty);
  setWindowTitle(tr("%1[*] — Counterpoise").arg(document_->displayName()));
}

void MainWindow::updateStatus() {
  switch (document_->fileKind()) {
    case FileKind::case_store:
      if (document_->inDatabase())
        status_file_->setText(document_->readOnly() ? tr("Shared store, read-only")
                                                    : tr("Shared store: every edit saved"));
      else
        status_file_->setText(document_->readOnly() ? tr("Case file, read-only") : tr("Case file: every edit saved"));
      break;
    case FileKind::interchange_json:
      status_file_->setText(document_->modified() ? tr("JSON file: unsaved edits") : tr("JSON file: saved"));
      break;
    case FileKind::none:
      status_file_->setText(tr("Not saved yet"));
      break;
  }
  spread_busy_->setVisible(document_->spreadPending());
  const auto& points = document_->points();
  std::optional<uncertainty::SpreadSummary> spread;
  if (document_->spread().evaluation && !document_->spreadPending()) spread = document_->spread().evaluation->combined.spread;
  status_lr_->setText(points.combined ? combinedStatusText(points, spread)
                                      : tr("%n problem(s)", nullptr, static_cast<int>(points.problems.size())));
  const auto count = document_->guard().findings.size();
  status_guard_->setText(count ? tr("Guard: %n flagged", nullptr, static_cast<int>(count)) : tr("Guard: clear"));
  status_guard_->setStyleSheet(count ? "color: #b00020;" : "");
  save_->setEnabled(document_->fileKind() != FileKind::case_store);
}

QString MainWindow::combinedStatusText(const PointSnapshot& points, const std::optional<uncertainty::SpreadSummary>& spread) const {
  const auto& value = points.evaluated_case;
  if (!value || !value->propositions.has_alternatives() || points.combined_by_alternative.empty())
    return tr("Combined LR %1").arg(lr_text(*points.combined, spread));
  // Several alternatives: the combined LR against each (the first with its interval), and
  // against the weighted set when weights are given.
  QStringList against;
  const auto& alternatives = value->propositions.alternatives;
  for (std::size_t i = 0; i < alternatives.size() && i < points.combined_by_alternative.size(); ++i)
    against << tr("%1 %2").arg(QString::fromStdString(validation::display_text(alternatives[i].id)),
                               lr_text(points.combined_by_alternative[i], i == 0 ? spread : std::nullopt));
  QString text = tr("Combined LR against %1").arg(against.join(", "));
  if (points.combined_compound) text += tr("; the weighted set %1").arg(lr_text(*points.combined_compound, std::nullopt));
  return text;
}

void MainWindow::updateRecentMenu() {
  recent_menu_->clear();
  for (const QString& path : settings::recent_files()) {
    const bool address = store::is_database_address(path.toStdString());
    QAction* a = recent_menu_->addAction(address ? path : QFileInfo(path).fileName(), this, [this, path] {
      if (!confirmDiscard()) return;
      const QString problem = openPath(path);
      if (!problem.isEmpty()) QMessageBox::warning(this, tr("Open"), problem);
    });
    a->setToolTip(path);
    a->setEnabled(address || QFileInfo::exists(path));
  }
  if (recent_menu_->isEmpty()) recent_menu_->addAction(tr("(none)"))->setEnabled(false);
  else {
    recent_menu_->addSeparator();
    recent_menu_->addAction(tr("Clear the List"), this, [] { settings::clear_recent_files(); });
  }
}

void MainWindow::showInfo(const QString& html, const QString& action_text, std::function<void()> action) {
  info_text_->setText(html);
  info_action_->setText(action_text);
  info_action_->setVisible(!action_text.isEmpty());
  info_callback_ = std::move(action);
  info_bar_->show();
}

QString MainWindow::askExaminerName(bool change) {
  QString name = session_examiner_.isEmpty() || change ? settings::examiner_name() : session_examiner_;
  if (name.isEmpty() || change) {
    bool ok = false;
    const QString typed =
        QInputDialog::getText(this, tr("Examiner"),
                              tr("Your name as examiner. It is recorded with every edit and every seal of a case "
                                 "file, beside your account on this computer, and kept for your next sessions "
                                 "(Edit ▸ Examiner Name… changes it)."),
                              QLineEdit::Normal, name, &ok)
            .trimmed();
    if (ok && !typed.isEmpty()) {
      settings::set_examiner_name(typed);
      name = typed;
    }
  }
  document_->setExaminer(name);
  if (change && document_->fileKind() == FileKind::case_store && !name.isEmpty())
    statusBar()->showMessage(tr("Edits from the next time a case file is opened are recorded as %1.").arg(name), 8000);
  return name;
}

QWidget* MainWindow::showUserGuide() {
  if (!user_guide_window_) user_guide_window_ = new UserGuideWindow(this);
  user_guide_window_->show();
  user_guide_window_->raise();
  return user_guide_window_;
}

QString MainWindow::openPath(const QString& path) {
  const bool address = store::is_database_address(path.toStdString());
  if (address && askExaminerName().isEmpty())
    return tr("A shared case records who makes each edit: the case was not opened because no examiner's name was "
              "given.");
  if (!address && store::is_case_file(std::filesystem::path(path.toStdString())) && askExaminerName().isEmpty())
    return tr("A case file records who makes each edit: %1 was not opened because no examiner's name was given.")
        .arg(QFileInfo(path).fileName());
  const QString problem = document_->openFile(path);
  if (!problem.isEmpty()) {
    statusBar()->showMessage(problem, 10000);
    return problem;
  }
  stack_->clear();
  settings::add_recent_file(path);
  if (!address) settings::set_last_folder(QFileInfo(path).absolutePath());
  info_bar_->hide();
  const auto ids = document_->itemIds();
  if (!ids.empty()) selectItem(ids.front());
  if (document_->readOnly()) showInfo(tr("<b>Open read-only.</b> %1").arg(document_->readOnlyReason().toHtmlEscaped()));
  else if (address)
    statusBar()->showMessage(tr("Opened %1: every edit is committed to the shared store as you make it; an edit made "
                                "after someone else's is refused and names their change.")
                                 .arg(document_->displayName()),
                             8000);
  else if (document_->fileKind() == FileKind::case_store)
    statusBar()->showMessage(tr("Opened %1: every edit is saved to the case file as you make it.").arg(document_->displayName()), 6000);
  else
    statusBar()->showMessage(tr("Opened %1. Save as a case file (.cpcase) to keep every edit with its audit trail.")
                                 .arg(document_->displayName()), 8000);
  showRecoveryOffer();
  askAboutOutsideDataFiles();
  return {};
}

void MainWindow::askAboutOutsideDataFiles() {
  const auto& files = document_->refusedDataFiles();
  if (files.empty()) return;
  // Every text here came from the case: plain text, control characters and invalid UTF-8 escaped.
  const auto shown = [](const std::string& text) { return QString::fromStdString(validation::display_text(text)); };
  QStringList lines;
  for (const auto& file : files) {
    QString line = tr("• item %1, field %2: %3").arg(shown(file.where.item), shown(file.where.field), shown(file.written));
    if (file.resolved.string() != file.written) line += tr(", which leads to %1").arg(shown(file.resolved.string()));
    lines << line;
  }
  QMessageBox box(this);
  box.setObjectName("outsideDataFiles");
  box.setIcon(QMessageBox::Warning);
  box.setWindowTitle(tr("Data files outside the case's folder"));
  box.setTextFormat(Qt::PlainText);
  const QString name = shown(document_->displayName().toStdString());
  const QString lead =
      files.size() == 1
          ? tr("%1 names a data file outside its folder and the laboratory data folders:").arg(name)
          : tr("%1 names data files outside its folder and the laboratory data folders:").arg(name);
  box.setText(lead +
              "\n\n" + lines.join("\n") + "\n\n" +
              tr("A case from another party could name files on this computer this way and carry what it reads from them "
                 "into a report. Read them only if you know why the case names them; until then the items that use them "
                 "are not evaluated. Allowing them lasts until the program ends."));
  auto* allow = box.addButton(tr("Read these files for this session"), QMessageBox::AcceptRole);
  auto* refuse = box.addButton(tr("Do not read them"), QMessageBox::RejectRole);
  box.setDefaultButton(refuse);
  box.setEscapeButton(refuse);
  box.exec();
  if (box.clickedButton() == allow) document_->allowRefusedDataFiles();
}

void MainWindow::showRecoveryOffer() {
  if (!document_->recoverySnapshot()) return;
  showInfo(tr("<b>Unsaved edits to this case were found from an earlier session</b> (the program ended before they "
              "were saved)."),
           tr("Restore them"), [this] {
             if (auto snapshot = document_->recoverySnapshot())
               edits_->replaceDocument(*snapshot, tr("Restore unsaved edits"));
           });
}

QString MainWindow::saveTo(const QString& path) {
  commit_pending_typing(this);
  QString problem;
  if (QFileInfo(path).suffix().toLower() == "cpcase" && askExaminerName().isEmpty()) {
    problem = tr("A case file records who makes each edit: it was not created because no examiner's name was given.");
  } else if (QFileInfo(path).suffix().toLower() == "cpcase") {
    // A case file holds an audit trail and sealed revisions: never overwrite one.
    if (QFileInfo::exists(path))
      problem = tr("%1 already exists; a case file is never overwritten. Choose another name.").arg(path);
    else problem = document_->saveAsCaseStore(path);
    if (problem.isEmpty()) stack_->clear();  // undo would now be edits of the new file, before its import
  } else {
    problem = document_->saveJson(path);
  }
  if (problem.isEmpty()) {
    settings::add_recent_file(path);
    stack_->setClean();
    statusBar()->showMessage(tr("Saved %1").arg(QDir::toNativeSeparators(path)), 5000);
  } else {
    statusBar()->showMessage(problem, 10000);
  }
  updateTitle();
  updateStatus();
  return problem;
}

bool MainWindow::confirmDiscard() {
  commit_pending_typing(this);
  if (!document_->modified()) return true;
  const auto answer = QMessageBox::question(this, tr("Unsaved edits"),
                                            tr("%1 has unsaved edits. Save them first?").arg(document_->displayName()),
                                            QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
  if (answer == QMessageBox::Cancel) return false;
  if (answer == QMessageBox::Save) return saveCase();
  document_->discardRecovery();
  return true;
}

void MainWindow::newCase() {
  if (!confirmDiscard()) return;
  document_->newCase();
  stack_->clear();
  selectItem("E1");
  showTab(CaseTab);
}

void MainWindow::openDialog() {
  if (!confirmDiscard()) return;
  const QString path = QFileDialog::getOpenFileName(this, tr("Open a case"), settings::last_folder(), tr(kFileFilter));
  if (path.isEmpty()) return;
  const QString problem = openPath(path);
  if (!problem.isEmpty()) QMessageBox::warning(this, tr("Open"), problem);
}

void MainWindow::openSharedStoreDialog() {
  if (!confirmDiscard()) return;
  // The last address opened, as a start: a laboratory works in one database.
  QString last;
  for (const QString& recent : settings::recent_files())
    if (store::is_database_address(recent.toStdString())) {
      last = recent;
      break;
    }
  bool ok = false;
  const QString address =
      QInputDialog::getText(this, tr("Open from Shared Store"),
                            tr("The case's address in the laboratory's shared store, as "
                               "postgresql://SERVER/DATABASE?case=REFERENCE. The database role and the "
                               "password come from your PostgreSQL settings (PGUSER, the service file, the "
                               "password file), never from the address."),
                            QLineEdit::Normal, last, &ok)
          .trimmed();
  if (!ok || address.isEmpty()) return;
  const QString problem = store::is_database_address(address.toStdString())
                              ? openPath(address)
                              : tr("A shared-store address starts with postgresql://; a case file is opened "
                                   "with File ▸ Open.");
  if (!problem.isEmpty()) QMessageBox::warning(this, tr("Open from Shared Store"), problem);
}

bool MainWindow::saveCase() {
  if (document_->fileKind() == FileKind::case_store) return true;
  if (document_->fileKind() == FileKind::interchange_json && !document_->filePath().isEmpty())
    return saveTo(document_->filePath()).isEmpty();
  return saveAsDialog();
}

QString MainWindow::suggestedPath(const QString& fallback_name, const QString& suffix) const {
  const QString base = document_->baseName().isEmpty() ? fallback_name : document_->baseName();
  // Beside the case's own file; a case in a database or never saved: in the last folder used.
  const bool beside_file = !document_->filePath().isEmpty() && !document_->inDatabase();
  const QString folder = beside_file ? QFileInfo(document_->filePath()).absolutePath() : settings::last_folder();
  return QDir(folder).filePath(base + suffix);
}

bool MainWindow::saveAsDialog() {
  const QString suggested = suggestedPath(tr("case"), ".cpcase");
  const QString path = QFileDialog::getSaveFileName(this, tr("Save the case"), suggested,
                                                    tr("Case file, every edit kept (*.cpcase);;Interchange file (*.json)"));
  if (path.isEmpty()) return false;
  const QString problem = saveTo(path);
  if (!problem.isEmpty()) QMessageBox::warning(this, tr("Save"), problem);
  return problem.isEmpty();
}

bool MainWindow::saveAsCaseFileDialog() {
  QString path = QFileDialog::getSaveFileName(this, tr("Create a case file"), suggestedPath(tr("case"), ".cpcase"),
                                              tr("Case file, every edit kept (*.cpcase)"));
  if (path.isEmpty()) return false;
  if (QFileInfo(path).suffix().toLower() != "cpcase") path += ".cpcase";
  const QString problem = saveTo(path);
  if (!problem.isEmpty()) QMessageBox::warning(this, tr("Save"), problem);
  return problem.isEmpty();
}

void MainWindow::exportJsonDialog() {
  const QString base = document_->baseName().isEmpty() ? tr("case") : document_->baseName();
  const QString path = QFileDialog::getSaveFileName(this, tr("Export interchange JSON"),
                                                    QDir(settings::last_folder()).filePath(base + ".json"), tr("JSON (*.json)"));
  if (path.isEmpty()) return;
  // Case content: written with the store's permissions, atomically, never through a link.
  try {
    platform::write_private_file(path.toStdString(), document_->document().dump(2) + "\n");
    statusBar()->showMessage(tr("Exported %1").arg(path), 5000);
  } catch (const std::exception& error) {
    QMessageBox::warning(this, tr("Export"), tr("Cannot write %1: %2").arg(path, QString::fromStdString(error.what())));
  }
}

QString MainWindow::exportContributionChart(const QString& path) {
  const ContributionData data = ContributionData::from(*document_);
  return export_figure(path, QSize(900, 480), [&](QPainter& p, const QRectF& r) { paint_contributions(p, r, data); },
                       tr("Contribution of each item of findings"));
}

QString MainWindow::exportPriorView(const QString& path) {
  priors_->renderIfStale();
  const PriorPlotData data = priors_->plot()->data();
  return export_figure(path, QSize(900, 480), [&](QPainter& p, const QRectF& r) { paint_prior_plot(p, r, data); },
                       tr("Posterior probability against prior odds"));
}

void MainWindow::exportFigureDialog(bool chart) {
  const QString name = chart ? tr("contributions.png") : tr("priors.png");
  const QString path = QFileDialog::getSaveFileName(this, chart ? tr("Export the contribution chart") : tr("Export the prior view"),
                                                    QDir(settings::last_folder()).filePath(name),
                                                    tr("PNG image (*.png);;SVG drawing (*.svg)"));
  if (path.isEmpty()) return;
  const QString problem = chart ? exportContributionChart(path) : exportPriorView(path);
  if (problem.isEmpty()) statusBar()->showMessage(tr("Wrote %1").arg(path), 5000);
  else QMessageBox::warning(this, tr("Export"), problem);
}

bool MainWindow::reportsAvailable() const { return reports_->available(); }

QString MainWindow::exportReportPdf(const QString& path) { return writeReport(path, std::nullopt); }

QString MainWindow::issueReport(const QString& path, const SealSigning& signing) { return writeReport(path, signing); }

QString MainWindow::writeReport(const QString& path, const std::optional<SealSigning>& issue) {
  commit_pending_typing(this);
  if (!reports_->available()) return reports_->unavailableReason();
  if (issue && document_->fileKind() != FileKind::case_store)
    return tr("Issuing a report seals a revision of a case file: save the case as a case file (.cpcase) first.");
  // Evaluating the case and laying out the pages takes seconds: off the GUI thread, with a
  // progress dialog whose Cancel leaves no file written and nothing sealed. The seal is prepared
  // (and signed) before, on this thread, since the report prints it.
  const auto done = run_with_progress<ReportOutput>(
      this, issue ? tr("Issuing the report") : tr("Writing the report"),
      tr("Evaluating the case and laying out the report for %1…").arg(QFileInfo(path).fileName()),
      reports_->prepare_pdf(*document_, issue), [this](QProgressDialog* dialog) { emit progressShown(dialog->windowTitle()); });
  if (!done) return tr("Cancelled: no report was written.");
  const ReportOutput& output = *done;
  if (!output.problem.isEmpty()) return output.problem;
  if (issue) {
    // Seal first: a report whose printed seal is not the one written is never written.
    if (!output.seal) return tr("The report was rendered without its seal; nothing was sealed or written.");
    const QString problem = document_->sealRevision(*output.seal, output.pdf, QFileInfo(path).fileName());
    if (!problem.isEmpty()) return tr("The revision was not sealed, so the report was not issued: %1").arg(problem);
  }
  try {
    reports::write_file_atomically(path.toStdString(), output.pdf.toStdString());
  } catch (const std::exception& error) {
    return tr("Cannot write %1: %2").arg(path, QString::fromStdString(error.what()));
  }
  return {};
}

std::optional<SealSigning> MainWindow::chooseSealSigning() {
  QString problem;
  auto key = document_->sealerKey(problem);
  if (key) return SealSigning{std::move(key)};
  if (!problem.isEmpty()) {
    QMessageBox::warning(this, tr("Issue the report"), tr("The revision cannot be sealed: %1").arg(problem));
    return std::nullopt;
  }
  // sealerKey has accepted the declared name, so it reads here.
  const store::ExaminerName sealer(document_->examiner().toStdString());
  QMessageBox box(this);
  box.setObjectName("noSigningKey");
  box.setWindowTitle(tr("Issue the report"));
  box.setIcon(QMessageBox::Warning);
  box.setTextFormat(Qt::PlainText);  // the name and folder are the user's own text: never markup
  box.setTextInteractionFlags(Qt::TextSelectableByMouse);  // so the command can be copied
  box.setStyleSheet(QStringLiteral("QLabel#qt_msgbox_label { min-width: 34em; }"));  // the command on one line
  box.setText(tr("The seal cannot be signed (%1): make your key with\n\n    %2\n\nand issue the report again, or "
                 "seal this revision unsigned, which the report and verify then state.")
                  .arg(QString::fromStdString(store::missing_signing_key_text(sealer)),
                       QString::fromStdString(store::key_create_command(sealer))));
  QPushButton* unsigned_seal = box.addButton(tr("Seal Unsigned"), QMessageBox::AcceptRole);
  box.addButton(QMessageBox::Cancel);
  box.setDefaultButton(QMessageBox::Cancel);
  box.exec();
  if (box.clickedButton() != unsigned_seal) return std::nullopt;
  return SealSigning{nullptr};
}

void MainWindow::reportPreview() {
  commit_pending_typing(this);
  const QString problem =
      reports_->preview(*document_, this, [this](QProgressDialog* dialog) { emit progressShown(dialog->windowTitle()); });
  if (!problem.isEmpty()) statusBar()->showMessage(problem, 10000);
}

bool MainWindow::confirmIssuing() {
  commit_pending_typing(this);
  const auto read = interchange::read_case(document_->document(), document_->baseDir());
  if (!read.value) return true;  // the report itself names the case's problems and writes nothing
  const casefile::Case& value = *read.value;
  // The editor writes the report in the case's own mode, so a training case gives a training report.
  const auto points = casefile::issue_checklist(value, value.mode_or_default() != casefile::CaseMode::training);
  QString list;
  for (const auto& point : points) list += QStringLiteral("\u2022 ") + QString::fromStdString(point.message) + "\n";
  QMessageBox box(this);
  box.setObjectName("issueChecklist");
  box.setWindowTitle(tr("Issue the report"));
  box.setTextFormat(Qt::PlainText);  // the points quote the case's own ids: never read as markup
  if (casefile::blocks_issuing(points)) {
    box.setIcon(QMessageBox::Warning);
    box.setText(tr("The report cannot be issued:\n\n%1").arg(list));
    box.setStandardButtons(QMessageBox::Close);
    box.exec();
    return false;
  }
  box.setIcon(points.empty() ? QMessageBox::Question : QMessageBox::Warning);
  box.setText(points.empty() ? tr("Issue checklist: nothing open.")
                             : tr("Issue checklist: %n point(s) open. Issue anyway only if you have dealt with them "
                                  "or they are as they should be.\n\n%1",
                                  "", static_cast<int>(points.size()))
                                   .arg(list));
  box.setInformativeText(QString::fromStdString(casefile::sealing_explanation()));
  QPushButton* seal = box.addButton(tr("Issue and Seal"), QMessageBox::AcceptRole);
  box.addButton(QMessageBox::Cancel);
  box.setDefaultButton(QMessageBox::Cancel);
  box.exec();
  return box.clickedButton() == seal;
}

void MainWindow::reportExportDialog(bool issue) {
  if (issue && document_->fileKind() != FileKind::case_store) {
    // Say why before asking for a PDF name: issuing seals a revision, which only a case file keeps.
    const auto answer = QMessageBox::question(
        this, tr("Issue the report"),
        tr("Issuing a report seals the case as it stands in a case file (.cpcase), which keeps every edit with "
           "its audit trail. %1 is not a case file yet.\n\nCreate a case file from it now, then issue the report?")
            .arg(document_->displayName()),
        QMessageBox::Yes | QMessageBox::Cancel, QMessageBox::Yes);
    if (answer != QMessageBox::Yes || !saveAsCaseFileDialog()) return;
  }
  if (issue && !confirmIssuing()) return;
  // Who seals and with which key is settled before a file name is asked for, as on the command line.
  std::optional<SealSigning> signing;
  if (issue && !(signing = chooseSealSigning())) return;
  const QString base = document_->baseName().isEmpty() ? tr("report") : document_->baseName();
  const QString path = QFileDialog::getSaveFileName(this, issue ? tr("Issue the report") : tr("Export the report"),
                                                    QDir(settings::last_folder()).filePath(base + ".pdf"), tr("PDF (*.pdf)"));
  if (path.isEmpty()) return;
  const QString problem = writeReport(path, signing);
  if (problem.isEmpty())
    statusBar()->showMessage(!issue ? tr("Report written to %1").arg(path)
                             : signing->key ? tr("Report issued to %1; the revision is sealed and signed.").arg(path)
                                            : tr("Report issued to %1; the revision is sealed UNSIGNED.").arg(path),
                             8000);
  else QMessageBox::warning(this, tr("Report"), problem);
}

void MainWindow::addItem(const std::string& model) {
  const std::string id = edits_->addItem(model);
  if (id.empty()) return;
  selectItem(id);
  showTab(FindingsTab);
}

std::string MainWindow::selectedItem() const { return item_form_->item(); }

void MainWindow::removeSelectedItem() {
  const std::string id = selectedItem();
  if (!id.empty()) edits_->removeItem(id);
}

void MainWindow::moveSelectedItem(int delta) {
  const std::string id = selectedItem();
  const auto position = document_->state().item_position(id);
  if (!position) return;
  const long target = static_cast<long>(*position) + delta;
  if (target < 0 || target >= static_cast<long>(document_->state().items().size())) return;
  edits_->moveItem(id, static_cast<std::size_t>(target));
}

void MainWindow::showTab(Tab tab) { tabs_->setCurrentIndex(tab); }

void MainWindow::selectItem(const std::string& id) {
  const int row = items_model_->rowOf(id);
  item_form_->setItem(id);
  if (row < 0) return;
  const QModelIndex index = items_proxy_->mapFromSource(items_model_->index(row, ItemTableModel::Id));
  const QSignalBlocker block(items_view_->selectionModel());
  items_view_->selectionModel()->setCurrentIndex(index, QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
}

void MainWindow::showField(const TextFieldRef& where) {
  if (where.entity.kind == store::EntityKind::item) {
    selectItem(where.entity.key);
    showTab(FindingsTab);
    if (where.field == "description") {
      item_form_->descriptionField()->setFocus();
      return;
    }
    // The form's field widgets are named after the model field they edit (two by a name of their own).
    const QString name = where.field == "title" ? QStringLiteral("itemTitle")
                         : where.field == "lr"  ? QStringLiteral("reported_lr")
                                                : QString::fromStdString(where.field);
    for (auto* w : item_form_->findChildren<QWidget*>(name))
      if (w->isVisible()) {
        w->setFocus();
        break;
      }
  } else {
    showTab(where.entity.key == "propositions" ? PropositionsTab : CaseTab);
    SectionForm* form = where.entity.key == "propositions" ? propositions_form_ : case_form_;
    if (auto* w = form->findChild<QWidget*>(QString::fromStdString(where.entity.key + "." + where.field))) w->setFocus();
  }
}

void MainWindow::closeEvent(QCloseEvent* event) {
  if (!confirmDiscard()) {
    event->ignore();
    return;
  }
  settings::set_window_geometry(saveGeometry());
  settings::set_window_state(saveState());
  event->accept();
}

std::string MainWindow::versionLabel(const comparison::VersionLocation& where) {
  // A file is named as the window names the case as open: by its file name (the folder is where
  // the examiner keeps it, not part of the version); a shared-store address as given.
  std::string label = store::is_database_address(where.location)
                          ? where.location
                          : QFileInfo(QString::fromStdString(where.location)).fileName().toStdString();
  if (where.revision) label += "@" + std::to_string(*where.revision);
  return label;
}

QString MainWindow::compareWith(const QString& other) {
  commit_pending_typing(this);
  try {
    const comparison::VersionLocation where = comparison::parse_version_location(other.toStdString());
    auto located = comparison::read_version_at(where);
    if (!located.read.diagnostics.empty())
      return tr("%1 cannot be compared: %2")
          .arg(other, QString::fromStdString(located.read.diagnostics.problems().front().text()));
    auto current = interchange::read_case(document_->document(), document_->baseDir());
    if (!current.diagnostics.empty())
      return tr("The case as open cannot be compared until its problems are mended: %1")
          .arg(QString::fromStdString(current.diagnostics.problems().front().text()));
    const auto a = comparison::make_version(std::move(*located.read.value), located.base_dir, versionLabel(where));
    const auto b = comparison::make_version(std::move(*current.value), document_->baseDir(),
                                            tr("%1 (as open)").arg(document_->displayName()).toStdString());
    // Attribution reads items that mix the two versions, each naming its own version's files.
    reading::allow_folder_for_this_run(a.base_dir);
    reading::allow_folder_for_this_run(b.base_dir);
    const auto result = comparison::compare_cases(a, b);
    if (!comparison_window_) {
      comparison_window_ = new ComparisonWindow(this);
      comparison_window_->setWindowFlag(Qt::Window);
      connect(comparison_window_, &ComparisonWindow::differenceChosen, this, &MainWindow::showDifference);
      connect(comparison_window_, &ComparisonWindow::memoRequested, this, &MainWindow::saveComparisonMemoDialog);
    }
    compared_details_ = b.value.details;
    comparison_window_->showComparison(result);
    comparison_window_->show();
    comparison_window_->raise();
    return {};
  } catch (const std::exception& error) {
    return tr("%1 cannot be compared: %2").arg(other, QString::fromStdString(error.what()));
  }
}

QString MainWindow::showNetworkSensitivity(const QString& item_id) {
  commit_pending_typing(this);
  using models::network::EntrySensitivity;
  const auto& points = document_->points();
  const casefile::Item* item = points.evaluated_case ? points.evaluated_case->find_item(item_id.toStdString()) : nullptr;
  // The model is shared, never copied: the work reads it while the document may move on.
  std::shared_ptr<const models::network::NetworkModel> model =
      item ? std::dynamic_pointer_cast<const models::network::NetworkModel>(item->model) : nullptr;
  if (!model)
    return tr("Item %1 has no network that reads without problems: mend what its form shows first.").arg(item_id);
  // Read before the work: the point evaluation is replaced after any change while it runs.
  const auto& alternatives = points.evaluated_case->propositions.alternatives;
  const std::string against = alternatives.empty() ? std::string() : alternatives.front().id;
  // Two eliminations per table entry: seconds for a large network, so off the GUI thread with Cancel.
  const auto done = run_with_progress<std::vector<EntrySensitivity>>(
      this, tr("Network sensitivity"),
      tr("Recomputing the likelihood ratio of %1 with each table entry moved across its range…").arg(item_id),
      [model] {
        numbers::clear_upper_vector_state();
        auto rows = model->sensitivity();
        models::network::order_by_effect(rows);
        return rows;
      },
      [this](QProgressDialog* dialog) { emit progressShown(dialog->windowTitle()); });
  if (!done) return tr("Cancelled: the sensitivity of %1 was not computed.").arg(item_id);
  if (!sensitivity_window_) {
    sensitivity_window_ = new NetworkSensitivityWindow(this);
    sensitivity_window_->setWindowFlag(Qt::Window);
  }
  sensitivity_window_->showRows(item_id.toStdString(), model->network(), *done, model->evaluate().lr, against);
  sensitivity_window_->show();
  sensitivity_window_->raise();
  return {};
}

QString MainWindow::comparisonReviewer() const {
  // The person making the comparison: this session's examiner, else the name kept in settings;
  // never asked for here (the memo then says "not given", as compare -o without --reviewer).
  const QString session = document_->examiner().trimmed();
  return session.isEmpty() ? settings::examiner_name().trimmed() : session;
}

QString MainWindow::writeComparisonMemo(const QString& path) {
  if (!comparison_window_) return tr("There is no comparison to write: use Tools > Compare With… first.");
  if (!reports_->available()) return reports_->unavailableReason();
  // Laying out the memo's pages takes a moment for long comparisons: off the GUI thread, as the
  // report; Cancel leaves no file written.
  const auto done = run_with_progress<ReportOutput>(
      comparison_window_, tr("Writing the review memo"),
      tr("Laying out the review memo for %1…").arg(QFileInfo(path).fileName()),
      reports_->prepare_comparison_memo(comparison_window_->comparison(), compared_details_,
                                        comparisonReviewer().toStdString()),
      [this](QProgressDialog* dialog) { emit progressShown(dialog->windowTitle()); });
  if (!done) return tr("Cancelled: no memo was written.");
  if (!done->problem.isEmpty()) return done->problem;
  try {
    reports::write_file_atomically(path.toStdString(), done->pdf.toStdString());
  } catch (const std::exception& error) {
    return tr("Cannot write %1: %2").arg(path, QString::fromStdString(error.what()));
  }
  return {};
}

void MainWindow::saveComparisonMemoDialog() {
  const QString path = QFileDialog::getSaveFileName(comparison_window_, tr("Save the review memo"),
                                                    QDir(settings::last_folder()).filePath(tr("review-memo.pdf")),
                                                    tr("PDF document (*.pdf)"));
  if (path.isEmpty()) return;
  const QString problem = writeComparisonMemo(path);
  if (problem.isEmpty()) statusBar()->showMessage(tr("Wrote %1").arg(path), 5000);
  else QMessageBox::warning(comparison_window_, tr("Save the review memo"), problem);
}

void MainWindow::showDifference(const QString& section, const QString& item, const QString& field) {
  raise();
  activateWindow();
  if (section == "items") {
    if (item.isEmpty()) {  // the order of the items
      showTab(FindingsTab);
      return;
    }
    if (!document_->state().item_position(item.toStdString())) {
      statusBar()->showMessage(tr("Item %1 is not in the case as open (it was removed).").arg(item), 8000);
      return;
    }
    showField(TextFieldRef{store::EntityRef::item(item.toStdString()), field.toStdString()});
    return;
  }
  showField(TextFieldRef{store::EntityRef::section(section.toStdString()), field.toStdString()});
}

void MainWindow::compareDialog() {
  // The sealed revisions of this case first: the usual review is "what changed since it was issued".
  QStringList choices;
  QStringList locations;
  if (const auto* stored = document_->caseStore())
    for (const auto& revision : stored->revisions())
      if (revision.sealed()) {
        choices << tr("Sealed revision %1 of this case (%2)").arg(revision.revision).arg(QString::fromStdString(revision.sealed_at));
        locations << document_->filePath() + "@" + QString::number(revision.revision);
      }
  choices << tr("A case file (.cpcase or .json)…") << tr("A case in the shared store…");
  bool ok = false;
  const QString choice = QInputDialog::getItem(this, tr("Compare With"),
                                               tr("Compare the case as open (B) with another version of it (A):"), choices,
                                               0, false, &ok);
  if (!ok) return;
  QString other;
  const auto index = choices.indexOf(choice);
  if (index < locations.size()) {
    other = locations[index];
  } else if (index == locations.size()) {
    other = QFileDialog::getOpenFileName(this, tr("Compare with a case"), settings::last_folder(), tr(kFileFilter));
  } else {
    other = QInputDialog::getText(this, tr("Compare With"),
                                  tr("The other version's address: postgresql://SERVER/DATABASE?case=REFERENCE, with "
                                     "@N at the end for its sealed revision N."),
                                  QLineEdit::Normal, QString(), &ok)
                .trimmed();
  }
  if (other.isEmpty()) return;
  const QString problem = compareWith(other);
  if (!problem.isEmpty()) QMessageBox::warning(this, tr("Compare With"), problem);
}

MethodValidationWindow* MainWindow::showMethodValidation() {
  // A window of its own beside the case: a validation is about a method, not about this case.
  if (!validation_window_) {
    validation_window_ = new MethodValidationWindow(this);
    validation_window_->setWindowFlag(Qt::Window);
  }
  validation_window_->show();
  validation_window_->raise();
  validation_window_->activateWindow();
  return validation_window_;
}

}  // namespace counterpoise::editor
