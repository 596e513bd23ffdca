#pragma once
// Wall-clock timing for benchmarks: the median of repeated runs (benchmarks are measured and
// printed, never asserted).
#include <algorithm>
#include <chrono>
#include <vector>

namespace counterpoise::bench {

template <class F>
double median_milliseconds(int repeats, F&& work) {
  std::vector<double> times;
  for (int i = 0; i < repeats; ++i) {
    const auto start = std::chrono::steady_clock::now();
    work();
    times.push_back(std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
  }
  std::sort(times.begin(), times.end());
  return times[times.size() / 2];
}

}  // namespace counterpoise::bench
