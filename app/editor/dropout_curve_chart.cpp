#include "app/editor/dropout_curve_chart.hpp"

#include <QPainter>
#include <QPainterPath>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>

#include "core/numbers/number_text.hpp"

namespace counterpoise::editor {

using nlohmann::json;

namespace {

// Numbers through the one formatter for readers (core/numbers/number_text).
QString d_text(double d) { return QString::fromStdString(numbers::entered_for_readers(d)); }
QString log10_text(double y) { return QString::fromStdString(numbers::log10_for_readers(y)); }
QString whole_text(double y) { return QString::fromStdString(numbers::count_for_readers(static_cast<std::int64_t>(y))); }

// log10 LR of a point of the curve when finite or zero (-inf).
std::optional<double> drawable_log10(const json& lr) {
  if (!lr.is_object()) return std::nullopt;
  const std::string state = lr.value("state", std::string());
  if (state == "zero") return -std::numeric_limits<double>::infinity();
  if (state != "finite" || !lr.contains("log10_lr")) return std::nullopt;
  return lr["log10_lr"].get<double>();
}

}  // namespace

DropoutCurveData DropoutCurveData::from_detail(const json& detail) {
  DropoutCurveData data;
  if (!detail.is_object() || !detail.contains("dropout_curve")) return data;
  const json& curve = detail["dropout_curve"];
  for (const auto& point : curve.value("points", json::array())) {
    const double d = point.value("dropout", 0.0);
    const auto y = drawable_log10(point.value("lr", json()));
    if (!y) data.other.push_back(d);
    else if (std::isinf(*y)) data.zero.push_back(d);
    else data.finite.push_back({d, *y});
  }
  const json minimum = curve.value("minimum", json());
  if (minimum.is_object())
    if (const auto y = drawable_log10(minimum.value("lr", json()))) data.minimum = Point{minimum.value("dropout", 0.0), *y};
  if (detail.contains("dropout") && detail["dropout"].contains("point")) data.point_dropout = detail["dropout"]["point"].get<double>();
  return data;
}

DropoutCurveChart::DropoutCurveChart(QWidget* parent) : QWidget(parent) {
  setObjectName("mixture_dropout_curve");
  setMinimumHeight(180);
}

void DropoutCurveChart::showCurve(DropoutCurveData data) {
  data_ = std::move(data);
  update();
}

void DropoutCurveChart::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  painter.setRenderHint(QPainter::Antialiasing);
  painter.fillRect(rect(), palette().base());
  const QFontMetrics metrics(font());
  const QRectF plot = QRectF(rect()).adjusted(metrics.horizontalAdvance("−00.0") + 14, 10, -14, -2.5 * metrics.height() - 6);
  if (data_.finite.empty()) {
    painter.drawText(rect(), Qt::AlignCenter, tr("No curve: the item has no LR yet."));
    return;
  }
  double low = data_.finite.front().log10_lr, high = low;
  for (const auto& p : data_.finite) {
    low = std::min(low, p.log10_lr);
    high = std::max(high, p.log10_lr);
  }
  // Whole log10 units around the curve, with 0 (LR 1) inside when the curve comes near it.
  low = std::floor(low);
  high = std::ceil(high);
  if (high - low < 1) high = low + 1;
  auto x_of = [&](double d) { return plot.left() + d * plot.width(); };
  auto y_of = [&](double y) { return plot.bottom() - (y - low) / (high - low) * plot.height(); };

  painter.setPen(palette().color(QPalette::Mid));
  painter.drawRect(plot);
  const int steps = static_cast<int>(high - low);
  const int every = std::max(1, steps / 6);
  painter.setPen(palette().color(QPalette::Text));
  for (int i = 0; i <= steps; i += every) {
    const double y = low + i;
    painter.setPen(QPen(palette().color(QPalette::Midlight), 1));
    painter.drawLine(QPointF(plot.left(), y_of(y)), QPointF(plot.right(), y_of(y)));
    painter.setPen(palette().color(QPalette::Text));
    painter.drawText(QRectF(0, y_of(y) - metrics.height() / 2.0, plot.left() - 6, metrics.height()), Qt::AlignRight | Qt::AlignVCenter,
                     whole_text(y));
  }
  for (int i = 0; i <= 4; ++i) {
    const double d = i / 4.0;
    painter.drawText(QRectF(x_of(d) - 30, plot.bottom() + 2, 60, metrics.height()), Qt::AlignCenter, d_text(d));
  }
  painter.drawText(QRectF(plot.left(), plot.bottom() + metrics.height() + 2, plot.width(), metrics.height()), Qt::AlignCenter,
                   tr("drop-out probability d — vertical: log10 LR"));

  if (data_.point_dropout) {
    painter.setPen(QPen(palette().color(QPalette::Dark), 1, Qt::DashLine));
    painter.drawLine(QPointF(x_of(*data_.point_dropout), plot.top()), QPointF(x_of(*data_.point_dropout), plot.bottom()));
  }
  QPainterPath line;
  bool started = false;
  for (const auto& p : data_.finite) {
    const QPointF at(x_of(p.d), y_of(p.log10_lr));
    if (started) line.lineTo(at);
    else line.moveTo(at);
    started = true;
  }
  painter.setPen(QPen(QColor(30, 90, 160), 2));
  painter.drawPath(line);
  // LR zero has no place on a log scale: its points are ticks on the bottom edge (the lowest
  // point's label then says LR 0).
  painter.setPen(QPen(QColor(176, 0, 32), 2));
  for (double d : data_.zero) painter.drawLine(QPointF(x_of(d), plot.bottom()), QPointF(x_of(d), plot.bottom() - 6));
  if (data_.minimum) {
    const double y = std::isinf(data_.minimum->log10_lr) ? low : data_.minimum->log10_lr;
    const QPointF at(x_of(data_.minimum->d), y_of(y));
    painter.setPen(QPen(QColor(176, 0, 32), 2));
    painter.setBrush(Qt::NoBrush);
    painter.drawEllipse(at, 5, 5);
    const QString label = std::isinf(data_.minimum->log10_lr)
                              ? tr("lowest: LR 0 at d = %1").arg(d_text(data_.minimum->d))
                              : tr("lowest: log10 LR %1 at d = %2").arg(log10_text(data_.minimum->log10_lr), d_text(data_.minimum->d));
    const double width = metrics.horizontalAdvance(label) + 4;
    const double left = std::clamp(at.x() - width / 2, plot.left() + 2, plot.right() - width - 2);
    const double top = at.y() + 8 + metrics.height() < plot.bottom() ? at.y() + 8 : at.y() - 8 - 2 * metrics.height();
    painter.drawText(QRectF(left, top, width, metrics.height()), Qt::AlignCenter, label);
  }
}

}  // namespace counterpoise::editor
