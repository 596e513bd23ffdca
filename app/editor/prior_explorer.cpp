#include "app/editor/prior_explorer.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QGridLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPainter>
#include <QSlider>
#include <QVBoxLayout>

#include <cmath>

#include "app/editor/display_text.hpp"
#include "app/editor/figure_export.hpp"
#include "app/editor/render_when_visible.hpp"
#include "app/editor/weight_growth_plot.hpp"
#include "core/numbers/posterior.hpp"
#include "core/numbers/number_text.hpp"
#include "core/sensitivity/posterior_over_set.hpp"

namespace counterpoise::editor {

namespace {
constexpr int kSliderScale = 100;  // slider units per decade of prior odds
constexpr double kSliderFrom = -12.0, kSliderTo = 6.0;
constexpr int kWeightSteps = 100;  // points of the curve over one alternative's weight
}  // namespace

// --- plot ------------------------------------------------------------------------------------

void paint_prior_plot(QPainter& painter, const QRectF& area, const PriorPlotData& data) {
  const QFont font = begin_figure(painter, area,
                                 data.casework ? QObject::tr("Illustration for the fact-finder: posterior probability of Hp for a range of prior odds")
                                               : QObject::tr("Posterior probability of Hp against the prior odds"));
  const QFontMetricsF metrics(font);
  const double left = area.left() + metrics.horizontalAdvance("0.00") + 18;
  const double right = area.right() - 14;
  const double top = area.top() + metrics.height() * 2 + 8;
  const double bottom = area.bottom() - metrics.height() * 2 - 14;
  auto x_of = [&](double v) { return left + (v - data.log10_from) / (data.log10_to - data.log10_from) * (right - left); };
  auto y_of = [&](double p) { return bottom - p * (bottom - top); };

  painter.setPen(QPen(QColor(225, 225, 225), 0.8));
  for (double p : {0.0, 0.25, 0.5, 0.75, 1.0}) {
    painter.drawLine(QPointF(left, y_of(p)), QPointF(right, y_of(p)));
  }
  painter.setPen(Qt::black);
  for (double p : {0.0, 0.5, 1.0})
    painter.drawText(QRectF(area.left(), y_of(p) - metrics.height() / 2, left - area.left() - 6, metrics.height()),
                     Qt::AlignRight | Qt::AlignVCenter, QString::number(p, 'g', 2));
  const int span = static_cast<int>(data.log10_to - data.log10_from);
  const int tick = std::max(1, span / 8);
  for (int k = static_cast<int>(std::ceil(data.log10_from)); k <= static_cast<int>(data.log10_to); k += tick) {
    const double x = x_of(k);
    painter.setPen(QPen(QColor(225, 225, 225), 0.8));
    painter.drawLine(QPointF(x, top), QPointF(x, bottom));
    painter.setPen(Qt::black);
    const QString label = QString::fromStdString(numbers::odds_for_readers(k));
    const double half = metrics.horizontalAdvance(label) / 2 + 2;
    if (x - half >= area.left() && x + half <= area.right())
      painter.drawText(QRectF(x - half, bottom + 4, 2 * half, metrics.height()), Qt::AlignHCenter, label);
  }
  painter.drawText(QRectF(left, bottom + 6 + metrics.height(), right - left, metrics.height()), Qt::AlignHCenter,
                   QObject::tr("prior odds Hp : Hd (log scale)"));
  painter.drawRect(QRectF(QPointF(left, top), QPointF(right, bottom)));

  if (data.x.empty()) {
    painter.drawText(QRectF(left, top, right - left, bottom - top), Qt::AlignCenter | Qt::TextWordWrap, data.note);
    painter.restore();
    return;
  }
  if (!data.y_low.empty() && !data.y_high.empty()) {
    QPolygonF band;
    for (std::size_t i = 0; i < data.x.size(); ++i) band << QPointF(x_of(data.x[i]), y_of(data.y_low[i]));
    for (std::size_t i = data.x.size(); i-- > 0;) band << QPointF(x_of(data.x[i]), y_of(data.y_high[i]));
    painter.setPen(Qt::NoPen);
    painter.setBrush(QColor(52, 101, 164, 60));
    painter.drawPolygon(band);
    painter.setBrush(Qt::NoBrush);
  }
  QPolygonF curve;
  for (std::size_t i = 0; i < data.x.size(); ++i) curve << QPointF(x_of(data.x[i]), y_of(data.y[i]));
  painter.setPen(QPen(QColor(32, 74, 135), 2.0));
  painter.drawPolyline(curve);

  for (const auto& crossing : data.crossings) {
    painter.setPen(QPen(QColor(164, 0, 0), 1.0, Qt::DashLine));
    const double y = y_of(crossing.threshold);
    painter.drawLine(QPointF(left, y), QPointF(right, y));
    if (std::isfinite(crossing.log10_prior_odds) && crossing.log10_prior_odds >= data.log10_from &&
        crossing.log10_prior_odds <= data.log10_to) {
      const double x = x_of(crossing.log10_prior_odds);
      painter.setPen(QPen(QColor(164, 0, 0), 1.5));
      painter.setBrush(QColor(164, 0, 0));
      painter.drawEllipse(QPointF(x, y), 3.5, 3.5);
      painter.setBrush(Qt::NoBrush);
      // The curve rises through the crossing, so below the line and to its right is clear of
      // it: the label goes there, on a white ground so grid lines do not run through it.
      const QString label = QString::fromStdString(numbers::decimal_for_readers(crossing.threshold));
      QRectF box(QPointF(x + 7, y + 3), QSizeF(metrics.horizontalAdvance(label) + 4, metrics.height()));
      if (box.right() > right) box.moveBottomRight(QPointF(x - 7, y - 3));  // at the edge: above and to the left
      painter.fillRect(box, QColor(255, 255, 255, 220));
      painter.drawText(box, Qt::AlignCenter, label);
    }
  }
  if (data.current) {
    const double x = x_of(std::clamp(*data.current, data.log10_from, data.log10_to));
    painter.setPen(QPen(QColor(78, 154, 6), 1.5));
    painter.drawLine(QPointF(x, top), QPointF(x, bottom));
  }
  painter.restore();
}

PriorPlot::PriorPlot(QWidget* parent) : QWidget(parent) {
  setObjectName("priorPlot");
  setMinimumSize(360, 220);
}

void PriorPlot::setData(PriorPlotData data) {
  data_ = std::move(data);
  update();
}

void PriorPlot::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  paint_prior_plot(painter, rect(), data_);
}

