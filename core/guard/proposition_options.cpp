#include "core/guard/proposition_options.hpp"

namespace counterpoise::guard {

CheckOptions check_options(const casefile::Propositions& propositions, CheckMode mode) {
  CheckOptions options;
  options.mode = mode;
  options.hp = propositions.hp;
  options.hd = propositions.hd;
  for (const auto& alternative : propositions.alternatives) options.alternatives.push_back(alternative.text);
  return options;
}

}  // namespace counterpoise::guard
