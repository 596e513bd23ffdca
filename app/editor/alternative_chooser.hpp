#pragma once
// The choice of the alternative to Hp whose own inputs a model's form shows and edits, in a
// case with several alternatives (hidden otherwise): a list of the alternatives by id and text.
// A form with more per-alternative inputs than fit one row per alternative (a mixture's
// contributors, a population) keeps one chooser, reads and writes the chosen alternative's entry
// (`alternatives.<id>`), and shows the core's reading against it. The choice survives a re-render
// and falls back to the first alternative when the chosen one is removed.

#include <QWidget>

#include <string>
#include <utility>
#include <vector>

class QComboBox;
class QLabel;

namespace counterpoise::editor {

using AlternativeList = std::vector<std::pair<std::string, std::string>>;  // (id, text)

class AlternativeChooser : public QWidget {
  Q_OBJECT
 public:
  // `label` stands before the list ("Under the alternative"); `object_name` names the list box.
  AlternativeChooser(const QString& label, const QString& object_name, QWidget* parent = nullptr);

  // Offers `alternatives` (empty: a case with two propositions; the chooser hides).
  void showAlternatives(const AlternativeList& alternatives);
  // The chosen alternative's id; empty with two propositions.
  const std::string& chosen() const { return chosen_; }
  // Its position in the list (0 with two propositions).
  std::size_t chosenIndex() const;
  bool several() const { return !alternatives_.empty(); }
  // "Hd" with two propositions, else the chosen id: how the form's labels name the alternative.
  QString chosenName() const;
  QComboBox* box() const { return box_; }

 signals:
  // The user chose another alternative.
  void chosenChanged();

 private:
  QComboBox* box_;
  AlternativeList alternatives_;
  std::string chosen_;
};

}  // namespace counterpoise::editor
