#pragma once
// Help: the user guide (docs/user-guide.md, with its screenshots) in a window of its own, and
// the About text with the version, the build and the libraries with their licences.

#include <QDialog>
#include <QString>

class QTextBrowser;

namespace counterpoise::editor {

// The user guide's file: <prefix>/share/counterpoise/docs when installed, else the source
// tree's docs folder. Empty when neither has it.
QString user_guide_path();

class UserGuideWindow : public QDialog {
  Q_OBJECT
 public:
  explicit UserGuideWindow(QWidget* parent = nullptr);
  QTextBrowser* browser() const { return browser_; }

 private:
  QTextBrowser* browser_;
};

// Rich text for the About box: version, build (commit, date, compiler, type), the libraries
// in use (Qt, and the core's: core_library_versions()) with their licences, and the cautions.
QString about_text();

}  // namespace counterpoise::editor
