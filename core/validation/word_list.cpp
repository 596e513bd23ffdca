#include "core/validation/word_list.hpp"

namespace counterpoise::validation {

std::string list_in_words(const std::vector<std::string>& items) {
  std::string text;
  for (std::size_t i = 0; i < items.size(); ++i) text += (i == 0 ? "" : i + 1 == items.size() ? " and " : ", ") + items[i];
  return text;
}

}  // namespace counterpoise::validation
