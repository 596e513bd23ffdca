#pragma once
// The large invented case of the benchmarks (bench_large_case, bench_reading_memory): `items`
// assigned items, 30 % of them identical (the same model inputs: one grouped warning), ten with
// Beta inputs (a spread to combine), the others each with a description and its own values.
#include <string>

#include <nlohmann/json.hpp>

namespace counterpoise::bench {

inline std::string large_case_text(int items) {
  nlohmann::json list = nlohmann::json::array();
  const int identical = items * 3 / 10;
  for (int i = 1; i <= items; ++i) {
    nlohmann::json item = {{"id", "E" + std::to_string(i)}, {"model", "assigned"}};
    if (i <= identical) {
      item["p_given_hp"] = 0.8;
      item["p_given_hd"] = 0.05;
    } else if (i > items - 10) {
      item["p_given_hp"] = {{"beta", {20 + i % 7, 3}}};
      item["p_given_hd"] = {{"counts", {{"k", 2 + i % 5}, {"n", 300 + i % 97}}}};
    } else {
      item["description"] = "Trace " + std::to_string(i) + " on the items from Tanner Row.";
      item["p_given_hp"] = 0.5 + 0.4 * (i % 1000) / 1000.0;
      item["p_given_hd"] = 0.2 + 0.5 * (i % 997) / 997.0;
    }
    list.push_back(item);
  }
  nlohmann::json doc = {{"format", "counterpoise.case"},
                        {"version", 1},
                        {"case", {{"reference", "HV-BENCH-LARGE"}, {"title", "A large invented benchmark case"}}},
                        {"propositions", {{"level", "source"}, {"hp", "The traces come from the workshop at 3 Tanner Row"},
                                          {"hd", "The traces come from other sources"}}},
                        {"items", list}};
  return doc.dump();
}

}  // namespace counterpoise::bench
