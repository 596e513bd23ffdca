#pragma once
// The fields every item of findings has, whatever its model. The case reader reads them; a
// model reader reads only its own and calls check_model_members so misspelt fields are caught.

#include <initializer_list>
#include <string_view>

#include <nlohmann/json.hpp>

#include "core/validation/input_error.hpp"

namespace counterpoise::models {

// id, title, description, model, level, combination, notes, source_data.
inline constexpr std::string_view kCommonItemFields[] = {
    "id", "title", "description", "model", "level", "combination", "notes", "source_data"};

// Throws validation::InvalidValue naming the first member of `item` that is neither a common
// item field nor one of `model_fields`.
void check_model_members(const nlohmann::json& item, std::initializer_list<std::string_view> model_fields,
                         const validation::Location& where);

}  // namespace counterpoise::models
