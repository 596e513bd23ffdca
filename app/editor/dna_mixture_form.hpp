#pragma once
// The form of a dna-mixture item. Above, the settings: theta, the drop-in probability c, the
// drop-out probability d (a number, or a distribution given as JSON and shown in words), the
// drop-out of a homozygote and the minimum allele frequency. Then the loci, one row each: the
// observed alleles, those marked uncertain (below the threshold), beside one column per reference profile (named by the reference's name), with
// the core's reading of the locus (its LR at the point drop-out and the genotype sets of the
// unknowns summed over under each proposition). Then who contributed under Hp and under Hd: a
// check box per named person, their own drop-out probability if they have one, and the number of
// unknown people. In a case with several alternatives to Hp a chooser above them picks the
// alternative whose contributors the Hd column shows and edits (alternatives.<id>.hd, the shared
// hd being the default it replaces), and the locus readings and the curve are the LR against
// that alternative. Then the curve of the LR over d
// with its lowest value marked, and where the allele frequencies come from. Loci and people are
// added by name and removed with buttons under the table (a person's removal also takes them out
// of both propositions and their own drop-out probability). Each change is one
// undoable edit of one field through the EditFacade; the core's messages are shown under the
// part of the form they concern, naming the locus and the field.

#include <QWidget>

#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "app/editor/alternative_chooser.hpp"
#include "core/validation/input_error.hpp"

class QCheckBox;
class QComboBox;
class QGroupBox;
class QGridLayout;
class QLabel;
class QLineEdit;
class QPushButton;
class QSpinBox;
class QTableWidget;

namespace counterpoise::editor {

class DropoutCurveChart;
class EditFacade;
class FieldMessage;
class FrequencySourceBox;

class DnaMixtureForm : public QWidget {
  Q_OBJECT
 public:
  // The table's first columns; the references follow, then the two reading columns.
  enum Column { LocusColumn = 0, ObservedColumn, UncertainColumn, FirstReferenceColumn };

  DnaMixtureForm(EditFacade* edits, QWidget* parent = nullptr);

  // Shows the model fields `fields` of item `item_id`, the core's point detail of the item
  // (null when the core refused it) and the problems the core found in the model's fields.
  void showFields(const std::string& item_id, const nlohmann::json& fields, const nlohmann::json& detail,
                  const std::vector<validation::Problem>& problems);
  // The case's alternatives to Hp (empty with two propositions), before showFields: the item form
  // then passes the detail of the item's model against chosenAlternative().
  void showAlternatives(const AlternativeList& alternatives);
  std::size_t chosenAlternative() const { return hd_chooser_->chosenIndex(); }
  // Takes the allele frequencies from `relative_path`, keeping a database size already given.
  void useFrequencyFile(const QString& relative_path);

  // For tests.
  QLineEdit* thetaField() const { return theta_; }
  QLineEdit* dropinField() const { return dropin_; }
  QLineEdit* dropoutField() const { return dropout_; }
  QLabel* dropoutWords() const { return dropout_words_; }
  QTableWidget* lociTable() const { return loci_; }
  int rowOfLocus(const QString& locus) const;
  int columnOfReference(const QString& name) const;
  int lrColumn() const { return FirstReferenceColumn + static_cast<int>(reference_names_.size()); }
  int genotypeSetsColumn() const { return lrColumn() + 1; }
  QCheckBox* contributorBox(const char* side, const QString& name) const;
  // A named person's own drop-out probability (empty: the shared d), or null.
  QLineEdit* ownDropoutField(const QString& name) const;
  AlternativeChooser* alternativeChooser() const { return hd_chooser_; }
  QSpinBox* unknownsBox(const char* side) const { return std::string(side) == "hp" ? hp_unknowns_ : hd_unknowns_; }
  DropoutCurveChart* curveChart() const { return curve_; }
  QLabel* curveSummary() const { return curve_summary_; }
  QLabel* frequencySource() const;
  QComboBox* newLocusField() const { return new_locus_; }
  QPushButton* addLocusButton() const { return add_locus_; }
  QPushButton* removeLocusButton() const { return remove_locus_; }
  QLineEdit* newPersonField() const { return new_person_; }
  QPushButton* addPersonButton() const { return add_person_; }
  QPushButton* removePersonButton() const { return remove_person_; }