// --- explorer --------------------------------------------------------------------------------

PriorExplorer::PriorExplorer(CaseDocument* document, QWidget* parent) : QWidget(parent), document_(document) {
  auto* layout = new QVBoxLayout(this);
  banner_ = new QLabel(this);
  banner_->setWordWrap(true);
  banner_->setObjectName("priorBanner");
  layout->addWidget(banner_);

  auto* controls = new QHBoxLayout;
  auto* slider_label = new QLabel(tr("&Prior odds"), this);
  slider_ = new QSlider(Qt::Horizontal, this);
  slider_->setRange(static_cast<int>(kSliderFrom * kSliderScale), static_cast<int>(kSliderTo * kSliderScale));
  slider_->setSingleStep(10);
  slider_->setPageStep(100);
  slider_->setToolTip(tr("Move the prior odds (log scale, one step per tenth of a decade). The prior is the "
                         "fact-finder's; this only shows what the findings would do to it."));
  slider_label->setBuddy(slider_);
  controls->addWidget(slider_label);
  controls->addWidget(slider_, 1);
  auto* n_label = new QLabel(tr("or one of &N possible sources:"), this);
  one_of_n_ = new QLineEdit(this);
  one_of_n_->setPlaceholderText(tr("N, e.g. 10000"));
  one_of_n_->setMaximumWidth(120);
  one_of_n_->setToolTip(tr("Prior odds 1 to N − 1: each of N possible sources equally likely before the findings."));
  n_label->setBuddy(one_of_n_);
  controls->addWidget(n_label);
  controls->addWidget(one_of_n_);
  layout->addLayout(controls);

  auto* grid = new QFormLayout;
  lr_ = new QLabel(this);
  prior_ = new QLabel(this);
  posterior_ = new QLabel(this);
  posterior_->setObjectName("posterior");
  complement_ = new QLabel(this);
  complement_->setObjectName("complement");
  band_ = new QLabel(this);
  crossings_ = new QLabel(this);
  crossings_->setWordWrap(true);
  for (QLabel* label : {lr_, prior_, posterior_, complement_, band_, crossings_}) label->setTextInteractionFlags(Qt::TextSelectableByMouse);
  grid->addRow(tr("Combined LR:"), lr_);
  grid->addRow(tr("Prior odds Hp : Hd:"), prior_);
  grid->addRow(tr("Posterior probability of Hp:"), posterior_);
  grid->addRow(tr("Posterior probability of Hd:"), complement_);
  grid->addRow(tr("Band from the LR's interval:"), band_);
  grid->addRow(tr("Thresholds reached:"), crossings_);
  layout->addLayout(grid);
  plot_ = new PriorPlot(this);
  layout->addWidget(plot_, 1);

  weight_box_ = new QGroupBox(tr("What one alternative's weight does"), this);
  weight_box_->setObjectName("weightGrowthBox");
  auto* weight_layout = new QVBoxLayout(weight_box_);
  auto* weight_row = new QHBoxLayout;
  auto* weight_label = new QLabel(tr("&Alternative:"), weight_box_);
  weight_alternative_ = new QComboBox(weight_box_);
  weight_alternative_->setObjectName("weightAlternative");
  weight_alternative_->setToolTip(tr("The curve shows the posterior probability of Hp as this alternative's weight goes "
                                     "from 0 to the weight the case states, the prior odds of Hp against the set and "
                                     "the other weights held as they are."));
  weight_label->setBuddy(weight_alternative_);
  weight_row->addWidget(weight_label);
  weight_row->addWidget(weight_alternative_, 1);
  weight_layout->addLayout(weight_row);
  weight_summary_ = new QLabel(weight_box_);
  weight_summary_->setObjectName("weightGrowthSummary");
  weight_summary_->setWordWrap(true);
  weight_summary_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  weight_layout->addWidget(weight_summary_);
  weight_plot_ = new WeightGrowthPlot(weight_box_);
  weight_layout->addWidget(weight_plot_, 1);
  layout->addWidget(weight_box_, 1);
  connect(weight_alternative_, &QComboBox::currentIndexChanged, this, [this] { renderWeightGrowth(); });

  connect(slider_, &QSlider::valueChanged, this, [this](int value) {
    log10_prior_ = static_cast<double>(value) / kSliderScale;
    if (one_of_n_->hasFocus() == false) one_of_n_->clear();
    render();
  });
  connect(one_of_n_, &QLineEdit::textEdited, this, [this](const QString& text) {
    bool ok = false;
    const double n = text.trimmed().remove(' ').toDouble(&ok);
    if (!ok || !(n > 1) || !std::isfinite(n)) return;
    log10_prior_ = -std::log10(n - 1);
    const QSignalBlocker block(slider_);
    slider_->setValue(static_cast<int>(std::lround(std::clamp(log10_prior_, kSliderFrom, kSliderTo) * kSliderScale)));
    render();
  });
  refresh_ = new RenderWhenVisible(this, [this] { render(); });
  connect(document_, &CaseDocument::changed, this, [this](Changes what) {
    if (what & (Change::evaluation | Change::spread | Change::content)) refresh_->request();
  });
  slider_->setValue(static_cast<int>(log10_prior_ * kSliderScale));
  render();
}

