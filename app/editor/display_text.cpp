#include "app/editor/display_text.hpp"

#include <QObject>

#include <cmath>

#include "core/numbers/reader_format.hpp"

namespace counterpoise::editor {

namespace {
std::optional<double> width_of(const std::optional<uncertainty::SpreadSummary>& spread) {
  if (!spread || !std::isfinite(spread->low_log10) || !std::isfinite(spread->high_log10)) return std::nullopt;
  return spread->high_log10 - spread->low_log10;
}
}  // namespace

QString lr_text(const numbers::LikelihoodRatio& lr, const std::optional<uncertainty::SpreadSummary>& spread) {
  return QString::fromStdString(numbers::lr_for_readers(lr, numbers::significant_figures_for(width_of(spread))));
}

QString log10_text(double log10_value) {
  if (std::isinf(log10_value)) return log10_value > 0 ? QStringLiteral("+∞") : QStringLiteral("−∞");
  return QString::number(log10_value, 'f', 2).replace('-', QChar(0x2212));
}

QString interval_text(const std::optional<uncertainty::SpreadSummary>& spread) {
  if (!spread) return {};
  const int figures = numbers::significant_figures_for(width_of(spread));
  auto end = [&](double log10_value) -> QString {
    if (std::isinf(log10_value)) return log10_value > 0 ? QStringLiteral("infinite") : QStringLiteral("0");
    return QString::fromStdString(numbers::magnitude_for_readers(log10_value, figures));
  };
  return QObject::tr("%1 to %2 (%3 %)")
      .arg(end(spread->low_log10), end(spread->high_log10), QString::number(spread->levels.credible * 100, 'g', 3));
}

QString probability_text(double log10_p) {
  if (std::isinf(log10_p) && log10_p < 0) return QStringLiteral("0");
  return QString::fromStdString(numbers::probability_for_readers(log10_p, 3));
}

}  // namespace counterpoise::editor
