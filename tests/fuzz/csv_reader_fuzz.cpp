// libFuzzer harness for the CSV reader (frequency tables, background data): any bytes must give
// either a clean refusal (validation::Error) whose message is displayable (no control character,
// no invalid UTF-8: validation::display_lines leaves it unchanged) or a table whose rows all have
// the header's width; every field read as a number is finite or refused cleanly.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "core/reading/csv_table.hpp"
#include "core/validation/display_text.hpp"
#include "core/validation/input_error.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace counterpoise;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const validation::Location where{"D1", "frequencies.file"};
  try {
    const reading::CsvTable table = reading::parse_csv(text, "fuzz.csv", where);
    for (const auto& row : table.rows) {
      if (row.fields.size() != table.header.size()) std::abort();  // the reader's promise
      for (std::size_t column = 0; column < row.fields.size(); ++column) {
        try {
          reading::csv_number(table, row, column, where);
        } catch (const validation::Error& error) {
          if (validation::display_lines(error.what()) != error.what()) std::abort();
        }
      }
    }
    (void)table.find_column("locus");
  } catch (const validation::Error& error) {
    if (validation::display_lines(error.what()) != error.what()) std::abort();  // a raw byte escaped
  }
  return 0;
}
