#pragma once
// The prior explorer: how the case's combined LR would move prior odds the fact-finder might
// hold. The user moves the prior (log10 odds, or "one of N possible sources") and sees the
// posterior probability and its complement (both exact, from the core), the band from the LR's
// interval and the priors at which the posterior crosses the case's thresholds. The prior is a
// view setting, never part of the case: in casework mode the view says it is an illustration for
// the fact-finder. With several weighted alternatives to Hp it also shows how the posterior of Hp
// moves as one alternative's weight goes from 0 to its stated value (WeightGrowthPlot), at the
// selected prior odds of Hp against the set.

#include <QWidget>

#include <optional>
#include <vector>

#include "app/editor/case_document.hpp"
#include "core/sensitivity/prior_sweep.hpp"

class QComboBox;
class QGroupBox;
class QLabel;
class QLineEdit;
class QSlider;
class QPainter;

namespace counterpoise::editor {

struct PriorPlotData {
  double log10_from = -8, log10_to = 4;
  std::vector<double> x, y, y_low, y_high;  // posterior probability over log10 prior odds
  std::vector<sensitivity::ThresholdCrossing> crossings;
  std::optional<double> current;            // the selected prior
  bool casework = true;
  QString note;                             // when there is no combined LR
};

void paint_prior_plot(QPainter& painter, const QRectF& area, const PriorPlotData& data);

class PriorPlot : public QWidget {
  Q_OBJECT
 public:
  explicit PriorPlot(QWidget* parent = nullptr);
  void setData(PriorPlotData data);
  const PriorPlotData& data() const { return data_; }
  QSize sizeHint() const override { return {640, 320}; }

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  PriorPlotData data_;
};

class RenderWhenVisible;
class WeightGrowthPlot;

class PriorExplorer : public QWidget {
  Q_OBJECT
 public:
  explicit PriorExplorer(CaseDocument* document, QWidget* parent = nullptr);

  // Selects prior log10 odds (clamped to the slider's range only for the slider's position).
  void setPriorLog10Odds(double log10_odds);
  double priorLog10Odds() const { return log10_prior_; }
  PriorPlot* plot() const { return plot_; }
  QLabel* posteriorLabel() const { return posterior_; }
  QLabel* complementLabel() const { return complement_; }
  // What one alternative's weight does (hidden unless the case weighs several alternatives).
  QGroupBox* weightGrowthBox() const { return weight_box_; }
  QComboBox* weightAlternative() const { return weight_alternative_; }
  WeightGrowthPlot* weightGrowthPlot() const { return weight_plot_; }
  QLabel* weightGrowthSummary() const { return weight_summary_; }
  // Brings the view up to date now if a change arrived while it was hidden (for an export).
  void renderIfStale();

 private:
  void render();
  void renderWeightGrowth();

  CaseDocument* document_;
  double log10_prior_ = -3.0;
  QLabel* banner_;
  QSlider* slider_;
  QLineEdit* one_of_n_;
  QLabel *prior_, *posterior_, *complement_, *band_, *crossings_, *lr_;
  PriorPlot* plot_;
  QGroupBox* weight_box_;
  QComboBox* weight_alternative_;
  QLabel* weight_summary_;
  WeightGrowthPlot* weight_plot_;
  RenderWhenVisible* refresh_ = nullptr;
};

}  // namespace counterpoise::editor
