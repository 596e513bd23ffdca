#pragma once
// What a benchmark prints about the machine it ran on: the CPU model (from /proc/cpuinfo) and
// the peak resident memory of the process.
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

// Peak resident set size of this process so far, in MB (getrusage reports kilobytes on Linux).
inline double peak_rss_mb() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;
}

}  // namespace counterpoise::bench
