#pragma once
// The invented 40-item case the store benchmarks edit (Harwick Vale scenario).
#include <string>

#include <nlohmann/json.hpp>

namespace counterpoise::bench {

inline nlohmann::json store_bench_case(const std::string& reference = "HV-BENCH") {
  nlohmann::json items = nlohmann::json::array();
  for (int i = 1; i <= 40; ++i)
    items.push_back({{"id", "E" + std::to_string(i)},
                     {"title", "Finding " + std::to_string(i) + " from the Harwick Vale bakery"},
                     {"model", "assigned"},
                     {"p_given_hp", {{"beta", {8.5, 2.5}}}},
                     {"p_given_hd", {{"counts", {{"k", 3}, {"n", 412}}}}}});
  return {{"format", "counterpoise.case"},
          {"version", 1},
          {"case", {{"reference", reference}, {"title", "Benchmark case"}}},
          {"propositions", {{"level", "source"}, {"hp", "..."}, {"hd", "..."}}},
          {"items", items},
          {"priors", {{"odds", {1e-6, 1e-3, 1}}}}};
}

}  // namespace counterpoise::bench
