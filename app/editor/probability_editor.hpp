#pragma once
// Editor for one assigned probability, P(E|Hp) or P(E|Hd): a single value, a range, a Beta
// distribution or survey counts "k of n" — the four forms the core reads
// (core/probability/probability_assignment.hpp). It shows the document's value and reports the
// JSON the user's input stands for; invalid input is passed on as typed so the core's reader
// names the problem.

#include <QComboBox>
#include <QLabel>
#include <QLineEdit>
#include <QStackedWidget>
#include <QWidget>

#include <optional>

#include <nlohmann/json.hpp>

#include "app/editor/field_widgets.hpp"

namespace counterpoise::editor {

class ProbabilityEditor : public QWidget {
  Q_OBJECT
 public:
  enum class Form { point = 0, interval, beta, counts };
  explicit ProbabilityEditor(QWidget* parent = nullptr);

  void showValue(const std::optional<nlohmann::json>& value);
  // The marginal probability the LR uses (from the core's point evaluation), or nothing.
  void showMean(const QString& text);
  // Shows the core's problems with this value; a value typed that is not a number (or a single
  // value outside 0 to 1) is named in the user's words instead, with an example.
  void showProblems(const std::vector<validation::Problem>& problems);
  // That message for the fields as typed, or "" when each is a number in range.
  QString typedValueProblem() const;
  Form form() const { return static_cast<Form>(form_->currentIndex()); }
  QLineEdit* pointField() const { return point_; }
  QComboBox* formBox() const { return form_; }

  // The JSON for the fields as they stand.
  nlohmann::json currentValue() const;

 signals:
  // The user changed the value (once per committed change: see commit_typing).
  void edited(const nlohmann::json& value);

 private:
  QLineEdit* addLine(QWidget* page, const QString& placeholder, const QString& tooltip);
  void emitEdited();

  QComboBox* form_;
  QStackedWidget* pages_;
  QLineEdit *point_, *low_, *high_, *beta_a_, *beta_b_, *k_, *n_;
  QComboBox* scale_;
  QLabel* mean_;
  FieldMessage* message_;
  std::optional<nlohmann::json> prior_;  // counts prior kept as read
};

}  // namespace counterpoise::editor
