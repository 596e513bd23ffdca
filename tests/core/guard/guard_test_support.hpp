#pragma once
// The warnings each demo case is expected to give, as "item/rule": the network demo leaves its
// covered items out of the combination (no warning); the casework demos that list prior odds for
// the illustration get the prior warning, and only that. A new demo case needs its line here.
#include <string>
#include <utility>
#include <vector>

inline const std::vector<std::pair<std::string, std::vector<std::string>>>& expected_demo_warnings() {
  static const std::vector<std::pair<std::string, std::vector<std::string>>> table = {
      {"harwick-vale-breakin.json", {}},
      {"harwick-vale-dna.json", {}},
      {"harwick-vale-fibres.json", {"priors/prior-in-casework"}},
      {"harwick-vale-glass.json", {"priors/prior-in-casework"}},
      {"harwick-vale-network.json", {"priors/prior-in-casework"}},
      {"harwick-vale-training-priors.json", {}},
  };
  return table;
}
