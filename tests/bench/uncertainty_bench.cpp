// Benchmark (measured, not asserted): the uncertainty of a 40-item case, each item with a
// Beta-distributed P(E|Hp) and a count-based P(E|Hd), by lattice convolution and by 100 000
// joint Monte Carlo draws; and a 10 000-point prior sweep. Prints times and the 5/50/95 %
// quantiles of log10 LR from both methods. Run on one core: taskset -c 0 build/tests/bench/bench_uncertainty
#include <cstdio>

#include "bench_timer.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/sensitivity/prior_sweep.hpp"

using namespace counterpoise;
using nlohmann::json;

int main() {
  json doc = {{"format", "counterpoise.case"}, {"version", 1}, {"case", {{"reference", "BENCH-40"}}},
              {"propositions", {{"level", "source"}, {"hp", "Hp of the benchmark"}, {"hd", "Hd of the benchmark"}}},
              {"uncertainty", {{"seed", 40}, {"draws", 100000}}}};
  json items = json::array();
  for (int i = 0; i < 40; ++i)
    items.push_back({{"id", "E" + std::to_string(i + 1)}, {"model", "assigned"},
                     {"p_given_hp", {{"beta", {20.0 + i, 3.0 + (i % 5)}}}},
                     {"p_given_hd", {{"counts", {{"k", 2 + (i % 7)}, {"n", 300 + 10 * i}}}}}});
  doc["items"] = items;
  const auto read = interchange::read_case(doc, ".");
  if (!read.value) return 1;
  const casefile::Case& value = *read.value;

  evaluation::CaseEvaluation lattice;
  const double lattice_ms = bench::median_milliseconds(9, [&] { lattice = evaluation::evaluate_case(value); });
  evaluation::EvaluationOptions with_mc;
  with_mc.monte_carlo_cross_check = true;
  evaluation::CaseEvaluation both;
  const double both_ms = bench::median_milliseconds(3, [&] { both = evaluation::evaluate_case(value, with_mc); });

  std::printf("40-item case, point log10 LR %.4f\n", lattice.combined.lr.log10());
  std::printf("lattice convolution (all 40 item intervals + combined): %.2f ms median of 9\n", lattice_ms);
  std::printf("  log10 LR 5/50/95 %%: %.4f %.4f %.4f (step %.2g)\n", lattice.combined.spread->low_log10,
              lattice.combined.spread->median_log10, lattice.combined.spread->high_log10,
              lattice.combined.spread->lattice_step);
  std::printf("lattice + joint Monte Carlo of 100 000 draws: %.2f ms median of 3 (Monte Carlo alone about %.2f ms)\n",
              both_ms, both_ms - lattice_ms);
  std::printf("  log10 LR 5/50/95 %%: %.4f %.4f %.4f\n", both.combined.monte_carlo_check->low_log10,
              both.combined.monte_carlo_check->median_log10, both.combined.monte_carlo_check->high_log10);

  const auto points = [] {
    std::vector<sensitivity::PriorPoint> p;
    for (double l : sensitivity::log_spaced(-12.0, 6.0, 10000)) p.push_back({l, std::nullopt, "range"});
    return p;
  }();
  sensitivity::PriorSensitivity sweep;
  const double sweep_ms = bench::median_milliseconds(21, [&] {
    sweep = sensitivity::sweep(points, lattice.combined.lr, lattice.combined.spread, {0.5, 0.95, 0.99});
  });
  std::printf("10 000-point prior sweep with band: %.3f ms median of 21 (last row P(Hd|E) = %.3g)\n", sweep_ms,
              sweep.rows.back().posterior.complement());
  return 0;
}
