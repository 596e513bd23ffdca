#pragma once
// The screenshot mode (`counterpoise --screenshots DIR CASE`): opens the case, shows each main
// view in turn at a fixed window size and writes QWidget::grab() of the window as PNG into DIR
// (for docs/screenshots, taken offscreen by scripts/screenshots).

#include <QString>

namespace counterpoise::editor {

class MainWindow;

// Returns 0 when every screenshot was written; messages go to stderr.
int take_screenshots(MainWindow& window, const QString& folder, const QString& case_path);

}  // namespace counterpoise::editor
