#include "app/editor/weight_growth_plot.hpp"

#include <QPainter>

#include <algorithm>

#include "app/editor/figure_export.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::editor {

void paint_weight_growth(QPainter& painter, const QRectF& area, const WeightGrowthData& data) {
  const QFont font = begin_figure(painter, area,
                                  QObject::tr("Illustration for the fact-finder: posterior probability of Hp as one "
                                              "alternative's weight grows"));
  const QFontMetricsF metrics(font);
  // The vertical axis spans the curve (a small weight may move the posterior by little or by
  // much; on 0 to 1 a curve near 0.002 would lie flat on the axis), padded by a tenth each side.
  double low = 0.0, high = 1.0;
  if (!data.hp.empty()) {
    const auto [least, most] = std::minmax_element(data.hp.begin(), data.hp.end());
    const double pad = std::max(0.1 * (*most - *least), 0.01 * *most + 1e-300);
    low = std::max(0.0, *least - pad), high = std::min(1.0, *most + pad);
  }
  const double ticks[] = {low, 0.5 * (low + high), high};
  double label_width = 0.0;
  for (double p : ticks)
    label_width = std::max(label_width, metrics.horizontalAdvance(QString::fromStdString(numbers::decimal_for_readers(p))));
  const double left = area.left() + label_width + 18;
  const double right = area.right() - 14;
  const double top = area.top() + metrics.height() * 2 + 8;
  const double bottom = area.bottom() - metrics.height() * 2 - 14;
  auto x_of = [&](double f) { return left + f * (right - left); };
  auto y_of = [&](double p) { return bottom - (p - low) / (high - low) * (bottom - top); };

  painter.setPen(QPen(QColor(225, 225, 225), 0.8));
  for (double p : ticks) painter.drawLine(QPointF(left, y_of(p)), QPointF(right, y_of(p)));
  for (double f : {0.25, 0.5, 0.75}) painter.drawLine(QPointF(x_of(f), top), QPointF(x_of(f), bottom));
  painter.setPen(Qt::black);
  for (double p : ticks)
    painter.drawText(QRectF(area.left(), y_of(p) - metrics.height() / 2, left - area.left() - 6, metrics.height()),
                     Qt::AlignRight | Qt::AlignVCenter, QString::fromStdString(numbers::decimal_for_readers(p)));
  const QString low_end = QObject::tr("weight 0"), high_end = QObject::tr("stated weight");
  painter.drawText(QRectF(left, bottom + 4, metrics.horizontalAdvance(low_end) + 4, metrics.height()), Qt::AlignLeft, low_end);
  const double high_width = metrics.horizontalAdvance(high_end) + 4;
  painter.drawText(QRectF(right - high_width, bottom + 4, high_width, metrics.height()), Qt::AlignRight, high_end);
  painter.drawText(QRectF(left, bottom + 6 + metrics.height(), right - left, metrics.height()), Qt::AlignHCenter,
                   metrics.elidedText(QObject::tr("weight of %1 (posterior probability of Hp on the vertical axis)").arg(data.alternative),
                                      Qt::ElideRight, right - left));
  painter.drawRect(QRectF(QPointF(left, top), QPointF(right, bottom)));

  if (data.fractions.empty()) {
    painter.drawText(QRectF(left, top, right - left, bottom - top), Qt::AlignCenter | Qt::TextWordWrap, data.note);
    painter.restore();
    return;
  }
  QPolygonF curve;
  for (std::size_t i = 0; i < data.fractions.size(); ++i) curve << QPointF(x_of(data.fractions[i]), y_of(data.hp[i]));
  painter.setPen(QPen(QColor(32, 74, 135), 2.0));
  painter.drawPolyline(curve);
  painter.restore();
}

WeightGrowthPlot::WeightGrowthPlot(QWidget* parent) : QWidget(parent) {
  setObjectName("weightGrowthPlot");
  setMinimumSize(360, 180);
}

void WeightGrowthPlot::setData(WeightGrowthData data) {
  data_ = std::move(data);
  update();
}

void WeightGrowthPlot::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  paint_weight_growth(painter, rect(), data_);
}

}  // namespace counterpoise::editor