void PriorExplorer::setPriorLog10Odds(double log10_odds) {
  log10_prior_ = log10_odds;
  const QSignalBlocker block(slider_);
  slider_->setValue(static_cast<int>(std::lround(std::clamp(log10_odds, kSliderFrom, kSliderTo) * kSliderScale)));
  render();
}

void PriorExplorer::renderIfStale() { refresh_->flush(); }

void PriorExplorer::render() {
  const auto& points = document_->points();
  const bool casework = !(points.evaluated_case && points.evaluated_case->mode_or_default() == casefile::CaseMode::training);
  banner_->setText(casework ? tr("<b>Illustration for the fact-finder.</b> The prior odds belong to the fact-finder; the "
                                 "scientist proposes none. This view shows how the same findings would change different prior "
                                 "odds — it is not part of the evaluation.")
                            : tr("<b>Training case.</b> Move the prior to see how the findings' LR turns prior odds into "
                                 "posterior odds: P(E | H) is the weight of the findings, P(H | E) also depends on the prior."));
  banner_->setStyleSheet(casework ? "background: #fff4d6; padding: 6px; border: 1px solid #e0c070;"
                                  : "background: #e3f1dc; padding: 6px; border: 1px solid #9cc58a;");
  prior_->setText(QString::fromStdString(numbers::odds_for_readers(log10_prior_)) +
                  tr("  (prior probability %1)")
                      .arg(QString::fromStdString(numbers::posterior_for_readers(numbers::posterior_from_log10_odds(log10_prior_)))));
  PriorPlotData plot;
  plot.casework = casework;
  plot.current = log10_prior_;
  if (!points.combined) {
    for (QLabel* label : {lr_, posterior_, complement_, band_, crossings_}) label->setText(tr("—"));
    plot.note = QString::fromStdString(points.combined_problem);
    plot_->setData(std::move(plot));
    weight_box_->setVisible(false);
    return;
  }
  const numbers::LikelihoodRatio lr = *points.combined;
  std::optional<uncertainty::SpreadSummary> spread;
  if (document_->spread().evaluation && !document_->spreadPending()) spread = document_->spread().evaluation->combined.spread;
  lr_->setText(lr_text(lr, spread) + (spread ? tr(" (interval %1)").arg(interval_text(spread)) : QString()));
  const numbers::Posterior posterior = numbers::posterior_from(log10_prior_, lr);
  posterior_->setText(QString::fromStdString(numbers::posterior_for_readers(posterior)));
  complement_->setText(QString::fromStdString(numbers::probability_for_readers(posterior.log10_complement)));
  if (spread && std::isfinite(spread->low_log10) && std::isfinite(spread->high_log10)) {
    const auto low = numbers::posterior_from(log10_prior_, numbers::LikelihoodRatio::from_log10(spread->low_log10));
    const auto high = numbers::posterior_from(log10_prior_, numbers::LikelihoodRatio::from_log10(spread->high_log10));
    band_->setText(tr("%1 to %2").arg(QString::fromStdString(numbers::posterior_for_readers(low)),
                                      QString::fromStdString(numbers::posterior_for_readers(high))));
  } else {
    band_->setText(document_->spreadPending() ? tr("computing…") : tr("no interval (the inputs are point values)"));
  }

  // The curve over a window of prior odds around the point where the posterior is one half.
  const double centre = lr.is_finite() ? -lr.log10() : 0.0;
  plot.log10_from = std::floor(std::min(centre - 4.0, log10_prior_ - 1.0));
  plot.log10_to = std::ceil(std::max(centre + 4.0, log10_prior_ + 1.0));
  std::vector<sensitivity::PriorPoint> priors;
  for (double x : sensitivity::log_spaced(plot.log10_from, plot.log10_to, 241)) priors.push_back({x, std::nullopt, "range"});
  const auto thresholds = points.evaluated_case->priors ? points.evaluated_case->priors->thresholds_or_default()
                                                        : casefile::PriorSettings{}.thresholds_or_default();
  const auto swept = sensitivity::sweep(priors, lr, spread, thresholds);
  for (const auto& row : swept.rows) {
    plot.x.push_back(row.prior.log10_prior_odds);
    plot.y.push_back(row.posterior.probability());
    if (row.at_low && row.at_high) plot.y_low.push_back(row.at_low->probability()), plot.y_high.push_back(row.at_high->probability());
  }
  if (plot.y_low.size() != plot.x.size()) plot.y_low.clear(), plot.y_high.clear();
  plot.crossings = swept.thresholds;
  QStringList lines;
  for (const auto& crossing : swept.thresholds) {
    const QString level = QString::fromStdString(numbers::decimal_for_readers(crossing.threshold));
    if (!std::isfinite(crossing.log10_prior_odds))
      lines << tr("%1: %2").arg(level, crossing.log10_prior_odds > 0 ? tr("never") : tr("for every prior"));
    else
      lines << tr("%1 from prior odds %2%3")
                   .arg(level, QString::fromStdString(numbers::odds_for_readers(crossing.log10_prior_odds)),
                        log10_prior_ >= crossing.log10_prior_odds ? tr(" (reached)") : QString());
  }
  crossings_->setText(lines.join("<br>"));
  plot_->setData(std::move(plot));
  renderWeightGrowth();
}

