// Comparison benchmark (not a timed test): two invented 100-item cases that differ in 20 inputs
// (four transfer items in t0, tn and gamma, which interact; four DNA items in θ and the donor's
// relationship, each mixture read again with its frequency file), compared with compare_cases,
// side by side in the same run with what a reviewer would otherwise run: evaluate_case on both
// versions (no attribution), and re-reading the whole first case once per difference with that
// one input changed (the one-at-a-time effects only). Figures: docs/performance.md ("Comparison").
#include <cstdio>
#include <filesystem>

#include "bench_machine.hpp"
#include "bench_timer.hpp"
#include "core/comparison/case_comparison.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/interchange/case_json.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

const std::filesystem::path kDemo = std::filesystem::path(COUNTERPOISE_BENCH_DIR) / "../../casefiles_demo";

json dna_item(int i, double theta, const std::string& relationship) {
  const json profile = {{"D3S1358", {"15", "17"}}, {"vWA", {"16", "18"}}, {"FGA", {"22", "24"}}};
  return {{"id", "D" + std::to_string(i)}, {"model", "dna-single-source"}, {"theta", theta},
          {"relationship", relationship},  {"profile", profile},           {"reference_profile", profile},
          {"frequencies", {{"file", "dna/vale-str-frequencies.csv"}}}};
}

json transfer_item(int i, double t0, double tn, double gamma) {
  return {{"id", "T" + std::to_string(i)}, {"model", "transfer"}, {"found", "group"}, {"n", 5}, {"t0", t0},
          {"tn", tn}, {"p0", 0.6}, {"p1", 0.3}, {"sn", 0.2}, {"gamma", gamma}};
}

// 60 assigned items, 20 transfer items, 10 reported LRs and 10 DNA items; `changed` gives the
// second version: 20 inputs differ.
json bench_case(bool changed) {
  json items = json::array();
  for (int i = 1; i <= 60; ++i)
    items.push_back({{"id", "E" + std::to_string(i)}, {"model", "assigned"},
                     {"p_given_hp", {{"beta", {8.5, 2.5}}}}, {"p_given_hd", {{"counts", {{"k", 3}, {"n", 412}}}}}});
  for (int i = 1; i <= 20; ++i)
    items.push_back(changed && i <= 4 ? transfer_item(i, 0.4, 0.05, 0.5) : transfer_item(i, 0.1, 0.3, 0.05));
  for (int i = 1; i <= 10; ++i) items.push_back({{"id", "R" + std::to_string(i)}, {"model", "reported-lr"}, {"lr", 40}});
  for (int i = 1; i <= 10; ++i)
    items.push_back(changed && i <= 4 ? dna_item(i, 0.03, "full-sibling") : dna_item(i, 0.01, "unrelated"));
  return {{"format", "counterpoise.case"},
          {"version", 1},
          {"case", {{"reference", "VFL-BENCH"}, {"title", "Comparison benchmark (invented)"}}},
          {"propositions", {{"level", "source"}, {"hp", "The findings came from the bench case."}, {"hd", "They did not."}}},
          {"items", items},
          {"uncertainty", {{"seed", 1}, {"draws", 20000}}}};
}

comparison::CaseVersion version(const json& document, const std::string& label) {
  auto read = interchange::read_case(document, kDemo);
  if (!read.value) {
    std::fprintf(stderr, "bench case does not read: %s\n", read.diagnostics.problems().front().text().c_str());
    std::exit(1);
  }
  return comparison::make_version(std::move(*read.value), kDemo, label);
}

}  // namespace

int main() {
  std::printf("Comparison of two 100-item cases with 20 differing inputs\n");
  std::printf("CPU: %s; load average %s\n", bench::cpu_model().c_str(), bench::load_average().c_str());
  const json first = bench_case(false), second = bench_case(true);
  const auto a = version(first, "A"), b = version(second, "B");

  comparison::CaseComparison result;
  const double compare_ms = bench::median_milliseconds(9, [&] { result = comparison::compare_cases(a, b); });
  std::size_t entering = 0;
  for (const auto& d : result.differences) entering += d.enters_lr();
  std::printf("  compare_cases (differences, Shapley shares, wording): %8.2f ms  [%zu differences, %zu enter the LR]\n",
              compare_ms, result.differences.size(), entering);

  const double list_ms = bench::median_milliseconds(9, [&] { (void)comparison::list_differences(a, b); });
  std::printf("  list_differences alone:                               %8.2f ms\n", list_ms);

  const double evaluate_ms = bench::median_milliseconds(3, [&] {
    (void)evaluation::evaluate_case(a.value);
    (void)evaluation::evaluate_case(b.value);
  });
  std::printf("  alternative: evaluate_case on both versions:          %8.2f ms  (no attribution)\n", evaluate_ms);

  // One-at-a-time by whole-case re-reads: the first case with one input of the second.
  const double reread_ms = bench::median_milliseconds(3, [&] {
    for (const auto& d : result.differences) {
      if (d.path.section != "items" || d.path.field.empty()) continue;
      json one = first;
      for (auto& item : one["items"])
        if (item["id"] == d.path.item_id) item[d.path.field] = *d.new_value;
      const auto read = interchange::read_case(one, kDemo);
      numbers::LikelihoodRatio combined = numbers::LikelihoodRatio::neutral();
      for (const auto& item : read.value->items) combined = combined * item.model->evaluate().lr;
    }
  });
  std::printf("  alternative: whole-case re-read per difference:       %8.2f ms  (one-at-a-time effects only)\n",
              reread_ms);
  std::printf("  total change of the combined log10 LR: %.6f; sum of shares %.6f\n", result.total_change.log10,
              result.sum_of_shares());
  std::printf("peak RSS %.1f MB\n", bench::peak_rss_mb());
  return 0;
}
