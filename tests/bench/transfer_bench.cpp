// Benchmark of the transfer model: the point LR and 100,000 seeded draws with every
// probability uncertain (Beta and count forms), as the Monte Carlo of a case would ask for.
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <random>
#include <vector>

#include "core/models/transfer/transfer_model.hpp"

using namespace counterpoise;
using Clock = std::chrono::steady_clock;

int main() {
  const auto item = nlohmann::json::parse(R"({"t0": {"beta": [2, 18]}, "tn": {"beta": [1, 19]},
      "p0": {"counts": {"k": 60, "n": 100}}, "p1": {"counts": {"k": 30, "n": 100}},
      "sn": {"beta": [2, 18]}, "gamma": {"counts": {"k": 4, "n": 200}}})");
  const auto model = models::transfer::read_transfer_model(item, models::ReadContext{std::filesystem::path("."), {"T1", ""}});

  auto start = Clock::now();
  double sum = 0.0;
  for (int i = 0; i < 10000; ++i) sum += model->evaluate().lr.log10();
  const double point_us = std::chrono::duration<double, std::micro>(Clock::now() - start).count() / 10000;

  std::vector<double> draws(100000);
  std::mt19937_64 rng(1984);
  start = Clock::now();
  model->draw_log10_lr(rng, draws);
  const double draws_ms = std::chrono::duration<double, std::milli>(Clock::now() - start).count();
  std::sort(draws.begin(), draws.end());
  std::printf("point LR with detail      %.2f us (log10 LR %.4f)\n", point_us, sum / 10000);
  std::printf("100000 draws              %.2f ms\n", draws_ms);
  std::printf("log10 LR 5/50/95 %%        %.3f / %.3f / %.3f\n", draws[5000], draws[50000], draws[95000]);
  return 0;
}