void PriorExplorer::renderWeightGrowth() {
  const auto& points = document_->points();
  const auto& evaluation = document_->spread().evaluation;
  const bool weighted = points.evaluated_case && points.evaluated_case->propositions.has_alternatives() && evaluation &&
                        evaluation->combined.compound && !document_->spreadPending();
  weight_box_->setVisible(weighted);
  if (!weighted) return;
  const auto& alternatives = points.evaluated_case->propositions.alternatives;
  const auto& by_alternative = evaluation->combined.by_alternative;
  if (by_alternative.size() != alternatives.size()) return;  // an evaluation of an earlier version of the case
  QStringList names;
  for (const auto& alternative : alternatives)
    names << QString::fromStdString(alternative.id) + ": " + QString::fromStdString(alternative.text);
  QStringList shown;
  for (int i = 0; i < weight_alternative_->count(); ++i) shown << weight_alternative_->itemText(i);
  if (shown != names) {
    const QSignalBlocker block(weight_alternative_);
    const int kept = weight_alternative_->currentIndex();
    weight_alternative_->clear();
    weight_alternative_->addItems(names);
    weight_alternative_->setCurrentIndex(kept >= 0 && kept < names.size() ? kept : names.size() - 1);
  }
  const auto index = static_cast<std::size_t>(std::max(0, weight_alternative_->currentIndex()));

  std::vector<numbers::LikelihoodRatio> pairwise;
  for (const auto& against : by_alternative) pairwise.push_back(against.lr);
  const auto& weights = evaluation->combined.compound->weights;
  const auto steps = sensitivity::hp_as_weight_grows(log10_prior_, pairwise, weights, index, kWeightSteps);
  WeightGrowthData data;
  data.alternative = QString::fromStdString(alternatives[index].id);
  for (const auto& step : steps) data.fractions.push_back(step.fraction), data.hp.push_back(step.hp.probability());
  if (steps.empty()) data.note = tr("No posterior can be formed for these LRs.");
  if (!steps.empty()) {
    const QString id = QString::fromStdString(alternatives[index].id);
    weight_summary_->setText(
        tr("At prior odds %1 for Hp against the set of alternatives: posterior probability of Hp %2 with no weight on %3, "
           "%4 at its stated weight (%5 of the alternatives' weight).")
            .arg(QString::fromStdString(numbers::odds_for_readers(log10_prior_)),
                 QString::fromStdString(numbers::posterior_for_readers(steps.front().hp)), id,
                 QString::fromStdString(numbers::posterior_for_readers(steps.back().hp)),
                 QString::fromStdString(numbers::percent_for_readers(weights[index]))));
  } else {
    weight_summary_->setText(data.note);
  }
  weight_plot_->setData(std::move(data));
}

}  // namespace counterpoise::editor
