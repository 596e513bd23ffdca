#pragma once
// Writes a figure (a QPainter drawing) as PNG (at twice the size, for slides) or SVG (Qt SVG),
// chosen by the file's extension.

#include <QFont>
#include <QRectF>
#include <QSize>
#include <QString>

#include <functional>

class QPainter;

namespace counterpoise::editor {

using FigurePainter = std::function<void(QPainter&, const QRectF&)>;

// Starts a figure: saves the painter state (restore it when done), fills `area` white, sets the
// 9-point figure font and writes `title` in bold at the top left. Returns the figure font.
QFont begin_figure(QPainter& painter, const QRectF& area, const QString& title);

// An interval drawn as a vertical line from y1 to y2 with end caps half_width wide.
void draw_whisker(QPainter& painter, double x, double y1, double y2, double half_width, double pen_width);

// Returns "" on success, otherwise the message naming the file.
QString export_figure(const QString& path, QSize size, const FigurePainter& paint, const QString& title);

}  // namespace counterpoise::editor
