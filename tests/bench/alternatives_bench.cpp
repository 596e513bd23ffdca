// Benchmark (measured, not asserted): a case of 100 items weighed against 5 weighted alternatives
// to Hp, as `counterpoise-cli evaluate --json` handles it — read, evaluate (each alternative's
// per-item and combined LR with its spread, the compound LR, the illustration over the set), JSON
// output — side by side with the same items against a single alternative (a two-proposition
// case), so what the alternatives cost shows. Ten items per case have Beta or counts inputs and
// ten a reported LR with an interval (spreads to combine). Invented numbers.
//
// Then the interval of the value against the weighted set (evaluation/compound_spread) alone, two
// ways side by side on the same case: as it was first made (each alternative's model drawn in
// full, so an item's P(E|Hp) is drawn again under every alternative, and every summary sorts its
// draws; kept below as the alternative) and as it is made now (draws in parts: the shared part
// drawn once per item, a compound of constant own parts formed once, summaries by selection).
// Both give the same intervals; the benchmark prints the largest difference.
// Run on one core: taskset -c 0 build/tests/bench/bench_alternatives
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "bench_machine.hpp"
#include "bench_timer.hpp"
#include "core/evaluation/case_evaluation.hpp"
#include "core/evaluation/compound_spread.hpp"
#include "core/numbers/compound_lr.hpp"
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

// The way first made: every alternative's model drawn in full from the item's generator, the
// compound formed draw by draw, every summary sorting its draws.
evaluation::CompoundSpreads compound_spreads_redrawn(const casefile::Case& value, std::span<const double> weights,
                                                     std::span<const numbers::LikelihoodRatio> item_points,
                                                     const numbers::LikelihoodRatio& combined_point) {
  const auto settings = value.uncertainty_or_default();
  const uncertainty::SpreadLevels levels{settings.credible_level_or_default(), settings.conservative_level_or_default()};
  const auto draws = static_cast<std::size_t>(settings.draws_or_default());
  const std::size_t alternatives = weights.size();
  std::vector<double> log10_weights;
  for (double w : weights) log10_weights.push_back(std::log10(w));
  const auto summary_of = [&](const std::vector<std::vector<double>>& by_alternative, const numbers::LikelihoodRatio& point,
                              std::vector<double>& buffer) -> std::optional<uncertainty::SpreadSummary> {
    if (!point.is_finite()) return std::nullopt;
    std::vector<double> one(alternatives);
    for (std::size_t k = 0; k < draws; ++k) {
      for (std::size_t i = 0; i < alternatives; ++i) one[i] = by_alternative[i][k];
      buffer[k] = numbers::compound_log10_lr(one, log10_weights);
      if (std::isnan(buffer[k])) return std::nullopt;
    }
    return uncertainty::summarize_draws(buffer, levels, point.log10());
  };
  evaluation::CompoundSpreads result;
  result.items.resize(value.items.size());
  std::vector<std::vector<double>> item_draws(alternatives, std::vector<double>(draws));
  std::vector<std::vector<double>> sums(alternatives, std::vector<double>(draws, 0.0));
  std::vector<double> buffer(draws);
  bool any_uncertain_included = false;
  for (std::size_t index = 0; index < value.items.size(); ++index) {
    const auto& item = value.items[index];
    const auto& models = item.alternative_models;
    if (std::none_of(models.begin(), models.end(), [](const auto& m) { return m->is_uncertain(); })) {
      if (item.included())
        for (std::size_t i = 0; i < alternatives; ++i) {
          const double log10_lr = models[i]->evaluate().lr.log10();  // the benchmark's LRs are finite
          for (double& s : sums[i]) s += log10_lr;
        }
      continue;
    }
    for (std::size_t i = 0; i < alternatives; ++i) {
      auto rng = evaluation::item_generator(settings.seed_or_default(), index);
      models[i]->draw_log10_lr(rng, item_draws[i]);
    }
    result.items[index] = summary_of(item_draws, item_points[index], buffer);
    if (!item.included()) continue;
    any_uncertain_included = true;
    for (std::size_t i = 0; i < alternatives; ++i)
      for (std::size_t k = 0; k < draws; ++k) sums[i][k] += item_draws[i][k];
  }
  if (any_uncertain_included) result.combined = summary_of(sums, combined_point, buffer);
  return result;
}

