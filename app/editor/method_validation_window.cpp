#include "app/editor/method_validation_window.hpp"

#include <QComboBox>
#include <QFileDialog>
#include <QFileInfo>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QPrintPreviewWidget>
#include <QPrinter>
#include <QPushButton>
#include <QToolBar>
#include <QVBoxLayout>

#include "app/editor/editor_settings.hpp"
#include "app/editor/work_progress.hpp"
#include "core/method_validation/results_file.hpp"
#include "core/method_validation/validation_criteria.hpp"
#include "core/platform/sha256.hpp"
#include "core/platform/today.hpp"
#include "core/reading/text_file.hpp"
#include "core/validation/input_error.hpp"
#include "reports/pdf_writer.hpp"
#include "reports/validation_report.hpp"

namespace counterpoise::editor {

namespace mv = method_validation;

namespace {

QString q(const std::string& text) { return QString::fromStdString(text); }

// A file as the window names it: its name, with the whole path as the label's tooltip.
void show_file(QLabel* label, const QString& path, const QString& none) {
  label->setText(path.isEmpty() ? none : QFileInfo(path).fileName());
  label->setToolTip(path);
}

// What a run needs, copied for the worker thread.
struct RunInput {
  std::string results, criteria, training;
  mv::Calibration calibration = mv::Calibration::none;
};

struct RunOutput {
  std::optional<mv::ValidationRun> run;
  std::string results_sha256;
  std::string problem;
};

// Reads the files and runs the validation. A problem names the file it came from.
RunOutput run_files(const RunInput& input) {
  RunOutput out;
  std::string reading = input.results;
  try {
    const mv::ResultsTable results = mv::read_results_file(input.results);
    mv::RunOptions options;
    options.calibration = input.calibration;
    if (!input.training.empty()) options.training = mv::read_results_file(reading = input.training);
    if (!input.criteria.empty()) options.criteria = mv::read_criteria_file(reading = input.criteria);
    reading = input.results;
    out.run = mv::run_validation(results, options);
    out.results_sha256 = platform::sha256_hex(reading::read_text_file(input.results, {"results", "file"}));
  } catch (const std::exception& error) {
    out.run.reset();
    out.problem = reading + ": " + error.what();
  }
  return out;
}

}  // namespace

MethodValidationWindow::MethodValidationWindow(QWidget* parent) : QMainWindow(parent) {
  setObjectName("method_validation_window");
  setWindowTitle(tr("Method validation"));
  setAttribute(Qt::WA_DeleteOnClose, false);
  auto* central = new QWidget(this);
  auto* layout = new QVBoxLayout(central);
  layout->addWidget(buildChoices());
  problem_ = new QLabel(central);
  problem_->setObjectName("validation_problem");
  problem_->setWordWrap(true);
  problem_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  problem_->setStyleSheet("color: #a40000;");
  problem_->hide();
  layout->addWidget(problem_);

  // The report's own page layout and resolution, so the preview breaks pages where the PDF does.
  printer_ = new QPrinter(QPrinter::HighResolution);
  printer_->setResolution(reports::kReportResolution);
  printer_->setPageLayout(reports::report_page_layout());
  preview_ = new QPrintPreviewWidget(printer_, central);
  preview_->setObjectName("validation_preview");
  preview_->setViewMode(QPrintPreviewWidget::SinglePageView);
  preview_->setZoomMode(QPrintPreviewWidget::FitToWidth);
  connect(preview_, &QPrintPreviewWidget::paintRequested, this, [this](QPrinter* printer) { paintPreview(printer); });
  layout->addWidget(preview_, 1);
  setCentralWidget(central);

  auto* tools = addToolBar(tr("Validation"));
  tools->setObjectName("validation_tools");
  save_ = new QPushButton(tr("&Save validation report (PDF)…"), this);
  save_->setObjectName("validation_save");
  save_->setEnabled(false);
  connect(save_, &QPushButton::clicked, this, [this] { chooseReportFile(); });
  tools->addWidget(save_);
  resize(900, 1000);
}

MethodValidationWindow::~MethodValidationWindow() { delete printer_; }

QWidget* MethodValidationWindow::buildChoices() {
  auto* box = new QWidget(this);
  auto* form = new QFormLayout(box);
  form->setContentsMargins(0, 0, 0, 0);

  const auto file_row = [&](QLabel*& label, const QString& none, const QString& button_text, auto choose) {
    auto* row = new QWidget(box);
    auto* h = new QHBoxLayout(row);
    h->setContentsMargins(0, 0, 0, 0);
    label = new QLabel(none, row);
    label->setTextInteractionFlags(Qt::TextSelectableByMouse);
    auto* button = new QPushButton(button_text, row);
    connect(button, &QPushButton::clicked, this, choose);
    h->addWidget(label, 1);
    h->addWidget(button);
    return row;
  };
  form->addRow(tr("Results"), file_row(results_label_, tr("none: open a results file (CSV or JSON)"), tr("Open…"),
                                       [this] { chooseResults(); }));
  form->addRow(tr("Criteria"), file_row(criteria_label_, tr("none: the guideline's rows without the laboratory's criteria"),
                                        tr("Choose…"), [this] { chooseCriteria(); }));
  calibration_ = new QComboBox(box);
  calibration_->setObjectName("validation_calibration");
  calibration_->addItem(tr("none: the results are likelihood ratios"), static_cast<int>(mv::Calibration::none));
  calibration_->addItem(tr("linear (logistic regression on the scores)"), static_cast<int>(mv::Calibration::linear));
  calibration_->addItem(tr("PAV (pool-adjacent-violators)"), static_cast<int>(mv::Calibration::pav));
  calibration_->setToolTip(tr("How raw scores are turned into likelihood ratios before they are judged."));
  connect(calibration_, &QComboBox::activated, this, [this](int index) {
    setCalibration(static_cast<mv::Calibration>(calibration_->itemData(index).toInt()));
  });
  form->addRow(tr("Calibration"), calibration_);
  form->addRow(tr("Training set"), file_row(training_label_, tr("none: the calibration is fitted on the results themselves"),
                                            tr("Choose…"), [this] { chooseTraining(); }));
  return box;
}

bool MethodValidationWindow::openResults(const QString& path) {
  const QString before = results_path_;
  results_path_ = path;
  if (rerun()) return true;
  results_path_ = before;
  return false;
}

bool MethodValidationWindow::setCriteriaFile(const QString& path) {
  return setOptionalFile(criteria_path_, path, criteria_label_,
                         tr("none: the guideline's rows without the laboratory's criteria"));
}

bool MethodValidationWindow::setTrainingFile(const QString& path) {
  return setOptionalFile(training_path_, path, training_label_, tr("none: the calibration is fitted on the results themselves"));
}

// Sets a file the run may use (criteria, training) and runs again; on failure the file before stays.
bool MethodValidationWindow::setOptionalFile(QString& member, const QString& path, QLabel* label, const QString& none) {
  const QString before = member;
  member = path;
  if (results_path_.isEmpty() || rerun()) {
    show_file(label, member, none);
    return true;
  }
  member = before;
  return false;
}

bool MethodValidationWindow::setCalibration(mv::Calibration calibration) {
  const mv::Calibration before = calibration_choice_;
  calibration_choice_ = calibration;
  const bool ok = results_path_.isEmpty() || rerun();
  if (!ok) calibration_choice_ = before;
  calibration_->setCurrentIndex(calibration_->findData(static_cast<int>(calibration_choice_)));
  return ok;
}

// Runs the validation for the current choices. On success the run, the labels and the preview
// show it; on failure the problem is shown and the last good run stays.
bool MethodValidationWindow::rerun() {
  const RunInput input{results_path_.toStdString(), criteria_path_.toStdString(), training_path_.toStdString(),
                       calibration_choice_};
  const auto done = run_with_progress<RunOutput>(this, tr("Method validation"),
                                                 tr("Computing the measures and their bootstrap intervals…"),
                                                 [input] { return run_files(input); });
  if (!done) return false;  // cancelled: nothing changes
  if (!done->run) {
    showProblem(q(done->problem));
    return false;
  }
  run_ = std::move(done->run);
  results_sha256_ = done->results_sha256;
  problem_->hide();
  show_file(results_label_, results_path_, QString());
  save_->setEnabled(true);
  preview_->updatePreview();
  return true;
}

void MethodValidationWindow::showProblem(const QString& text) {
  problem_->setText(text);
  problem_->show();
}

// The examiner is the one the editor records with every edit (Edit ▸ Examiner Name).
reports::ValidationReportInfo MethodValidationWindow::reportInfo() const {
  reports::ValidationReportInfo info;
  info.examiner = settings::examiner_name().toStdString();
  info.date = platform::today_iso_date();
  info.results_sha256 = results_sha256_;
  return info;
}

QString MethodValidationWindow::problemText() const { return problem_->isHidden() ? QString() : problem_->text(); }

void MethodValidationWindow::paintPreview(QPrinter* printer) {
  if (!run_) return;  // nothing opened yet: an empty page
  try {
    if (printer->resolution() != reports::kReportResolution) printer->setResolution(reports::kReportResolution);
    reports::paint_report(reports::build_validation_report(*run_, reportInfo()), *printer);
  } catch (const std::exception& error) {
    showProblem(tr("The validation report could not be drawn: %1").arg(q(error.what())));
  }
}

bool MethodValidationWindow::saveReport(const QString& path) {
  if (!run_) {
    showProblem(tr("Open a results file first."));
    return false;
  }
  try {
    reports::write_file_atomically(path.toStdString(),
                                   reports::render_pdf(reports::build_validation_report(*run_, reportInfo())).bytes);
    return true;
  } catch (const std::exception& error) {
    showProblem(path + QStringLiteral(": ") + q(error.what()));
    return false;
  }
}

void MethodValidationWindow::chooseResults() {
  const QString path = QFileDialog::getOpenFileName(this, tr("Open results"), QFileInfo(results_path_).path(),
                                                    tr("Results (*.csv *.json);;All files (*)"));
  if (!path.isEmpty()) openResults(path);
}

void MethodValidationWindow::chooseCriteria() {
  const QString path = QFileDialog::getOpenFileName(this, tr("Choose the laboratory's criteria"),
                                                    QFileInfo(results_path_).path(), tr("Criteria (*.json);;All files (*)"));
  if (!path.isEmpty()) setCriteriaFile(path);
}

void MethodValidationWindow::chooseTraining() {
  const QString path = QFileDialog::getOpenFileName(this, tr("Choose a training set"), QFileInfo(results_path_).path(),
                                                    tr("Results (*.csv *.json);;All files (*)"));
  if (!path.isEmpty()) setTrainingFile(path);
}

void MethodValidationWindow::chooseReportFile() {
  const QString path = QFileDialog::getSaveFileName(this, tr("Save validation report"),
                                                    QFileInfo(results_path_).completeBaseName() + "-validation.pdf",
                                                    tr("PDF (*.pdf)"));
  if (!path.isEmpty()) saveReport(path);
}

}  // namespace counterpoise::editor
