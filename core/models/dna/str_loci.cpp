#include "core/models/dna/str_loci.hpp"

#include <cctype>

namespace counterpoise::models::dna {

namespace {

constexpr std::string_view kStandardLoci[] = {
    // CODIS core 20 (the European Standard Set loci are all among them).
    "CSF1PO", "FGA", "TH01", "TPOX", "vWA", "D3S1358", "D5S818", "D7S820", "D8S1179", "D13S317",
    "D16S539", "D18S51", "D21S11", "D1S1656", "D2S441", "D2S1338", "D10S1248", "D12S391",
    "D19S433", "D22S1045",
    // Commonly typed besides them.
    "Penta D", "Penta E", "SE33", "D6S1043"};

constexpr std::string_view kAmelogenin = "Amelogenin";

// Upper case without spaces, hyphens and underscores.
std::string folded(std::string_view name) {
  std::string out;
  for (char c : name) {
    if (c == ' ' || c == '-' || c == '_' || c == '\t') continue;
    out += static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  }
  return out;
}

}  // namespace

std::span<const std::string_view> standard_str_loci() { return kStandardLoci; }

std::optional<std::string> canonical_locus_name(std::string_view name) {
  const std::string key = folded(name);
  for (auto locus : kStandardLoci)
    if (folded(locus) == key) return std::string(locus);
  if (key == "AMELOGENIN" || key == "AMEL") return std::string(kAmelogenin);
  return std::nullopt;
}

bool is_amelogenin(std::string_view name) {
  auto canonical = canonical_locus_name(name);
  return canonical && *canonical == kAmelogenin;
}

std::string locus_key(std::string_view name) {
  auto canonical = canonical_locus_name(name);
  return canonical ? *canonical : std::string(name);
}

}  // namespace counterpoise::models::dna
