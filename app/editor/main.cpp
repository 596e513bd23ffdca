// counterpoise: the case editor.
//   counterpoise [CASE]                      opens CASE (.cpcase or .json), or a new case
//   counterpoise --screenshots DIR CASE      writes screenshots of the main views to DIR
//   counterpoise --startup-time CASE         prints the time to an interactive window, then exits
//   counterpoise --examiner NAME ...          records NAME with this session's edits

#include <QApplication>
#include <QCommandLineParser>
#include <QElapsedTimer>
#include <QMessageBox>
#include <QTextStream>
#include <QTimer>

#include "app/editor/main_window.hpp"
#include "app/editor/screenshot_mode.hpp"

int main(int argc, char** argv) {
  QElapsedTimer started;
  started.start();
  QApplication app(argc, argv);
  QApplication::setOrganizationName("Counterpoise");
  QApplication::setApplicationName("counterpoise");
  QApplication::setApplicationVersion(COUNTERPOISE_VERSION);

  QCommandLineParser parser;
  parser.setApplicationDescription("Counterpoise case editor");
  parser.addHelpOption();
  parser.addVersionOption();
  QCommandLineOption screenshots("screenshots", "Write screenshots of the main views to DIR and exit.", "DIR");
  QCommandLineOption startup("startup-time", "Print the milliseconds to an interactive window and exit.");
  QCommandLineOption examiner("examiner", "The examiner recorded with the edits of this session (instead of the one "
                                          "declared in the settings).", "NAME");
  parser.addOption(screenshots);
  parser.addOption(examiner);
  parser.addOption(startup);
  parser.addPositionalArgument("case", "A case file (.cpcase), an interchange file (.json) or a shared-store address "
                                       "(postgresql://SERVER/DATABASE?case=REFERENCE) to open.");
  parser.process(app);
  const QStringList files = parser.positionalArguments();

  counterpoise::editor::MainWindow window;
  if (parser.isSet(examiner)) window.setSessionExaminer(parser.value(examiner));
  if (parser.isSet(screenshots)) {
    if (files.isEmpty()) {
      QTextStream(stderr) << "--screenshots needs a case to open\n";
      return 2;
    }
    return counterpoise::editor::take_screenshots(window, parser.value(screenshots), files.front());
  }
  window.show();
  if (!files.isEmpty()) {
    const QString problem = window.openPath(files.front());
    if (!problem.isEmpty() && !parser.isSet(startup)) QMessageBox::warning(&window, "Counterpoise", problem);
  }
  if (parser.isSet(startup)) {
    // Interactive: the window is shown, the case is open, its point evaluation is on screen and
    // the event loop has run once.
    QTimer::singleShot(0, &app, [&] {
      QTextStream(stdout) << "startup_ms " << started.elapsed() << "\n";
      window.document()->waitForSpread(20000);
      QTextStream(stdout) << "with_intervals_ms " << started.elapsed() << "\n";
      app.quit();
    });
  }
  return app.exec();
}
