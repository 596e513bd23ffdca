// Benchmark of the dna-single-source model: the point LR of a 24-locus profile (reading the
// item with its inline count table, and evaluating it) and the Monte Carlo sampling interval
// from 100,000 Dirichlet draws. Prints times and the 5/50/95 % quantiles of log10 LR.
#include <algorithm>
#include <chrono>
#include <ctime>
#include <cstdio>
#include <random>
#include <vector>

#include "core/models/dna/dna_single_source_model.hpp"
#include "core/models/dna/str_loci.hpp"

using namespace counterpoise::models;
using Clock = std::chrono::steady_clock;

namespace {
double ms_since(Clock::time_point start) {
  return std::chrono::duration<double, std::milli>(Clock::now() - start).count();
}

// An invented table of 10 alleles per locus, 1000 people (2000 alleles), and a profile that is
// heterozygous at 20 loci and homozygous at 4, matched by the reference profile at every locus.
nlohmann::json bench_item() {
  nlohmann::json counts = nlohmann::json::object(), profile = nlohmann::json::object();
  int index = 0;
  for (auto locus : dna::standard_str_loci()) {
    const std::string name(locus);
    int weights[10] = {20, 60, 150, 300, 420, 440, 330, 180, 70, 30};  // sums to 2000
    for (int a = 0; a < 10; ++a) counts[name][std::to_string(10 + a)] = weights[a];
    const int first = 10 + (index % 6), second = index % 6 == 0 ? first : first + 2;
    profile[name] = {std::to_string(first), std::to_string(second)};
    ++index;
  }
  return {{"theta", 0.01}, {"profile", profile}, {"reference_profile", profile}, {"frequencies", {{"counts", counts}}}};
}
}  // namespace

int main() {
  const auto item = bench_item();
  const ReadContext context{{}, {"B1", ""}};

  const int reads = 200;
  auto start = Clock::now();
  EvidenceModelPtr model;
  for (int i = 0; i < reads; ++i) model = dna::read_dna_single_source_model(item, context);
  const double read_ms = ms_since(start) / reads;

  const int evaluations = 2000;
  double sink = 0.0;
  start = Clock::now();
  for (int i = 0; i < evaluations; ++i) sink += model->evaluate().lr.log10();
  const double evaluate_ms = ms_since(start) / evaluations;

  std::vector<double> draws(100000);
  std::mt19937_64 rng(2026);
  start = Clock::now();
  const std::clock_t cpu_start = std::clock();
  model->draw_log10_lr(rng, draws);
  const double draw_cpu_ms = 1000.0 * static_cast<double>(std::clock() - cpu_start) / CLOCKS_PER_SEC;
  const double draw_ms = ms_since(start);
  std::sort(draws.begin(), draws.end());
  auto q = [&](double p) { return draws[static_cast<std::size_t>(p * (draws.size() - 1))]; };

  std::printf("dna-single-source, 24 loci (20 heterozygous, 4 homozygous), theta 0.01, 2N = 2000\n");
  std::printf("  read item + table:      %8.3f ms\n", read_ms);
  std::printf("  point LR (evaluate):    %8.3f ms   log10 LR = %.6f\n", evaluate_ms, sink / evaluations);
  std::printf("  100,000 Dirichlet draws: %7.1f ms wall, %.1f ms CPU   log10 LR 5/50/95 %%: %.4f / %.4f / %.4f\n",
              draw_ms, draw_cpu_ms, q(0.05), q(0.5), q(0.95));
  return 0;
}
