#pragma once
// Helpers shared by the network tests: build a model from JSON text as the case reader would.

#include <memory>
#include <string>

#include <nlohmann/json.hpp>

#include "core/models/network/network_model.hpp"

namespace network_test {

inline std::shared_ptr<const counterpoise::models::network::NetworkModel> read_model(const nlohmann::json& item) {
  counterpoise::models::ReadContext context{{}, {item.value("id", "N1"), ""}};
  auto model = counterpoise::models::network::read_network_model(item, context);
  return std::dynamic_pointer_cast<const counterpoise::models::network::NetworkModel>(model);
}

// The burglary-alarm network of Russell & Norvig (2010), Artificial Intelligence: A Modern
// Approach, 3rd ed., figure 14.2, with Burglary as the proposition node and both calls observed.
// CPTs as in the figure (checked against a course page reproducing them in full).
inline nlohmann::json burglary_network() {
  return nlohmann::json::parse(R"({
    "id": "RN1", "model": "network",
    "nodes": [
      {"name": "Burglary", "states": ["yes", "no"], "cpt": [[0.001, 0.999]]},
      {"name": "Earthquake", "states": ["yes", "no"], "cpt": [[0.002, 0.998]]},
      {"name": "Alarm", "states": ["yes", "no"], "parents": ["Burglary", "Earthquake"],
       "cpt": [[0.95, 0.05], [0.94, 0.06], [0.29, 0.71], [0.001, 0.999]]},
      {"name": "JohnCalls", "states": ["yes", "no"], "parents": ["Alarm"], "cpt": [[0.90, 0.10], [0.05, 0.95]]},
      {"name": "MaryCalls", "states": ["yes", "no"], "parents": ["Alarm"], "cpt": [[0.70, 0.30], [0.01, 0.99]]}
    ],
    "proposition": {"node": "Burglary", "hp": "yes", "hd": "no"},
    "observed": {"JohnCalls": "yes", "MaryCalls": "yes"}
  })");
}

}  // namespace network_test
