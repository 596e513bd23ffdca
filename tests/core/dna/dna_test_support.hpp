#pragma once
// Helpers for the DNA model tests: temporary case folders and item construction.

#include <filesystem>
#include <fstream>
#include <random>
#include <string>

#include <nlohmann/json.hpp>

#include "core/models/dna/dna_single_source_model.hpp"

namespace dna_test {

// A fresh folder under the system temporary directory, removed when the object goes away.
class TempFolder {
 public:
  TempFolder() {
    std::random_device device;
    path_ = std::filesystem::temp_directory_path() / ("counterpoise-dna-" + std::to_string(device()));
    std::filesystem::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  const std::filesystem::path& path() const { return path_; }
  void write(const std::string& name, const std::string& text) const {
    std::ofstream out(path_ / name, std::ios::binary);
    out << text;
  }

 private:
  std::filesystem::path path_;
};

inline counterpoise::models::ReadContext context(const std::filesystem::path& base = {}) {
  return counterpoise::models::ReadContext{base, counterpoise::validation::Location{"D1", ""}};
}

// `item` with a reference profile equal to its questioned profile when it gives none: the
// person of interest matches at every locus, the situation the match-probability formulas
// describe. An item without a profile, or with a reference of its own, is returned as it is.
inline nlohmann::json matched(nlohmann::json item) {
  if (item.is_object() && !item.contains("reference_profile") && item.contains("profile"))
    item["reference_profile"] = item["profile"];
  return item;
}

// Reads `item` as matched() gives it.
inline std::shared_ptr<const counterpoise::models::dna::DnaSingleSourceModel> read(
    const nlohmann::json& item, const std::filesystem::path& base = {}) {
  auto model = counterpoise::models::dna::read_dna_single_source_model(matched(item), context(base));
  return std::dynamic_pointer_cast<const counterpoise::models::dna::DnaSingleSourceModel>(model);
}

}  // namespace dna_test
