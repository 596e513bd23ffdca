// libFuzzer harness for the CSV reader (core/reading/csv_table): any input must give a clean
// refusal (validation::Error) or a table whose rows start on increasing lines after the header,
// whose fields together are no longer than the input, and every field must read as a number or
// be refused cleanly.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "core/reading/csv_table.hpp"
#include "core/validation/input_error.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace counterpoise::reading;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const counterpoise::validation::Location where{"F1", "frequencies.file"};
  try {
    const CsvTable table = parse_csv(text, "fuzz input", where);
    if (table.header.empty()) std::abort();  // a table always has a header
    // Every row is checked; numbers are read from the first fields only, since each refusal is
    // an exception and thousands of them per input would slow the search, not deepen it.
    constexpr std::size_t kFieldsRead = 256;
    std::size_t read = 0;
    std::size_t previous_line = table.header_line;
    std::size_t field_bytes = 0;
    for (std::size_t row = 0; row < table.row_count(); ++row) {
      if (table.row_line(row) <= previous_line) std::abort();
      previous_line = table.row_line(row);
      for (std::size_t column = 0; column < table.header.size(); ++column) {
        field_bytes += table.field(row, column).size();
        if (read >= kFieldsRead) continue;
        ++read;
        try {
          (void)csv_number(table, row, column, where);
        } catch (const counterpoise::validation::Error&) {
        }
      }
    }
    if (field_bytes > text.size()) std::abort();
    // A header name is found again (as the first column of that name, compared without case).
    for (std::size_t i = 0; i < table.header.size() && i < kFieldsRead; ++i)
      if (!table.find_column(table.header[i])) std::abort();
  } catch (const counterpoise::validation::Error&) {
    // A clean refusal.
  }
  return 0;
}
