#pragma once
// A number written by number_text as an operand of a calculation a reader does by hand (the
// report's recomputation appendix): in brackets when its text is itself a calculation, a product
// with a power of ten ("2.5 × 10⁻⁵") or a complement ("1 − 3.16 × 10⁻¹⁵"), so that
// "1 / (2.5 × 10⁻⁵)" cannot be read as (1 / 2.5) × 10⁻⁵; unchanged otherwise ("0.25", "10⁻⁵").

#include <string>

namespace counterpoise::numbers {

std::string operand_for_readers(const std::string& number_text);

}  // namespace counterpoise::numbers
