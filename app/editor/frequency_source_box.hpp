#pragma once
// Where the allele frequencies of a DNA item come from (the `frequencies` field, shared by the
// single-source and the mixture form): the source in words, the import of a frequency table and
// the database size N. The box only shows the field and reports the new value the user made;
// the form it sits in turns that into one edit through the EditFacade.

#include <QGroupBox>

#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

class QLabel;
class QLineEdit;
class QPushButton;

namespace counterpoise::editor {

class FieldMessage;

// The minimum allele frequency field of a DNA item (`min_allele_frequency`).
QLineEdit* new_minimum_frequency_field(QWidget* parent, const QString& object_name);

class FrequencySourceBox : public QGroupBox {
  Q_OBJECT
 public:
  // `name_prefix` starts the object names of the fields ("dna" gives "dna_frequency_source").
  FrequencySourceBox(const QString& name_prefix, QWidget* parent = nullptr);

  // Shows the item's `frequencies` field (null when absent) and the problems found in it.
  void showFrequencies(const nlohmann::json& frequencies, const std::vector<validation::Problem>& problems);
  // The field with the frequencies read from `relative_path` (CSV: locus, allele, frequency or
  // count), keeping a database size and tolerance already given; reported by `edited`.
  void useFile(const QString& relative_path);

  QLabel* sourceLabel() const { return source_; }

 signals:
  void importRequested();
  void edited(const nlohmann::json& frequencies);

 private:
  void databaseSizeEdited();

  nlohmann::json frequencies_;
  QLabel* source_;
  QPushButton* import_;
  QLineEdit* database_size_;
  FieldMessage* message_;
};

}  // namespace counterpoise::editor
