#pragma once
// Text laid out once and drawn many times. Laying out (shaping) text is most of what a chart's
// repaint costs, and between two edits nearly every label of a chart is the same, so the chart
// widgets keep their laid-out labels here, keyed by font and text. A figure exported to a file
// is drawn without a cache (draw_label with a null cache draws the text directly).

#include <QHash>
#include <QRectF>
#include <QStaticText>
#include <QString>

class QFont;
class QPainter;

namespace counterpoise::editor {

class LabelCache {
 public:
  // The width of `text` in `font`.
  double width(const QFont& font, const QString& text);
  // Draws `text` in the painter's current font and pen inside `box`: left, centred or right
  // (Qt::AlignLeft, AlignHCenter, AlignRight), at the top of the box or centred in it
  // (Qt::AlignTop, AlignVCenter).
  void draw(QPainter& painter, const QRectF& box, Qt::Alignment align, const QString& text);

 private:
  struct Entry {
    QStaticText text;
    double width = 0;
    double height = 0;
  };
  const Entry& entry(const QFont& font, const QString& text);
  QHash<QString, Entry> entries_;
};

// Through `cache` when there is one, otherwise QPainter::drawText / QFontMetricsF directly.
void draw_label(QPainter& painter, LabelCache* cache, const QRectF& box, Qt::Alignment align, const QString& text);
double label_width(LabelCache* cache, const QFont& font, const QString& text);

}  // namespace counterpoise::editor
