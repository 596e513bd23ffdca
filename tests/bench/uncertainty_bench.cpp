// Benchmark (measured, not asserted): the uncertainty of a 40-item case, each item with a
// Beta-distributed P(E|Hp) and a count-based P(E|Hd), by lattice convolution and by 100 000
// joint Monte Carlo draws; and a 10 000-point prior sweep (rows, and columns). Side by side in the same run, the
// same work in NumPy (tests/bench/uncertainty_numpy.py, when python3 with NumPy is installed:
// apt-get install python3-numpy; nothing else needs it), with the ratios.
// Run as build/tests/bench/bench_uncertainty (not pinned: the Monte Carlo is measured on one
// thread and on two; the NumPy side is pinned to core 0 and runs on one thread).
#include <cstdio>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "bench_machine.hpp"
#include "bench_timer.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/evaluation/joint_monte_carlo.hpp"
#include "core/interchange/case_json.hpp"
#include "core/sensitivity/posterior_columns.hpp"
#include "core/sensitivity/prior_sweep.hpp"
#include "core/uncertainty/unordered_draws_summary.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

// The NumPy figures ("name wall_ms cpu_ms" lines; "numpy_version V"), or an empty map when NumPy
// cannot be run.
std::map<std::string, std::vector<std::string>> numpy_figures(double log10_lr, double low, double high) {
  const std::string command = "taskset -c 0 /usr/bin/python3 '" COUNTERPOISE_BENCH_DIR "/uncertainty_numpy.py' " +
                              std::to_string(log10_lr) + " " + std::to_string(low) + " " + std::to_string(high) +
                              " 2>/dev/null";
  std::map<std::string, std::vector<std::string>> figures;
  FILE* pipe = popen(command.c_str(), "r");
  if (!pipe) return figures;
  char line[256];
  while (std::fgets(line, sizeof line, pipe)) {
    std::istringstream words(line);
    std::string name, value;
    words >> name;
    while (words >> value) figures[name].push_back(value);
  }
  pclose(pipe);
  return figures;
}

// A NumPy figure as {wall, cpu} milliseconds.
bench::Timing numpy_timing(const std::map<std::string, std::vector<std::string>>& figures, const std::string& name) {
  const auto& values = figures.at(name);
  return {std::stod(values.at(0)), std::stod(values.at(1))};
}

// The joint Monte Carlo exactly as evaluate --cross-check runs it (joint_log10_lr_draws over all
// items, then summarised), on `threads` threads.
uncertainty::SpreadSummary joint_monte_carlo(const casefile::Case& value, double reported_log10, unsigned threads) {
  std::vector<std::size_t> all(value.items.size());
  for (std::size_t i = 0; i < all.size(); ++i) all[i] = i;
  auto draws = evaluation::joint_log10_lr_draws(value, all, threads);
  return uncertainty::summarize_unordered_draws(draws, uncertainty::SpreadLevels{}, reported_log10);
}

}  // namespace

