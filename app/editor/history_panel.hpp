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
  // Columns of the audit table. The account column holds the row's account beside the examiner:
  // the operating-system account the program ran under for a case file ("Operating-system
  // account"), the database role that wrote the row for a case in a shared store ("Database
  // role", enforced by the database).
  enum AuditColumn {
    SeqColumn,
    RevisionColumn,
    WhenColumn,
    ExaminerColumn,
    AccountColumn,
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
