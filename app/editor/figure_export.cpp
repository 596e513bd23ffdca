#include "app/editor/figure_export.hpp"

#include <QFileInfo>
#include <QImage>
#include <QPainter>
#include <QSvgGenerator>

namespace counterpoise::editor {

QFont begin_figure(QPainter& painter, const QRectF& area, const QString& title) {
  painter.save();
  painter.setRenderHint(QPainter::Antialiasing);
  painter.fillRect(area, Qt::white);
  QFont font = painter.font();
  font.setPointSizeF(9);
  QFont bold = font;
  bold.setBold(true);
  painter.setFont(bold);
  painter.setPen(Qt::black);
  const QFontMetricsF metrics(font);
  painter.drawText(QRectF(area.left() + 8, area.top() + 4, area.width() - 16, metrics.height() + 4), Qt::AlignLeft, title);
  painter.setFont(font);
  return font;
}

void draw_whisker(QPainter& painter, double x, double y1, double y2, double half_width, double pen_width) {
  painter.setPen(QPen(QColor(40, 40, 40), pen_width));
  painter.drawLine(QPointF(x, y1), QPointF(x, y2));
  painter.drawLine(QPointF(x - half_width, y1), QPointF(x + half_width, y1));
  painter.drawLine(QPointF(x - half_width, y2), QPointF(x + half_width, y2));
}

QString export_figure(const QString& path, QSize size, const FigurePainter& paint, const QString& title) {
  const QString suffix = QFileInfo(path).suffix().toLower();
  if (suffix == "svg") {
    QSvgGenerator svg;
    svg.setFileName(path);
    svg.setSize(size);
    svg.setViewBox(QRect(QPoint(0, 0), size));
    svg.setTitle(title);
    svg.setDescription(QObject::tr("Figure written by Counterpoise"));
    QPainter painter;
    if (!painter.begin(&svg)) return QObject::tr("Cannot write %1").arg(path);
    paint(painter, QRectF(QPointF(0, 0), QSizeF(size)));
    painter.end();
    return QFileInfo(path).size() > 0 ? QString() : QObject::tr("Cannot write %1").arg(path);
  }
  if (suffix == "png") {
    constexpr int scale = 2;
    QImage image(size * scale, QImage::Format_ARGB32_Premultiplied);
    image.setDevicePixelRatio(scale);
    image.fill(Qt::white);
    QPainter painter(&image);
    paint(painter, QRectF(QPointF(0, 0), QSizeF(size)));
    painter.end();
    image.setText("Title", title);
    return image.save(path, "PNG") ? QString() : QObject::tr("Cannot write %1").arg(path);
  }
  return QObject::tr("Figures are written as .png or .svg, not .%1").arg(suffix);
}

}  // namespace counterpoise::editor
