#include "app/editor/render_when_visible.hpp"

#include <QEvent>
#include <QWidget>

namespace counterpoise::editor {

RenderWhenVisible::RenderWhenVisible(QWidget* view, std::function<void()> render)
    : QObject(view), view_(view), render_(std::move(render)) {
  view_->installEventFilter(this);
}

void RenderWhenVisible::request() {
  stale_ = true;
  if (view_->isVisible()) flush();
}

void RenderWhenVisible::flush() {
  if (!stale_) return;
  stale_ = false;
  render_();
}

bool RenderWhenVisible::eventFilter(QObject* watched, QEvent* event) {
  // Rendered before the show is painted, so a stale frame is never on screen.
  if (watched == view_ && event->type() == QEvent::Show) flush();
  return QObject::eventFilter(watched, event);
}

}  // namespace counterpoise::editor
