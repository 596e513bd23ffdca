#include "app/editor/label_cache.hpp"

#include <QFont>
#include <QFontMetricsF>
#include <QPainter>

namespace counterpoise::editor {

namespace {
// Enough for every label of a large case many times over; beyond it the cache starts again, so
// labels of values no longer shown do not accumulate while the user types.
constexpr qsizetype kMaxEntries = 4000;
}  // namespace

const LabelCache::Entry& LabelCache::entry(const QFont& font, const QString& text) {
  const QString key = font.key() + QChar('\n') + text;
  if (auto it = entries_.constFind(key); it != entries_.constEnd()) return *it;
  if (entries_.size() >= kMaxEntries) entries_.clear();
  Entry made;
  made.text = QStaticText(text);
  made.text.setTextFormat(Qt::PlainText);
  made.text.setPerformanceHint(QStaticText::AggressiveCaching);
  const QFontMetricsF metrics(font);
  made.width = metrics.horizontalAdvance(text);
  made.height = metrics.height();
  made.text.prepare(QTransform(), font);
  return *entries_.insert(key, made);
}

double LabelCache::width(const QFont& font, const QString& text) { return entry(font, text).width; }

void LabelCache::draw(QPainter& painter, const QRectF& box, Qt::Alignment align, const QString& text) {
  const Entry& e = entry(painter.font(), text);
  double x = box.left();
  if (align & Qt::AlignHCenter) x = box.center().x() - e.width / 2;
  else if (align & Qt::AlignRight) x = box.right() - e.width;
  const double y = (align & Qt::AlignVCenter) ? box.center().y() - e.height / 2 : box.top();
  painter.drawStaticText(QPointF(x, y), e.text);
}

void draw_label(QPainter& painter, LabelCache* cache, const QRectF& box, Qt::Alignment align, const QString& text) {
  if (cache) cache->draw(painter, box, align, text);
  else painter.drawText(box, static_cast<int>(align), text);
}

double label_width(LabelCache* cache, const QFont& font, const QString& text) {
  return cache ? cache->width(font, text) : QFontMetricsF(font).horizontalAdvance(text);
}

}  // namespace counterpoise::editor
