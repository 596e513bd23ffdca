#pragma once
// The form of a continuous-two-level item: the control and recovered measurements, the
// within-source standard deviation (given, or pooled from replicate groups of reference
// sources), and the between-source population (normal with a mean and standard deviation, or
// background data through a kernel density, with import of a background file). Under the
// fields, the core's reading of them: the two means, the standard deviation used, the
// population and bandwidth. Below the population, where the recovered material's source comes
// from if Hd is true: the same population, or one of its own, normal or from background data
// (population_hd; in a case with several alternatives to Hp, per alternative, chosen in a list:
// alternatives.<id>.population_hd).
// Each change is one undoable edit through the EditFacade; the core's messages are shown under the
// part of the form they concern.

#include <QWidget>

#include <map>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "app/editor/alternative_chooser.hpp"
#include "core/validation/input_error.hpp"

class QComboBox;
class QGroupBox;
class QLabel;
class QLineEdit;
class QPushButton;
class QStackedWidget;

namespace counterpoise::editor {

class BackgroundDataFields;
class EditFacade;
class FieldMessage;
class TextField;

class MeasurementForm : public QWidget {
  Q_OBJECT
 public:
  enum class Within { sd = 0, replicates };
  enum class Population { normal = 0, background };
  // The population of the recovered material's sources if Hd (the chosen alternative) is true.
  enum class HdPopulation { same = 0, normal, background };

  MeasurementForm(EditFacade* edits, QWidget* parent = nullptr);

  // Shows the model fields `fields` of item `item_id`, the core's point detail of the item
  // (null when the core refused it) and the problems the core found in the model's fields.
  void showFields(const std::string& item_id, const nlohmann::json& fields, const nlohmann::json& detail,
                  const std::vector<validation::Problem>& problems);
  // Takes the between-source population from column `column` of the background file
  // `relative_path`, keeping a bandwidth and method already given. The import button asks.
  void useBackgroundFile(const QString& relative_path, const QString& column);
  // The same for the population of the recovered material's sources if Hd (the chosen
  // alternative) is true, as one edit of its population_hd. Its import button asks.
  void useHdBackgroundFile(const QString& relative_path, const QString& column);
  void chooseWithin(Within kind);
  void choosePopulation(Population kind);
  void chooseHdPopulation(HdPopulation kind);
  // The case's alternatives to Hp (empty with two propositions), before showFields: the item
  // form then passes the detail of the item's model against chosenAlternative().
  void showAlternatives(const AlternativeList& alternatives);
  std::size_t chosenAlternative() const { return hd_chooser_->chosenIndex(); }

  // For tests.
  QLineEdit* controlField() const { return control_; }
  QLineEdit* recoveredField() const { return recovered_; }
  QLineEdit* withinSdField() const { return within_sd_; }
  TextField* replicatesField() const { return replicates_; }
  QLineEdit* normalMeanField() const { return normal_mean_; }
  QLineEdit* normalSdField() const { return normal_sd_; }
  QLineEdit* bandwidthField() const;
  BackgroundDataFields* backgroundFields() const { return background_; }
  BackgroundDataFields* hdBackgroundFields() const { return hd_background_; }
  QLabel* readingLabel() const { return reading_; }
  AlternativeChooser* alternativeChooser() const { return hd_chooser_; }
  QComboBox* hdPopulationKind() const { return hd_kind_; }
  QLineEdit* hdMeanField() const { return hd_mean_; }
  QLineEdit* hdSdField() const { return hd_sd_; }

 signals:
  void importRequested();
  // The same for the population if Hd (the chosen alternative) is true.
  void hdImportRequested();
  // The user chose another alternative: the item form shows the form again with its detail.
  void alternativeChosen();

 private:
  QWidget* buildMeasurements();
  QWidget* buildWithin();
  QWidget* buildPopulation();
  QWidget* buildHdPopulation();
  // population_hd as the fields hold it for Hd or the chosen alternative; null when absent.
  nlohmann::json hdPopulation() const;
  // Writes it (null: the same population as Hp's) as one edit.
  void setHdPopulation(const nlohmann::json& population);
  void render();
  void setField(const std::string& field, std::optional<nlohmann::json> value);
  // A problem's message naming the value it concerns ("Recovered measurement 2 of 3, “1,5x”, is
  // not a number…"); other problems keep the core's message.
  QString valueNamed(const validation::Problem& problem) const;
  void setFields(const nlohmann::json& fields);
  void setPopulation(const nlohmann::json& population);
  nlohmann::json normalPopulation() const;
  nlohmann::json kdePopulation() const;

  EditFacade* edits_;
  std::string id_;
  nlohmann::json fields_ = nlohmann::json::object();
  nlohmann::json detail_;
  std::vector<validation::Problem> problems_;
  bool rendering_ = false;
  // What the other choice held when the user switched away from it, so switching back restores it.
  std::map<std::string, nlohmann::json> set_aside_;

  QLineEdit* control_;
  QLineEdit* recovered_;
  FieldMessage* measurement_message_;
  QComboBox* within_kind_;
  QStackedWidget* within_pages_;
  QLineEdit* within_sd_;
  TextField* replicates_;
  FieldMessage* within_message_;
  QComboBox* population_kind_;
  QStackedWidget* population_pages_;
  QLineEdit* normal_mean_;
  QLineEdit* normal_sd_;
  QComboBox* normal_form_;
  BackgroundDataFields* background_;
  FieldMessage* population_message_;
  QGroupBox* hd_box_;
  AlternativeChooser* hd_chooser_;
  QComboBox* hd_kind_;
  QWidget* hd_normal_;
  QLineEdit* hd_mean_;
  QLineEdit* hd_sd_;
  BackgroundDataFields* hd_background_;
  FieldMessage* hd_message_;
  QLabel* reading_;
};

}  // namespace counterpoise::editor
