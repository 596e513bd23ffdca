#pragma once
// A data file a model reads (an allele frequency table, background measurements), read once so
// that the bytes the model uses are the bytes whose digest is recorded: the case names the file
// by a path that anyone can later change the contents of, so a report pins the data its numbers
// came from by the file's SHA-256 (FIPS 180-4, through OpenSSL) and size.

#include <cstdint>
#include <filesystem>
#include <string>

#include "core/reading/data_access.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::models {

struct DataFileUse {
  std::string field;   // the item field that names the file ("frequencies.file")
  std::string name;    // the path as the case writes it (relative to the case file)
  std::string sha256;  // of the bytes read, 64 lower-case hex digits
  std::uintmax_t bytes = 0;
};

struct DataFile {
  DataFileUse use;
  std::string text;  // the file's contents
};

// Reads `name` (relative to the case's folder, or absolute) for the item field `where`. Throws
// validation::FileError naming the item and field when the file lies where `access` does not
// allow (reading::DataAccess::locate) or cannot be read.
DataFile read_data_file(const reading::DataAccess& access, const std::string& name, const validation::Location& where);

}  // namespace counterpoise::models
