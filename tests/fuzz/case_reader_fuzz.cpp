// libFuzzer harness for the case reader: bounded JSON parsing, then every field of every item read
// by the models. Any input must give either a clean refusal whose messages are displayable
// (validation::display_lines leaves them unchanged) or a case that writes back to a document the
// reader accepts again. Files a case names are looked up in an empty folder of its own, so the
// fuzzer cannot reach the machine's files.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <string_view>

#include "core/interchange/case_json.hpp"
#include "core/reading/json_text.hpp"
#include "core/validation/display_text.hpp"
#include "core/validation/input_error.hpp"

namespace {

bool displayable(const std::string& text) { return counterpoise::validation::display_lines(text) == text; }

const std::filesystem::path& empty_folder() {
  static const std::filesystem::path folder = [] {
    auto path = std::filesystem::temp_directory_path() / "counterpoise-fuzz-empty";
    std::filesystem::create_directories(path);
    return path;
  }();
  return folder;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace counterpoise;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  reading::JsonLimits limits;
  limits.max_bytes = 1u << 20;  // libFuzzer's inputs are small; keep each run fast
  try {
    const nlohmann::json document = reading::parse_json_text(text, "fuzz input", limits);
    const auto result = interchange::read_case(document, reading::DataAccess(empty_folder(), {}, false));
    for (const auto& problem : result.diagnostics.problems())
      if (!displayable(problem.text())) std::abort();
    if (result.value) {
      const auto again = interchange::read_case(interchange::write_case(*result.value), empty_folder());
      if (!again.value) std::abort();  // the writer produced what the reader refuses
    }
  } catch (const validation::Error& error) {
    if (!displayable(error.what())) std::abort();
  }
  return 0;
}
