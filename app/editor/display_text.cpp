#include "app/editor/display_text.hpp"

#include <QObject>

#include <cmath>

#include "core/numbers/number_text.hpp"

namespace counterpoise::editor {

QString lr_text(const numbers::LikelihoodRatio& lr, const std::optional<uncertainty::SpreadSummary>& spread) {
  (void)spread;  // one rounding for every LR (core/numbers/number_text), whatever its interval
  return QString::fromStdString(numbers::lr_for_readers(lr));
}

QString log10_text(double log10_value) {
  if (std::isinf(log10_value)) return log10_value > 0 ? QStringLiteral("+∞") : QStringLiteral("−∞");
  return QString::fromStdString(numbers::log10_for_readers(log10_value));
}

QString interval_text(const std::optional<uncertainty::SpreadSummary>& spread) {
  if (!spread) return {};
  auto end = [&](double log10_value) -> QString {
    if (std::isinf(log10_value)) return log10_value > 0 ? QStringLiteral("infinite") : QStringLiteral("0");
    return QString::fromStdString(numbers::magnitude_for_readers(log10_value));
  };
  return QObject::tr("%1 to %2 (%3)")
      .arg(end(spread->low_log10), end(spread->high_log10),
           QString::fromStdString(numbers::percent_for_readers(spread->levels.credible)));
}

QString probability_text(double log10_p) {
  if (std::isinf(log10_p) && log10_p < 0) return QStringLiteral("0");
  return QString::fromStdString(numbers::probability_for_readers(log10_p));
}

}  // namespace counterpoise::editor
