#include "reports/validation_report.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>

#include "core/method_validation/validation_criteria.hpp"
#include "core/numbers/number_text.hpp"

namespace counterpoise::reports {

namespace mv = method_validation;

namespace {

// Through the one reader formatter, as in the case report: 3 significant figures, powers of ten as
// superscripts, never "1e-05".
std::string measure(double x) { return numbers::decimal_for_readers(x); }
std::string interval(const mv::Interval& i) { return measure(i.low) + " to " + measure(i.high); }

Paragraph body(std::string text) { return Paragraph{std::move(text), Paragraph::Style::body, {}, {}, {}}; }
Paragraph bullet(std::string text) { return Paragraph{std::move(text), Paragraph::Style::bullet, {}, {}, {}}; }

Section what_was_validated(const mv::ValidationRun& run, const ValidationReportInfo& info) {
  Section s{"validated", "What was validated", false, {}};
  s.blocks.push_back(body("The likelihood ratios in " + run.source + " were judged against the ground truth of each comparison: " +
                          std::to_string(run.summary.hp_count) + " comparisons in which Hp was true and " +
                          std::to_string(run.summary.hd_count) + " in which Hd was true."));
  s.blocks.push_back(body("Calibration: " + run.calibration_text + "."));
  if (!info.results_sha256.empty())
    s.blocks.push_back(Paragraph{"The SHA-256 digest in the header identifies the results file's bytes.", Paragraph::Style::note, {}, {}, {}});
  return s;
}

Section measures(const mv::ValidationRun& run) {
  const mv::PerformanceSummary& m = run.summary;
  const mv::BootstrapIntervals& b = run.intervals;
  Section s{"measures", "Performance", false, {}};
  Table t;
  t.header = {"Measure", "Value", std::to_string(static_cast<int>(b.options.level * 100 + 0.5)) + " % interval"};
  t.widths = {3.2, 1.0, 1.6};
  t.no_wrap = {false, true, true};
  t.rows = {{"log-likelihood-ratio cost, Cllr (bits)", measure(m.cllr), interval(b.cllr)},
            {"minimum cost after PAV, Cllr_min (bits)", measure(m.cllr_min), interval(b.cllr_min)},
            {"calibration loss, Cllr \u2212 Cllr_min (bits)", measure(m.cllr_cal), interval(b.cllr_cal)},
            {"equal error rate", measure(m.eer), interval(b.eer)},
            {"LR < 1 when Hp is true (misleading)", measure(m.misleading.hp), interval(b.misleading_hp)},
            {"LR > 1 when Hd is true (misleading)", measure(m.misleading.hd), interval(b.misleading_hd)},
            {"LR at most 1/100 when Hp is true", measure(m.misleading.strong_hp), interval(b.strong_hp)},
            {"LR at least 100 when Hd is true", measure(m.misleading.strong_hd), interval(b.strong_hd)}};
  s.blocks.push_back(t);
  s.blocks.push_back(Paragraph{"Intervals are percentile intervals of " + std::to_string(b.options.resamples) +
                                   " bootstrap resamples drawn within each truth (seed " + std::to_string(b.options.seed) +
                                   "). Cllr is 0 for a perfect method and 1 for a method that always reports an LR of 1.",
                               Paragraph::Style::note, {}, {}, {}});
  if (!run.by_condition.empty()) {
    Table c;
    c.header = {"Condition", "Hp / Hd", "Cllr", "Cllr_min", "EER"};
    c.widths = {2.4, 1.2, 1, 1, 1};
    c.no_wrap = {false, true, true, true, true};
    for (const auto& [condition, p] : run.by_condition)
      c.rows.push_back({condition, std::to_string(p.hp_count) + " / " + std::to_string(p.hd_count), measure(p.cllr),
                        measure(p.cllr_min), measure(p.eer)});
    s.blocks.push_back(body("The same measures for each condition in the results:"));
    s.blocks.push_back(c);
  }
  return s;
}

Section criteria(const mv::ValidationRun& run) {
  Section s{"criteria", "Validation criteria", false, {}};
  Table t;
  t.header = {"Characteristic", "Metric", "Value", "Criterion", "Result"};
  t.widths = {1.5, 2.6, 0.9, 1.3, 0.9};
  t.no_wrap = {false, false, true, false, true};
  for (const mv::CriterionResult& r : run.criteria) {
    std::string bound;
    if (r.criterion.at_most) bound = "at most " + measure(*r.criterion.at_most);
    if (r.criterion.at_least) bound += (bound.empty() ? "" : ", ") + std::string("at least ") + measure(*r.criterion.at_least);
    t.rows.push_back({r.criterion.characteristic, mv::metric_description(r.criterion.metric), measure(r.value), bound,
                      r.pass ? "pass" : "fail"});
  }
  for (const mv::Criterion& c : run.rows_without_criteria)
    t.rows.push_back({c.characteristic, mv::metric_description(c.metric),
                      measure(mv::metric_value(run.summary, c.metric, {"criteria", c.metric})), "not set", "-"});
  s.blocks.push_back(body(run.criteria.empty()
                              ? "The laboratory gave no criteria for this run: the table lists the measures for each "
                                "performance characteristic without judging them."
                              : "The criteria are the laboratory's, set before the run; a value on the bound passes."));
  s.blocks.push_back(t);
  return s;
}

LineChart tippett_chart(const mv::ValidationRun& run) {
  LineChart c;
  c.x_title = "log10 LR";
  c.y_title = "Proportion with log10 LR at least x";
  LineChart::Series hp{"Hp true", {}, {}, LineChart::Series::Style::solid};
  LineChart::Series hd{"Hd true", {}, {}, LineChart::Series::Style::dashed};
  for (const auto& p : run.tippett.hp) hp.x.push_back(p.x), hp.y.push_back(p.y);
  for (const auto& p : run.tippett.hd) hd.x.push_back(p.x), hd.y.push_back(p.y);
  c.x_from = hp.x.empty() ? -1 : hp.x.front();
  c.x_to = hp.x.empty() ? 1 : hp.x.back();
  c.y_from = 0, c.y_to = 1;
  c.series = {hp, hd};
  c.caption = "Tippett plot: for each truth, the proportion of comparisons whose log10 LR is at least the value on the "
              "axis. Misleading results are the Hd curve right of 0 and the Hp curve's complement left of 0.";
  return c;
}

LineChart cross_entropy_chart(const mv::ValidationRun& run) {
  LineChart c;
  c.x_title = "Prior log10 odds of Hp";
  c.y_title = "Empirical cross-entropy (bits)";
  const auto& o = run.ece.prior_log10_odds;
  c.series = {{"LRs as given", o, run.ece.method, LineChart::Series::Style::solid},
              {"after PAV", o, run.ece.calibrated, LineChart::Series::Style::dashed},
              {"LR = 1 always", o, run.ece.neutral, LineChart::Series::Style::dotted}};
  c.x_from = o.front(), c.x_to = o.back(), c.y_from = 0;
  double top = 0;
  for (const auto& s : c.series)
    for (double y : s.y)
      if (std::isfinite(y)) top = std::max(top, y);
  c.y_to = std::max(1.0, std::ceil(top * 5.0) / 5.0);
  c.caption = "Empirical cross-entropy over the prior odds: the lower the curve, the more information the LRs give. "
              "The gap between the first two curves is the loss from calibration; a curve above the third means the "
              "LRs mislead at those prior odds. At even odds the first curve equals Cllr.";
  return c;
}

LineChart calibration_chart(const mv::ValidationRun& run) {
  LineChart c;
  c.x_title = "log10 LR as given";
  c.y_title = "log10 LR after PAV";
  LineChart::Series steps{"after PAV", {}, {}, LineChart::Series::Style::solid};
  double lo = INFINITY, hi = -INFINITY;
  for (const mv::PavBlock& b : run.pav.blocks) {
    if (!std::isfinite(b.score_low) || !std::isfinite(b.score_high) || !std::isfinite(b.log10_lr)) continue;
    steps.x.insert(steps.x.end(), {b.score_low, b.score_high});
    steps.y.insert(steps.y.end(), {b.log10_lr, b.log10_lr});
    lo = std::min({lo, b.score_low, b.log10_lr});
    hi = std::max({hi, b.score_high, b.log10_lr});
  }
  if (!std::isfinite(lo)) lo = -1, hi = 1;
  lo = std::floor(lo), hi = std::ceil(hi);
  if (hi <= lo) hi = lo + 1;
  c.series = {steps, {"perfect calibration", {lo, hi}, {lo, hi}, LineChart::Series::Style::dotted}};
  c.x_from = c.y_from = lo;
  c.x_to = c.y_to = hi;
  c.caption = "Calibration: the LRs that the pool-adjacent-violators transform gives each range of the method's LRs. "
              "Well calibrated LRs follow the diagonal; steps with one truth only (infinite after PAV) are not drawn.";
  return c;
}

Section plots(const mv::ValidationRun& run) {
  Section s{"plots", "Plots", false, {}};
  s.blocks.push_back(tippett_chart(run));
  s.blocks.push_back(cross_entropy_chart(run));
  s.blocks.push_back(calibration_chart(run));
  return s;
}

Section notes_and_cautions(const mv::ValidationRun& run) {
  Section s{"cautions", "Notes and cautions", false, {}};
  for (std::string w : run.warnings) {
    if (!w.empty()) w[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(w[0])));
    s.blocks.push_back(bullet(w + "."));
  }
  s.blocks.push_back(bullet("A validation holds for the conditions tested: the kinds of material, the quantities, the "
                            "instruments and the settings represented in these results. Cases outside them need their "
                            "own validation."));
  s.blocks.push_back(bullet("The criteria are the laboratory's and are set before the run; this report does not set any."));
  s.blocks.push_back(bullet("Measures computed from a finite set of comparisons are uncertain; the intervals show how much."));
  s.blocks.push_back(bullet("Follow your accredited laboratory's procedures and the law of the place where the method is used."));
  return s;
}

}  // namespace

ReportModel build_validation_report(const mv::ValidationRun& run, const ValidationReportInfo& info) {
  ReportModel model;
  model.mode = ReportMode::casework;
  model.header.title = "Validation of a likelihood-ratio method";
  model.header.laboratory = info.laboratory.empty() ? "Laboratory not given" : info.laboratory;
  model.header.reference = run.source;
  model.header.case_title = "Results in " + run.source;
  model.header.examiner = info.examiner.empty() ? "not given" : info.examiner;
  model.header.date = info.date;
  model.header.revision = "not applicable (a validation run)";
  model.header.digest_label = "Results file (SHA-256)";
  model.header.digest = info.results_sha256;
  model.sections = {what_was_validated(run, info), measures(run), criteria(run), plots(run), notes_and_cautions(run)};
  return model;
}

}  // namespace counterpoise::reports
