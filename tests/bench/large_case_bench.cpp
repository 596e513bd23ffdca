// Benchmark (measured, not asserted): a large case as `counterpoise-cli evaluate --json` handles
// it — read (bounded parse + case reader), evaluate, case guard (with the same-findings check),
// JSON output (document, text, terminal-safe escaping) — at 1 000 and
// 10 000 items side by side, so the growth with the number of items shows (near-linear is the
// aim; the former pairwise same-findings check grew with the square). Each case has 30 % of its
// items identical (the same model inputs: one grouped warning) and ten items with Beta inputs (a
// spread to combine). Also the lookup of every included item by id, by a scan per item beside an
// index built once. Prints the CPU model and the peak resident memory of the process.
// Run on one core: taskset -c 0 build/tests/bench/bench_large_case
#include <cstdio>
#include <fstream>
#include <string>

#include "bench_large_case_text.hpp"
#include "bench_machine.hpp"
#include "bench_timer.hpp"
#include "core/casefile/item_index.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/guard/case_guard.hpp"
#include "core/guard/case_rules.hpp"
#include "core/interchange/case_json.hpp"
#include "core/interchange/evaluation_json.hpp"
#include "core/reading/json_text.hpp"
#include "core/validation/display_text.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

struct Stages {
  double read_ms, evaluate_ms, guard_ms, output_ms;
  double scan_lookup_ms, index_lookup_ms;
  double setup_checks_ms;  // check_case_setup: what the editor adds to every edit
  std::size_t same_findings_warnings;
};

Stages run(int items) {
  const std::string text = bench::large_case_text(items);
  Stages s{};
  interchange::CaseReadResult read;
  // As the command line reads a file: the bounded parse (reading/json_text), then the case reader.
  s.read_ms = bench::median_milliseconds(
      3, [&] { read = interchange::read_case(reading::parse_json_text(text, "large case"), "."); });
  if (!read.value) {
    std::fprintf(stderr, "the benchmark case does not read\n");
    std::exit(1);
  }
  evaluation::CaseEvaluation result;
  s.evaluate_ms = bench::median_milliseconds(3, [&] { result = evaluation::evaluate_case(*read.value); });
  std::vector<guard::CaseWarning> warnings;
  const auto& checker = guard::checker_for_case(*read.value);
  s.guard_ms = bench::median_milliseconds(3, [&] { warnings = guard::check_case(*read.value, checker); });
  // The editor re-runs the checks on the set-up (no wording) after every edit, beside its own
  // wording check, which keeps the findings of unchanged texts.
  std::size_t setup_warnings = 0;
  s.setup_checks_ms = bench::median_milliseconds(3, [&] { setup_warnings = guard::check_case_setup(*read.value).size(); });
  std::size_t bytes = 0;
  // As evaluate --json writes it: the document, its text, and the text made safe for a terminal
  // (app/cli/json_output: display_json; app/cli/display_stream: display_lines).
  s.output_ms = bench::median_milliseconds(3, [&] {
    const std::string dumped = interchange::evaluation_to_json(*read.value, result, warnings)
                                   .dump(2, ' ', false, json::error_handler_t::replace);
    bytes = validation::display_lines(validation::display_json(dumped)).size();
  });
  for (const auto& w : warnings) s.same_findings_warnings += w.rule == guard::case_rules::same_findings;
  // Looking up every included item by id, as the report's independence list and the editor's
  // point evaluation do: the scan per item (Case::find_item, their former way) beside the index
  // built once (casefile::ItemIndex).
  std::size_t found = 0;
  s.scan_lookup_ms = bench::median_milliseconds(3, [&] {
    for (const auto& id : result.combined.included_ids) found += read.value->find_item(id) != nullptr;
  });
  s.index_lookup_ms = bench::median_milliseconds(3, [&] {
    const casefile::ItemIndex index(*read.value);
    for (const auto& id : result.combined.included_ids) found += index.find(id) != nullptr;
  });
  std::printf("  %6d items: read %.0f ms, evaluate %.0f ms, guard %.0f ms, JSON output %.0f ms (%zu bytes): total %.0f ms;"
              " %zu same-findings warning(s)\n",
              items, s.read_ms, s.evaluate_ms, s.guard_ms, s.output_ms, bytes,
              s.read_ms + s.evaluate_ms + s.guard_ms + s.output_ms, s.same_findings_warnings);
  std::printf("          checks on the set-up alone (check_case_setup, run by the editor after each edit): %.1f ms"
              " (%zu warning(s))\n",
              s.setup_checks_ms, setup_warnings);
  std::printf("          looking up %zu included items by id: scan per item %.2f ms, index %.2f ms (%zu found)\n",
              result.combined.included_ids.size(), s.scan_lookup_ms, s.index_lookup_ms, found);
  return s;
}

}  // namespace

int main() {
  std::printf("CPU: %s\n", bench::cpu_model().c_str());
  std::printf("large case, median of 3 per stage:\n");
  const Stages small = run(1000);
  const Stages large = run(10000);
  const auto total = [](const Stages& s) { return s.read_ms + s.evaluate_ms + s.guard_ms + s.output_ms; };
  std::printf("10x the items: %.1fx the time (guard alone %.1fx); peak resident memory %.0f MB\n",
              total(large) / total(small), large.guard_ms / small.guard_ms, bench::peak_rss_mb());
  return 0;
}
