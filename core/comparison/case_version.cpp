#include "core/comparison/case_version.hpp"

#include "core/interchange/case_json.hpp"
#include "core/platform/sha256.hpp"

namespace counterpoise::comparison {

CaseVersion make_version(casefile::Case value, std::filesystem::path base_dir, std::string label) {
  const std::string digest = platform::sha256_hex(interchange::canonical_text(interchange::write_case(value)));
  return CaseVersion{std::move(value), std::move(base_dir), std::move(label), digest};
}

}  // namespace counterpoise::comparison