int main() {
  std::printf("CPU: %s (%u threads); load average at start: %s\n", bench::cpu_model().c_str(),
              std::thread::hardware_concurrency(), bench::load_average().c_str());
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
  const auto& spread = *lattice.combined.spread;
  std::printf("40-item case, reported log10 LR %.4f\n", lattice.combined.lr.log10());
  std::printf("lattice convolution (all 40 item intervals + combined): %.2f ms median of 9\n", lattice_ms);
  std::printf("  log10 LR 5/50/95 %%: %.4f %.4f %.4f (step %.2g)\n", spread.low_log10, spread.median_log10,
              spread.high_log10, spread.lattice_step);

  uncertainty::SpreadSummary mc, mc_one;
  const bench::Timing mc_one_ms =
      bench::median_timing(3, [&] { mc_one = joint_monte_carlo(value, lattice.combined.lr.log10(), 1); });
  const double mc_ms = bench::median_milliseconds(3, [&] { mc = joint_monte_carlo(value, lattice.combined.lr.log10(), 2); });
  std::printf("joint Monte Carlo, 100 000 draws x 40 items: %.1f ms on one thread (CPU time %.1f ms), %.1f ms on two,"
              " median of 3\n",
              mc_one_ms.wall_ms, mc_one_ms.cpu_ms, mc_ms);
  std::printf("  log10 LR 5/50/95 %%: %.4f %.4f %.4f (one thread: %.4f %.4f %.4f)\n", mc.low_log10, mc.median_log10,
              mc.high_log10, mc_one.low_log10, mc_one.median_log10, mc_one.high_log10);

  const auto points = [] {
    std::vector<sensitivity::PriorPoint> p;
    for (double l : sensitivity::log_spaced(-12.0, 6.0, 10000)) p.push_back({l, std::nullopt, "range"});
    return p;
  }();
  sensitivity::PriorSensitivity sweep;
  const bench::Timing sweep_ms = bench::median_timing(21, [&] {
    sweep = sensitivity::sweep(points, lattice.combined.lr, std::nullopt, {0.5, 0.95, 0.99});
  });
  const bench::Timing band_ms = bench::median_timing(21, [&] {
    sweep = sensitivity::sweep(points, lattice.combined.lr, lattice.combined.spread, {0.5, 0.95, 0.99});
  });
  std::printf("10 000-point prior sweep: %.3f ms without band, %.3f ms with band, median of 21 (last row P(Hd|E) = %.3g)\n",
              sweep_ms.wall_ms, band_ms.wall_ms, sweep.rows.back().posterior.complement());
  // Like for like with NumPy: only the two log10 posteriors per prior, into columns (no rows).
  std::vector<double> priors(points.size()), probability(points.size()), complement(points.size());
  for (std::size_t i = 0; i < points.size(); ++i) priors[i] = points[i].log10_prior_odds;
  const bench::Timing columns_ms = bench::median_timing(
      21, [&] { sensitivity::posterior_columns(priors, lattice.combined.lr, probability, complement); });
  std::printf("10 000 posteriors into columns (posterior_columns): %.3f ms, median of 21 (equal to the rows: %s)\n",
              columns_ms.wall_ms, complement.back() == sweep.rows.back().posterior.log10_complement ? "yes" : "NO");

  const auto numpy = numpy_figures(lattice.combined.lr.log10(), spread.low_log10, spread.high_log10);
  if (numpy.empty() || !numpy.count("numpy_monte_carlo_ms") || !numpy.count("numpy_sweep_band_ms")) {
    std::printf("NumPy side: not run (needs /usr/bin/python3 with NumPy: apt-get install python3-numpy)\n");
    return 0;
  }
  const bench::Timing np_mc = numpy_timing(numpy, "numpy_monte_carlo_ms");
  const bench::Timing np_sweep = numpy_timing(numpy, "numpy_sweep_ms");
  const bench::Timing np_band = numpy_timing(numpy, "numpy_sweep_band_ms");
  std::printf("NumPy %s, same work, one thread pinned to core 0; ratio = NumPy time / Counterpoise time, by the wall clock"
              " and by each side's CPU time (which leaves out the time other processes held the core):\n",
              numpy.count("numpy_version") ? numpy.at("numpy_version").at(0).c_str() : "?");
  const auto line = [](const char* what, const bench::Timing& np, const bench::Timing& ours, const char* target) {
    std::printf("  %s: NumPy %.3f ms, Counterpoise %.3f ms: ratio %.2f; CPU time %.3f / %.3f ms: ratio %.2f%s\n", what,
                np.wall_ms, ours.wall_ms, np.wall_ms / ours.wall_ms, np.cpu_ms, ours.cpu_ms, np.cpu_ms / ours.cpu_ms, target);
  };
  line("joint Monte Carlo, one thread", np_mc, mc_one_ms, " (target >= 2)");
  std::printf("  joint Monte Carlo, two threads: Counterpoise %.1f ms: ratio %.2f by the wall clock\n", mc_ms,
              np_mc.wall_ms / mc_ms);
  line("prior sweep without band, like for like (columns)", np_sweep, columns_ms, " (target >= 1)");
  line("prior sweep without band, rows as evaluate_case builds them", np_sweep, sweep_ms, "");
  line("prior sweep with band (rows)", np_band, band_ms, " (target: band under 1 ms)");
  std::printf("load average at end: %s\n", bench::load_average().c_str());
  return 0;
}
