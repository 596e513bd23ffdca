#pragma once
// The hierarchy of propositions (Cook, Evett, Jackson, Jones & Lambert 1998, "A hierarchy of
// propositions: deciding which level to address in casework", Science & Justice 38:231-239),
// with the sub-source level added below source (Evett et al. 2002 — from memory).

#include <optional>
#include <string>
#include <string_view>

namespace counterpoise::casefile {

// Ordered from the lowest level to the highest.
enum class PropositionLevel { sub_source = 0, source = 1, activity = 2, offence = 3 };

// "sub-source", "source", "activity", "offence".
std::string_view level_name(PropositionLevel level);
// The level for one of the names above, or nullopt.
std::optional<PropositionLevel> parse_level(std::string_view name);
// "sub-source, source, activity, offence" for messages.
std::string level_names_text();

}  // namespace counterpoise::casefile
