#pragma once
// The weight of the findings: every item's LR, log10 LR, interval and verbal expression, the
// contribution chart and the combined result with its interval, all re-rendered from the
// document (point values at once, intervals when the background evaluation arrives).

#include <QWidget>

#include "app/editor/case_document.hpp"

class QLabel;
class QTableView;
class QSortFilterProxyModel;

namespace counterpoise::editor {

class ContributionChart;
class ItemTableModel;
class RenderWhenVisible;

class WeightView : public QWidget {
  Q_OBJECT
 public:
  WeightView(CaseDocument* document, ItemTableModel* items, QWidget* parent = nullptr);
  ContributionChart* chart() const { return chart_; }
  QLabel* combinedLabel() const { return combined_; }
  QTableView* table() const { return table_; }

 signals:
  void itemActivated(const QString& id);

 private:
  void render();
  CaseDocument* document_;
  QLabel* combined_;
  QTableView* table_;
  QSortFilterProxyModel* proxy_;
  ContributionChart* chart_;
  RenderWhenVisible* refresh_;
};

}  // namespace counterpoise::editor
