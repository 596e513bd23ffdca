#pragma once
// The curve of a mixture item's log10 LR over the drop-out probability d in [0, 1], as the core
// computed it (the "dropout_curve" of the dna-mixture model's point detail), with the d that
// minimises the LR marked and the d the per-locus values are shown at drawn as a dashed line.
// Where the LR is zero (an allele of a named contributor that cannot drop out at small d) the
// points are ticks on the bottom edge, not drawn as a number; infinite or undefined points are
// left out of the line (the form says where they are).

#include <QWidget>

#include <optional>
#include <vector>

#include <nlohmann/json.hpp>

namespace counterpoise::editor {

struct DropoutCurveData {
  struct Point {
    double d;
    double log10_lr;  // -inf for LR zero
  };
  std::vector<Point> finite;            // the points with a finite LR, in order of d
  std::vector<double> zero;             // d of the points with LR zero
  std::vector<double> other;            // d of the points with LR infinite or undefined
  std::optional<Point> minimum;         // the lowest LR (finite or zero)
  std::optional<double> point_dropout;  // d of the per-locus values

  // From the model's point detail (empty when it has no curve).
  static DropoutCurveData from_detail(const nlohmann::json& detail);
};

class DropoutCurveChart : public QWidget {
  Q_OBJECT
 public:
  explicit DropoutCurveChart(QWidget* parent = nullptr);
  void showCurve(DropoutCurveData data);
  const DropoutCurveData& data() const { return data_; }
  QSize sizeHint() const override { return {520, 220}; }
  QSize minimumSizeHint() const override { return {320, 180}; }

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  DropoutCurveData data_;
};

}  // namespace counterpoise::editor
