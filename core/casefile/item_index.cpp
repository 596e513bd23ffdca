#include "core/casefile/item_index.hpp"

namespace counterpoise::casefile {

ItemIndex::ItemIndex(const Case& value) {
  by_id_.reserve(value.items.size());
  for (const auto& item : value.items) by_id_.emplace(item.id, &item);  // keeps the first of an id
}

const Item* ItemIndex::find(std::string_view id) const {
  const auto found = by_id_.find(id);
  return found == by_id_.end() ? nullptr : found->second;
}

}  // namespace counterpoise::casefile
