#include "core/casefile/proposition_level.hpp"

namespace counterpoise::casefile {

namespace {
constexpr std::string_view kNames[] = {"sub-source", "source", "activity", "offence"};
}

std::string_view level_name(PropositionLevel level) { return kNames[static_cast<int>(level)]; }

std::optional<PropositionLevel> parse_level(std::string_view name) {
  for (int i = 0; i < 4; ++i)
    if (kNames[i] == name) return static_cast<PropositionLevel>(i);
  return std::nullopt;
}

std::string level_names_text() { return "sub-source, source, activity, offence"; }

}  // namespace counterpoise::casefile
