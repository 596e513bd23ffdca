#pragma once
// The reasoning guard's findings as a list beside the case: where each finding is, what it is
// (the family's published name), why it is a problem, and the suggested rewrite, which one click
// applies as an undoable edit of that text field. The text fields highlight the same spans.

#include <QWidget>

#include "app/editor/case_document.hpp"
#include "app/editor/edit_commands.hpp"

class QLabel;
class QPushButton;
class QTreeWidget;

namespace counterpoise::editor {

class GuardPanel : public QWidget {
  Q_OBJECT
 public:
  GuardPanel(CaseDocument* document, EditFacade* edits, QWidget* parent = nullptr);
  QTreeWidget* list() const { return list_; }
  // Applies the suggested rewrite of the finding at `row`; returns whether an edit was made.
  bool applySuggestion(int row);

 signals:
  // The user picked a finding: show its field.
  void showField(const counterpoise::editor::TextFieldRef& where);

 private:
  void render();
  void showDetails();
  CaseDocument* document_;
  EditFacade* edits_;
  QLabel* summary_;
  QTreeWidget* list_;
  QLabel* details_;
  QPushButton* apply_;
  std::vector<TextFinding> shown_;
};

// "Case: question asked", "Item E2: description" ...
QString describe_field(const TextFieldRef& where);

}  // namespace counterpoise::editor
