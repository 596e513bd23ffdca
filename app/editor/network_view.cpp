#include "app/editor/network_view.hpp"

#include <QFontMetricsF>
#include <QPainter>
#include <QPainterPath>
#include <QPalette>

#include <algorithm>
#include <cmath>
#include <exception>

namespace counterpoise::editor {

namespace {

constexpr double kMargin = 12.0;
constexpr double kColumnGap = 24.0;
constexpr double kRowGap = 44.0;
constexpr double kPadding = 8.0;

}  // namespace

NetworkView::NetworkView(QWidget* parent) : QWidget(parent) {
  setObjectName("network_view");
  setAccessibleName(tr("Drawing of the network"));
  setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Expanding);
}

void NetworkView::showNetwork(const nlohmann::json& item, const std::string& item_id, const QString& alternative_states) {
  alternative_states_ = alternative_states;
  try {
    network_ = models::network::read_network(item, item_id, validation::Location{item_id, ""});
    layout_ = models::network::layered_layout(network_.dag());
    drawn_ = true;
    problem_.clear();
  } catch (const std::exception& error) {
    drawn_ = false;
    network_ = {};
    layout_ = {};
    problem_ = QString::fromStdString(error.what());
  }
  setToolTip(drawn_ ? QString() : tr("The graph is drawn once the network's fields are valid."));
  // Boxes keep their text readable: the widget never gets narrower than the layout needs.
  setMinimumSize(drawn_ ? sizeHint() : minimumSizeHint());
  updateGeometry();
  update();
}

QStringList NetworkView::nodeNames() const {
  QStringList names;
  if (!drawn_) return names;
  for (const auto& node : network_.nodes) names << QString::fromStdString(node.name);
  return names;
}

QString NetworkView::nodeLabel(std::size_t node) const {
  const auto& n = network_.nodes[node];
  if (node == network_.proposition.node) {
    const auto names = [&n](const std::vector<std::size_t>& states) {
      QStringList list;
      for (std::size_t s : states) list << QString::fromStdString(n.states[s]);
      return list.join(", ");
    };
    if (!alternative_states_.isEmpty()) return tr("Hp: %1 · %2").arg(names(network_.proposition.hp_states), alternative_states_);
    return tr("Hp: %1 · Hd: %2").arg(names(network_.proposition.hp_states), names(network_.proposition.hd_states));
  }
  for (const auto& finding : network_.findings)
    if (finding.node == node) return tr("observed: %1").arg(QString::fromStdString(n.states[finding.state]));
  if (n.states.size() > 3) return tr("%1 states").arg(n.states.size());
  QStringList states;
  for (const auto& state : n.states) states << QString::fromStdString(state);
  return states.join(" / ");
}

QSizeF NetworkView::boxSize() const {
  QFont bold = font();
  bold.setBold(true);
  const QFontMetricsF name_metrics(bold);
  const QFontMetricsF label_metrics(font());
  double width = 60.0;
  for (std::size_t i = 0; i < network_.nodes.size(); ++i) {
    width = std::max(width, name_metrics.horizontalAdvance(QString::fromStdString(network_.nodes[i].name)));
    width = std::max(width, label_metrics.horizontalAdvance(nodeLabel(i)));
  }
  return {width + 2 * kPadding, name_metrics.height() + label_metrics.height() + 2 * kPadding};
}

QSize NetworkView::sizeHint() const {
  if (!drawn_) return {240, 120};
  const QSizeF box = boxSize();
  const std::size_t widest = layout_.layer_widths.empty() ? 1 : *std::max_element(layout_.layer_widths.begin(), layout_.layer_widths.end());
  const std::size_t layers = std::max<std::size_t>(1, layout_.layer_widths.size());
  return QSize(static_cast<int>(std::ceil(2 * kMargin + widest * box.width() + (widest - 1) * kColumnGap)),
               static_cast<int>(std::ceil(2 * kMargin + layers * box.height() + (layers - 1) * kRowGap)));
}

QSize NetworkView::minimumSizeHint() const { return {160, 100}; }

