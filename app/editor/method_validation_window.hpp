#pragma once
// The window that validates an LR method from a results file (comparisons whose ground truth is
// known): the same run as `counterpoise-cli method-validation` (core/method_validation), shown
// as the validation report itself — measures with their bootstrap intervals, the breakdown by
// condition, the laboratory's criteria with pass or fail, the Tippett, cross-entropy and
// calibration plots, the cautions — in a page preview, so the screen and the PDF are one
// document. The user picks the results file, optionally a criteria file, a calibration for raw
// scores and a training file; the run is done off the GUI thread. Every problem with a file is
// shown in the window, naming the file, row and column, and leaves the last good run in place.

#include <QMainWindow>

#include <optional>
#include <string>

#include "core/method_validation/validation_run.hpp"
#include "reports/validation_report.hpp"

class QComboBox;
class QLabel;
class QPrintPreviewWidget;
class QPrinter;
class QPushButton;

namespace counterpoise::editor {

class MethodValidationWindow : public QMainWindow {
  Q_OBJECT
 public:
  explicit MethodValidationWindow(QWidget* parent = nullptr);
  ~MethodValidationWindow() override;

  // Each sets its part and runs the validation again when a results file is open. They return
  // false (with the problem shown in the window) when the file cannot be used.
  bool openResults(const QString& path);
  bool setCriteriaFile(const QString& path);  // empty: no criteria (the guideline's rows only)
  bool setTrainingFile(const QString& path);  // empty: calibrate on the results themselves
  bool setCalibration(method_validation::Calibration calibration);
  // Writes the validation report shown as a PDF; false with the problem shown when it cannot.
  bool saveReport(const QString& path);

  // For tests and the screenshot mode.
  const method_validation::ValidationRun* lastRun() const { return run_ ? &*run_ : nullptr; }
  QString problemText() const;
  QPrintPreviewWidget* preview() const { return preview_; }
  QComboBox* calibrationBox() const { return calibration_; }

 private:
  QWidget* buildChoices();
  bool rerun();
  bool setOptionalFile(QString& member, const QString& path, QLabel* label, const QString& none);
  void showProblem(const QString& text);
  void paintPreview(QPrinter* printer);
  reports::ValidationReportInfo reportInfo() const;
  void chooseResults();
  void chooseCriteria();
  void chooseTraining();
  void chooseReportFile();

  QString results_path_, criteria_path_, training_path_;
  method_validation::Calibration calibration_choice_ = method_validation::Calibration::none;
  std::optional<method_validation::ValidationRun> run_;
  std::string results_sha256_;

  QLabel* results_label_;
  QLabel* criteria_label_;
  QLabel* training_label_;
  QComboBox* calibration_;
  QLabel* problem_;
  QPushButton* save_;
  QPrintPreviewWidget* preview_;
  QPrinter* printer_;
};

}  // namespace counterpoise::editor
