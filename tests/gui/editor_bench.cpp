// Responsiveness of the case editor (a benchmark, not a test; figures in docs/performance.md,
// "Case editor"). A 40-item case (each item Beta-distributed P(E|Hp), count-based P(E|Hd)):
//  1. the point evaluation alone (read through the core's reader, each item's point LR, combined);
//  2. a whole edit as the user makes it: a probability typed into the item form, through the
//     undo stack, the document, the guard and every view re-rendering — what must fit in a frame —
//     with the Findings tab in front (typing) and with the Weight tab in front (undo, redo there);
//  3. the background evaluation with uncertainty (lattice convolution) that follows it.

#include <QApplication>
#include <QLineEdit>
#include <QDir>
#include <QFile>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <vector>

#include "app/editor/edit_commands.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/main_window.hpp"
#include "app/editor/point_evaluation.hpp"
#include "app/editor/probability_editor.hpp"

using namespace counterpoise;
using Clock = std::chrono::steady_clock;

namespace {

nlohmann::json forty_item_case() {
  nlohmann::json items = nlohmann::json::array();
  for (int i = 1; i <= 40; ++i)
    items.push_back({{"id", "E" + std::to_string(i)},
                     {"title", "Item " + std::to_string(i)},
                     {"description", "Findings of item " + std::to_string(i) + " agree with the control material."},
                     {"model", "assigned"},
                     {"p_given_hp", {{"beta", {20 + i, 3}}}},
                     {"p_given_hd", {{"counts", {{"k", i % 7}, {"n", 400 + 10 * i}}}}}});
  return {{"format", "counterpoise.case"},
          {"version", 1},
          {"case", {{"reference", "BENCH-40"}, {"title", "Forty items (benchmark)"}}},
          {"propositions", {{"level", "source"}, {"hp", "The items come from the control sources"}, {"hd", "They come from other sources"}}},
          {"items", items}};
}

struct Stats {
  double median, p95;
};

Stats stats(std::vector<double> ms) {
  std::sort(ms.begin(), ms.end());
  return {ms[ms.size() / 2], ms[static_cast<std::size_t>(0.95 * static_cast<double>(ms.size() - 1))]};
}

}  // namespace

int main(int argc, char** argv) {
  qputenv("QT_QPA_PLATFORM", qgetenv("QT_QPA_PLATFORM").isEmpty() ? "offscreen" : qgetenv("QT_QPA_PLATFORM"));
  QApplication app(argc, argv);
  const auto document = forty_item_case();

  std::vector<double> point_ms;
  for (int run = 0; run < 200; ++run) {
    const auto begin = Clock::now();
    const auto snapshot = editor::evaluate_points(document, ".");
    point_ms.push_back(std::chrono::duration<double, std::milli>(Clock::now() - begin).count());
    if (!snapshot.combined) return std::fprintf(stderr, "the benchmark case does not evaluate\n"), 1;
  }

  const QString path = QDir::temp().filePath("counterpoise-bench-40.json");
  {
    QFile out(path);
    out.open(QIODevice::WriteOnly);
    out.write(QByteArray::fromStdString(document.dump()));
  }
  editor::MainWindow window;
  window.resize(1280, 820);
  window.show();
  window.openPath(path);
  window.selectItem("E20");
  QApplication::processEvents();
  // One edit as the user makes it, timed to the end of the views' update and to the end of the
  // repaint; then the background evaluation it started, waited for so the next edit starts clean.
  struct Timings {
    std::vector<double> update_ms, edit_ms, spread_ms;
  };
  const auto edit_sixty_times = [&](editor::MainWindow::Tab tab, double offset) {
    window.showTab(tab);
    QApplication::processEvents();
    Timings t;
    for (int run = 0; run < 60; ++run) {
      const double p = offset + 0.004 * run;
      const auto begin = Clock::now();
      window.edits()->setItemField("E20", "p_given_hp", p);
      t.update_ms.push_back(std::chrono::duration<double, std::milli>(Clock::now() - begin).count());
      QApplication::processEvents();  // the views repaint
      t.edit_ms.push_back(std::chrono::duration<double, std::milli>(Clock::now() - begin).count());
      window.document()->waitForSpread(30000);
      t.spread_ms.push_back(window.document()->spread().milliseconds);
    }
    return t;
  };
  // Typing in the item form (the Findings tab in front), and an edit with the Weight tab in
  // front (undo, redo there), which repaints the table and the contribution chart of all 40 items.
  const Timings findings = edit_sixty_times(editor::MainWindow::FindingsTab, 0.5);
  const Timings weight = edit_sixty_times(editor::MainWindow::WeightTab, 0.3);
  const auto& update_ms = findings.update_ms;
  const auto& edit_ms = findings.edit_ms;
  const auto& spread_ms = findings.spread_ms;
  const Stats point = stats(point_ms), update = stats(update_ms), edit = stats(edit_ms), spread = stats(spread_ms);
  const Stats weight_update = stats(weight.update_ms), weight_edit = stats(weight.edit_ms);
  std::printf("40-item point evaluation (read + point LRs + combination): median %.2f ms, p95 %.2f ms (200 runs)\n",
              point.median, point.p95);
  std::printf("40-item edit through the editor, views updated (undo stack, document, guard, models, forms): median %.2f ms, p95 %.2f ms\n",
              update.median, update.p95);
  std::printf("40-item edit through the editor, with the repaint of the window: median %.2f ms, p95 %.2f ms (60 edits)\n",
              edit.median, edit.p95);
  std::printf("The same with the Weight tab in front: views updated median %.2f ms, p95 %.2f ms; with the repaint median %.2f ms, "
              "p95 %.2f ms\n",
              weight_update.median, weight_update.p95, weight_edit.median, weight_edit.p95);
  std::printf("40-item background evaluation with uncertainty (off the GUI thread): median %.1f ms, p95 %.1f ms\n", spread.median,
              spread.p95);
  QFile::remove(path);
  return 0;
}
