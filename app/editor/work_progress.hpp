#pragma once
// Long work off the GUI thread with a progress dialog: the window stays responsive (it repaints,
// the dialog's Cancel answers) while a worker thread does the work. The work gets copies of what
// it needs, never the document, so the document may change (or go away) while it runs.
//
// Cancel abandons the result: the worker runs to its end in the background, and nothing it
// produced is used (no file is written, nothing is sealed).

#include <QEventLoop>
#include <QFutureWatcher>
#include <QProgressDialog>
#include <QString>
#include <QWidget>
#include <QtConcurrent/QtConcurrentRun>

#include <functional>
#include <optional>

namespace counterpoise::editor {

// Runs `work` on a worker thread; shows `parent`'s progress dialog (object name
// "workProgress", a busy bar, `label`, a Cancel button) until it ends. Returns the work's
// result, or nullopt when the user cancelled. `shown` is called with the dialog once it is up
// (the main window reports it; tests observe it).
template <typename Result>
std::optional<Result> run_with_progress(QWidget* parent, const QString& title, const QString& label,
                                        std::function<Result()> work,
                                        const std::function<void(QProgressDialog*)>& shown = {}) {
  QProgressDialog dialog(label, QObject::tr("Cancel"), 0, 0, parent);
  dialog.setObjectName("workProgress");
  dialog.setWindowTitle(title);
  dialog.setWindowModality(Qt::WindowModal);
  dialog.setMinimumDuration(0);
  dialog.setAutoClose(false);
  dialog.setAutoReset(false);
  QFutureWatcher<Result> watcher;
  QEventLoop loop;
  QObject::connect(&watcher, &QFutureWatcher<Result>::finished, &loop, &QEventLoop::quit);
  QObject::connect(&dialog, &QProgressDialog::canceled, &loop, &QEventLoop::quit);
  watcher.setFuture(QtConcurrent::run(std::move(work)));
  dialog.show();
  if (shown) shown(&dialog);
  // The dialog is window-modal: the window repaints but takes no edits while the work runs.
  if (!watcher.isFinished()) loop.exec();
  if (dialog.wasCanceled()) return std::nullopt;
  return watcher.result();
}

}  // namespace counterpoise::editor
