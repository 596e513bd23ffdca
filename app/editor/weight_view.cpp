#include "app/editor/weight_view.hpp"

#include <QHeaderView>
#include <QLabel>
#include <QSortFilterProxyModel>
#include <QSplitter>
#include <QTableView>
#include <QVBoxLayout>

#include <cmath>

#include "app/editor/contribution_chart.hpp"
#include "app/editor/display_text.hpp"
#include "app/editor/item_table_model.hpp"
#include "app/editor/render_when_visible.hpp"

namespace counterpoise::editor {

WeightView::WeightView(CaseDocument* document, ItemTableModel* items, QWidget* parent) : QWidget(parent), document_(document) {
  auto* layout = new QVBoxLayout(this);
  combined_ = new QLabel(this);
  combined_->setObjectName("combinedResult");
  combined_->setWordWrap(true);
  combined_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  combined_->setStyleSheet("background: #eef3fa; border: 1px solid #b8c8e0; padding: 8px;");
  layout->addWidget(combined_);
  auto* splitter = new QSplitter(Qt::Vertical, this);
  table_ = new QTableView(splitter);
  proxy_ = new QSortFilterProxyModel(this);
  proxy_->setSourceModel(items);
  proxy_->setSortRole(ItemTableModel::RawValueRole);
  table_->setModel(proxy_);
  table_->setSortingEnabled(true);
  table_->sortByColumn(-1, Qt::AscendingOrder);
  table_->setSelectionBehavior(QAbstractItemView::SelectRows);
  table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
  table_->verticalHeader()->hide();
  table_->horizontalHeader()->setStretchLastSection(true);
  for (int c : {ItemTableModel::Model, ItemTableModel::PGivenHp, ItemTableModel::PGivenHd}) table_->hideColumn(c);
  table_->setColumnWidth(ItemTableModel::Title, 220);
  table_->setColumnWidth(ItemTableModel::Interval, 170);
  table_->setColumnWidth(ItemTableModel::Verbal, 200);
  chart_ = new ContributionChart(document, splitter);
  splitter->setStretchFactor(0, 1);
  splitter->setStretchFactor(1, 2);
  layout->addWidget(splitter, 1);
  connect(table_, &QTableView::activated, this, [this](const QModelIndex& index) {
    emit itemActivated(index.data(ItemTableModel::ItemIdRole).toString());
  });
  refresh_ = new RenderWhenVisible(this, [this] { render(); });
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & (Change::evaluation | Change::spread | Change::content)) refresh_->request();
  });
  render();
}

void WeightView::render() {
  const auto& points = document_->points();
  if (!points.combined) {
    combined_->setText(tr("<b>Combined LR: not available.</b> %1").arg(QString::fromStdString(points.combined_problem).toHtmlEscaped()));
    return;
  }
  std::optional<uncertainty::SpreadSummary> spread;
  const auto& full = document_->spread();
  if (full.evaluation && !document_->spreadPending()) spread = full.evaluation->combined.spread;
  const int included = static_cast<int>(std::count_if(points.items.begin(), points.items.end(),
                                                      [](const ItemPoint& p) { return p.evaluated && p.included; }));
  QString text = tr("<b>Combined LR %1</b> &nbsp; (log10 %2) from %n included item(s)", nullptr, included)
                     .arg(lr_text(*points.combined, spread), log10_text(points.combined->log10()));
  if (spread) {
    const QString bound = std::isfinite(spread->conservative_log10)
                              ? lr_text(numbers::LikelihoodRatio::from_log10(spread->conservative_log10), spread)
                              : (spread->conservative_log10 > 0 ? tr("infinite") : tr("0"));
    text += tr("<br>Interval %1; conservative bound %2 (%3)")
                .arg(interval_text(spread), bound, QString::fromStdString(spread->method).toHtmlEscaped());
  } else if (document_->spreadPending()) {
    text += tr("<br><i>Interval: computing…</i>");
  } else if (!full.problem.empty()) {
    text += "<br>" + QString::fromStdString(full.problem).toHtmlEscaped();
  }
  text += "<br>" + QString::fromStdString(points.combined_verbal.sentence).toHtmlEscaped();
  combined_->setText(text);
}

}  // namespace counterpoise::editor
