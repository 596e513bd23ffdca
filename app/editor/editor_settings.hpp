#pragma once
// The editor's settings, as typed keys over QSettings (organisation "Counterpoise", application
// "counterpoise"). Only the app layer reads them; the core receives plain values.

#include <QByteArray>
#include <QString>
#include <QStringList>

namespace counterpoise::editor::settings {

inline constexpr int kMaxRecentFiles = 8;

QStringList recent_files();
// Puts `path` first in the recent files (dropping duplicates and files beyond the maximum).
void add_recent_file(const QString& path);
void clear_recent_files();

QByteArray window_geometry();
void set_window_geometry(const QByteArray& value);
QByteArray window_state();
void set_window_state(const QByteArray& value);

// The examiner's name, declared once per user and recorded with every edit and seal of a case
// file; empty until declared.
QString examiner_name();
void set_examiner_name(const QString& name);

QString last_folder();
void set_last_folder(const QString& folder);

}  // namespace counterpoise::editor::settings
