// libFuzzer harness for the case importer: bounded JSON parsing, the split of a document into
// sections and items, and canonical text. Any input must give either a clean error
// (validation::Error) or a case whose canonical text survives the split and a re-parse intact.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "core/reading/json_text.hpp"
#include "core/store/canonical_json.hpp"
#include "core/store/case_state.hpp"
#include "core/validation/input_error.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace counterpoise::store;
  using counterpoise::reading::JsonLimits;
  using counterpoise::reading::parse_json_text;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  JsonLimits limits;
  limits.max_bytes = 1u << 20;  // libFuzzer's inputs are small; keep each run fast
  try {
    const nlohmann::json document = parse_json_text(text, "fuzz input", limits);
    const std::string canonical = canonical_text(document);
    const CaseState state = CaseState::from_document(document);
    if (canonical_text(state.to_document()) != canonical) std::abort();  // the split lost something
    if (canonical_text(parse_json_text(canonical, "canonical", limits)) != canonical) std::abort();
  } catch (const counterpoise::validation::Error&) {
    // A clean refusal.
  }
  return 0;
}
