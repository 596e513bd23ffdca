#pragma once
// The form of one item of findings: what the findings are, the level they address, the model
// and its inputs (a page per model), whether the item enters the combination and why, and the
// item's LR as it stands, updated with every keystroke. Pages: assigned probabilities, a
// reported LR, transfer findings, a DNA profile (DnaProfileForm), continuous measurements
// (MeasurementForm), a DNA mixture (DnaMixtureForm), and for networks the fields as JSON beside
// the drawing with the structured NetworkForm below. The file dialogs for the data tables are asked for here.

#include <QWidget>

#include <string>

#include <nlohmann/json.hpp>

#include "app/editor/case_document.hpp"
#include "app/editor/edit_commands.hpp"

class QCheckBox;
class QComboBox;
class QLabel;
class QLineEdit;
class QPushButton;

namespace counterpoise::editor {

class DnaMixtureForm;
class DnaProfileForm;
class FieldMessage;
class MeasurementForm;
class NetworkForm;
class NetworkView;
class ProbabilityEditor;
class TextField;

class ItemForm : public QWidget {
  Q_OBJECT
 public:
  ItemForm(CaseDocument* document, EditFacade* edits, QWidget* parent = nullptr);

  void setItem(const std::string& id);
  const std::string& item() const { return id_; }
  void render();

  // For tests and the guard panel.
  ProbabilityEditor* probabilityEditor(bool given_hp) const { return given_hp ? p_hp_ : p_hd_; }
  TextField* descriptionField() const { return description_; }
  QLabel* resultLabel() const { return result_; }
  QLineEdit* reportedLrField() const { return lr_; }
  NetworkView* networkView() const { return network_view_; }
  NetworkForm* networkForm() const { return network_form_; }
  DnaProfileForm* dnaForm() const { return dna_form_; }
  DnaMixtureForm* mixtureForm() const { return mixture_form_; }
  MeasurementForm* measurementForm() const { return measurement_form_; }
  // With several alternatives: the field of each alternative, by alternative id (nullptr for
  // an id the case does not have).
  ProbabilityEditor* alternativeProbability(const std::string& alternative) const;
  QLineEdit* alternativeLrField(const std::string& alternative) const;
  QComboBox* alternativeRelationship(const std::string& alternative) const;
  // The IBD coefficients typed for an alternative's donor ("other (IBD coefficients)"), or nullptr.
  QLineEdit* alternativeIbdField(const std::string& alternative) const;
  // The low and high ends of the reported interval against an alternative, or nullptrs.
  std::pair<QLineEdit*, QLineEdit*> alternativeIntervalFields(const std::string& alternative) const;
  // The transfer field `field` ("t0_hd" or "tn_hd") of an alternative, or nullptr.
  QLineEdit* alternativeTransferField(const std::string& alternative, const std::string& field) const;

 private:
  QWidget* buildAssignedPage();
  QWidget* buildReportedLrPage();
  QWidget* buildTransferPage();
  QWidget* buildDnaPage();
  QWidget* buildMeasurementPage();
  QWidget* buildMixturePage();
  QWidget* buildDataPage();
  QString askForTable(const QString& title);
  QString askForColumn(const QString& path, const std::string& field);
  QString relativeToCase(const QString& path) const;
  void setField(const std::string& field, std::optional<nlohmann::json> value);
  void setCombination(const char* key, std::optional<nlohmann::json> value);
  void renderResult();
  // The case's alternatives as the document holds them: (id, text); empty for two propositions.
  std::vector<std::pair<std::string, std::string>> alternatives() const;
  // Rebuilds the per-alternative rows when the alternatives' ids or texts changed.
  void buildAlternativeRows(const std::vector<std::pair<std::string, std::string>>& alternatives);
  void renderAlternativeRows(const nlohmann::json& body);
  // Sets member `alternative` of the object field `field` (p_given, alternatives) to `value`.
  // The donor under `alternative` from its relationship list and IBD field, as one edit.
  void setAlternativeDonor(const std::string& alternative, const QComboBox* relationship, QLineEdit* ibd);
  void setKeyed(const std::string& field, const std::string& alternative, const nlohmann::json& value);
  std::optional<nlohmann::json> field(const std::string& name) const;
  // The core's problems of the item at `field_prefix`, those in an alternative's entry naming it
  // ("Alternative 2 (Hd2), tn_hd: ...").
  std::vector<validation::Problem> problemsAt(const std::string& field_prefix) const;
  // A network item of a case with several alternatives as the drawing reads it (see the body).
  nlohmann::json drawnNetwork(const nlohmann::json& body) const;
  // The point evaluation's detail of the item against alternative `alternative` (by position),
  // computed once per edit; `first` when the item was not evaluated against it.
  nlohmann::json chosenDetail(std::size_t alternative, const nlohmann::json& first) const;

