#pragma once
// The contribution chart: each included item's log10 LR as a bar, the running total as a line
// through the cumulative sums, and the combined log10 LR with its interval at the end, so a
// reader sees which findings carry the weight. Drawn with QPainter so the same drawing goes to
// the screen, a PNG and an SVG.

#include <QString>
#include <QWidget>

#include <optional>
#include <vector>

#include "app/editor/case_document.hpp"
#include "app/editor/label_cache.hpp"

class QPainter;

namespace counterpoise::editor {

struct ContributionData {
  struct Bar {
    QString id, title;
    double log10_lr;  // ±inf for zero / infinite
    std::optional<std::pair<double, double>> interval_log10;
  };
  std::vector<Bar> bars;                 // included, evaluated items in document order
  std::optional<double> combined_log10;  // absent when not combined
  std::optional<std::pair<double, double>> combined_interval;
  QString note;                          // shown when there is nothing to draw

  static ContributionData from(const CaseDocument& document);
};

// Draws the chart into `area`; with `labels`, through that cache of laid-out text (the widget),
// without, directly (a figure exported to a file).
void paint_contributions(QPainter& painter, const QRectF& area, const ContributionData& data, LabelCache* labels = nullptr);

class ContributionChart : public QWidget {
  Q_OBJECT
 public:
  explicit ContributionChart(CaseDocument* document, QWidget* parent = nullptr);
  const ContributionData& data() const { return data_; }
  QSize sizeHint() const override { return {640, 320}; }

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  CaseDocument* document_;
  ContributionData data_;
  LabelCache labels_;
};

}  // namespace counterpoise::editor
