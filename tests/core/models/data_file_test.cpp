// Data files read by models: the digest recorded is the SHA-256 of the bytes the model used,
// checked against GNU coreutils `sha256sum` (an implementation of FIPS 180-4 outside the
// project), and the models that read files say which file, through which field, they used.
#include <catch2/catch.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>

#include "core/models/continuous/continuous_model.hpp"
#include "core/models/data_file.hpp"
#include "core/models/dna/dna_single_source_model.hpp"
#include "core/reading/data_access.hpp"

using namespace counterpoise;
using nlohmann::json;

namespace {

const std::filesystem::path& folder() {
  static const std::filesystem::path dir = [] {
    auto d = std::filesystem::temp_directory_path() / ("counterpoise-data-file-" + std::to_string(::getpid()));
    std::filesystem::create_directories(d);
    return d;
  }();
  return dir;
}

std::string write(const std::string& name, const std::string& text) {
  std::ofstream(folder() / name, std::ios::binary) << text;
  return name;
}

// The first field of `sha256sum FILE`.
std::string coreutils_sha256(const std::filesystem::path& path) {
  const std::string command = "sha256sum '" + path.string() + "'";
  FILE* pipe = ::popen(command.c_str(), "r");
  REQUIRE(pipe);
  char buffer[128] = {};
  const std::size_t n = std::fread(buffer, 1, sizeof buffer - 1, pipe);
  ::pclose(pipe);
  return std::string(buffer, n).substr(0, 64);
}

}  // namespace

TEST_CASE("a data file's digest and size are those of its bytes", "[models][data-file]") {
  // Bytes that a text reader might alter: a byte-order mark, CRLF line ends, no final newline.
  const std::string text = "\xEF\xBB\xBFlocus,allele,frequency\r\nTH01,9.3,1\r\nTH01,10,0.5";
  const auto name = write("bytes.csv", text);
  const auto file = models::read_data_file(folder(), name, validation::Location{"D1", "frequencies.file"});
  CHECK(file.text == text);
  CHECK(file.use.name == name);
  CHECK(file.use.field == "frequencies.file");
  CHECK(file.use.bytes == text.size());
  CHECK(file.use.sha256 == coreutils_sha256(folder() / name));
}

TEST_CASE("a missing data file is a FileError naming the item and field", "[models][data-file]") {
  try {
    models::read_data_file(folder(), "nowhere.csv", validation::Location{"G1", "population.kde.file"});
    FAIL("no error");
  } catch (const validation::FileError& error) {
    CHECK(error.where().item == "G1");
    CHECK(error.where().field == "population.kde.file");
  }
}

TEST_CASE("the DNA model names the frequency file it read, with its digest", "[models][data-file][dna]") {
  const auto name = write("freq.csv", "locus,allele,frequency\nD8S1179,13,0.3\nD8S1179,14,0.21\nTH01,9.3,0.35\n");
  json item = json::parse(R"({"id": "D1", "model": "dna-single-source", "theta": 0.01,
    "profile": {"D8S1179": ["13", "14"], "TH01": ["9.3"]},
    "reference_profile": {"D8S1179": ["13", "14"], "TH01": ["9.3"]}})");
  item["frequencies"] = {{"file", name}};
  const auto model = models::dna::read_dna_single_source_model(item, models::ReadContext{folder(), {"D1", ""}});
  const auto files = model->data_files();
  REQUIRE(files.size() == 1);
  CHECK(files[0].name == name);
  CHECK(files[0].field == "frequencies.file");
  CHECK(files[0].sha256 == coreutils_sha256(folder() / name));

  // A table given in the case itself is no file.
  item["frequencies"] = json::parse(R"({"table": {"D8S1179": {"13": 0.3, "14": 0.21}, "TH01": {"9.3": 0.35}}})");
  CHECK(models::dna::read_dna_single_source_model(item, models::ReadContext{folder(), {"D1", ""}})->data_files().empty());
}

TEST_CASE("the continuous model names the background file it read, with its digest", "[models][data-file][continuous]") {
  const auto name = write("background.csv", "source,ri\nW1,1.5180\nW2,1.5190\nW3,1.5201\nW4,1.5213\n");
  json item = json::parse(R"({"id": "G1", "model": "continuous-two-level", "control": [1.51844, 1.51846],
    "recovered": [1.51848], "within_sd": 4e-5})");
  item["population"] = {{"kde", {{"file", name}, {"column", "ri"}}}};
  const auto model = models::continuous::read_continuous_model(item, models::ReadContext{folder(), {"G1", ""}});
  const auto files = model->data_files();
  REQUIRE(files.size() == 1);
  CHECK(files[0].name == name);
  CHECK(files[0].field == "population.kde.file");
  CHECK(files[0].sha256 == coreutils_sha256(folder() / name));

  item["population"] = json::parse(R"({"normal": {"mean": 1.5186, "sd": 0.004}})");
  CHECK(models::continuous::read_continuous_model(item, models::ReadContext{folder(), {"G1", ""}})->data_files().empty());
}

TEST_CASE("a case cannot make a model read a folder or a device", "[models][data-file][errors]") {
  // Without the check, reading /dev/zero would never end (common practice: read only regular files).
  // /dev/zero lies outside the case's folder, so by default it is refused before that; allowed for
  // the run, it is still not read.
  const auto refusal = [](const std::string& name) {
    try {
      models::read_data_file(folder(), name, validation::Location{"D1", "frequencies.file"});
    } catch (const validation::FileError& error) {
      CHECK(error.where().field == "frequencies.file");
      return std::string(error.what());
    }
    return std::string("no error");
  };
  CHECK_THAT(refusal(folder().string()), Catch::Contains("not a regular file"));
  CHECK_THAT(refusal("/dev/zero"), Catch::Contains("lies outside the case's folder"));
  reading::allow_data_outside_for_this_run();
  CHECK_THAT(refusal("/dev/zero"), Catch::Contains("not a regular file"));
  reading::reset_data_permissions();
}