  CaseDocument* document_;
  EditFacade* edits_;
  std::string id_;
  bool rendering_ = false;

  QLabel* heading_;
  QLabel* result_;
  QLineEdit* title_;
  TextField* description_;
  QComboBox* level_;
  QComboBox* model_;
  QLineEdit* source_data_;
  FieldMessage* common_message_;
  // One page per model family; only the current one is shown (hidden pages take no space).
  std::vector<QWidget*> model_pages_;
  void showModelPage(int page);
  // assigned
  ProbabilityEditor *p_hp_ = nullptr, *p_hd_ = nullptr;
  QLabel* hd_label_ = nullptr;
  // With several alternatives: one row per alternative on the assigned, reported-LR, transfer and DNA pages.
  std::vector<std::pair<std::string, std::string>> shown_alternatives_;
  QWidget *assigned_alternatives_ = nullptr, *lr_alternatives_ = nullptr, *dna_alternatives_ = nullptr;
  std::vector<std::pair<std::string, ProbabilityEditor*>> alternative_p_;
  std::vector<std::pair<std::string, QLineEdit*>> alternative_lr_;
  std::vector<std::pair<std::string, QComboBox*>> alternative_relationship_;
  std::vector<std::pair<std::string, QLineEdit*>> alternative_ibd_;  // beside each relationship
  struct TransferRow {
    std::string alternative, field;
    QLineEdit* line;
  };
  std::vector<TransferRow> alternative_transfer_;
  struct IntervalRow {
    std::string alternative;
    QLineEdit *low, *high;
  };
  std::vector<IntervalRow> alternative_interval_;
  QWidget* transfer_alternatives_ = nullptr;
  FieldMessage* dna_alternatives_message_ = nullptr;
  QWidget* lr_range_ = nullptr;
  // reported-lr
  QLineEdit *lr_ = nullptr, *lr_low_ = nullptr, *lr_high_ = nullptr, *lr_method_ = nullptr;
  FieldMessage* lr_message_ = nullptr;
  // transfer
  std::vector<std::pair<std::string, QLineEdit*>> transfer_fields_;
  FieldMessage* transfer_message_ = nullptr;
  DnaProfileForm* dna_form_ = nullptr;
  DnaMixtureForm* mixture_form_ = nullptr;
  MeasurementForm* measurement_form_ = nullptr;
  // networks (and any model without a form of its own): the fields as JSON
  TextField* model_json_ = nullptr;
  QCheckBox* show_json_ = nullptr;
  NetworkView* network_view_ = nullptr;  // shown beside the fields for network items
  NetworkForm* network_form_ = nullptr;  // the structured form below them, for network items
  QLabel* data_hint_ = nullptr;
  FieldMessage* data_message_ = nullptr;
  // combination
  QCheckBox* included_;
  TextField* independence_;
  QLineEdit* exclusion_reason_;
  FieldMessage* combination_message_;
  TextField* notes_;
};

}  // namespace counterpoise::editor
