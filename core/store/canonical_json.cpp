#include "core/store/canonical_json.hpp"

#include <cmath>
#include <vector>

#include "core/interchange/case_json.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {

// nlohmann::json would write a NaN or an infinity as `null`, which would not read back the same.
void require_finite_numbers(const nlohmann::json& value) {
  if (!value.is_structured()) {
    if (value.is_number_float() && !std::isfinite(value.get<double>()))
      throw validation::InvalidValue({}, "a number is not finite and has no JSON form");
    return;
  }
  // Iterative walk: documents reach here only after the depth limit, but the check stays cheap.
  std::vector<const nlohmann::json*> pending{&value};
  while (!pending.empty()) {
    const nlohmann::json* v = pending.back();
    pending.pop_back();
    if (v->is_number_float() && !std::isfinite(v->get<double>()))
      throw validation::InvalidValue({}, "a number is not finite and has no JSON form");
    if (v->is_structured())
      for (const auto& child : *v) pending.push_back(&child);
  }
}

}  // namespace

std::string canonical_text(const nlohmann::json& document) {
  require_finite_numbers(document);
  // One canonical form for the whole program: the interchange writer's (sorted members, shortest
  // round-trip numbers, integral floats as integers, no white space), so a report's digest and
  // the store's seal of the same case agree.
  return interchange::canonical_text(document);
}

}  // namespace counterpoise::store
