#include "app/editor/editor_settings.hpp"

#include <QFileInfo>
#include <QSettings>

#include "core/store/database_case.hpp"

namespace counterpoise::editor::settings {

namespace {
constexpr const char* kRecent = "files/recent";
constexpr const char* kGeometry = "window/geometry";
constexpr const char* kState = "window/state";
constexpr const char* kFolder = "files/last_folder";
constexpr const char* kExaminer = "examiner/name";
}  // namespace

QStringList recent_files() { return QSettings().value(kRecent).toStringList(); }

void add_recent_file(const QString& path) {
  // A file by its absolute path; a shared-store address as it was given.
  const QString absolute =
      store::is_database_address(path.toStdString()) ? path : QFileInfo(path).absoluteFilePath();
  QStringList files = recent_files();
  files.removeAll(absolute);
  files.prepend(absolute);
  while (files.size() > kMaxRecentFiles) files.removeLast();
  QSettings().setValue(kRecent, files);
}

void clear_recent_files() { QSettings().remove(kRecent); }

QByteArray window_geometry() { return QSettings().value(kGeometry).toByteArray(); }
void set_window_geometry(const QByteArray& value) { QSettings().setValue(kGeometry, value); }
QByteArray window_state() { return QSettings().value(kState).toByteArray(); }
void set_window_state(const QByteArray& value) { QSettings().setValue(kState, value); }

QString examiner_name() { return QSettings().value(kExaminer).toString().trimmed(); }
void set_examiner_name(const QString& name) { QSettings().setValue(kExaminer, name.trimmed()); }

QString last_folder() { return QSettings().value(kFolder).toString(); }
void set_last_folder(const QString& folder) { QSettings().setValue(kFolder, folder); }

}  // namespace counterpoise::editor::settings
