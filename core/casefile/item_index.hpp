#pragma once
// The items of a case by id, for code that looks up many items: Case::find_item scans the list,
// so a lookup per item costs the square of the item count (10 000 items: 50 million string
// comparisons), while this index is built once in one pass and answers each lookup in constant
// expected time (tests/bench/large_case_bench.cpp prints both).

#include <string>
#include <string_view>
#include <unordered_map>

#include "core/casefile/case_model.hpp"

namespace counterpoise::casefile {

class ItemIndex {
 public:
  // Indexes the items of `value`, which must outlive the index and keep its items unchanged.
  // Ids are unique in a case that was read (the case reader refuses a repeated id); should one
  // repeat, the first item of that id is found, as Case::find_item finds it.
  explicit ItemIndex(const Case& value);

  // The item with this id, or nullptr.
  const Item* find(std::string_view id) const;

 private:
  std::unordered_map<std::string_view, const Item*> by_id_;
};

}  // namespace counterpoise::casefile
