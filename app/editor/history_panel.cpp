#include "app/editor/history_panel.hpp"

#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>

#include "app/editor/render_when_visible.hpp"
#include "core/store/audit_row_words.hpp"
#include "core/store/case_store.hpp"

namespace counterpoise::editor {

namespace {
QTableWidget* make_table(QWidget* parent, const QStringList& headers) {
  auto* table = new QTableWidget(parent);
  table->setColumnCount(static_cast<int>(headers.size()));
  table->setHorizontalHeaderLabels(headers);
  table->setEditTriggers(QAbstractItemView::NoEditTriggers);
  table->setSelectionBehavior(QAbstractItemView::SelectRows);
  table->verticalHeader()->hide();
  table->horizontalHeader()->setStretchLastSection(true);
  return table;
}

void set_row(QTableWidget* table, int row, const QStringList& cells) {
  for (int c = 0; c < cells.size(); ++c) table->setItem(row, c, new QTableWidgetItem(cells[c]));
}

QString shown(const std::string& value) {
  if (value.empty()) return QObject::tr("(none)");
  QString text = QString::fromStdString(value);
  return text.size() > 120 ? text.left(117) + "…" : text;
}
}  // namespace

HistoryPanel::HistoryPanel(CaseDocument* document, QWidget* parent) : QWidget(parent), document_(document) {
  auto* layout = new QVBoxLayout(this);
  status_ = new QLabel(this);
  status_->setWordWrap(true);
  layout->addWidget(status_);
  auto* verify_row = new QHBoxLayout;
  verify_ = new QLabel(this);
  verify_->setObjectName("verifyResult");
  verify_->setWordWrap(true);
  verify_button_ = new QPushButton(tr("&Verify the audit trail"), this);
  verify_button_->setToolTip(tr("Re-walks the hash chain and replays every edit to check that nothing was changed behind "
                                "the program's back."));
  verify_row->addWidget(verify_button_);
  verify_row->addWidget(verify_, 1);
  layout->addLayout(verify_row);
  auto* splitter = new QSplitter(Qt::Vertical, this);
  revisions_ = make_table(splitter, {tr("Revision"), tr("State"), tr("Sealed at"), tr("Sealed by"), tr("Report"), tr("State digest (SHA-256)")});
  // The account column's header is set by render(): it depends on where the case is.
  audit_ = make_table(splitter, {tr("#"), tr("Rev."), tr("When (UTC)"), tr("Examiner"), QString(), tr("Action"),
                                 tr("What"), tr("Old value"), tr("New value")});
  audit_->setObjectName("auditTable");
  splitter->setStretchFactor(1, 3);
  layout->addWidget(splitter, 1);
  connect(verify_button_, &QPushButton::clicked, this, [this] { verifyNow(); });
  // Reading the audit trail costs a query per row: only when the panel can be seen.
  auto* refresh = new RenderWhenVisible(this, [this] { render(); });
  connect(document_, &CaseDocument::changed, this, [refresh](Changes what) {
    if (what & (Change::history | Change::file)) refresh->request();
  });
  render();
}

bool HistoryPanel::verifyNow() {
  auto* store = document_->caseStore();
  if (!store) return false;
  try {
    const auto report = store->verify();
    if (report.ok()) {
      verify_->setText(tr("<span style='color:#2e7d32'><b>Verified.</b></span> %1 audit rows and %2 revision(s) fit the hash chain and the current state.")
                           .arg(report.rows_checked)
                           .arg(report.revisions));
      return true;
    }
    verify_->setText(tr("<span style='color:#b00020'><b>Does not verify:</b></span> row %1: %2")
                         .arg(report.problem->seq)
                         .arg(QString::fromStdString(report.problem->reason).toHtmlEscaped()));
  } catch (const std::exception& error) {
    verify_->setText(tr("<b>Cannot verify:</b> %1").arg(QString::fromStdString(error.what()).toHtmlEscaped()));
  }
  return false;
}

void HistoryPanel::render() {
  auto* store = document_->caseStore();
  verify_button_->setEnabled(store != nullptr);
  if (!store) {
    status_->setText(tr("History is kept for case files (.cpcase): every edit is committed with an audit row, and issuing "
                        "a report seals a revision. Use File ▸ Save As and choose a case file to start the audit trail."));
    verify_->clear();
    revisions_->setRowCount(0);
    audit_->setRowCount(0);
    return;
  }
  status_->setText((document_->inDatabase() ? tr("Shared case %1 — current revision %2, examiner %3%4")
                                             : tr("Case file %1 — current revision %2, examiner %3%4"))
                       .arg(document_->displayName())
                       .arg(store->current_revision())
                       .arg(document_->examiner().isEmpty() ? tr("not named") : document_->examiner(),
                            document_->readOnly() ? tr(" (open read-only: %1)").arg(document_->readOnlyReason()) : QString()));
  const auto revisions = store->revisions();
  revisions_->setRowCount(static_cast<int>(revisions.size()));
  for (std::size_t i = 0; i < revisions.size(); ++i) {
    const auto& r = revisions[i];
    set_row(revisions_, static_cast<int>(i),
            {QString::number(r.revision), r.sealed() ? tr("sealed") : tr("open"), QString::fromStdString(r.sealed_at),
             QString::fromStdString(r.sealed_by), QString::fromStdString(r.report_file_name), QString::fromStdString(r.state_sha256)});
  }
  revisions_->resizeColumnsToContents();
  const auto rows = store->audit_rows();
  const bool in_database = document_->inDatabase();
  auto* account_header = audit_->horizontalHeaderItem(AccountColumn);
  account_header->setText(in_database ? tr("Database role") : tr("Operating-system account"));
  account_header->setToolTip(
      in_database ? tr("The database role that wrote the row, recorded and enforced by the shared store itself")
                  : tr("The operating-system account the program ran under when the row was written, taken from the "
                       "system (the examiner column is the name the examiner declared)"));
  audit_->setRowCount(static_cast<int>(rows.size()));
  // Newest first: the last edit is what the user looks for.
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const auto& a = rows[rows.size() - 1 - i];
    const auto words = store::audit_row_words(a);
    // The row's account: the database role in a shared store (never absent there), the
    // operating-system account in a case file; rows written before accounts were recorded
    // (case format version 1) have none.
    const QString account = a.account ? QString::fromStdString(a.account.value()) : tr("(not recorded)");
    set_row(audit_, static_cast<int>(i),
            {QString::number(a.seq), QString::number(a.revision), QString::fromStdString(a.at), QString::fromStdString(words.who),
             account, QString::fromStdString(words.action), QString::fromStdString(words.place), shown(words.old_value),
             shown(words.new_value)});
    // A value (a description, a review note) is often longer than its cell: the whole of it on hover.
    audit_->item(static_cast<int>(i), OldValueColumn)->setToolTip(QString::fromStdString(words.old_value));
    audit_->item(static_cast<int>(i), NewValueColumn)->setToolTip(QString::fromStdString(words.new_value));
  }
  audit_->resizeColumnsToContents();
  // A long old value would push the new one out of sight: the two value columns share what the
  // other columns leave (the whole value is on hover).
  int others = 0;
  for (int c = 0; c < AuditColumnCount; ++c)
    if (c != OldValueColumn && c != NewValueColumn) others += audit_->columnWidth(c);
  const int widest_value = std::max(160, (audit_->viewport()->width() - others) / 2);
  if (audit_->columnWidth(OldValueColumn) > widest_value) audit_->setColumnWidth(OldValueColumn, widest_value);
  verifyNow();
}

}  // namespace counterpoise::editor
