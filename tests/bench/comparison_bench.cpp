// Comparison benchmark (not a timed test): two invented 100-item cases that differ in 20 inputs
// (four transfer items in t0, tn and gamma, which interact; four DNA items in θ and the donor's
// relationship, each mixture read again with its frequency file), compared with compare_cases,
// side by side in the same run with what a reviewer would otherwise run: evaluate_case on both
// versions (no attribution), and re-reading the whole first case once per difference with that
// one input changed (the one-at-a-time effects only). Then the same with three weighted
// alternatives to Hp: two 100-item cases that differ in 20 inputs, attributed against each
// alternative and against the weighted set (one game over every changed item's players and the
// weights). Figures: docs/performance.md ("Comparison").
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

// Three alternatives weighted 6 : 3 : 1 (Hd1 in the second version 4 : 5 : 1), 80 assigned items
// with a probability per alternative, 10 reported LRs per alternative and 10 DNA items with the
// donor's relationship per alternative. The second version differs in 20 inputs: P(E|Hd2) of
// eight assigned items, θ and the Hd2 relationship of four DNA items, Hd2's LR of three reported
// items, and the weights.
json bench_case_with_alternatives(bool changed) {
  json items = json::array();
  for (int i = 1; i <= 80; ++i)
    items.push_back({{"id", "E" + std::to_string(i)}, {"model", "assigned"},
                     {"p_given", {{"Hp", {{"beta", {8.5, 2.5}}}},
                                  {"Hd1", {{"counts", {{"k", 3}, {"n", 412}}}}},
                                  {"Hd2", {{"counts", {{"k", changed && i <= 8 ? 9 : 5}, {"n", 200}}}}},
                                  {"Hd3", 0.02}}}});
  for (int i = 1; i <= 10; ++i)
    items.push_back({{"id", "R" + std::to_string(i)}, {"model", "reported-lr"},
                     {"alternatives", {{"Hd1", {{"lr", 40}}}, {"Hd2", {{"lr", changed && i <= 3 ? 5 : 10}}}, {"Hd3", {{"lr", 100}}}}}});
  for (int i = 1; i <= 10; ++i) {
    json item = dna_item(i, changed && i <= 4 ? 0.03 : 0.01, "unrelated");
    item.erase("relationship");
    item["alternatives"] = {{"Hd1", {{"relationship", "unrelated"}}},
                            {"Hd2", {{"relationship", changed && i <= 4 ? "full-sibling" : "unrelated"}}},
                            {"Hd3", {{"relationship", "unrelated"}}}};
    items.push_back(item);
  }
  const json alternatives = {
      {{"id", "Hd1"}, {"text", "The findings came from another bench case."}, {"weight", changed ? 4 : 6}},
      {{"id", "Hd2"}, {"text", "The findings came from a relative's bench case."}, {"weight", changed ? 5 : 3}},
      {{"id", "Hd3"}, {"text", "The findings came from an unknown bench case."}, {"weight", 1}}};
  return {{"format", "counterpoise.case"},
          {"version", 1},
          {"case", {{"reference", "VFL-BENCH-ALT"}, {"title", "Comparison benchmark with alternatives (invented)"}}},
          {"propositions", {{"level", "source"}, {"hp", "The findings came from the bench case."}, {"alternatives", alternatives}}},
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

  std::printf("\nThe same with three weighted alternatives to Hp (two 100-item cases, 20 differing inputs)\n");
  const auto alt_a = version(bench_case_with_alternatives(false), "A");
  const auto alt_b = version(bench_case_with_alternatives(true), "B");
  comparison::CaseComparison with_alternatives;
  const double alternatives_ms =
      bench::median_milliseconds(9, [&] { with_alternatives = comparison::compare_cases(alt_a, alt_b); });
  std::size_t alternatives_entering = 0;
  for (const auto& d : with_alternatives.differences) alternatives_entering += d.enters_lr();
  std::printf("  compare_cases (each alternative and the weighted set): %7.2f ms  [%zu differences, %zu enter the LR]\n",
              alternatives_ms, with_alternatives.differences.size(), alternatives_entering);
  for (const auto& against : with_alternatives.alternatives.by_alternative)
    std::printf("    against %s: change %.6f, sum of shares %.6f, band %s\n", against.id.c_str(),
                against.total_change.log10, against.sum_of_shares(), against.band_changes() ? "changes" : "the same");
  if (with_alternatives.alternatives.compound) {
    const auto& set = *with_alternatives.alternatives.compound;
    std::printf("    against the weighted set: change %.6f, sum of shares %.6f (%s)\n", set.total_change.log10,
                set.sum_of_shares(), set.note.c_str());
  }
  const double alternatives_evaluate_ms = bench::median_milliseconds(3, [&] {
    (void)evaluation::evaluate_case(alt_a.value);
    (void)evaluation::evaluate_case(alt_b.value);
  });
  std::printf("  alternative: evaluate_case on both versions:           %7.2f ms  (no attribution)\n",
              alternatives_evaluate_ms);
  std::printf("peak RSS %.1f MB\n", bench::peak_rss_mb());
  return 0;
}