 signals:
  void importRequested();
  // The user chose another alternative: the item form shows the form again with its detail.
  void alternativeChosen();

 private:
  QWidget* buildSettings();
  QWidget* buildLoci();
  QWidget* buildContributors();
  QWidget* buildCurve();
  void render();
  void renderTable();
  void renderReadings();
  void renderContributors();
  void renderCurve();
  void showProblems();
  void setField(const std::string& field, std::optional<nlohmann::json> value);
  void setAlleles(int row, int column);
  void setContributor(const char* side, const std::string& name, bool contributes);
  void setOwnDropout(const std::string& name, const QString& text);
  void setProposition(const char* side, const char* key, int value);
  QWidget* buildTableButtons(QWidget* parent);
  void updateTableButtons();
  // Each one undoable edit of the item's model fields.
  void addLocus();
  void removeCurrentLocus();
  void addPerson();
  void removeCurrentPerson();
  void setModelFields(const nlohmann::json& fields);
  nlohmann::json object_field(const char* key) const;
  // The contributors under `side` ("hp" or "hd"): with several alternatives, "hd" is the chosen
  // alternative's entry, or the shared hd it would replace when the entry has none.
  nlohmann::json proposition(const char* side) const;
  void setPropositionValue(const char* side, const nlohmann::json& value);
  // The locus and the column a problem's field points at ("observed.D8S1179[1]",
  // "references.Mr Dray.TH01"), when it points into the table.
  std::optional<std::pair<std::string, int>> cell_of(const std::string& field) const;

  EditFacade* edits_;
  std::string id_;
  nlohmann::json fields_ = nlohmann::json::object();
  nlohmann::json detail_;
  std::vector<validation::Problem> problems_;
  std::vector<std::string> row_loci_;         // the locus each table row shows, as written
  std::vector<std::string> reference_names_;  // the person each reference column shows
  bool rendering_ = false;
  bool editing_cell_ = false;  // inside the table's cellChanged

  QLineEdit* theta_;
  QLineEdit* dropin_;
  QLineEdit* dropout_;
  QLabel* dropout_words_;
  QLineEdit* dropout_homozygote_;
  QLineEdit* min_frequency_;
  FieldMessage* settings_message_;
  QTableWidget* loci_;
  FieldMessage* loci_message_;
  QComboBox* new_locus_;
  QPushButton* add_locus_;
  QPushButton* remove_locus_;
  QLineEdit* new_person_;
  QPushButton* add_person_;
  QPushButton* remove_person_;
  QGridLayout* contributors_grid_;
  std::vector<std::string> contributor_rows_;  // the people the check boxes stand for
  std::map<std::string, std::pair<QCheckBox*, QCheckBox*>> contributor_boxes_;  // name: Hp, Hd
  std::map<std::string, QLineEdit*> own_dropout_fields_;                         // name: own d
  AlternativeChooser* hd_chooser_;
  QLabel* hd_heading_ = nullptr;
  QLabel* hd_counts_heading_;
  QGroupBox* curve_box_;
  QSpinBox* hp_unknowns_;
  QSpinBox* hd_unknowns_;
  QSpinBox* hp_stated_;
  QSpinBox* hd_stated_;
  QLabel* hp_total_;
  QLabel* hd_total_;
  FieldMessage* contributors_message_;
  DropoutCurveChart* curve_;
  QLabel* curve_summary_;
  FrequencySourceBox* frequencies_box_;
};

}  // namespace counterpoise::editor
