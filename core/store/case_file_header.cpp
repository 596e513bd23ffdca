#include "core/store/case_file_header.hpp"

#include <cstdio>
#include <cstring>
#include <fstream>
#include <string>

#include "core/store/store_schema.hpp"
#include "core/validation/input_error.hpp"

namespace counterpoise::store {

namespace {

std::uint32_t big_endian_32(const unsigned char* p) {
  return (std::uint32_t{p[0]} << 24) | (std::uint32_t{p[1]} << 16) | (std::uint32_t{p[2]} << 8) |
         std::uint32_t{p[3]};
}

std::string hex32(std::int32_t value) {
  char buffer[16];
  std::snprintf(buffer, sizeof buffer, "0x%08x", static_cast<unsigned>(value));
  return buffer;
}

}  // namespace

CaseFileHeader read_case_file_header(const std::filesystem::path& path) {
  const validation::Location where{};
  std::error_code ec;
  CaseFileHeader header;
  header.file_size = std::filesystem::file_size(path, ec);
  if (ec) throw validation::FileError(where, path.string() + ": cannot read: " + ec.message());
  std::ifstream in(path, std::ios::binary);
  if (!in) throw validation::FileError(where, path.string() + ": cannot open");
  unsigned char bytes[100] = {};
  in.read(reinterpret_cast<char*>(bytes), sizeof bytes);
  if (in.gcount() < static_cast<std::streamsize>(sizeof bytes) ||
      std::memcmp(bytes, "SQLite format 3\0", 16) != 0)
    return header;
  const std::uint32_t raw_page_size = (std::uint32_t{bytes[16]} << 8) | bytes[17];
  header.page_size = raw_page_size == 1 ? 65536 : raw_page_size;
  if (big_endian_32(bytes + 92) == big_endian_32(bytes + 24))
    header.header_page_count = big_endian_32(bytes + 28);
  header.write_ahead_log = bytes[18] == 2 || bytes[19] == 2;
  header.user_version = static_cast<std::int32_t>(big_endian_32(bytes + 60));
  header.application_id = static_cast<std::int32_t>(big_endian_32(bytes + 68));
  header.kind =
      header.application_id == kApplicationId ? FileKind::case_file : FileKind::other_application;
  return header;
}

void check_case_file_header(const std::filesystem::path& path, std::int64_t newest_schema_version) {
  const validation::Location where{};
  const CaseFileHeader header = read_case_file_header(path);
  if (header.kind == FileKind::not_sqlite)
    throw validation::UnsupportedFormat(
        where, path.string() + ": " +
                   (header.file_size == 0 ? "the file is empty, not a case file"
                                          : "not a case file (not an SQLite database)"));
  if (header.kind == FileKind::other_application)
    throw validation::UnsupportedFormat(
        where, path.string() + ": " + "an SQLite database of another application (application_id " +
                   hex32(header.application_id) + ", a case file has " + hex32(kApplicationId) +
                   ")");
  if (header.user_version > newest_schema_version)
    throw validation::UnsupportedFormat(
        where, path.string() + ": " + "the case file has schema version " +
                   std::to_string(header.user_version) + "; this program reads up to version " +
                   std::to_string(newest_schema_version) + " (made by a newer program)");
  if (header.write_ahead_log)
    throw validation::UnsupportedFormat(
        where, path.string() + ": the case file is in write-ahead-log mode, which this program "
                               "never writes (it was changed by another program)");
  const bool valid_page_size = header.page_size >= 512 && header.page_size <= 65536 &&
                               (header.page_size & (header.page_size - 1)) == 0;
  if (!valid_page_size)
    throw validation::FileError(
        where, path.string() + ": " + "the case file is damaged (invalid page size)");
  // A hot rollback journal beside the file means a writer was killed inside a transaction: the
  // file may be mid-write (even shorter than its header says) until SQLite rolls it back from the
  // journal when it opens it, so the size is judged only without one (integrity_check runs after
  // the open either way).
  std::error_code ignored;
  const auto journal = std::filesystem::path(path.string() + "-journal");
  const bool hot_journal = std::filesystem::exists(journal, ignored) && std::filesystem::file_size(journal, ignored) > 0;
  if (!hot_journal && (header.file_size % header.page_size != 0 ||
                       header.file_size < std::uint64_t{header.header_page_count} * header.page_size))
    throw validation::FileError(
        where, path.string() + ": " + "the case file is truncated or damaged (" +
                   std::to_string(header.file_size) + " bytes, expected " +
                   std::to_string(std::uint64_t{header.header_page_count} * header.page_size) +
                   ")");
}

}  // namespace counterpoise::store
