#pragma once
// Keeps a view's rendering for when it can be seen. A change while the view is hidden (another
// tab is in front) only marks it stale, and it renders when it is next shown, so an edit costs
// the layout and repaint of what is on screen rather than of every tab.

#include <QObject>

#include <functional>

class QWidget;

namespace counterpoise::editor {

class RenderWhenVisible : public QObject {
  Q_OBJECT
 public:
  RenderWhenVisible(QWidget* view, std::function<void()> render);

  // Renders now when the view is visible, otherwise when it is next shown.
  void request();
  // Renders now if a change is still waiting (for code that reads what the view holds).
  void flush();
  bool stale() const { return stale_; }

 protected:
  bool eventFilter(QObject* watched, QEvent* event) override;

 private:
  QWidget* view_;
  std::function<void()> render_;
  bool stale_ = false;
};

}  // namespace counterpoise::editor
