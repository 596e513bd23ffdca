#pragma once
// Recognising a case file from its first 100 bytes, before SQLite touches it. Layout of the
// SQLite database header: sqlite.org/fileformat2.html, section 1.3 (magic at 0, page size at 16,
// change counter at 24, size in pages at 28, user_version at 60, application_id at 68,
// version-valid-for at 92; all big-endian).

#include <cstdint>
#include <filesystem>

namespace counterpoise::store {

enum class FileKind { not_sqlite, other_application, case_file };

struct CaseFileHeader {
  FileKind kind = FileKind::not_sqlite;
  std::uint64_t file_size = 0;
  std::uint32_t page_size = 0;
  std::uint32_t header_page_count = 0;  // 0 when the header's count is not valid
  std::int32_t user_version = 0;
  std::int32_t application_id = 0;
  bool write_ahead_log = false;  // file format read/write version 2 (bytes 18 and 19)
};

// The header fields of `path`. Throws validation::FileError when the file cannot be read.
CaseFileHeader read_case_file_header(const std::filesystem::path& path);

// Throws unless `path` is a case file this program can open, without writing to it:
// validation::UnsupportedFormat for a file that is not SQLite, an SQLite file of another
// application, a newer schema version, or write-ahead-log mode (the program writes only rollback
// journal files, and opening a WAL file would create -wal and -shm files beside it);
// validation::FileError for a truncated file.
void check_case_file_header(const std::filesystem::path& path, std::int64_t newest_schema_version);

}  // namespace counterpoise::store
