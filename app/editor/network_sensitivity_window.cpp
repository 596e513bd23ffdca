#include "app/editor/network_sensitivity_window.hpp"

#include <QDialogButtonBox>
#include <QHeaderView>
#include <QLabel>
#include <QLayout>
#include <QScrollBar>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>

#include "app/editor/display_text.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::editor {

namespace {
// A table entry (its mean where it is a distribution) is an intermediate value of the LR:
// shown to the working precision, as the report's sensitivity table does.
QString entry_text(double x) { return QString::fromStdString(numbers::decimal_for_readers(x, numbers::kWorkingFigures)); }
}  // namespace

NetworkSensitivityWindow::NetworkSensitivityWindow(QWidget* parent) : QDialog(parent) {
  setObjectName("networkSensitivity");
  setWindowTitle(tr("Network sensitivity"));
  auto* layout = new QVBoxLayout(this);
  summary_ = new QLabel(this);
  summary_->setWordWrap(true);
  layout->addWidget(summary_);
  table_ = new QTableWidget(0, ColumnCount, this);
  table_->setObjectName("sensitivityTable");
  table_->setHorizontalHeaderLabels({tr("Node"), tr("Given"), tr("State"), tr("Value"), tr("Range tried"),
                                     tr("log10 LR at low end"), tr("log10 LR at high end")});
  table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
  table_->setSelectionBehavior(QAbstractItemView::SelectRows);
  table_->verticalHeader()->hide();
  table_->horizontalHeader()->setStretchLastSection(true);
  layout->addWidget(table_, 1);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::close);
  layout->addWidget(buttons);
  resize(900, 480);
}

void NetworkSensitivityWindow::showRows(const std::string& item_id, const models::network::Network& network,
                                        const std::vector<models::network::EntrySensitivity>& rows,
                                        const numbers::LikelihoodRatio& lr, const std::string& against) {
  const QString id = QString::fromStdString(item_id);
  setWindowTitle(tr("Network sensitivity of %1").arg(id));
  summary_->setText(
      tr("Each table entry of %1's network was moved on its own across the range shown, the other entries of its row "
         "adjusted in proportion so the row still sums to one, and the log10 likelihood ratio recomputed at both ends. "
         "The entries that move it most come first. At the tables' means the log10 LR is %2%3.")
          .arg(id, log10_text(lr.log10()),
               against.empty() ? QString() : tr(" (Hp against %1, the first alternative)").arg(QString::fromStdString(against))));
  table_->setRowCount(static_cast<int>(rows.size()));
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const auto& e = rows[i];
    const auto& node = network.nodes[e.node];
    const QStringList cells{QString::fromStdString(node.name),
                            QString::fromStdString(network.row_label(e.node, e.row)),
                            QString::fromStdString(node.states[e.state]),
                            entry_text(e.value),
                            tr("%1 to %2 (%3)").arg(entry_text(e.range.low), entry_text(e.range.high),
                                                    QString::fromStdString(e.range.basis)),
                            QString::fromStdString(models::network::sensitivity_end_text(e.lr_at_low)),
                            QString::fromStdString(models::network::sensitivity_end_text(e.lr_at_high))};
    for (int c = 0; c < cells.size(); ++c) table_->setItem(static_cast<int>(i), c, new QTableWidgetItem(cells[c]));
  }
  table_->resizeColumnsToContents();
  // Wide enough for every column, both ends of the range included (the window system keeps it on
  // the screen).
  const int wanted = table_->horizontalHeader()->length() + table_->verticalScrollBar()->sizeHint().width() +
                     layout()->contentsMargins().left() + layout()->contentsMargins().right() + 8;
  resize(std::max(width(), wanted), height());
}

}  // namespace counterpoise::editor
