#pragma once
// The case's history, read-only: the revisions (sealed or open) and the audit trail of every
// edit, from the case store, with the result of re-walking the hash chain (verify).

#include <QWidget>

#include "app/editor/case_document.hpp"

class QLabel;
class QPushButton;
class QTableWidget;

namespace counterpoise::editor {

class HistoryPanel : public QWidget {
  Q_OBJECT
 public:
  // Columns of the audit table. The database role is the row's account in a shared store
  // (enforced by the database); a case file's rows have none, and the column is hidden there.
  enum AuditColumn {
    SeqColumn,
    RevisionColumn,
    WhenColumn,
    ExaminerColumn,
    RoleColumn,
    ActionColumn,
    WhatColumn,
    OldValueColumn,
    NewValueColumn,
    AuditColumnCount
  };

  explicit HistoryPanel(CaseDocument* document, QWidget* parent = nullptr);
  // Re-walks the audit chain now and shows the result; returns whether it verified.
  bool verifyNow();
  QTableWidget* auditTable() const { return audit_; }
  QLabel* verifyLabel() const { return verify_; }

 private:
  void render();
  CaseDocument* document_;
  QLabel* status_;
  QLabel* verify_;
  QPushButton* verify_button_;
  QTableWidget* revisions_;
  QTableWidget* audit_;
};

}  // namespace counterpoise::editor
