#pragma once
// The form of a dna-single-source item. The questioned and the reference profile side by side,
// one row per locus (alleles separated by commas), with the core's reading of each locus: used,
// with its match probability and the allele frequencies it took (floored ones marked); not
// interpretable; differing from the reference (an exclusion); not compared; a sex marker. Above
// the profiles: theta, the alternative donor under Hd (a standard relationship or IBD
// coefficients) and the minimum allele frequency; below them, where the allele frequencies come
// from, with import of a frequency table. Each change is one undoable edit of one field through
// the EditFacade; the core's messages are shown under the part of the form they concern.

#include <QWidget>

#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

class QComboBox;
class QLabel;
class QLineEdit;
class QPushButton;
class QTableWidget;

namespace counterpoise::editor {

class EditFacade;
class FieldMessage;
class FrequencySourceBox;

class DnaProfileForm : public QWidget {
  Q_OBJECT
 public:
  enum Column { LocusColumn = 0, QuestionedColumn, ReferenceColumn, ReadingColumn, FrequenciesColumn };

  DnaProfileForm(EditFacade* edits, QWidget* parent = nullptr);

  // Shows the model fields `fields` of item `item_id`, the core's point detail of the item
  // (null when the core refused it) and the problems the core found in the model's fields.
  void showFields(const std::string& item_id, const nlohmann::json& fields, const nlohmann::json& detail,
                  const std::vector<validation::Problem>& problems);
  // Takes the allele frequencies from `relative_path` (CSV: locus, allele, frequency), keeping
  // a database size and tolerance already given. The import button asks for the file.
  void useFrequencyFile(const QString& relative_path);

  // For tests.
  QLineEdit* thetaField() const { return theta_; }
  QComboBox* relationshipBox() const { return relationship_; }
  // Shows or hides the one donor choice (hidden while the case has several alternatives, whose
  // relationships the item form asks per alternative).
  void showSharedDonor(bool shown);
  QLineEdit* ibdField() const { return ibd_; }
  QTableWidget* profileTable() const { return profiles_; }
  QLabel* frequencySource() const;
  int rowOfLocus(const QString& locus) const;
  void addLocus(const QString& locus);
  void removeLocusAt(int row);

 signals:
  void importRequested();

 private:
  QWidget* buildSettings();
  QWidget* buildProfiles();
  QWidget* buildFrequencies();
  void render();
  void renderReadings();
  void setField(const std::string& field, std::optional<nlohmann::json> value);
  void setFields(const nlohmann::json& fields);  // several fields at once: one undo step
  void setGenotype(int row, int column);
  void renameLocus(int row);
  void setRelationship();
  nlohmann::json profile(const char* key) const;

  EditFacade* edits_;
  std::string id_;
  nlohmann::json fields_ = nlohmann::json::object();
  nlohmann::json detail_;
  std::vector<validation::Problem> problems_;
  std::vector<std::string> row_loci_;  // the locus each table row shows, as written
  bool rendering_ = false;
  bool editing_cell_ = false;                       // inside the table's cellChanged
  std::optional<validation::Problem> form_problem_;  // a locus name the form itself refused

  QLineEdit* theta_;
  QComboBox* relationship_;
  QWidget* donor_ = nullptr;
  QLineEdit* ibd_;
  QLineEdit* min_frequency_;
  FieldMessage* settings_message_;
  QTableWidget* profiles_;
  QComboBox* new_locus_;
  QLineEdit* uninterpretable_;
  FieldMessage* profile_message_;
  FrequencySourceBox* frequencies_box_;
};

}  // namespace counterpoise::editor
