#pragma once
// What a benchmark prints about the machine it ran on: the CPU model (from /proc/cpuinfo) and
// the load average and the peak resident memory of the process.
#include <sys/resource.h>

#include <fstream>
#include <string>

namespace counterpoise::bench {

inline std::string cpu_model() {
  std::ifstream in("/proc/cpuinfo");
  for (std::string line; std::getline(in, line);)
    if (line.rfind("model name", 0) == 0) return line.substr(line.find(':') + 2);
  return "unknown";
}

// The load averages over 1, 5 and 15 minutes (/proc/loadavg), to print beside the figures: on a
// shared machine they say how far the timings are inflated.
inline std::string load_average() {
  std::ifstream in("/proc/loadavg");
  std::string one, five, fifteen;
  if (!(in >> one >> five >> fifteen)) return "unknown";
  return one + " " + five + " " + fifteen;
}

// Peak resident set size of this process so far, in MB (getrusage reports kilobytes on Linux).
inline double peak_rss_mb() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;
}

}  // namespace counterpoise::bench
