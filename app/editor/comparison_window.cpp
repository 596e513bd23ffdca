#include "app/editor/comparison_window.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QSignalBlocker>
#include <QSplitter>
#include <QTableWidget>
#include <QVBoxLayout>

#include <algorithm>

#include "core/comparison/band_move.hpp"
#include "core/comparison/comparison_text.hpp"
#include "core/comparison/log10_change.hpp"
#include "core/numbers/number_text.hpp"
#include "core/validation/display_text.hpp"

namespace counterpoise::editor {

namespace {

QString text_of(const std::string& text) { return QString::fromStdString(text); }

// An effect in words, or a dash where the difference has none of that kind.
QString effect_text(const std::optional<comparison::Log10Change>& change) {
  return change ? text_of(comparison::change_for_readers(*change)) : QStringLiteral("—");
}

QString log10_side(const std::optional<double>& log10) {
  return log10 ? text_of(numbers::log10_for_readers(*log10)) : QObject::tr("absent");
}

// The item data of "Effects on": the combined LR, an alternative's index, the weighted set.
constexpr int kCombinedTarget = -1;
constexpr int kCompoundTarget = -2;

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
      tr("Whose verbal band it alone, changed from A, would move: the combined LR, the LR against an "
         "alternative, the compound LR against the weighted set. These differences are listed first."));
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
  target_ = new QComboBox(this);
  target_->setObjectName("comparisonTarget");
  target_->setToolTip(tr("Whose LR the Alone and Share columns show: the combined LR, the LR against one "
                         "alternative, or the compound LR against the weighted set of alternatives"));
  connect(target_, &QComboBox::currentIndexChanged, this, [this] {
    fillTable();
    fillTargetLine();
  });
  target_line_ = new QLabel(this);
  target_line_->setObjectName("comparisonTargetLine");
  target_line_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  target_line_->setTextFormat(Qt::PlainText);
  target_line_->setWordWrap(true);  // the LR's values and its verbal expression in each version
  memo_ = new QPushButton(tr("Save Memo as PDF…"), this);
  memo_->setObjectName("comparisonMemo");
  memo_->setToolTip(tr("Write the review memo of this comparison, as counterpoise-cli compare -o writes it"));
  connect(memo_, &QPushButton::clicked, this, &ComparisonWindow::memoRequested);
  auto* target_row = new QHBoxLayout;
  target_label_ = new QLabel(tr("Effects on:"), this);
  target_row->addWidget(target_label_);
  target_row->addWidget(target_);
  target_row->addWidget(target_line_, 1);
  target_row->addStretch();
  target_row->addWidget(memo_);
  auto* layout = new QVBoxLayout(this);
  layout->addWidget(heading_);
  layout->addLayout(target_row);
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

  {
    const QSignalBlocker quiet(target_);
    target_->clear();
    const auto& alternatives = result.alternatives;
    target_->addItem(alternatives.by_alternative.empty() || !alternatives.by_alternative.front().in_a()
                         ? tr("the combined LR")
                         : tr("the combined LR (Hp against %1)")
                               .arg(text_of(validation::display_text(alternatives.by_alternative.front().id))),
                     kCombinedTarget);
    for (std::size_t i = 0; i < alternatives.by_alternative.size(); ++i)
      target_->addItem(tr("the LR against %1").arg(text_of(validation::display_text(alternatives.by_alternative[i].id))),
                       static_cast<int>(i));
    if (alternatives.compound) target_->addItem(tr("the compound LR against the weighted set"), kCompoundTarget);
    const bool several = !alternatives.by_alternative.empty();
    target_->setVisible(several);
    target_label_->setVisible(several);
    target_line_->setVisible(several);
  }
  fillTable();
  fillTargetLine();

  QStringList lines;
  for (const auto& line : comparison::comparison_lines(result)) lines << text_of(line);
  text_->setPlainText(lines.join('\n'));
}

const comparison::AlternativeAttribution* ComparisonWindow::chosenTarget() const {
  const int chosen = target_->currentData().toInt();
  if (chosen == kCompoundTarget) return result_.alternatives.compound ? &*result_.alternatives.compound : nullptr;
  if (chosen < 0) return nullptr;
  return &result_.alternatives.by_alternative.at(static_cast<std::size_t>(chosen));
}

void ComparisonWindow::fillTable() {
  const auto* target = chosenTarget();
  // The differences that alone move any verbal conclusion first; within each group the chosen
  // LR's differences, largest share first, then the others in document order.
  std::vector<std::size_t> order = target ? target->by_effect() : result_.by_effect();
  if (target) {
    for (std::size_t k = 0; k < result_.differences.size(); ++k)
      if (std::find(order.begin(), order.end(), k) == order.end()) order.push_back(k);
  }
  order = comparison::movers_first(std::move(order), [this](std::size_t k) { return result_.moves_any_conclusion(k); });
  const auto enters = [&](std::size_t k) {
    if (!target) return result_.differences[k].enters_lr();
    return target->attributed && std::find(target->entering.begin(), target->entering.end(), k) != target->entering.end();
  };
  table_->setRowCount(static_cast<int>(order.size()));
  for (int row = 0; row < static_cast<int>(order.size()); ++row) {
    const std::size_t index = order[static_cast<std::size_t>(row)];
    const auto& difference = result_.differences[index];
    const auto& effect = target ? target->effects[index] : result_.effects[index];
    const bool shared = enters(index);
    const QStringList cells{text_of(validation::display_text(difference.place)),
                            text_of(comparison::kind_words(difference.kind)),
                            text_of(validation::display_text(comparison::change_summary(difference))),
                            shared ? effect_text(effect.combined_alone) : QStringLiteral("—"),
                            shared ? effect_text(effect.combined_share) : QStringLiteral("—"),
                            text_of(comparison::conclusions_moved_cell(result_, index))};
    for (int column = 0; column < ColumnCount; ++column) {
      auto* cell = new QTableWidgetItem(cells[column]);
      cell->setData(Qt::UserRole, static_cast<qulonglong>(index));
      cell->setToolTip(text_of(validation::display_text(comparison::change_words(difference))));
      table_->setItem(row, column, cell);
    }
  }
}

void ComparisonWindow::fillTargetLine() {
  const auto* target = chosenTarget();
  if (!target) {
    target_line_->clear();
    return;
  }
  QString line = tr("log10 LR %1 → %2").arg(log10_side(target->log10_lr_a), log10_side(target->log10_lr_b));
  if (target->in_a() && target->in_b())
    line += tr(", change %1").arg(text_of(comparison::change_for_readers(target->total_change)));
  if (!target->attributed) line += tr("; not attributed: %1").arg(text_of(target->note));
  const bool compound = result_.alternatives.compound && target == &*result_.alternatives.compound;
  const std::string name = compound ? std::string(comparison::kWeightedSetWords)
                                                                     : validation::display_text(target->id);
  line += QStringLiteral(". ") + text_of(comparison::alternative_band_sentence(*target, name));
  target_line_->setText(line);
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
