#include "core/models/data_file.hpp"

#include "core/interchange/json_reading.hpp"
#include "core/store/sha256.hpp"

namespace counterpoise::models {

DataFile read_data_file(const std::filesystem::path& base_dir, const std::string& name, const validation::Location& where) {
  DataFile file;
  file.text = interchange::read_text_file(interchange::resolve_path(base_dir, name), where);
  file.use.field = where.field;
  file.use.name = name;
  file.use.sha256 = store::sha256_hex(file.text);
  file.use.bytes = file.text.size();
  return file;
}

}  // namespace counterpoise::models