QPointF NetworkView::slotCentre(std::size_t layer, std::size_t position) const {
  const QSizeF box = boxSize();
  const std::size_t layers = std::max<std::size_t>(1, layout_.layer_widths.size());
  const std::size_t slot_count = layer < layout_.layer_widths.size() ? std::max<std::size_t>(1, layout_.layer_widths[layer]) : 1;
  // Each layer is spread over the full width, so narrow layers sit centred under wide ones.
  const double column = (width() - 2 * kMargin) / static_cast<double>(slot_count);
  const double row = layers > 1 ? (height() - 2 * kMargin - box.height()) / static_cast<double>(layers - 1) : 0.0;
  const double y = layers > 1 ? kMargin + box.height() / 2 + layer * row : height() / 2.0;
  return {kMargin + (position + 0.5) * column, y};
}

std::vector<QRectF> NetworkView::nodeRects() const {
  std::vector<QRectF> rects;
  if (!drawn_) return rects;
  const QSizeF box = boxSize();
  for (const auto& placement : layout_.nodes) {
    const QPointF centre = slotCentre(placement.layer, placement.position);
    rects.emplace_back(centre.x() - box.width() / 2, centre.y() - box.height() / 2, box.width(), box.height());
  }
  return rects;
}

void NetworkView::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  painter.setRenderHint(QPainter::Antialiasing);
  painter.fillRect(rect(), palette().color(QPalette::Base));
  const QColor ink = palette().color(QPalette::Text);
  if (!drawn_) {
    painter.setPen(palette().color(QPalette::PlaceholderText));
    painter.drawText(rect().adjusted(8, 8, -8, -8), Qt::AlignCenter | Qt::TextWordWrap,
                     tr("The graph is drawn once the network's fields are valid."));
    return;
  }
  const auto rects = nodeRects();

  // Arrows first, so boxes sit on top of their ends.
  painter.setPen(QPen(ink, 1.2));
  for (const auto& edge : layout_.edges) {
    const QRectF& from = rects[edge.parent];
    const QRectF& to = rects[edge.child];
    QPainterPath path(QPointF(from.center().x(), from.bottom()));
    QPointF last = path.currentPosition();
    for (const auto& bend : edge.bends) {
      last = slotCentre(bend.layer, bend.position);
      path.lineTo(last);
    }
    const QPointF end(to.center().x(), to.top());
    path.lineTo(end);
    painter.setBrush(Qt::NoBrush);
    painter.drawPath(path);
    // Arrow head along the last segment.
    const double angle = std::atan2(end.y() - last.y(), end.x() - last.x());
    constexpr double head = 8.0, spread = 0.45;
    const QPointF a(end.x() - head * std::cos(angle - spread), end.y() - head * std::sin(angle - spread));
    const QPointF b(end.x() - head * std::cos(angle + spread), end.y() - head * std::sin(angle + spread));
    painter.setBrush(ink);
    painter.drawPolygon(QPolygonF({end, a, b}));
  }

  QFont bold = font();
  bold.setBold(true);
  const QFontMetricsF name_metrics(bold);
  for (std::size_t i = 0; i < rects.size(); ++i) {
    const bool proposition = i == network_.proposition.node;
    const bool observed = std::any_of(network_.findings.begin(), network_.findings.end(),
                                      [i](const models::network::Finding& f) { return f.node == i; });
    // Proposition node: warm fill, double border; observed nodes: shaded with a thick border.
    const QColor fill = proposition ? QColor(255, 236, 200) : observed ? QColor(214, 228, 245) : palette().color(QPalette::Base);
    painter.setBrush(fill);
    painter.setPen(QPen(ink, observed || proposition ? 2.2 : 1.0));
    painter.drawRoundedRect(rects[i], 6, 6);
    if (proposition) {
      painter.setBrush(Qt::NoBrush);
      painter.setPen(QPen(ink, 0.8));
      painter.drawRoundedRect(rects[i].adjusted(3, 3, -3, -3), 4, 4);
    }
    painter.setPen(observed || proposition ? QColor(20, 20, 20) : ink);
    const QRectF inner = rects[i].adjusted(kPadding, kPadding, -kPadding, -kPadding);
    painter.setFont(bold);
    painter.drawText(QRectF(inner.left(), inner.top(), inner.width(), name_metrics.height()), Qt::AlignCenter,
                     QString::fromStdString(network_.nodes[i].name));
    painter.setFont(font());
    painter.drawText(QRectF(inner.left(), inner.top() + name_metrics.height(), inner.width(), inner.height() - name_metrics.height()),
                     Qt::AlignCenter, nodeLabel(i));
  }
}

}  // namespace counterpoise::editor
