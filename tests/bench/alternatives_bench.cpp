// Benchmark (measured, not asserted): a case of 100 items weighed against 5 weighted alternatives
// to Hp, as `counterpoise-cli evaluate --json` handles it — read, evaluate (each alternative's
// per-item and combined LR with its spread, the compound LR, the illustration over the set), JSON
// output — side by side with the same items against a single alternative (a two-proposition
// case), so what the alternatives cost shows. Ten items per case have Beta or counts inputs and
// ten a reported LR with an interval (spreads to combine). Invented numbers.
// Run on one core: taskset -c 0 build/tests/bench/bench_alternatives
#include <cstdio>
#include <string>

#include "bench_machine.hpp"
#include "bench_timer.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"
#include "core/interchange/evaluation_json.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

// The probability of item i's findings under alternative a (a = -1: under Hp).
json probability(int i, int a) {
  if (i % 10 == 0) return {{"counts", {{"k", 2 + (i + a) % 5}, {"n", 300 + i % 97}}}};
  if (i % 10 == 1 && a < 0) return {{"beta", {20 + i % 7, 3}}};
  return a < 0 ? 0.5 + 0.4 * (i % 13) / 13.0 : 0.05 + 0.1 * ((i * 7 + a * 3) % 11) / 11.0;
}

std::string case_text(int items, int alternatives) {
  json list = json::array();
  for (int i = 1; i <= items; ++i) {
    json item = {{"id", "E" + std::to_string(i)}};
    if (i % 10 == 5) {
      item["model"] = "reported-lr";
      const auto lr_of = [&](int a) { return json{{"log10_lr", 1.0 + 0.1 * a}, {"interval_log10", {0.7 + 0.1 * a, 1.4 + 0.1 * a}}}; };
      if (alternatives == 1) {
        item.update(lr_of(0));
      } else {
        for (int a = 0; a < alternatives; ++a) item["alternatives"]["Hd" + std::to_string(a + 1)] = lr_of(a);
      }
    } else {
      item["model"] = "assigned";
      if (alternatives == 1) {
        item["p_given_hp"] = probability(i, -1);
        item["p_given_hd"] = probability(i, 0);
      } else {
        item["p_given"]["Hp"] = probability(i, -1);
        for (int a = 0; a < alternatives; ++a) item["p_given"]["Hd" + std::to_string(a + 1)] = probability(i, a);
      }
    }
    list.push_back(item);
  }
  json propositions = {{"level", "source"}, {"hp", "The traces come from the workshop at 3 Tanner Row"}};
  if (alternatives == 1) {
    propositions["hd"] = "The traces come from other sources";
  } else {
    for (int a = 0; a < alternatives; ++a)
      propositions["alternatives"].push_back({{"id", "Hd" + std::to_string(a + 1)},
                                              {"text", "The traces come from source " + std::to_string(a + 1)},
                                              {"weight", 1.0 + a}});
  }
  json doc = {{"format", "counterpoise.case"}, {"version", 1},
              {"case", {{"reference", "HV-BENCH-ALT"}, {"title", "An invented benchmark case with alternatives"}}},
              {"propositions", propositions}, {"items", list}, {"priors", {{"odds", {1e-6, 1e-3, 1}}}}};
  return doc.dump();
}

double run(int items, int alternatives) {
  const std::string text = case_text(items, alternatives);
  interchange::CaseReadResult read;
  const double read_ms = bench::median_milliseconds(3, [&] { read = interchange::read_case(json::parse(text), "."); });
  if (!read.value) {
    std::fprintf(stderr, "the benchmark case does not read: %s\n", read.diagnostics.problems().front().text().c_str());
    std::exit(1);
  }
  evaluation::CaseEvaluation result;
  const double evaluate_ms = bench::median_milliseconds(3, [&] { result = evaluation::evaluate_case(*read.value); });
  std::size_t bytes = 0;
  const double output_ms = bench::median_milliseconds(
      3, [&] { bytes = interchange::evaluation_to_json(*read.value, result, {}).dump(2).size(); });
  const double total = read_ms + evaluate_ms + output_ms;
  std::printf("  %3d items, %d alternative(s): read %.1f ms, evaluate %.1f ms, JSON output %.1f ms (%zu bytes): total %.1f ms\n",
              items, alternatives, read_ms, evaluate_ms, output_ms, bytes, total);
  return total;
}

}  // namespace

int main() {
  std::printf("CPU: %s\n", bench::cpu_model().c_str());
  std::printf("case with alternatives, median of 3 per stage:\n");
  const double one = run(100, 1);
  const double five = run(100, 5);
  std::printf("5 alternatives: %.1fx the time of one; peak resident memory %.0f MB\n", five / one, bench::peak_rss_mb());
  return 0;
}