// The largest difference between the two ways' interval ends, medians and bounds; infinite when
// one gives an interval the other does not.
double largest_difference(const evaluation::CompoundSpreads& a, const evaluation::CompoundSpreads& b) {
  double largest = 0.0;
  const auto compare = [&](const std::optional<uncertainty::SpreadSummary>& x, const std::optional<uncertainty::SpreadSummary>& y) {
    if (x.has_value() != y.has_value()) largest = std::numeric_limits<double>::infinity();
    if (!x || !y) return;
    for (auto [u, v] : {std::pair{x->low_log10, y->low_log10}, std::pair{x->high_log10, y->high_log10},
                        std::pair{x->median_log10, y->median_log10}, std::pair{x->conservative_log10, y->conservative_log10}})
      largest = std::max(largest, std::abs(u - v));
  };
  for (std::size_t i = 0; i < a.items.size(); ++i) compare(a.items[i], b.items[i]);
  compare(a.combined, b.combined);
  return largest;
}

void compare_compound_ways(const casefile::Case& value, const evaluation::CaseEvaluation& evaluated) {
  std::vector<numbers::LikelihoodRatio> item_points;
  for (const auto& item : evaluated.items) item_points.push_back(item.compound->lr);
  const auto& weights = evaluated.combined.compound->weights;
  const auto& combined = evaluated.combined.compound->lr;
  evaluation::CompoundSpreads before, now;
  const auto redrawn = bench::median_timing(3, [&] { before = compound_spreads_redrawn(value, weights, item_points, combined); });
  const auto in_parts = bench::median_timing(3, [&] { now = evaluation::compound_spreads(value, weights, item_points, combined); });
  std::printf("interval against the weighted set alone (100 items, 5 alternatives, %lld draws), median of 3:\n",
              static_cast<long long>(value.uncertainty_or_default().draws_or_default()));
  std::printf("  before: every alternative drawn in full, summaries sorted: %.1f ms wall, %.1f ms CPU\n", redrawn.wall_ms,
              redrawn.cpu_ms);
  std::printf("  now:    shared part drawn once, summaries by selection:    %.1f ms wall, %.1f ms CPU\n", in_parts.wall_ms,
              in_parts.cpu_ms);
  std::printf("  ratio before / now: %.2fx wall, %.2fx CPU; largest difference between the two: %.3g (log10)\n",
              redrawn.wall_ms / in_parts.wall_ms, redrawn.cpu_ms / in_parts.cpu_ms, largest_difference(before, now));
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
  const auto evaluate = bench::median_timing(3, [&] { result = evaluation::evaluate_case(*read.value); });
  const double evaluate_ms = evaluate.wall_ms;
  std::size_t bytes = 0;
  const double output_ms = bench::median_milliseconds(
      3, [&] { bytes = interchange::evaluation_to_json(*read.value, result, {}).dump(2).size(); });
  const double total = read_ms + evaluate_ms + output_ms;
  std::printf("  %3d items, %d alternative(s): read %.1f ms, evaluate %.1f ms (CPU %.1f ms), JSON output %.1f ms (%zu bytes): total %.1f ms\n",
              items, alternatives, read_ms, evaluate_ms, evaluate.cpu_ms, output_ms, bytes, total);
  if (alternatives > 1) compare_compound_ways(*read.value, result);
  return total;
}

}  // namespace

int main() {
  std::printf("CPU: %s; load average %s\n", bench::cpu_model().c_str(), bench::load_average().c_str());
  std::printf("case with alternatives, median of 3 per stage:\n");
  const double one = run(100, 1);
  const double five = run(100, 5);
  std::printf("5 alternatives: %.1fx the time of one; peak resident memory %.0f MB\n", five / one, bench::peak_rss_mb());
  return 0;
}
