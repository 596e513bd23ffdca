#include "core/models/data_file.hpp"

#include "core/platform/sha256.hpp"
#include "core/reading/text_file.hpp"

namespace counterpoise::models {

DataFile read_data_file(const std::filesystem::path& base_dir, const std::string& name, const validation::Location& where) {
  DataFile file;
  file.text = reading::read_text_file(reading::resolve_path(base_dir, name), where);
  file.use.field = where.field;
  file.use.name = name;
  file.use.sha256 = platform::sha256_hex(file.text);
  file.use.bytes = file.text.size();
  return file;
}

}  // namespace counterpoise::models
