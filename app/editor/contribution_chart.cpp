#include "app/editor/contribution_chart.hpp"

#include <QPainter>
#include <QPainterPath>

#include <algorithm>
#include <cmath>

#include "app/editor/display_text.hpp"
#include "core/numbers/number_text.hpp"
#include "app/editor/figure_export.hpp"

namespace counterpoise::editor {

ContributionData ContributionData::from(const CaseDocument& document) {
  ContributionData data;
  const auto& points = document.points();
  const auto& full = document.spread();
  const bool spread_current = full.evaluation && !document.spreadPending();
  for (const auto& item : points.items) {
    if (!item.evaluated || !item.included) continue;
    Bar bar;
    bar.id = QString::fromStdString(item.id);
    if (const auto body = document.itemBody(item.id)) bar.title = QString::fromStdString(body->value("title", std::string()));
    bar.log10_lr = item.point.lr.log10();
    if (spread_current)
      for (const auto& evaluated : full.evaluation->items)
        if (evaluated.id == item.id && evaluated.spread)
          bar.interval_log10 = std::pair{evaluated.spread->low_log10, evaluated.spread->high_log10};
    data.bars.push_back(bar);
  }
  if (points.combined) {
    data.combined_log10 = points.combined->log10();
    if (spread_current && full.evaluation->combined.spread)
      data.combined_interval = std::pair{full.evaluation->combined.spread->low_log10, full.evaluation->combined.spread->high_log10};
  } else {
    data.note = QString::fromStdString(points.combined_problem);
  }
  if (data.bars.empty() && data.note.isEmpty()) data.note = QObject::tr("No item is included in the combination.");
  return data;
}

namespace {

// "1", "10", "10²", "10⁻³": a power of ten with a superscript exponent (core/numbers/number_text).
QString power_label(int k) {
  if (k == 0) return QStringLiteral("1");
  if (k == 1) return QStringLiteral("10");
  return QString::fromStdString(numbers::power_of_ten_text(k));
}

}  // namespace

void paint_contributions(QPainter& painter, const QRectF& area, const ContributionData& data, LabelCache* labels) {
  const QFont font = begin_figure(painter, area, QObject::tr("Weight of each item (log10 LR) and the running total"));
  const QFontMetricsF metrics(font);

  // Values to scale: bars, running totals, intervals; infinite values drawn at the edge.
  std::vector<double> values{0.0};
  double total = 0.0;
  bool total_finite = true;
  for (const auto& bar : data.bars) {
    if (std::isfinite(bar.log10_lr)) values.push_back(bar.log10_lr), total += bar.log10_lr, values.push_back(total);
    else total_finite = false;
    if (bar.interval_log10) {
      if (std::isfinite(bar.interval_log10->first)) values.push_back(bar.interval_log10->first);
      if (std::isfinite(bar.interval_log10->second)) values.push_back(bar.interval_log10->second);
    }
  }
  if (data.combined_interval) {
    if (std::isfinite(data.combined_interval->first)) values.push_back(data.combined_interval->first);
    if (std::isfinite(data.combined_interval->second)) values.push_back(data.combined_interval->second);
  }
  double low = std::floor(*std::min_element(values.begin(), values.end()));
  double high = std::ceil(*std::max_element(values.begin(), values.end()));
  if (high - low < 2) high = low + 2;

  const double left = area.left() + metrics.horizontalAdvance("10⁻¹⁰⁰") + 16;
  const double right = area.right() - 12;
  const double top = area.top() + metrics.height() * 2 + 8;
  const double bottom = area.bottom() - metrics.height() * 2 - 12;
  auto y_of = [&](double v) {
    if (!std::isfinite(v)) v = v > 0 ? high : low;
    return bottom - (v - low) / (high - low) * (bottom - top);
  };

  // Axis and grid at each power of ten (thinned when many).
  const int step = std::max(1, static_cast<int>(std::ceil((high - low) / 10.0)));
  for (int k = static_cast<int>(low); k <= static_cast<int>(high); k += step) {
    const double y = y_of(k);
    painter.setPen(QPen(QColor(k == 0 ? 90 : 220, k == 0 ? 90 : 220, k == 0 ? 90 : 220), k == 0 ? 1.2 : 0.8));
    painter.drawLine(QPointF(left, y), QPointF(right, y));
    painter.setPen(Qt::black);
    draw_label(painter, labels, QRectF(area.left(), y - metrics.height() / 2, left - area.left() - 6, metrics.height()),
               Qt::AlignRight | Qt::AlignVCenter, power_label(k));
  }

  if (data.bars.empty()) {
    painter.drawText(QRectF(left, top, right - left, bottom - top), Qt::AlignCenter | Qt::TextWordWrap, data.note);
    painter.restore();
    return;
  }

  const std::size_t slot_count = data.bars.size() + (data.combined_log10 ? 1 : 0);
  const double slot = (right - left) / static_cast<double>(slot_count);
  const double bar_width = std::min(slot * 0.55, 60.0);
  // Labels of narrow bars would run into each other: an id is shown at every k-th bar, k making
  // room for the widest id; a title only where a slot has room for a few letters; a value only
  // where it fits its slot (the Weight table lists every value).
  double widest_id = 0;
  for (const auto& bar : data.bars) widest_id = std::max(widest_id, label_width(labels, font, bar.id));
  const std::size_t id_every = std::max<std::size_t>(1, static_cast<std::size_t>(std::ceil((widest_id + 6) / slot)));
  const bool titles = slot >= 48;
  for (std::size_t i = 0; i < data.bars.size(); ++i) {
    const auto& bar = data.bars[i];
    const double cx = left + slot * (static_cast<double>(i) + 0.5);
    const QColor colour = bar.log10_lr >= 0 ? QColor(52, 101, 164) : QColor(204, 102, 0);
    const QRectF rect(QPointF(cx - bar_width / 2, y_of(std::max(0.0, bar.log10_lr))),
                      QPointF(cx + bar_width / 2, y_of(std::min(0.0, bar.log10_lr))));
    painter.fillRect(rect, colour);
    if (bar.interval_log10) draw_whisker(painter, cx, y_of(bar.interval_log10->first), y_of(bar.interval_log10->second), 4, 1.2);
    painter.setPen(Qt::black);
    if (i % id_every == 0)
      draw_label(painter, labels, QRectF(cx - slot / 2, bottom + 4, slot, metrics.height()), Qt::AlignHCenter, bar.id);
    if (titles) {
      painter.setPen(QColor(90, 90, 90));
      draw_label(painter, labels, QRectF(cx - slot / 2, bottom + 4 + metrics.height(), slot, metrics.height()), Qt::AlignHCenter,
                 metrics.elidedText(bar.title, Qt::ElideRight, slot - 4));
      painter.setPen(Qt::black);
    }
    // The value sits above the bar and above its whisker, never under the whisker's line.
    const QString value = log10_text(bar.log10_lr);
    const double value_bottom = std::min(rect.top(), bar.interval_log10 ? y_of(bar.interval_log10->second) - 2 : rect.top());
    if (label_width(labels, font, value) + 4 <= slot)
      draw_label(painter, labels, QRectF(cx - slot / 2, value_bottom - metrics.height() - 2, slot, metrics.height()),
                 Qt::AlignHCenter, value);
  }
  if (data.combined_log10) {
    const double cx = left + slot * (static_cast<double>(data.bars.size()) + 0.5);
    const double v = *data.combined_log10;
    const QRectF rect(QPointF(cx - bar_width / 2, y_of(std::max(0.0, v))), QPointF(cx + bar_width / 2, y_of(std::min(0.0, v))));
    painter.fillRect(rect, QColor(78, 154, 6));
    if (data.combined_interval)
      draw_whisker(painter, cx, y_of(data.combined_interval->first), y_of(data.combined_interval->second), 5, 1.5);
    painter.setPen(Qt::black);
    QFont bold = font;
    bold.setBold(true);
    painter.setFont(bold);
    draw_label(painter, labels, QRectF(cx - slot / 2, bottom + 4, slot, metrics.height()), Qt::AlignHCenter, QObject::tr("Combined"));
    const double value_bottom =
        std::min(rect.top(), data.combined_interval ? y_of(data.combined_interval->second) - 2 : rect.top());
    draw_label(painter, labels, QRectF(cx - slot / 2, value_bottom - metrics.height() - 2, slot, metrics.height()),
               Qt::AlignHCenter, log10_text(v));
    painter.setFont(font);
  }
  if (total_finite) {
    QPolygonF line;
    line << QPointF(left, y_of(0));
    double cum = 0;
    for (std::size_t i = 0; i < data.bars.size(); ++i) {
      cum += data.bars[i].log10_lr;
      line << QPointF(left + slot * (static_cast<double>(i) + 0.5), y_of(cum));
    }
    painter.setPen(QPen(QColor(164, 0, 0), 1.6, Qt::DashLine));
    painter.drawPolyline(line);
    painter.setBrush(QColor(164, 0, 0));
    for (int i = 1; i < line.size(); ++i) painter.drawEllipse(line[i], 3, 3);
    painter.setBrush(Qt::NoBrush);
  }
  // Legend.
  const double lx = right - 170, ly = area.top() + 6;
  painter.setPen(QPen(QColor(164, 0, 0), 1.6, Qt::DashLine));
  painter.drawLine(QPointF(lx, ly + metrics.height() / 2), QPointF(lx + 24, ly + metrics.height() / 2));
  painter.setPen(Qt::black);
  painter.drawText(QPointF(lx + 30, ly + metrics.ascent()), QObject::tr("running total"));
  painter.restore();
}

ContributionChart::ContributionChart(CaseDocument* document, QWidget* parent) : QWidget(parent), document_(document) {
  setObjectName("contributionChart");
  setMinimumSize(360, 220);
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & (Change::evaluation | Change::spread | Change::content)) {
      data_ = ContributionData::from(*document_);
      update();
    }
  });
  data_ = ContributionData::from(*document_);
}

void ContributionChart::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  paint_contributions(painter, rect(), data_, &labels_);
}

}  // namespace counterpoise::editor
