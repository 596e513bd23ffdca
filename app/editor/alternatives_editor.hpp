#pragma once
// The propositions tab's list of alternatives to Hp (propositions.alternatives): switch a
// two-proposition case to several alternatives and back, add, remove and reorder alternatives,
// edit each one's id, text, weight and "unspecified" mark. It only shows the document and asks
// the EditFacade: what a switch, a new id or a removal does to the items' values is the core's
// (interchange/alternative_edits.hpp). Each change is one undo step; an edit that would make
// the list unreadable is refused with the reader's message in the user's words, and a removal
// that would take values out of items names them and waits for the user's yes.

#include <QWidget>

#include <functional>

#include "app/editor/case_document.hpp"
#include "app/editor/edit_commands.hpp"

class QCheckBox;
class QLabel;
class QPushButton;
class QTableWidget;

namespace counterpoise::editor {

class FieldMessage;

class AlternativesEditor : public QWidget {
  Q_OBJECT
 public:
  enum Column { IdColumn, TextColumn, WeightColumn, UnspecifiedColumn, ColumnCount };

  AlternativesEditor(CaseDocument* document, EditFacade* edits, QWidget* parent = nullptr);
  void render();

  // Asks the user to confirm a removal that takes values out of items (`text` names them);
  // replaced by tests. The default shows a question whose default answer is No.
  void setConfirmation(std::function<bool(const QString& text)> confirm) { confirm_ = std::move(confirm); }

  QTableWidget* table() const { return table_; }
  QPushButton* switchButton() const { return to_several_; }
  QPushButton* backButton() const { return to_two_; }
  QPushButton* addButton() const { return add_; }
  QPushButton* removeButton() const { return remove_; }
  QPushButton* upButton() const { return up_; }
  QPushButton* downButton() const { return down_; }
  QCheckBox* weightsBox() const { return weighted_; }
  // The refusal or the core's problems with the list, as shown under it.
  QString message() const;

 signals:
  // Whether the case now has several alternatives (the panel hides the Hd field then).
  void severalChanged(bool several);

 private:
  nlohmann::json list() const;
  void cellEdited(int row, int column);
  void setList(nlohmann::json list, const QString& text);
  void apply(const std::function<interchange::AlternativesEdit(const nlohmann::json&)>& edit, const QString& text);
  void removeCurrent();
  void moveCurrent(int by);
  void setWeighted(bool on);
  void refuse(const QString& reason);

  CaseDocument* document_;
  EditFacade* edits_;
  std::function<bool(const QString&)> confirm_;
  bool rendering_ = false;
  bool in_cell_edit_ = false;
  QString refusal_;  // the last refused edit, shown until the next change

  QLabel* intro_;
  QPushButton* to_several_;
  QWidget* list_box_;
  QTableWidget* table_;
  QCheckBox* weighted_;
  QPushButton *add_, *remove_, *up_, *down_, *to_two_;
  FieldMessage* message_;
};

}  // namespace counterpoise::editor
