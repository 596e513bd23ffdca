#pragma once
// What a new item of findings starts with before the scientist fills it in: the model's starting
// fields and a placeholder title. The editor creates items from these, and the issue checklist
// (issue_checklist.hpp) points out an item that still holds them, so a report is never issued with
// an item nobody filled in.

#include <string>

#include <nlohmann/json.hpp>

#include "core/casefile/case_model.hpp"

namespace counterpoise::casefile {

// The title a new item gets.
inline constexpr const char* kNewItemTitle = "New item of findings";

// The model fields a new item of `model` starts with (valid, so the item evaluates at once); an
// empty object for a model with no starting fields.
nlohmann::json starting_fields(const std::string& model);

// True when the item's model fields are still exactly its model's starting fields.
bool holds_starting_fields(const Item& item);

}  // namespace counterpoise::casefile
