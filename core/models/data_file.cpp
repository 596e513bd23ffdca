#include "core/models/data_file.hpp"

#include "core/platform/sha256.hpp"
#include "core/reading/data_access.hpp"
#include "core/reading/text_file.hpp"

namespace counterpoise::models {

DataFile read_data_file(const std::filesystem::path& base_dir, const std::string& name, const validation::Location& where) {
  DataFile file;
  // The case names the file: it must lie where the case may read (reading/data_access.hpp).
  file.text = reading::read_text_file(reading::locate_data_file(base_dir, name, where), where);
  file.use.field = where.field;
  file.use.name = name;
  file.use.sha256 = platform::sha256_hex(file.text);
  file.use.bytes = file.text.size();
  return file;
}

}  // namespace counterpoise::models
