#pragma once
// What one alternative's weight does: the posterior probability of Hp as the fact-finder's weight
// on one alternative (a brother as the donor, a source nothing is known of) goes from 0 to its
// stated value, with Hp's prior odds against the set and the other weights held as stated. The
// values are the core's (sensitivity::hp_as_weight_grows); this only draws them.

#include <QString>
#include <QWidget>

#include <vector>

class QPainter;

namespace counterpoise::editor {

struct WeightGrowthData {
  std::vector<double> fractions;   // of the alternative's stated weight, 0 to 1
  std::vector<double> hp;          // posterior probability of Hp at each fraction
  QString alternative;             // the alternative's id and text, for the axis
  QString note;                    // shown instead of the curve when there is none
};

void paint_weight_growth(QPainter& painter, const QRectF& area, const WeightGrowthData& data);

class WeightGrowthPlot : public QWidget {
  Q_OBJECT
 public:
  explicit WeightGrowthPlot(QWidget* parent = nullptr);
  void setData(WeightGrowthData data);
  const WeightGrowthData& data() const { return data_; }
  QSize sizeHint() const override { return {640, 220}; }

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  WeightGrowthData data_;
};

}  // namespace counterpoise::editor
