#include "app/editor/comparison_window.hpp"

#include <QHeaderView>
#include <QLabel>
#include <QPlainTextEdit>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>

#include "core/comparison/comparison_text.hpp"
#include "core/comparison/log10_change.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

namespace {

QString text_of(const std::string& text) { return QString::fromStdString(text); }

// An effect in words, or a dash where the difference has none of that kind.
QString effect_text(const std::optional<comparison::Log10Change>& change) {
  return change ? text_of(comparison::change_for_readers(*change)) : QStringLiteral("—");
}

}  // namespace

ComparisonWindow::ComparisonWindow(QWidget* parent) : QWidget(parent) {
  setWindowTitle(tr("Comparison — Counterpoise"));
  heading_ = new QLabel(this);
  heading_->setWordWrap(true);
  heading_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  table_ = new QTableWidget(0, ColumnCount, this);
  table_->setObjectName("comparisonDifferences");
  table_->setHorizontalHeaderLabels({tr("Where"), tr("Change"), tr("Was → now"), tr("Alone (log10)"),
                                     tr("Share (log10)"), tr("Moves the conclusion")});
  table_->horizontalHeaderItem(AloneColumn)->setToolTip(tr("Its effect on the combined log10 LR, changed by itself from A"));
  table_->horizontalHeaderItem(ShareColumn)->setToolTip(
      tr("Its share of the change of the combined log10 LR from A to B; the shares add up to the change"));
  table_->horizontalHeaderItem(ConclusionColumn)->setToolTip(
      tr("Whether it alone would put the combined LR in another verbal band"));
  table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
  table_->setSelectionBehavior(QAbstractItemView::SelectRows);
  table_->setSelectionMode(QAbstractItemView::SingleSelection);
  table_->verticalHeader()->hide();
  table_->horizontalHeader()->setSectionResizeMode(ValuesColumn, QHeaderView::Stretch);
  table_->setColumnWidth(WhereColumn, 220);
  table_->setColumnWidth(ChangeColumn, 230);
  table_->setColumnWidth(AloneColumn, 110);
  table_->setColumnWidth(ShareColumn, 110);
  table_->setColumnWidth(ConclusionColumn, 150);
  table_->setToolTip(tr("Double-click a difference (or press Enter) to show its item and field in the editor."));
  connect(table_, &QTableWidget::cellActivated, this, [this](int row, int) { chooseRow(row); });
  text_ = new QPlainTextEdit(this);
  text_->setObjectName("comparisonText");
  text_->setReadOnly(true);
  text_->setLineWrapMode(QPlainTextEdit::WidgetWidth);
  auto* split = new QSplitter(Qt::Vertical, this);
  split->addWidget(table_);
  split->addWidget(text_);
  split->setStretchFactor(0, 3);
  split->setStretchFactor(1, 2);
  auto* layout = new QVBoxLayout(this);
  layout->addWidget(heading_);
  layout->addWidget(split, 1);
  resize(1180, 720);
}

void ComparisonWindow::showComparison(const comparison::CaseComparison& result) {
  result_ = result;
  QStringList heading{tr("<b>A</b> %1 (SHA-256 %2)").arg(text_of(validation::display_text(result.a.label)).toHtmlEscaped(),
                                                        text_of(result.a.sha256.substr(0, 16)) + "…"),
                      tr("<b>B</b> %1 (SHA-256 %2)").arg(text_of(validation::display_text(result.b.label)).toHtmlEscaped(),
                                                        text_of(result.b.sha256.substr(0, 16)) + "…"),
                      text_of(comparison::version_line("A", result.a)).toHtmlEscaped(),
                      text_of(comparison::version_line("B", result.b)).toHtmlEscaped(),
                      tr("Change of the combined log10 LR from A to B: %1. %2")
                          .arg(text_of(comparison::change_for_readers(result.total_change)),
                               result.band_changes() ? tr("<b>The verbal conclusion changes.</b>")
                                                     : tr("The verbal conclusion does not change."))};
  heading_->setText(heading.join("<br>"));

  const auto order = result.by_effect();
  table_->setRowCount(static_cast<int>(order.size()));
  for (int row = 0; row < static_cast<int>(order.size()); ++row) {
    const std::size_t index = order[static_cast<std::size_t>(row)];
    const auto& difference = result.differences[index];
    const auto& effect = result.effects[index];
    const bool enters = difference.enters_lr();
    const QStringList cells{text_of(validation::display_text(difference.place)),
                            text_of(comparison::kind_words(difference.kind)),
                            text_of(validation::display_text(comparison::change_summary(difference))),
                            enters ? effect_text(effect.combined_alone) : QStringLiteral("—"),
                            enters ? effect_text(effect.combined_share) : QStringLiteral("—"),
                            result.moves_conclusion[index] ? tr("yes") : QString()};
    for (int column = 0; column < ColumnCount; ++column) {
      auto* cell = new QTableWidgetItem(cells[column]);
      cell->setData(Qt::UserRole, static_cast<qulonglong>(index));
      cell->setToolTip(text_of(validation::display_text(comparison::change_words(difference))));
      table_->setItem(row, column, cell);
    }
  }

  QStringList lines;
  for (const auto& line : comparison::comparison_lines(result)) lines << text_of(line);
  text_->setPlainText(lines.join('\n'));
}

QString ComparisonWindow::summaryText() const { return text_->toPlainText(); }

std::size_t ComparisonWindow::differenceAt(int row) const {
  return static_cast<std::size_t>(table_->item(row, 0)->data(Qt::UserRole).toULongLong());
}

void ComparisonWindow::chooseRow(int row) {
  if (row < 0 || row >= table_->rowCount()) return;
  const auto& path = result_.differences[differenceAt(row)].path;
  emit differenceChosen(text_of(path.section), text_of(path.item_id), text_of(path.field));
}

}  // namespace counterpoise::editor
