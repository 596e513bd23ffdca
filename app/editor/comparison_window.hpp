#pragma once
// Compare with…: what differs between another version of the case (a case file, a case in the
// shared store, a sealed revision) and the case as open, and how much each difference moved the
// LR — the comparison `counterpoise-cli compare OTHER THIS` makes (core/comparison), shown as a
// table of the differences, largest effect first, beside the same text the command prints.
// Choosing a difference (double-click, Enter) asks the main window to show its item and field.
// With several alternatives to Hp, "Effects on" chooses whose LR the Alone and Share columns
// show: the combined LR, the LR against one alternative, or the compound LR against the weighted
// set. "Save Memo as PDF…" asks the main window to write the review memo compare -o writes.

#include <QWidget>

#include <string>

#include "core/comparison/case_comparison.hpp"

class QComboBox;
class QLabel;
class QPushButton;
class QTableWidget;
class QPlainTextEdit;

namespace counterpoise::editor {

class ComparisonWindow : public QWidget {
  Q_OBJECT
 public:
  // Columns of the table of differences.
  enum Column { WhereColumn, ChangeColumn, ValuesColumn, AloneColumn, ShareColumn, ConclusionColumn, ColumnCount };

  explicit ComparisonWindow(QWidget* parent = nullptr);

  void showComparison(const comparison::CaseComparison& result);
  // The choices of "Effects on": the combined LR (0), then each alternative, then the weighted set.
  QComboBox* targetChoice() const { return target_; }
  QPushButton* memoButton() const { return memo_; }
  const comparison::CaseComparison& comparison() const { return result_; }

  QTableWidget* differencesTable() const { return table_; }
  // The comparison in words, as `counterpoise-cli compare` prints it.
  QString summaryText() const;
  // The difference shown in `row` (an index into comparison().differences).
  std::size_t differenceAt(int row) const;
  // Emits differenceChosen for the difference in `row` (what double-click and Enter do).
  void chooseRow(int row);

 signals:
  // section ("items", "propositions", …), item id (items only) and field ("" for the whole).
  void differenceChosen(const QString& section, const QString& item, const QString& field);
  // The user asked to save the review memo of this comparison.
  void memoRequested();

 private:
  // The attribution the Alone and Share columns show (null: the combined LR's).
  const comparison::AlternativeAttribution* chosenTarget() const;
  void fillTable();
  void fillTargetLine();

  comparison::CaseComparison result_;
  QLabel* heading_;
  QComboBox* target_;
  QLabel* target_label_;
  QLabel* target_line_;
  QPushButton* memo_;
  QTableWidget* table_;
  QPlainTextEdit* text_;
};

}  // namespace counterpoise::editor
