// Which files a case may make the program read (docs/file-formats.md, "Trust model"): the case's
// folder and the configured laboratory data folders, after symbolic links are resolved; anything
// else only when the user allows it for the run. Paths are compared after resolution as POSIX
// realpath(3) does (IEEE Std 1003.1-2017), which std::filesystem::weakly_canonical follows.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>

#include "core/reading/data_access.hpp"
#include "core/validation/input_error.hpp"

using counterpoise::reading::DataAccess;
using counterpoise::validation::FileError;
using counterpoise::validation::Location;
namespace fs = std::filesystem;

namespace {

// A fresh folder tree: case/ (the case's folder, with data.csv) and lab/ and elsewhere/ beside it.
struct Tree {
  fs::path root = fs::temp_directory_path() / ("counterpoise-access-" + std::to_string(::getpid()));
  fs::path case_folder = root / "case";
  fs::path lab = root / "lab";
  fs::path elsewhere = root / "elsewhere";
  Tree() {
    fs::remove_all(root);
    for (const auto& folder : {case_folder, lab, elsewhere}) fs::create_directories(folder);
    for (const auto& file : {case_folder / "data.csv", lab / "alleles.csv", elsewhere / "secret.txt"})
      std::ofstream(file) << "a,b\n1,2\n";
  }
  ~Tree() { fs::remove_all(root); }
};

const Location kField{"D1", "frequencies.file"};

// The message of the FileError `locate` throws, or "" when it does not throw.
std::string refusal(const DataAccess& access, const std::string& name) {
  try {
    access.locate(name, kField);
  } catch (const FileError& error) {
    CHECK(error.where().item == "D1");
    CHECK(error.where().field == "frequencies.file");
    return error.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a file inside the case's folder is read, named relatively or absolutely") {
  const Tree tree;
  const DataAccess access(tree.case_folder, {}, false);
  CHECK(access.locate("data.csv", kField) == fs::canonical(tree.case_folder / "data.csv"));
  CHECK(access.locate((tree.case_folder / "data.csv").string(), kField) == fs::canonical(tree.case_folder / "data.csv"));
  CHECK(access.locate("./sub/../data.csv", kField) == fs::canonical(tree.case_folder / "data.csv"));
}

TEST_CASE("a path that climbs out, an absolute path elsewhere and a link pointing out are refused") {
  const Tree tree;
  const DataAccess access(tree.case_folder, {}, false);
  const std::string climbing = refusal(access, "../elsewhere/secret.txt");
  CHECK_THAT(climbing, Catch::Contains("item D1, field frequencies.file: '../elsewhere/secret.txt'"));
  CHECK_THAT(climbing, Catch::Contains("lies outside the case's folder"));
  CHECK_THAT(climbing, Catch::Contains("--allow-data-outside"));
  CHECK_THAT(refusal(access, "/etc/passwd"), Catch::Contains("'/etc/passwd' lies outside"));
  CHECK_THAT(refusal(access, "/proc/self/environ"), Catch::Contains("lies outside"));
  // A folder whose name starts like the case folder's is not inside it.
  fs::create_directories(tree.root / "case-other");
  std::ofstream(tree.root / "case-other" / "x.csv") << "a\n";
  CHECK_THAT(refusal(access, "../case-other/x.csv"), Catch::Contains("lies outside"));

  fs::create_symlink(tree.elsewhere / "secret.txt", tree.case_folder / "innocent.csv");
  const std::string through_link = refusal(access, "innocent.csv");
  CHECK_THAT(through_link, Catch::Contains("which leads to '" + fs::canonical(tree.elsewhere / "secret.txt").string()));
  fs::create_directory_symlink(tree.elsewhere, tree.case_folder / "more");
  CHECK_THAT(refusal(access, "more/secret.txt"), Catch::Contains("lies outside"));
}

TEST_CASE("a link that stays inside the folder, and a case folder reached through a link, are fine") {
  const Tree tree;
  fs::create_symlink(tree.case_folder / "data.csv", tree.case_folder / "alias.csv");
  CHECK(DataAccess(tree.case_folder, {}, false).locate("alias.csv", kField) == fs::canonical(tree.case_folder / "data.csv"));
  fs::create_directory_symlink(tree.case_folder, tree.root / "linked-case");
  CHECK(DataAccess(tree.root / "linked-case", {}, false).locate("data.csv", kField) ==
        fs::canonical(tree.case_folder / "data.csv"));
}

TEST_CASE("a configured laboratory data folder is allowed; allowing outside for the run allows anything") {
  const Tree tree;
  const std::string name = (tree.lab / "alleles.csv").string();
  CHECK_THAT(refusal(DataAccess(tree.case_folder, {}, false), name), Catch::Contains("lies outside"));
  CHECK(DataAccess(tree.case_folder, {tree.lab}, false).locate(name, kField) == fs::canonical(tree.lab / "alleles.csv"));
  CHECK(DataAccess(tree.case_folder, {}, true).locate("../elsewhere/secret.txt", kField) ==
        fs::canonical(tree.elsewhere / "secret.txt"));
  CHECK(DataAccess::allowing_outside(tree.case_folder).allows_outside());
}

TEST_CASE("the laboratory data folders come from COUNTERPOISE_DATA_FOLDERS, separated by colons") {
  ::setenv(counterpoise::reading::kDataFoldersVariable, "/srv/lab-a::/srv/lab b", 1);
  const auto folders = counterpoise::reading::configured_data_folders();
  ::unsetenv(counterpoise::reading::kDataFoldersVariable);
  REQUIRE(folders.size() == 2);
  CHECK(folders[0] == "/srv/lab-a");
  CHECK(folders[1] == "/srv/lab b");
  CHECK(counterpoise::reading::configured_data_folders().empty());
}
