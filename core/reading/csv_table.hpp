#pragma once
// A small reader for comma-separated tables with a header row, as used for allele frequency
// tables and background measurement data. It follows the quoting rules of RFC 4180
// (Shafranovich 2005, "Common Format and MIME Type for CSV Files", section 2): fields may be
// enclosed in double quotes, a quote inside a quoted field is written twice, and a quoted field
// may contain commas and line breaks. Beyond RFC 4180 (common practice): a UTF-8 byte-order
// mark is skipped, CRLF and LF line ends are both accepted, blank lines and lines whose first
// character is '#' (comments) are skipped, and spaces around unquoted fields are trimmed.
// Every error names the file (or source name) and the line.

#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

struct CsvRow {
  std::size_t line = 0;             // 1-based line number where the row starts
  std::vector<std::string> fields;  // as many as the header has columns
};

struct CsvTable {
  std::string source;               // file name or other label used in messages
  std::size_t header_line = 0;      // 1-based line of the header row
  std::vector<std::string> header;  // column names, trimmed
  std::vector<CsvRow> rows;

  // Index of the column named `name` (compared without regard to ASCII case), or nullopt.
  std::optional<std::size_t> find_column(std::string_view name) const;
  // Index of the column named `name`; throws validation::InvalidValue naming the source and
  // listing the columns present when there is none.
  std::size_t require_column(std::string_view name, const validation::Location& where) const;
  // "<source> line <n>" for messages about one row.
  std::string row_label(const CsvRow& row) const;
};

// Parses CSV text. Throws validation::InvalidValue (naming `source` and the line, at `where`)
// when the text has no header row, a header name is empty or repeated, a quoted field is not
// closed, a closing quote is followed by something other than a comma or line end, or a row
// has a different number of fields than the header.
CsvTable parse_csv(std::string_view text, std::string source, const validation::Location& where);

// Reads and parses a CSV file; `source` in messages is the file name as given. Throws
// validation::FileError when the file cannot be read, and as parse_csv otherwise.
CsvTable read_csv_file(const std::filesystem::path& path, const validation::Location& where);

// The field `column` of `row` as a finite number written in plain decimal or scientific form
// ("0.25", "2.5e-3"). Throws validation::InvalidValue naming the source, line and column when
// the field is empty, is not entirely a number, or is NaN or infinite.
double csv_number(const CsvTable& table, const CsvRow& row, std::size_t column,
                  const validation::Location& where);

}  // namespace counterpoise::reading
