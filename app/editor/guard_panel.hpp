#pragma once
// The reasoning guard's findings as a list beside the case: where each finding is, what it is
// (the family's published name), why it is a problem, and the suggested rewrite, which is shown
// in place before it is applied as an undoable edit of that text field. The text fields
// highlight the same spans. After them, one row per check on how the case is set up
// (core/guard/case_guard.hpp), the warnings validate prints beside the wording.

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
  // Shows the finding at `row` with its sentence as it is and as the suggested rewrite would
  // make it, in a dialog (object name "rewritePreview"); Apply applies it, Cancel changes
  // nothing. Returns whether an edit was made.
  bool previewSuggestion(int row);
  // Applies the suggested rewrite of the finding at `row` to its own field only (the rest of the
  // field, and every other field, unchanged); returns whether an edit was made.
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
  std::vector<guard::CaseWarning> checks_;  // the rows after shown_'s
};

// "Case: question asked", "Item E2: description" ...
QString describe_field(const TextFieldRef& where);

// Where a check on the case points: "Item G1: notes", "Propositions: hd", "Priors".
QString describe_check_place(const guard::CaseWarning& check);

}  // namespace counterpoise::editor
