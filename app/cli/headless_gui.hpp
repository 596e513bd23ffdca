#pragma once
// The QGuiApplication that painting a PDF needs, made for a command-line run: the offscreen
// platform unless the user chose another. Only in builds with reports (Qt).
#ifdef COUNTERPOISE_HAVE_REPORTS
#include <memory>

#include <QGuiApplication>

namespace counterpoise::cli {

// A new application, or nullptr when one exists already.
std::unique_ptr<QGuiApplication> make_headless_gui_application();

}  // namespace counterpoise::cli
#endif
