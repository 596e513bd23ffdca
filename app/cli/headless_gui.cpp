#include "app/cli/headless_gui.hpp"

#ifdef COUNTERPOISE_HAVE_REPORTS
namespace counterpoise::cli {

std::unique_ptr<QGuiApplication> make_headless_gui_application() {
  if (QCoreApplication::instance()) return nullptr;
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", QByteArray("offscreen"));
  static int argc = 1;
  static char name[] = "counterpoise-cli";
  static char* argv[] = {name, nullptr};
  return std::make_unique<QGuiApplication>(argc, argv);
}

}  // namespace counterpoise::cli
#endif
