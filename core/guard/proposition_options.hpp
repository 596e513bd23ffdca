#pragma once
// The check options of a case: its mode and the propositions a suggested rewrite names. A case
// with several alternatives to Hp gives them all, so a rewrite of "than if [Hd]" names every
// alternative rather than the first (wording_checker.hpp, CheckOptions::alternatives).

#include "core/casefile/case_model.hpp"
#include "core/guard/wording_checker.hpp"

namespace counterpoise::guard {

CheckOptions check_options(const casefile::Propositions& propositions, CheckMode mode);

}  // namespace counterpoise::guard
