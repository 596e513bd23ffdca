#pragma once
// Timing for benchmarks: the median of repeated runs (benchmarks are measured and printed, never
// asserted), in wall-clock time, and also in the calling thread's CPU time: on a shared, loaded
// machine the wall clock counts the time other processes held the core, the CPU time does not.
#include <time.h>

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

struct Timing {
  double wall_ms, cpu_ms;  // medians over the repeats, each of its own clock
};

inline double thread_cpu_milliseconds() {
  timespec now{};
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &now);
  return static_cast<double>(now.tv_sec) * 1e3 + static_cast<double>(now.tv_nsec) * 1e-6;
}

// Wall-clock and CPU-time medians of the same runs (CPU time of the calling thread only: work on
// other threads is not in it).
template <class F>
Timing median_timing(int repeats, F&& work) {
  std::vector<double> wall, cpu;
  for (int i = 0; i < repeats; ++i) {
    const auto start = std::chrono::steady_clock::now();
    const double cpu_start = thread_cpu_milliseconds();
    work();
    cpu.push_back(thread_cpu_milliseconds() - cpu_start);
    wall.push_back(std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
  }
  std::sort(wall.begin(), wall.end());
  std::sort(cpu.begin(), cpu.end());
  return {wall[wall.size() / 2], cpu[cpu.size() / 2]};
}

}  // namespace counterpoise::bench
