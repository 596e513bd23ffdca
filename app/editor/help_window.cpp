#include "app/editor/help_window.hpp"

#include <QDialogButtonBox>
#include <QFile>
#include <QFileInfo>
#include <QTextBrowser>
#include <QVBoxLayout>
#include <QtGlobal>

#include "core/platform/library_versions.hpp"
#include "core/platform/shipped_data.hpp"

#ifndef COUNTERPOISE_BUILD_ID
#define COUNTERPOISE_BUILD_ID "unknown"
#endif

namespace counterpoise::editor {

QString user_guide_path() {
  const QString installed = QString::fromStdString((platform::shipped_data_dir() / "docs" / "user-guide.md").string());
  if (QFileInfo::exists(installed)) return installed;
  const QString source = QStringLiteral(COUNTERPOISE_DOCS "/user-guide.md");
  return QFileInfo::exists(source) ? source : QString();
}

UserGuideWindow::UserGuideWindow(QWidget* parent) : QDialog(parent), browser_(new QTextBrowser(this)) {
  setWindowTitle(tr("Counterpoise User Guide"));
  setObjectName("userGuide");
  auto* layout = new QVBoxLayout(this);
  browser_->setOpenExternalLinks(false);
  browser_->setOpenLinks(true);
  layout->addWidget(browser_);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  layout->addWidget(buttons);
  resize(900, 760);
  const QString path = user_guide_path();
  QFile file(path);
  if (path.isEmpty() || !file.open(QIODevice::ReadOnly)) {
    browser_->setPlainText(tr("The user guide (user-guide.md) was not found beside the program. It is in the docs "
                              "folder of the source."));
    return;
  }
  // Links and screenshots are relative to the guide's folder.
  browser_->setSearchPaths({QFileInfo(path).absolutePath()});
  browser_->setMarkdown(QString::fromUtf8(file.readAll()));
}

QString about_text() {
  QString libraries = QStringLiteral("<tr><td>Qt</td><td>%1</td><td>GNU LGPL version 3</td></tr>").arg(QString::fromLatin1(qVersion()));
  for (const auto& library : platform::core_library_versions())
    libraries += QStringLiteral("<tr><td>%1</td><td>%2</td><td>%3</td></tr>")
                     .arg(QString::fromStdString(library.name).toHtmlEscaped(), QString::fromStdString(library.version).toHtmlEscaped(),
                          QString::fromStdString(library.licence).toHtmlEscaped());
#if defined(__clang__)
  const QString compiler = QStringLiteral("Clang " __clang_version__);
#elif defined(__GNUC__)
  const QString compiler = QStringLiteral("GCC " __VERSION__);
#else
  const QString compiler = QObject::tr("an unnamed compiler");
#endif
  return QObject::tr("<h3>Counterpoise %1</h3>"
                     "<p>Weighs forensic findings under two competing propositions: the likelihood ratio of each item "
                     "of findings, their combination, its uncertainty and how it would move a range of prior odds.</p>"
                     "<p>Build %2, compiled %3 with %4.</p>"
                     "<p><b>Libraries</b></p><table cellspacing='6'><tr><th align='left'>Library</th><th "
                     "align='left'>Version</th><th align='left'>Licence</th></tr>%5</table>"
                     "<p>The scientist evaluates the findings, not guilt or innocence; the prior odds are the "
                     "fact-finder's; a verbal scale is a convention. Follow your laboratory's accredited procedures "
                     "and the law where you work.</p>")
      .arg(QStringLiteral(COUNTERPOISE_VERSION), QStringLiteral(COUNTERPOISE_BUILD_ID), QStringLiteral(__DATE__), compiler,
           libraries);
}

}  // namespace counterpoise::editor
