#pragma once
// The fields of a population taken from background data through a kernel density ({"kde":
// {"file", "column", "bandwidth", "method"}}): the file with an import button, the column, the
// bandwidth (empty: Silverman's rule of thumb) and the summation. The measurement form shows one
// for the population of the sources and one for the population of the recovered material's
// sources if Hd (or the chosen alternative) is true. It only shows values and reports what the
// user changed; the form turns that into one edit.

#include <QWidget>

#include <nlohmann/json.hpp>

class QComboBox;
class QLabel;
class QLineEdit;
class QPushButton;

namespace counterpoise::editor {

class BackgroundDataFields : public QWidget {
  Q_OBJECT
 public:
  // `prefix` starts the object names of the fields ("measurement": measurement_background_file,
  // measurement_background_column, measurement_bandwidth, measurement_summation).
  BackgroundDataFields(const QString& prefix, QWidget* parent = nullptr);

  // Shows the kde object `kde` (null or not an object: nothing given yet).
  void showKde(const nlohmann::json& kde);
  // `kde` with the column, bandwidth and summation as the fields hold them (the file and any
  // other member kept): what edited() reports.
  nlohmann::json typedKde(const nlohmann::json& kde) const;

  // For tests.
  QLabel* fileLabel() const { return file_; }
  QPushButton* importButton() const { return import_; }
  QLineEdit* columnField() const { return column_; }
  QLineEdit* bandwidthField() const { return bandwidth_; }
  QComboBox* summationBox() const { return method_; }

 signals:
  // The user asked to choose a background file (the item form asks for the file and column).
  void importRequested();
  // The user changed the column, the bandwidth or the summation.
  void edited();

 private:
  QLabel* file_;
  QPushButton* import_;
  QLineEdit* column_;
  QLineEdit* bandwidth_;
  QComboBox* method_;
};

}  // namespace counterpoise::editor
