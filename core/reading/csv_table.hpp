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
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/validation/input_error.hpp"

namespace counterpoise::reading {

// A parsed table, kept compact: each column's fields side by side in one block of text with
// the end of each field (4 bytes a cell), and the line numbers of rows only where a row does not
// start on the line after the previous one (after comments, blank lines or a quoted line break).
// A background file of N bytes so costs about N plus 4 bytes a cell, not a string (32 bytes or
// more) and a vector per row. The reader refuses text of 4 GiB or more, so that every offset and
// line number fits in 4 bytes (the file limit of reading/text_file is far below that).
class CsvTable {
 public:
  std::string source;               // file name or other label used in messages
  std::size_t header_line = 0;      // 1-based line of the header row
  std::vector<std::string> header;  // column names, trimmed

  std::size_t row_count() const { return row_count_; }
  // The field of `row` (0-based, in file order) in `column`, with quoting undone.
  std::string_view field(std::size_t row, std::size_t column) const;
  // 1-based line number where `row` starts.
  std::size_t row_line(std::size_t row) const;

  // Index of the column named `name` (compared without regard to ASCII case), or nullopt.
  std::optional<std::size_t> find_column(std::string_view name) const;
  // Index of the column named `name`; throws validation::InvalidValue naming the source and
  // listing the columns present when there is none.
  std::size_t require_column(std::string_view name, const validation::Location& where) const;
  // "<source> line <n>" for messages about one row, or about the line `line`.
  std::string row_label(std::size_t row) const { return line_label(row_line(row)); }
  std::string line_label(std::size_t line) const;

  // The bytes the table holds on the heap (allocated capacity of its text, field ends, line
  // numbers and header), for the memory budget and its test.
  std::size_t byte_size() const;

 private:
  friend CsvTable parse_csv(std::string_view text, std::string source, const validation::Location& where);

  struct Column {
    std::string text;                 // the column's fields, one after another
    std::vector<std::uint32_t> ends;  // where each field ends in `text`
  };
  // A row whose line is not the previous row's line + 1 (the first row is always listed).
  struct LineJump {
    std::uint32_t row;
    std::uint32_t line;
  };
  std::vector<Column> columns_;
  std::vector<LineJump> line_jumps_;  // in row order
  std::size_t row_count_ = 0;
};

// Parses CSV text. Throws validation::InvalidValue (naming `source` and the line, at `where`)
// when the text has no header row, a header name is empty or repeated, a quoted field is not
// closed, a closing quote is followed by something other than a comma or line end, a row has a
// different number of fields than the header, or the text is 4 GiB or larger.
CsvTable parse_csv(std::string_view text, std::string source, const validation::Location& where);

// Reads and parses a CSV file; `source` in messages is the file name as given. Throws
// validation::FileError when the file cannot be read, and as parse_csv otherwise.
CsvTable read_csv_file(const std::filesystem::path& path, const validation::Location& where);

// The field `column` of `row` as a finite number written in plain decimal or scientific form
// ("0.25", "2.5e-3"). Throws validation::InvalidValue naming the source, line and column when
// the field is empty, is not entirely a number, or is NaN or infinite.
double csv_number(const CsvTable& table, std::size_t row, std::size_t column, const validation::Location& where);

// Every field of `column`, in row order, as csv_number reads it: the compact form (8 bytes a
// value) of a column read as numbers. Throws as csv_number at the first field that is not one.
std::vector<double> csv_numbers(const CsvTable& table, std::size_t column, const validation::Location& where);

}  // namespace counterpoise::reading
