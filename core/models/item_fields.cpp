#include "core/models/item_fields.hpp"

#include <algorithm>

#include "core/reading/json_fields.hpp"

namespace counterpoise::models {

void check_model_members(const nlohmann::json& item, std::initializer_list<std::string_view> model_fields,
                         const validation::Location& where) {
  reading::require_object(item, where);
  for (auto it = item.begin(); it != item.end(); ++it) {
    const auto& key = it.key();
    const bool common = std::find(std::begin(kCommonItemFields), std::end(kCommonItemFields), key) !=
                        std::end(kCommonItemFields);
    const bool own = std::find(model_fields.begin(), model_fields.end(), key) != model_fields.end();
    if (common || own) continue;
    std::string list;
    for (auto name : model_fields) list += (list.empty() ? "" : ", ") + std::string(name);
    throw validation::InvalidValue(where.with_field(key),
                                   "unknown field for this model (model fields: " + list + ")");
  }
}

}  // namespace counterpoise::models
