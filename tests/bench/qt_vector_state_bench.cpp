// Benchmark (measured, not asserted): the same evaluation of the fibres demo case before and
// after a QGuiApplication exists (and has drawn some text, as the report does), in one process. Some libraries Qt loads leave the upper halves
// of the AVX registers dirty, which slows core's SSE code (core/numbers/vector_state.hpp);
// evaluate_case clears that state on entry. Printed side by side:
//   - evaluate_case before Qt, with Qt (the ratio the fix is for; target <= 1.1);
//   - a bare lattice convolution (which does not clear the state) before Qt, with Qt, and with
//     Qt after clear_upper_vector_state(), to show the cause and the remedy.
// Run on one core: taskset -c 0 build/tests/bench/bench_qt_vector_state
#include <QByteArray>
#include <QGuiApplication>
#include <QImage>
#include <QPainter>

#include <cstdio>
#include <fstream>
#include <memory>
#include <string>

#include "bench_machine.hpp"
#include "bench_timer.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/numbers/vector_state.hpp"
#include "core/uncertainty/grid_pmf.hpp"

using namespace counterpoise;

namespace {

// A convolution of two 4 000-bin triangular distributions: pure SSE arithmetic in core.
double convolution_ms() {
  uncertainty::GridPmf a;
  a.step = 0.001;
  a.mass.assign(4000, 0.0);
  for (std::size_t i = 0; i < a.mass.size(); ++i) a.mass[i] = static_cast<double>(i < 2000 ? i : 4000 - i);
  double sink = 0.0;
  const double ms = bench::median_milliseconds(9, [&] { sink += uncertainty::convolve(a, a).mass[3999]; });
  if (sink < 0.0) std::printf("unexpected\n");
  return ms;
}

}  // namespace

int main(int argc, char** argv) {
  std::printf("CPU: %s\n", bench::cpu_model().c_str());
  const auto read = interchange::read_case_file(std::filesystem::path(COUNTERPOISE_DEMO_DIR) / "harwick-vale-fibres.json");
  if (!read.value) {
    std::fprintf(stderr, "the fibres demo case does not read\n");
    return 1;
  }
  const casefile::Case& value = *read.value;
  const auto evaluate_ms = [&] {
    return bench::median_milliseconds(7, [&] { (void)evaluation::evaluate_case(value); });
  };

  const double evaluate_before = evaluate_ms();
  const double convolve_before = convolution_ms();

  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", QByteArray("offscreen"));
  QGuiApplication app(argc, argv);
  {
    // What the report and the editor do next: lay out and draw text (fonts, shaping, raster).
    QImage image(400, 100, QImage::Format_ARGB32);
    image.fill(Qt::white);
    QPainter painter(&image);
    painter.drawText(10, 50, QStringLiteral("The findings are about 1 200 times more probable if Hp is true."));
  }

  const double convolve_with_qt = convolution_ms();
  const double evaluate_with_qt = evaluate_ms();
  numbers::clear_upper_vector_state();
  const double convolve_cleared = convolution_ms();

  std::printf("fibres demo case, evaluate_case (median of 7):\n");
  std::printf("  without Qt %.2f ms, with a QGuiApplication %.2f ms: ratio %.2f (target <= 1.1)\n", evaluate_before,
              evaluate_with_qt, evaluate_with_qt / evaluate_before);
  std::printf("bare lattice convolution, 4 000 x 4 000 bins (median of 9):\n");
  std::printf("  without Qt %.2f ms, with Qt %.2f ms (ratio %.2f), with Qt after clearing %.2f ms (ratio %.2f)\n",
              convolve_before, convolve_with_qt, convolve_with_qt / convolve_before, convolve_cleared,
              convolve_cleared / convolve_before);
  return 0;
}
